import type { Plan, Problem } from "../../src/core/model.js";

/**
 * An independent checker written for the tests (not the code under test): recomputes every
 * route's load and timing from the problem alone (service starts at arrival or at the opening
 * of the first window still open; a route leaves at its shift start, and leaving later never
 * makes a hard window reachable that leaving earlier misses) and lists every broken hard rule
 * and every stop not exactly once in the routes or the unassigned list.
 */
export function checkPlan(problem: Problem, plan: Plan): string[] {
  const broken: string[] = [];
  const seen = new Array<number>(problem.stops.length).fill(0);
  for (const u of plan.unassigned) seen[u.stop]!++;
  const L = problem.matrix.size;
  for (const route of plan.routes) {
    const veh = problem.vehicles[route.vehicle]!;
    const stops = route.visits.map((v) => v.stop);
    for (const s of stops) seen[s]!++;
    if (veh.maxStops !== undefined && stops.length > veh.maxStops) broken.push(`${veh.id}: more than ${veh.maxStops} stops`);
    problem.loadDimensions.forEach((dim, d) => {
      const load = stops.reduce((a, s) => a + (problem.stops[s]!.demand[d] ?? 0), 0);
      if (load > (veh.capacity[d] ?? 0) + 1e-9) broken.push(`${veh.id}: ${load} ${dim} over capacity ${veh.capacity[d]}`);
    });
    if (stops.length === 0) continue;
    const factor = problem.matrix.userSupplied ? 1 : problem.referenceSpeedKmh / veh.speedKmh;
    let t = veh.shiftStartMin;
    let at = veh.startLocation;
    for (const s of stops) {
      const stop = problem.stops[s]!;
      if (!(stop.requiredFeatures ?? []).every((f) => (veh.features ?? []).includes(f)))
        broken.push(`${veh.id} lacks a feature of ${stop.id}`);
      const arrive = t + problem.matrix.travelMin[at * L + stop.location]! * factor;
      const w = stop.windows.find((x) => x.latestMin >= arrive - 1e-9);
      if (!w && problem.hardWindows) broken.push(`${veh.id}: late at ${stop.id}`);
      t = (w ? Math.max(arrive, w.earliestMin) : arrive) + stop.serviceMin;
      at = stop.location;
    }
    const back = t + problem.matrix.travelMin[at * L + veh.endLocation]! * factor;
    if (back > veh.shiftEndMin + 1e-6) broken.push(`${veh.id}: back at ${back}, after the shift end ${veh.shiftEndMin}`);
  }
  seen.forEach((c, s) => {
    if (c !== 1) broken.push(`stop ${problem.stops[s]!.id} appears ${c} times`);
  });
  return broken;
}
