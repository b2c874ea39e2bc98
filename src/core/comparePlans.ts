import type { Plan, Problem } from "./model.js";

/**
 * The order in which a run ranks its plans, applied to finished plans: a plan that breaks no
 * rule before one that does; then fewer must-serve stops left out; then, under the hierarchical
 * objective, fewer vehicles; then lower cost (route costs plus unserved costs). Used to pick
 * the best of several independent chains.
 *
 * @param problem - the problem both plans answer (its objective decides whether vehicles count first)
 * @param a - a plan
 * @param b - another plan of the same problem
 * @returns negative when `a` is better, positive when `b` is, 0 when they rank equal
 * @example comparePlans(problem, chain0.plan, chain1.plan) < 0 // => chain 0 is better
 */
export function comparePlans(problem: Problem, a: Plan, b: Plan): number {
  const broken = (p: Plan): number => (p.violations.length > 0 ? 1 : 0);
  if (broken(a) !== broken(b)) return broken(a) - broken(b);
  if (a.totals.mustServeUnassigned !== b.totals.mustServeUnassigned) return a.totals.mustServeUnassigned - b.totals.mustServeUnassigned;
  if (problem.objective === "hierarchical" && a.totals.vehiclesUsed !== b.totals.vehiclesUsed) {
    return a.totals.vehiclesUsed - b.totals.vehiclesUsed;
  }
  const d = a.totals.cost - b.totals.cost;
  return Math.abs(d) <= 1e-9 ? 0 : d;
}
