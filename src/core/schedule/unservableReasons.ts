/** Which stops no vehicle can serve, and why: the checks `compileProblem` makes before the search. */
import type { Problem } from "../model.js";

/** Can vehicle k reach stop i inside one of its windows and be back by the shift end (direct trip)? */
export function reachable(problem: Problem, i: number, k: number, factor: number): boolean {
  const s = problem.stops[i]!;
  const v = problem.vehicles[k]!;
  const L = problem.matrix.size;
  const arrive = v.shiftStartMin + problem.matrix.travelMin[v.startLocation * L + s.location]! * factor;
  for (const w of s.windows) {
    if (arrive > w.latestMin) continue;
    const back = Math.max(arrive, w.earliestMin) + s.serviceMin + problem.matrix.travelMin[s.location * L + v.endLocation]! * factor;
    if (back <= v.shiftEndMin + 1e-9) return true;
  }
  return false;
}

/** Why no vehicle can serve stop i, in words for the unassigned list. */
export function reasonFor(problem: Problem, i: number, featureOk: number, capOk: number): string {
  const s = problem.stops[i]!;
  if (featureOk === 0) {
    return `needs ${(s.requiredFeatures ?? []).join(", ")}, which no vehicle has`;
  }
  if (capOk === 0) {
    const dims = problem.loadDimensions;
    for (let d = 0; d < dims.length; d++) {
      const largest = Math.max(...problem.vehicles.map((v) => v.capacity[d] ?? 0));
      const q = s.demand[d] ?? 0;
      if (q > largest) return `demand ${q} ${dims[d]} is more than the largest capacity, ${largest} ${dims[d]}`;
      const p = s.pickup?.[d] ?? 0;
      if (p > largest) return `pickup ${p} ${dims[d]} is more than the largest capacity, ${largest} ${dims[d]}`;
    }
    return "no vehicle may take another stop (max stops)";
  }
  return "its time window cannot be reached within any vehicle's shift (even as the only stop)";
}
