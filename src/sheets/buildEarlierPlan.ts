import type { EarlierPlan, Issue, Problem } from "../core/index.js";
import type { PlanRouteCells } from "./readPlanRoutes.js";

/** Options of `buildEarlierPlan`. */
export interface BuildEarlierPlanOptions {
  /** Cost per stop moved to another vehicle (the Stability cost setting). */
  readonly stabilityCost: number;
  /** Vehicle ids whose earlier route is kept exactly. */
  readonly lock: readonly string[];
  /** Where the lock list came from, for messages ("--lock", "Locked routes"). */
  readonly lockSource: string;
}

/**
 * Turn the routes read from an earlier plan sheet into the core's `EarlierPlan` for today's
 * stops and fleet: stops no longer in Stops (cancelled) are dropped and listed in a warning;
 * a vehicle no longer in the Fleet is an error at its cell (its stops would otherwise move
 * without the user knowing), as is a locked vehicle the Fleet does not have.
 *
 * @param problem - today's problem (read from Stops and Fleet)
 * @param sheet - the earlier plan sheet's name
 * @param routes - its routes (`readPlanRoutes`)
 * @param options - stability cost and locked vehicles
 * @returns the earlier plan, warnings (cancelled stops) and errors (each with sheet and cell)
 * @example buildEarlierPlan(problem, "Monday", routes, { stabilityCost: 20, lock: [], lockSource: "--lock" }).earlier.routes
 */
export function buildEarlierPlan(
  problem: Problem,
  sheet: string,
  routes: readonly PlanRouteCells[],
  options: BuildEarlierPlanOptions,
): { earlier?: EarlierPlan; warnings: Issue[]; issues: Issue[] } {
  const issues: Issue[] = [];
  const warnings: Issue[] = [];
  const vehicleIndex = new Map(problem.vehicles.map((v, k) => [v.id, k]));
  const stopIndex = new Map(problem.stops.map((s, i) => [s.id, i]));
  const earlier: number[][] = problem.vehicles.map(() => []);
  const cancelled: string[] = [];
  for (const route of routes) {
    const v = vehicleIndex.get(route.vehicle);
    if (v === undefined) {
      issues.push({
        sheet,
        cell: route.cell,
        message: `vehicle "${route.vehicle}" of the earlier plan is no longer in the Fleet; add it back to the Fleet, or re-plan from scratch (its ${route.stops.length} stops cannot keep their vehicle).`,
      });
      continue;
    }
    for (const s of route.stops) {
      const i = stopIndex.get(s.id);
      if (i === undefined) cancelled.push(s.id);
      else earlier[v]!.push(i);
    }
  }
  if (cancelled.length > 0) {
    warnings.push({
      sheet,
      cell: "",
      message: `${cancelled.length} stop${cancelled.length === 1 ? " is" : "s are"} in the earlier plan but no longer in Stops, so taken out of the routes (cancelled): ${listIds(cancelled)}.`,
    });
  }
  const locked: number[] = [];
  for (const id of options.lock) {
    const v = vehicleIndex.get(id);
    if (v === undefined)
      issues.push({
        sheet: options.lockSource,
        cell: "",
        message: `locked vehicle "${id}" is not in the Fleet; give a vehicle id as the Fleet and the plan sheet show it (such as ${problem.vehicles[0]?.id ?? "Van 1"}).`,
      });
    else if (!locked.includes(v)) locked.push(v);
  }
  if (issues.length > 0) return { warnings, issues };
  return { earlier: { routes: earlier, stabilityCost: options.stabilityCost, locked }, warnings, issues };
}

function listIds(ids: readonly string[]): string {
  return ids.length > 20 ? `${ids.slice(0, 20).join(", ")}, and ${ids.length - 20} more` : ids.join(", ");
}
