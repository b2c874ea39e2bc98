import { acceptanceProbability } from "./anneal/acceptanceProbability.js";
import { resolveCooling, temperatureAt } from "./anneal/resolveCooling.js";
import { isWorseMove } from "./anneal/sampleUphill.js";
import { ROUTE_MINIMISATION_SHARE, ROUTE_MINIMISATION_STALL } from "./constants.js";
import type { Plan, Problem } from "./model.js";
import { eliminateRoute } from "./moves/eliminateRoute.js";
import { applyMove, Move, proposeMove } from "./moves/proposeMove.js";
import { SOLVE_DEFAULTS, type Progress, type SolveOptions } from "./options.js";
import { adaptPenalties, ADAPT_EVERY } from "./search/adaptPenalties.js";
import { BestPlan } from "./search/BestPlan.js";
import { EliminationSchedule } from "./search/EliminationSchedule.js";
import { annealingEnds, QUENCH_FROM } from "./search/endOfRun.js";
import { FinalDescent } from "./search/finalDescent.js";
import { KickSearch } from "./search/kickSearch.js";
import { prepareRun } from "./search/prepareRun.js";
import { RouteMinimiser } from "./search/routeMinimisation.js";
import { keepHardRules } from "./schedule/keepHardRules.js";
import type { SolveResult, Solver } from "./search/runTypes.js";

export type { RunStats, SolveResult, Solver } from "./search/runTypes.js";

/** Moves between clock and abort checks, and between temperature updates. */
const CLOCK_EVERY = 256;
const TEMPERATURE_EVERY = 16;
/**
 * At the route-minimisation phase's fleet, a chain that has broken a rule for this many moves
 * per stop goes back to the best plan with the initial penalty weights (measured on Solomon
 * R109, R207, C103: better distance at the same vehicles; `bench/results/route-minimisation-*`).
 */
const RESTART_MOVES_PER_STOP = 2000;

/**
 * Metropolis on a worse move: `r < acceptanceProbability("metropolis", dE, T)` for a draw `r` of
 * the run's generator (a multiple of 2^-32) and dE > 0, the same decision without the exponential
 * where it cannot matter: for dE > 23 T, exp(-dE / T) is below 1.1e-10, under the generator's
 * smallest step above 0 (2.3e-10), so only a draw of 0 could accept.
 *
 * @param r - the draw, uniform in [0, 1) in steps of 2^-32
 * @param dE - the cost change (> 0)
 * @param temperature - T >= 0
 * @returns whether the move is accepted
 * @example acceptsUphill(0.5, 20, 90) // => true (0.5 < exp(-20 / 90) = 0.80)
 */
export function acceptsUphill(r: number, dE: number, temperature: number): boolean {
  if (r > 0 && temperature >= 0 && dE > 23 * temperature) return false;
  return r < acceptanceProbability("metropolis", dE, temperature);
}

/**
 * Plan routes by simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983) with Metropolis or
 * logistic acceptance over relocate, swap, 2-opt, 2-opt*, or-opt and pool moves in a granular
 * neighbourhood, time-warp and load penalties that adapt so the search crosses infeasible
 * plans, and the best feasible plan kept; the last part of the budget descends from the best
 * plan at temperature 0 (a steepest descent over the neighbourhood, then random improving moves).
 * Under the vehicles-first objective a route-minimisation phase (`RouteMinimiser`: ejection
 * pool, squeeze, ejections and perturbation, after Nagata & Bräysy 2009) first empties routes
 * for up to `ROUTE_MINIMISATION_SHARE` of the budget (less when it stalls or reaches
 * the lower bound on vehicles), and the annealing schedule runs over the
 * rest from the plan with the fewest vehicles. When no plan serves every must-serve stop within the
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
  const { cp, rng, nb, moveNb, state, active, t0, budgetMoves, seconds } = run;
  let { cooling, tEnd } = run;

  const best = new BestPlan(problem, cp);
  best.consider(state);
  const elimination = new EliminationSchedule();
  // The route-minimisation phase runs first (it repairs a first plan that breaks a rule);
  // when it finds no feasible plan, the annealer's own route elimination
  // (`EliminationSchedule`) empties routes as it goes.
  let minimiser =
    o.routeMinimisation && cp.hierarchical && active.length > 0
      ? new RouteMinimiser(
          state,
          nb,
          moveNb,
          rng,
          active,
          best,
          budgetMoves !== undefined ? ROUTE_MINIMISATION_STALL * budgetMoves : Infinity,
        )
      : undefined;
  /** Seconds budgets: the share of the budget used when the phase last saved a vehicle (or started). */
  let savedAtFraction = 0;
  let savedCount = 0;
  /** Whether the annealer empties routes itself: only when the phase did not run or found no feasible plan. */
  let annealerEliminates = minimiser === undefined;
  /**
   * After a phase that found a feasible plan, the annealing keeps its number of vehicles: moves
   * that open or empty a route are not drawn into the chain. Otherwise the adaptive time-warp
   * weight grows until opening a vehicle pays, or the vehicle weight empties routes into plans
   * that break every window, and the chain leaves the phase's fleet for good.
   */
  let fixedFleet = false;
  let feasibleAt = 0;
  /** Moves and budget share the phase used: the annealing schedule runs over the rest. */
  let phaseMoves = 0;
  let phaseFraction = 0;
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
  let kicks: KickSearch | undefined;
  let kickCount = 0;
  let kicksKept = 0;
  /** Where the annealing schedule stops governing the run: the kick phase or the quench starts. */
  let kickFrom = annealingEnds(o.kickPhase);
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
      phase: minimiser ? "routeMinimisation" : kicks ? "kicks" : polished ? "quench" : "annealing",
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

  /**
   * One slice of a phase that works in whole steps (final descent, kicks) within the moves the
   * budget has left; its evaluations count as moves of the budget.
   *
   * @returns the evaluations it used
   */
  function runSlice(phase: { run(limit: number, quota: number): number }, quota: number): number {
    const left = budgetMoves !== undefined ? budgetMoves - moves : Number.MAX_SAFE_INTEGER;
    const used = phase.run(left, quota);
    moves += used;
    movesSinceReport += used;
    evaluations += used;
    if (budgetMoves !== undefined) fraction = Math.min(1, moves / budgetMoves);
    return used;
  }

  /** End the kick phase (its numbers go to the run's statistics); random improving moves follow. */
  function endKicks(): void {
    if (!kicks) return;
    kickCount += kicks.kicks;
    kicksKept += kicks.kept;
    kicks = undefined;
  }

  /**
   * End the route-minimisation phase: back to the best plan (fewest vehicles) when a removal
   * was under way, and the cooling schedule fitted again to the moves left for the annealing.
   */
  function endPhase(): void {
    if (!minimiser) return;
    minimiser.abandon();
    routeEliminations += minimiser.attempts;
    annealerEliminates = !best.feasibleFound;
    fixedFleet = best.feasibleFound;
    minimiser = undefined;
    phaseMoves = moves;
    phaseFraction = Math.min(fraction, kickFrom);
    if (phaseMoves === 0) return;
    const left =
      budgetMoves !== undefined
        ? budgetMoves - moves
        : Math.round((run.movesPerSecond ?? 0) * Math.max(0, (seconds ?? 0) - elapsedMs / 1000));
    cooling = resolveCooling(o.cooling, { t0, tEnd, budgetMoves: Math.max(1, left) });
    if (!("tEnd" in cooling)) tEnd = temperatureAt(cooling, Math.max(1, left), 1);
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
      if (minimiser) {
        // The route-minimisation phase, in slices of whole pops; its evaluations count as moves.
        const limit = budgetMoves !== undefined ? Math.floor(ROUTE_MINIMISATION_SHARE * budgetMoves) - moves : Number.MAX_SAFE_INTEGER;
        const used = limit > 0 ? minimiser.run(limit, maxMoves - k) : 0;
        moves += used;
        movesSinceReport += used;
        evaluations += used;
        k += Math.max(0, used - 1);
        if (budgetMoves !== undefined) fraction = Math.min(1, moves / budgetMoves);
        const over = checkClock();
        if (minimiser.removed !== savedCount) {
          savedCount = minimiser.removed;
          savedAtFraction = fraction;
        }
        const stalled = budgetMoves === undefined && fraction - savedAtFraction >= ROUTE_MINIMISATION_STALL;
        if (minimiser.finished || used >= limit || fraction >= ROUTE_MINIMISATION_SHARE || stalled || over) endPhase();
        if (over) break;
        continue;
      }
      if (descent) {
        // The final descent, in slices of whole stops (the same evaluations however the run is
        // sliced).
        const used = runSlice(descent, maxMoves - k);
        k += Math.max(0, used - 1);
        if (descent.finished || used === 0) descent = undefined;
        if (checkClock()) break;
        continue;
      }
      if (kicks) {
        // The kick phase, in slices of whole stops.
        const used = runSlice(kicks, maxMoves - k);
        k += Math.max(0, used - 1);
        if (kicks.finished || used === 0) endKicks();
        if (checkClock()) break;
        continue;
      }
      moves++;
      movesSinceReport++;
      if (moves % TEMPERATURE_EVERY === 0) {
        if (budgetMoves !== undefined) fraction = moves / budgetMoves;
        const annealFraction = phaseFraction > 0 ? (fraction - phaseFraction) / (1 - phaseFraction) : fraction;
        if (!polished && fraction >= kickFrom && o.kickPhase && state.used > 1 && kickFrom < QUENCH_FROM) {
          // Kicks measured mixed on fleets with windows (Solomon): a plan of several routes
          // anneals on to the quench instead.
          kickFrom = QUENCH_FROM;
        }
        temperature = fraction >= kickFrom ? 0 : temperatureAt(cooling, moves - phaseMoves, annealFraction);
        if (!polished && fraction >= kickFrom) {
          // The quench starts from the best feasible plan, with a steepest descent on it, or
          // the kick phase with its descent from that plan.
          polished = true;
          if (best.feasibleFound) best.restore(state);
          if (kickFrom < QUENCH_FROM) kicks = new KickSearch(state, moveNb, active, rng, cp.hierarchical, () => best.consider(state));
          else descent = new FinalDescent(state, moveNb, active, () => best.consider(state));
          continue;
        }
      }
      if (proposeMove(state, moveNb, rng, mv, active) && !(fixedFleet && mv.usedDelta !== 0)) {
        evaluations++;
        const dE = mv.delta;
        let accept: boolean;
        if (metropolis && dE <= 0) accept = true;
        else if (metropolis) accept = acceptsUphill(rng.next(), dE, temperature);
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
      if (fixedFleet && moves % ADAPT_EVERY === 0) {
        // At the phase's fleet the chain can stay out of the rules for good: back to the best plan.
        if (state.isFeasible()) feasibleAt = moves;
        else if (moves - feasibleAt >= RESTART_MOVES_PER_STOP * active.length) {
          best.restore(state);
          state.setWeights(run.weights.wTime, run.weights.wLoad);
          feasibleAt = moves;
        }
      }
      if (o.adaptivePenalties && moves % ADAPT_EVERY === 0) {
        const wTime = state.wTime;
        const wLoad = state.wLoad;
        adaptPenalties(state, run.weights);
        if (state.wTime !== wTime || state.wLoad !== wLoad) penaltyUpdates++;
      }
      if (o.routeMinimisation && cp.hierarchical && annealerEliminates && elimination.due(moves, fraction, best.key1, state)) {
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

  /**
   * Continue from another plan of the same problem (a plan another chain found): its routes
   * replace the current ones, every stop it leaves out goes to the pool, and the best plan
   * takes it when it is better. Moves, temperature, penalty weights and the random generator
   * stay where they are, so the run goes on at the same point of its schedule. Not while the
   * route-minimisation phase runs (it owns the routes then): false, and nothing changes.
   */
  function adopt(plan: Plan): boolean {
    const V = state.routes.length;
    for (const r of plan.routes) {
      if (!Number.isInteger(r.vehicle) || r.vehicle < 0 || r.vehicle >= V)
        throw new RangeError(`adopt: route of vehicle ${r.vehicle} is not a vehicle of this problem (0 to ${V - 1})`);
      for (const visit of r.visits) {
        if (!(visit.stop >= 0 && visit.stop < cp.n) || state.routeOf[visit.stop] === -2)
          throw new RangeError(`adopt: stop ${visit.stop} cannot be on a route of this problem`);
      }
    }
    if (minimiser) return false;
    for (let v = 0; v < V; v++) if (state.routes[v]!.len > 0) state.emptyRoute(v);
    for (const r of plan.routes) {
      if (r.visits.length > 0)
        state.setRoute(
          r.vehicle,
          r.visits.map((visit) => visit.stop),
        );
    }
    best.consider(state);
    // The restart at the phase's fleet counts from here.
    feasibleAt = moves;
    // In the quench, the steepest descent starts again from the adopted plan.
    if (descent) descent = new FinalDescent(state, moveNb, active, () => best.consider(state));
    if (kicks) {
      endKicks();
      kicks = new KickSearch(state, moveNb, active, rng, cp.hierarchical, () => best.consider(state));
    }
    progress = makeProgress();
    return true;
  }

  return {
    step,
    adopt,
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
          kicks: kickCount + (kicks?.kicks ?? 0),
          kicksKept: kicksKept + (kicks?.kept ?? 0),
          ...(run.movesPerSecond === undefined ? {} : { measuredMovesPerSecond: run.movesPerSecond }),
        },
      };
    },
  };
}
