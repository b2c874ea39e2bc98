import type { ResolvedCooling } from "../anneal/resolveCooling.js";
import type { Plan } from "../model.js";
import type { Progress } from "../options.js";

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
  /** The schedule as run, with every fitted number (beta, alpha, levels) fixed. */
  cooling: ResolvedCooling;
  /**
   * What the switchable parts did (see the ablation switches of `SolveOptions`): candidate
   * routes evaluated stop by stop instead of on segment summaries, routes emptied on purpose
   * (removals started by the route-minimisation phase, or the annealer's route eliminations
   * when the phase found no feasible plan), and updates of the adaptive penalties that changed
   * a weight.
   */
  fullRouteEvaluations: number;
  routeEliminations: number;
  penaltyUpdates: number;
  /** Kicks of the kick phase (`SolveOptions.kickPhase`) and how many of them were kept. */
  kicks: number;
  kicksKept: number;
  /** Moves per second measured before a seconds run (see `measureMoveRate`); absent for a move budget. */
  measuredMovesPerSecond?: number;
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
  /**
   * Continue from `plan` (a plan of the same problem, e.g. another chain's best) at the same
   * point of the schedule: the moves, temperature, penalty weights and random generator are
   * kept; the best plan takes `plan` when it is better.
   *
   * @returns true when adopted; false while the route-minimisation phase runs (nothing changes)
   * @throws RangeError when a route names a vehicle or stop the problem does not have
   */
  adopt(plan: Plan): boolean;
  readonly progress: Progress;
  /** The best plan so far (exactly re-evaluated), with the run's numbers. */
  result(): SolveResult;
}
