import { acceptanceProbability } from "./anneal/acceptanceProbability.js";
import { calibrateTemperatures } from "./anneal/calibrateTemperatures.js";
import { createRandom } from "./anneal/createRandom.js";
import { resolveCooling, temperatureAt, type ResolvedCooling } from "./anneal/resolveCooling.js";
import { sampleUphill } from "./anneal/sampleUphill.js";
import { constructPlan } from "./construct/constructPlan.js";
import type { Plan, Problem, Unassigned } from "./model.js";
import { eliminateRoute } from "./moves/eliminateRoute.js";
import { applyMove, Move, proposeMove } from "./moves/proposeMove.js";
import { SearchState } from "./moves/SearchState.js";
import { buildNeighbours } from "./neighbours/buildNeighbours.js";
import { SOLVE_DEFAULTS, type Progress, type SolveOptions } from "./options.js";
import { compileProblem, type CompiledProblem } from "./schedule/compileProblem.js";
import { evaluatePlan } from "./schedule/evaluatePlan.js";
import { initialWeights } from "./anneal/initialWeights.js";
import { validateProblem } from "./validateProblem.js";

/** Numbers of one run. */
export interface RunStats {
  /** Moves drawn (valid or not) and moves evaluated. */
  moves: number;
  evaluations: number;
  elapsedMs: number;
  /** Start and end temperatures used, and the calibration's mean uphill change. */
  t0: number;
  tEnd: number;
  meanUphill: number;
  accepted: number;
  feasibleFound: boolean;
}

/** The plan a run returns and how it went. */
export interface SolveResult {
  plan: Plan;
  stats: RunStats;
}

/** A run that advances in slices (for a Web Worker that must stay responsive). */
export interface Solver {
  /** Run up to `maxMoves` moves; true when the run is finished (budget used or aborted). */
  step(maxMoves: number): boolean;
  readonly progress: Progress;
  /** The best plan so far (exactly re-evaluated), with the run's numbers. */
  result(): SolveResult;
}

/** Moves between clock and abort checks, and between temperature updates. */
const CLOCK_EVERY = 256;
const TEMPERATURE_EVERY = 16;
/** Moves between penalty-weight updates, and the factors (adaptive penalties, common practice). */
const ADAPT_EVERY = 500;
const PENALTY_UP = 1.3;
const PENALTY_DOWN = 1.1;
/**
 * The last part of the budget runs at temperature 0 (descent): the calibrated end temperature
 * matches the mean uphill change of the first plan, which is far larger than the changes near
 * a good plan, so without it the run would end on a plan slightly above its local optimum.
 */
const QUENCH_FROM = 0.95;
/**
 * Under the vehicles-first objective, a feasible current plan loses a short route after this
 * many moves; the wait doubles after each elimination that did not lead to fewer vehicles
 * (so a fleet already at its minimum gets time to shorten its routes)...
 */
const ELIMINATE_EVERY = 2000;
/** ... until this fraction of the budget, leaving the rest to shorten the routes. */
const ELIMINATE_UNTIL = 0.85;
/** Descent moves per stop that polish the constructed plan before calibration. */
const DESCENT_MOVES_PER_STOP = 50;

/**
 * Plan routes by simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983) with Metropolis or
 * logistic acceptance over relocate, swap, 2-opt, 2-opt*, or-opt and pool moves in a granular
 * neighbourhood, time-warp and load penalties that adapt so the search crosses infeasible
 * plans, and the best feasible plan kept (else the least violating, violations listed).
 *
 * @param problem - a problem without `validateProblem` issues
 * @param options - seed, budget, rule, cooling, ... (defaults `SOLVE_DEFAULTS`)
 * @returns the plan and run statistics
 * @throws RangeError when the problem has issues; TypeError when a seconds budget comes without `now`
 * @example solve(problem, { seed: 7, budget: { moves: 200_000 } }).plan.totals.cost
 */
export function solve(problem: Problem, options: Partial<SolveOptions> = {}): SolveResult {
  const solver = createSolver(problem, options);
  while (!solver.step(4096)) {
    // step checks the signal and the clock itself.
  }
  return solver.result();
}

/**
 * A solver to drive in slices: `while (!solver.step(10_000)) postProgress(solver.progress)`.
 * Construction and calibration happen here, so the first plan exists before any step.
 *
 * @param problem - a problem without `validateProblem` issues
 * @param options - as for `solve`
 * @returns the solver
 * @throws RangeError when the problem has issues; TypeError when a seconds budget comes without `now`
 * @example const s = createSolver(problem, { seed: 1 }); s.step(1000); s.result().plan
 */
export function createSolver(problem: Problem, options: Partial<SolveOptions> = {}): Solver {
  const o: SolveOptions = { ...SOLVE_DEFAULTS, ...options };
  const issues = validateProblem(problem);
  if (issues.length > 0) {
    throw new RangeError(`problem has ${issues.length} issue(s); first: ${issues[0]!.sheet}!${issues[0]!.cell}: ${issues[0]!.message}`);
  }
  const seconds = "seconds" in o.budget ? o.budget.seconds : undefined;
  const budgetMoves = "moves" in o.budget ? o.budget.moves : undefined;
  if (seconds !== undefined && !o.now) throw new TypeError("options.now is required for a seconds budget");
  if (!(Number.isInteger(o.neighbours) && o.neighbours >= 1))
    throw new RangeError(`options.neighbours must be a positive integer, got ${o.neighbours}`);
  const now = o.now;
  const startedAt = now ? now() : 0;
  const cp = compileProblem(problem);
  const rng = createRandom(o.seed);
  const nb = buildNeighbours(cp, o.neighbours);
  const w = initialWeights(cp);
  const state = new SearchState(cp, w.wTime, w.wLoad);
  const active = Int32Array.from(Array.from({ length: cp.n }, (_, s) => s).filter((s) => !cp.unservableReason[s]));
  constructPlan(state, nb);
  if (cp.hierarchical) {
    // Worth more than the whole first plan: one vehicle fewer always wins.
    state.vehicleWeight = 2 * (state.realCost() + Math.abs(state.total())) + 1;
  }
  descend(state, nb, rng, active, DESCENT_MOVES_PER_STOP * active.length);
  const cal = sampleUphill(state, nb, rng, o.calibrationSamples, active);
  const temps = calibrateTemperatures(cal.meanUphill, o.rule, o.p0, o.pEnd, cal.uphill);
  const cooling: ResolvedCooling = resolveCooling(o.cooling, { ...temps, budgetMoves: budgetMoves ?? 0 });
  const t0 = cooling.t0;
  const tEnd = "tEnd" in cooling ? cooling.tEnd : temperatureAt(cooling, budgetMoves ?? 0, 1);

  const best = new Snapshot(cp);
  let bestKey1 = Infinity;
  let bestKey2 = Infinity;
  let feasibleFound = false;
  // The search times a stop with several windows on their hull (first opening to last close), so
  // a plan it finds feasible can still arrive in a gap between windows: before such a plan becomes
  // the best feasible one, it is timed exactly.
  const multiWindow = problem.stops.some((s) => s.windows.length > 1);
  const isExactlyFeasible = (): boolean =>
    evaluatePlan(
      problem,
      state.routes.map((r) => Array.from(r.nodes.subarray(1, r.len + 1))),
    ).feasible;
  const improvesFeasibleBest = (): boolean => {
    if (!feasibleFound) return true;
    const k1 = cp.hierarchical ? state.used : 0;
    return k1 < bestKey1 - 1e-9 || (Math.abs(k1 - bestKey1) <= 1e-9 && state.realCost() < bestKey2 - 1e-9);
  };
  const consider = (): void => {
    let feasible = state.isFeasible();
    if (!feasible && feasibleFound) return;
    if (feasible && multiWindow && improvesFeasibleBest() && !isExactlyFeasible()) feasible = false;
    if (!feasible && feasibleFound) return;
    // Feasible plans by (vehicles, cost) or cost; infeasible ones by (violation, penalised cost).
    const k1 = feasible ? (cp.hierarchical ? state.used : 0) : state.violation();
    if (k1 > bestKey1 + 1e-9 && !(feasible && !feasibleFound)) return;
    const k2 = feasible ? state.realCost() : state.total();
    if (feasible && !feasibleFound) {
      feasibleFound = true;
    } else if (!(k1 < bestKey1 - 1e-9 || (Math.abs(k1 - bestKey1) <= 1e-9 && k2 < bestKey2 - 1e-9))) {
      return;
    }
    bestKey1 = k1;
    bestKey2 = k2;
    best.take(state);
  };
  consider();

  const mv = new Move();
  let lastElimination = 0;
  let eliminationGap = ELIMINATE_EVERY;
  let usedAtElimination = Infinity;
  let moves = 0;
  let evaluations = 0;
  let accepted = 0;
  let acceptedSinceReport = 0;
  let movesSinceReport = 0;
  let elapsedMs = 0;
  let lastReportAt = startedAt;
  let fraction = 0;
  let temperature = t0;
  let done = active.length === 0;
  const metropolis = o.rule === "metropolis";
  let progress: Progress = makeProgress();

  function makeProgress(): Progress {
    return {
      moves,
      fraction,
      temperature,
      currentCost: state.realCost(),
      bestCost: feasibleFound ? bestKey2 : Infinity,
      acceptanceRate: movesSinceReport > 0 ? acceptedSinceReport / movesSinceReport : 0,
      elapsedMs,
    };
  }

  function adapt(): void {
    const parts = state.violationParts();
    const wTime = parts.time > 1e-9 ? state.wTime * PENALTY_UP : Math.max(w.wTime * 0.01, state.wTime / PENALTY_DOWN);
    const wLoad = parts.load > 1e-9 ? state.wLoad * PENALTY_UP : Math.max(w.wLoad * 0.01, state.wLoad / PENALTY_DOWN);
    state.setWeights(Math.min(wTime, w.wTime * 1e6), Math.min(wLoad, w.wLoad * 1e6));
  }

  function step(maxMoves: number): boolean {
    if (done) return true;
    if (o.signal?.aborted) {
      done = true;
      return true;
    }
    for (let k = 0; k < maxMoves; k++) {
      if (budgetMoves !== undefined && moves >= budgetMoves) {
        done = true;
        break;
      }
      moves++;
      movesSinceReport++;
      if (moves % TEMPERATURE_EVERY === 0) {
        if (budgetMoves !== undefined) fraction = moves / budgetMoves;
        temperature = fraction >= QUENCH_FROM ? 0 : temperatureAt(cooling, moves, fraction);
      }
      if (proposeMove(state, nb, rng, mv, active)) {
        evaluations++;
        const dE = mv.delta;
        let accept: boolean;
        if (metropolis && dE <= 0) accept = true;
        else accept = rng.next() < acceptanceProbability(o.rule, dE, temperature);
        if (accept) {
          applyMove(state, mv);
          accepted++;
          acceptedSinceReport++;
          consider();
        }
      }
      if (moves % ADAPT_EVERY === 0) adapt();
      if (cp.hierarchical && moves - lastElimination >= eliminationGap && fraction < ELIMINATE_UNTIL && state.isFeasible()) {
        if (lastElimination > 0) eliminationGap = bestKey1 < usedAtElimination ? ELIMINATE_EVERY : eliminationGap * 2;
        usedAtElimination = bestKey1;
        lastElimination = moves;
        if (eliminateRoute(state, nb, rng) >= 0) consider();
      }
      if (moves % CLOCK_EVERY === 0) {
        if (o.signal?.aborted) {
          done = true;
          break;
        }
        if (now) {
          const t = now();
          elapsedMs = t - startedAt;
          if (seconds !== undefined) {
            fraction = Math.min(1, elapsedMs / (seconds * 1000));
            if (elapsedMs >= seconds * 1000) done = true;
          }
          if (o.onProgress && t - lastReportAt >= o.progressEveryMs) {
            progress = makeProgress();
            o.onProgress(progress);
            lastReportAt = t;
            acceptedSinceReport = 0;
            movesSinceReport = 0;
          }
          if (done) break;
        }
      }
    }
    if (now) elapsedMs = now() - startedAt;
    progress = makeProgress();
    return done;
  }

  return {
    step,
    get progress() {
      return progress;
    },
    result(): SolveResult {
      const plan = best.plan(problem);
      return {
        plan,
        stats: { moves, evaluations, elapsedMs, t0, tEnd, meanUphill: cal.meanUphill, accepted, feasibleFound },
      };
    },
  };
}

/** A copy of the routes and pool of the best state seen. */
class Snapshot {
  private readonly routes: number[][];
  private pool: number[] = [];

  constructor(private readonly cp: CompiledProblem) {
    this.routes = Array.from({ length: cp.vehicleCount }, () => []);
  }

  /** Copy the routes changed since the previous copy (every accepted move marks its routes). */
  take(state: SearchState): void {
    for (let v = 0; v < state.routes.length; v++) {
      if (!state.dirty[v]) continue;
      const r = state.routes[v]!;
      this.routes[v] = Array.from(r.nodes.subarray(1, r.len + 1));
      state.dirty[v] = 0;
    }
    this.pool = Array.from(state.pool.subarray(0, state.poolSize));
  }

  plan(problem: Problem): Plan {
    const cp = this.cp;
    const unassigned: Unassigned[] = [];
    for (let s = 0; s < cp.n; s++) {
      if (cp.unservableReason[s]) unassigned.push({ stop: s, reason: cp.unservableReason[s]! });
    }
    for (const s of this.pool) {
      const stop = problem.stops[s]!;
      unassigned.push({
        stop: s,
        reason:
          stop.unservedCost !== undefined
            ? `serving it would cost more than leaving it, ${stop.unservedCost}`
            : "could not be fitted into any route within capacity, windows and shifts",
      });
    }
    unassigned.sort((a, b) => a.stop - b.stop);
    return evaluatePlan(problem, this.routes, unassigned);
  }
}

/** Greedy descent (only non-worsening moves): turns the constructed plan into a local optimum. */
function descend(
  state: SearchState,
  nb: ReturnType<typeof buildNeighbours>,
  rng: ReturnType<typeof createRandom>,
  active: Int32Array,
  moves: number,
): void {
  if (active.length === 0) return;
  const mv = new Move();
  for (let k = 0; k < moves; k++) {
    if (proposeMove(state, nb, rng, mv, active) && mv.delta < -1e-12) applyMove(state, mv);
  }
}
