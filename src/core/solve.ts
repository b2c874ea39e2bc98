import { acceptanceProbability } from "./anneal/acceptanceProbability.js";
import { temperatureAt } from "./anneal/resolveCooling.js";
import { isWorseMove } from "./anneal/sampleUphill.js";
import type { Problem } from "./model.js";
import { eliminateRoute } from "./moves/eliminateRoute.js";
import { applyMove, Move, proposeMove } from "./moves/proposeMove.js";
import { SOLVE_DEFAULTS, type Progress, type SolveOptions } from "./options.js";
import { adaptPenalties, ADAPT_EVERY } from "./search/adaptPenalties.js";
import { BestPlan } from "./search/BestPlan.js";
import { EliminationSchedule } from "./search/EliminationSchedule.js";
import { FinalDescent } from "./search/finalDescent.js";
import { prepareRun } from "./search/prepareRun.js";
import { keepHardRules } from "./schedule/keepHardRules.js";
import type { SolveResult, Solver } from "./search/runTypes.js";

export type { RunStats, SolveResult, Solver } from "./search/runTypes.js";

/** Moves between clock and abort checks, and between temperature updates. */
const CLOCK_EVERY = 256;
const TEMPERATURE_EVERY = 16;
/**
 * The last part of the budget runs at temperature 0 (descent): the calibrated end temperature
 * matches the mean uphill change of the first plan, which is far larger than the changes near
 * a good plan, so without it the run would end on a plan slightly above its local optimum.
 * The quench starts from the best feasible plan with a steepest descent (`finalDescent`).
 */
const QUENCH_FROM = 0.95;

/**
 * Plan routes by simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983) with Metropolis or
 * logistic acceptance over relocate, swap, 2-opt, 2-opt*, or-opt and pool moves in a granular
 * neighbourhood, time-warp and load penalties that adapt so the search crosses infeasible
 * plans, and the best feasible plan kept; the last part of the budget descends from the best
 * plan at temperature 0 (a steepest descent over the neighbourhood, then random improving moves). When no plan serves every must-serve stop within the
 * rules, the least violating one is cut back to the rules (`keepHardRules`): the stops left out
 * are unassigned with a reason, so the plan returned never breaks capacity, a hard window, a
 * shift, a feature or max stops.
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
  const now = o.now;
  const startedAt = now ? (o.startedAt ?? now()) : 0;
  const run = prepareRun(problem, o, startedAt);
  const { cp, rng, nb, moveNb, state, active, cooling, t0, tEnd, budgetMoves, seconds } = run;

  const best = new BestPlan(problem, cp);
  best.consider(state);
  const elimination = new EliminationSchedule();
  const mv = new Move();
  let moves = 0;
  let evaluations = 0;
  let routeEliminations = 0;
  let penaltyUpdates = 0;
  let accepted = 0;
  let acceptedSinceReport = 0;
  let movesSinceReport = 0;
  let worseSinceReport = 0;
  let worseAcceptedSinceReport = 0;
  let elapsedMs = 0;
  let lastReportAt = startedAt;
  let fraction = 0;
  let temperature = t0;
  let done = active.length === 0;
  let polished = false;
  let descent: FinalDescent | undefined;
  const metropolis = o.rule === "metropolis";
  let progress: Progress = makeProgress();

  function makeProgress(): Progress {
    return {
      moves,
      fraction,
      temperature,
      currentCost: state.realCost(),
      bestCost: best.feasibleFound ? best.key2 : Infinity,
      acceptanceRate: movesSinceReport > 0 ? acceptedSinceReport / movesSinceReport : 0,
      worseAccepted: worseSinceReport > 0 ? worseAcceptedSinceReport / worseSinceReport : undefined,
      elapsedMs,
    };
  }

  /**
   * Clock, abort and progress, every `CLOCK_EVERY` moves and after each slice of the final
   * descent; true when the run is over.
   */
  function checkClock(): boolean {
    if (o.signal?.aborted) {
      done = true;
      return true;
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
        worseSinceReport = 0;
        worseAcceptedSinceReport = 0;
      }
    }
    return done;
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
      if (descent) {
        // The final descent, in slices of whole stops (the same evaluations however the run is
        // sliced); its evaluations count as moves of the budget.
        const left = budgetMoves !== undefined ? budgetMoves - moves : Number.MAX_SAFE_INTEGER;
        const used = descent.run(left, maxMoves - k);
        moves += used;
        movesSinceReport += used;
        evaluations += used;
        k += Math.max(0, used - 1);
        if (descent.finished || used === 0) descent = undefined;
        if (budgetMoves !== undefined) fraction = Math.min(1, moves / budgetMoves);
        if (checkClock()) break;
        continue;
      }
      moves++;
      movesSinceReport++;
      if (moves % TEMPERATURE_EVERY === 0) {
        if (budgetMoves !== undefined) fraction = moves / budgetMoves;
        temperature = fraction >= QUENCH_FROM ? 0 : temperatureAt(cooling, moves, fraction);
        if (!polished && fraction >= QUENCH_FROM) {
          // The quench starts from the best feasible plan, with a steepest descent on it.
          polished = true;
          if (best.feasibleFound) best.restore(state);
          descent = new FinalDescent(state, moveNb, active, () => best.consider(state));
          continue;
        }
      }
      if (proposeMove(state, moveNb, rng, mv, active)) {
        evaluations++;
        const dE = mv.delta;
        let accept: boolean;
        if (metropolis && dE <= 0) accept = true;
        else accept = rng.next() < acceptanceProbability(o.rule, dE, temperature);
        if (dE > 0 && isWorseMove(state, mv)) {
          worseSinceReport++;
          if (accept) worseAcceptedSinceReport++;
        }
        if (accept) {
          applyMove(state, mv);
          accepted++;
          acceptedSinceReport++;
          best.consider(state);
        }
      }
      if (o.adaptivePenalties && moves % ADAPT_EVERY === 0) {
        const wTime = state.wTime;
        const wLoad = state.wLoad;
        adaptPenalties(state, run.weights);
        if (state.wTime !== wTime || state.wLoad !== wLoad) penaltyUpdates++;
      }
      if (o.routeMinimisation && cp.hierarchical && elimination.due(moves, fraction, best.key1, state)) {
        if (eliminateRoute(state, nb, rng) >= 0) {
          routeEliminations++;
          best.consider(state);
        }
      }
      if (moves % CLOCK_EVERY === 0 && checkClock()) break;
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
      const plan = keepHardRules(problem, best.plan());
      return {
        plan,
        stats: {
          moves,
          evaluations,
          elapsedMs,
          t0,
          tEnd,
          meanUphill: run.meanUphill,
          accepted,
          feasibleFound: best.feasibleFound,
          cooling,
          fullRouteEvaluations: state.fullEvaluations,
          routeEliminations,
          penaltyUpdates,
          ...(run.movesPerSecond === undefined ? {} : { measuredMovesPerSecond: run.movesPerSecond }),
        },
      };
    },
  };
}
