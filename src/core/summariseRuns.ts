import { comparePlans } from "./comparePlans.js";
import type { Plan, Problem } from "./model.js";

/** One finished run of a temperature plan: its seed and the plan it returned. */
export interface SeededRun {
  readonly seed: number | string;
  readonly plan: Plan;
}

/** The figures of several runs of one temperature plan with different seeds. */
export interface RunsSummary {
  /** The seeds, in the order the runs were given. */
  readonly seeds: readonly (number | string)[];
  /** Each run's plan cost (`plan.totals.cost`), in seed order. */
  readonly costs: readonly number[];
  /** Each run's vehicles used, in seed order. */
  readonly vehicles: readonly number[];
  /** Whether each run's plan is feasible, in seed order. */
  readonly feasibleBySeed: readonly boolean[];
  /** How many runs returned a feasible plan. */
  readonly feasible: number;
  /** Cost of the middle run by the solver's own order (mean of the two middle ones for an even count). */
  readonly median: number;
  /** Cost of the run that ranks first by the solver's own order (a feasible plan before any infeasible one). */
  readonly best: number;
  /** Cost of the run that ranks last. */
  readonly worst: number;
  readonly bestSeed: number | string;
  readonly worstSeed: number | string;
}

/**
 * Summarise the runs of one temperature plan: the median, best and worst cost, vehicles and how
 * many runs were feasible. Runs are ranked by `comparePlans` (the order a run ranks its own plans:
 * a plan that keeps every rule before one that does not, then fewer must-serve stops left out,
 * then cost), so a cheap plan that leaves stops out or breaks a rule never counts as the best,
 * and the median is the cost of the middle run in that order. With every run feasible this is
 * the usual median of the costs.
 *
 * @param problem - the problem every run answered
 * @param runs - at least one run
 * @returns the summary
 * @throws RangeError when `runs` is empty
 * @example summariseRuns(problem, [{ seed: 1, plan: a }, { seed: 2, plan: b }, { seed: 3, plan: c }]).median
 * // => the cost of the middle one of a, b and c
 */
export function summariseRuns(problem: Problem, runs: readonly SeededRun[]): RunsSummary {
  if (runs.length === 0) throw new RangeError("summariseRuns: runs must hold at least one run");
  // A stable sort keeps seed order among plans that rank equal.
  const ranked = runs.map((r, i) => ({ ...r, i })).sort((a, b) => comparePlans(problem, a.plan, b.plan) || a.i - b.i);
  const n = ranked.length;
  const mid = (n - 1) / 2;
  const median = (ranked[Math.floor(mid)]!.plan.totals.cost + ranked[Math.ceil(mid)]!.plan.totals.cost) / 2;
  const first = ranked[0]!;
  const last = ranked[n - 1]!;
  return {
    seeds: runs.map((r) => r.seed),
    costs: runs.map((r) => r.plan.totals.cost),
    vehicles: runs.map((r) => r.plan.totals.vehiclesUsed),
    feasibleBySeed: runs.map((r) => r.plan.feasible),
    feasible: runs.filter((r) => r.plan.feasible).length,
    median,
    best: first.plan.totals.cost,
    worst: last.plan.totals.cost,
    bestSeed: first.seed,
    worstSeed: last.seed,
  };
}
