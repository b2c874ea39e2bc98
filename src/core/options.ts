/**
 * The options of `solve` and of the cooling-schedule preview, with their defaults in one place.
 * Pure types and constants: the engine that reads them lives in `anneal/`.
 */

/** Acceptance rule of an uphill change dE > 0 at temperature T. */
export type AcceptanceRule =
  /** Metropolis et al. (1953): P = exp(-dE / T); dE <= 0 always accepted. */
  | "metropolis"
  /** Logistic (Barker 1965): P = 1 / (1 + exp(dE / T)), for every dE. */
  | "logistic";

/**
 * A cooling schedule. `t0` and `tEnd` are optional: when absent they come from calibration
 * (target acceptance `p0` at the start and `pEnd` at the end of the mean uphill change).
 */
export type CoolingSpec =
  /**
   * T <- alpha * T every `movesPerLevel` moves. Without `movesPerLevel` the levels are spread
   * evenly over the run (moves or seconds) so that T reaches tEnd at its end.
   */
  /** Without `alpha` but with `movesPerLevel`, alpha is fitted so that T reaches tEnd at the end of the budget. */
  | { readonly kind: "geometric"; readonly alpha?: number; readonly movesPerLevel?: number; readonly t0?: number; readonly tEnd?: number }
  /** T falls linearly from t0 to tEnd in `steps` equal steps, each held for budget/steps moves. */
  | { readonly kind: "linear"; readonly steps: number; readonly t0?: number; readonly tEnd?: number }
  /**
   * Lundy & Mees (1986): T <- T / (1 + beta * T) every move. Without `beta`, beta is fitted so that
   * T reaches tEnd at the end of the budget: 1/tEnd = 1/t0 + M beta for M moves.
   */
  | { readonly kind: "lundyMees"; readonly beta?: number; readonly t0?: number; readonly tEnd?: number }
  /** T(f) = t0 * (tEnd / t0)^f with f the fraction of the budget (moves or seconds) used. */
  | { readonly kind: "timeFraction"; readonly t0?: number; readonly tEnd?: number };

/** How long a run may go: a move budget (reproducible) or seconds (needs `now`). */
export type Budget = { readonly moves: number } | { readonly seconds: number };

/** Something with an `aborted` flag: an AbortSignal fits. */
export interface AbortFlag {
  readonly aborted: boolean;
}

/**
 * The part of a run under way: the route-minimisation phase (vehicles first), the annealing
 * (the user's cooling schedule), the kick phase at the end (`SolveOptions.kickPhase`), or the
 * quench (no worse move kept: a steepest descent from the best plan, then random improving moves).
 */
export type RunPhase = "routeMinimisation" | "annealing" | "kicks" | "quench";

/** The words the pane and the CLI show for each `RunPhase`. */
export const RUN_PHASE_LABELS: Readonly<Record<RunPhase, string>> = {
  routeMinimisation: "route minimisation",
  annealing: "annealing",
  kicks: "kick phase",
  quench: "quench",
};

/** What a run reports while it goes. */
export interface Progress {
  readonly moves: number;
  /** Fraction of the budget used, 0..1. */
  readonly fraction: number;
  readonly temperature: number;
  readonly currentCost: number;
  /** Best feasible cost so far; `Infinity` while none is feasible. */
  readonly bestCost: number;
  /** Share of the moves accepted since the previous report, 0..1. */
  readonly acceptanceRate: number;
  /**
   * Share of the worse moves (see `isWorseMove`) accepted since the previous report: the quantity
   * the acceptance targets and the preview speak of; undefined when none was drawn.
   */
  readonly worseAccepted?: number | undefined;
  readonly elapsedMs: number;
  /** The part of the run under way (absent in reports made before it was known). */
  readonly phase?: RunPhase | undefined;
}

/** Options of `solve`. */
export interface SolveOptions {
  /** Seed of the one generator every random choice draws from. */
  readonly seed: number | string;
  readonly budget: Budget;
  readonly rule: AcceptanceRule;
  readonly cooling: CoolingSpec;
  /** Target acceptance probability of the mean uphill change at the start (default 0.5). */
  readonly p0: number;
  /**
   * ... and at the end (default 0.001), as a share of the sampled uphill moves still accepted
   * (see `calibrateTemperatures`).
   */
  readonly pEnd: number;
  /** Random moves sampled for calibration (default 300). */
  readonly calibrationSamples: number;
  /** Granular neighbourhood size k (default 20). */
  readonly neighbours: number;
  /** Milliseconds clock; required for a `seconds` budget and for progress pacing. */
  readonly now?: () => number;
  /**
   * Reading of `now` at which the run's clock starts (default: `now()` when the solver is
   * created). Chains started on threads at different moments share one start, so a seconds
   * budget ends at the same moment for all of them.
   */
  readonly startedAt?: number;
  /** Called at most every `progressEveryMs` (default 100 ms; needs `now`). */
  readonly onProgress?: (progress: Progress) => void;
  readonly progressEveryMs: number;
  readonly signal?: AbortFlag;
  /**
   * Ablation switches: each part of the engine can be switched off to measure what it buys
   * (`bench/ablation.ts`). All true by default; plans with the defaults are the engine's.
   *
   * Granular neighbourhood: a move relates a stop to one of its `neighbours` closest partners
   * (Vidal et al. 2013). Off: the partner is drawn uniformly from every stop a vehicle can serve
   * (construction and route elimination keep their candidate lists).
   */
  readonly granularNeighbours: boolean;
  /**
   * O(1) move evaluation on segment summaries (Vidal et al. 2013). Off: every candidate route
   * is walked stop by stop from its depot, every arc read from the matrix, as a plain annealer
   * re-evaluates the routes a move touches.
   */
  readonly incrementalEvaluation: boolean;
  /**
   * Route elimination under the vehicles-first objective (`eliminateRoute`, after the route
   * minimisation of Nagata & Bräysy 2009). Off: no route is ever emptied on purpose; a route
   * still empties when the moves happen to take its last stop.
   */
  readonly routeMinimisation: boolean;
  /**
   * Adaptive penalty weights for time warp and excess load (`adaptPenalties`). Off: the weights
   * stay at their initial values (`initialWeights`) for the whole run.
   */
  readonly adaptivePenalties: boolean;
  /**
   * The kick phase at the end of the run (`KickSearch`: an iterated local search from the best
   * plan, double-bridge kicks and a descent around them). Off: the run ends with the quench
   * instead (a steepest descent from the best plan, then random improving moves).
   */
  readonly kickPhase: boolean;
}

/** The geometric factor when neither it nor moves per level is given: 0.94 is a usual choice (common practice). */
export const GEOMETRIC_ALPHA = 0.94;

/** Defaults of `SolveOptions`. Values are common practice unless a source is named. */
export const SOLVE_DEFAULTS: Omit<SolveOptions, "now" | "onProgress" | "signal" | "startedAt"> = {
  seed: 1,
  budget: { moves: 2_000_000 },
  rule: "metropolis",
  cooling: { kind: "timeFraction" },
  p0: 0.5,
  pEnd: 0.001,
  calibrationSamples: 300,
  neighbours: 20,
  progressEveryMs: 100,
  granularNeighbours: true,
  incrementalEvaluation: true,
  routeMinimisation: true,
  adaptivePenalties: true,
  kickPhase: true,
};
