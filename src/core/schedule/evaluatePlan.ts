import type { Plan, Problem, Route, Unassigned, Vehicle, Visit } from "../model.js";
import { scheduleRoute } from "./timeRoute.js";

/**
 * Evaluate routes from scratch: exact timing with every window of every stop, loads,
 * distances, costs, totals and each broken rule in words. Independent of the search's
 * summaries, so it serves as their check and as the source of every reported number.
 *
 * Timing (time-warp convention of Vidal et al. 2013): service starts at the arrival or at
 * the opening of the first window still open, with waiting allowed; an arrival after the
 * last window closes is late by that much and service is booked at the close (time warp),
 * and lateness at the end depot is overtime. The vehicle departs at the shift start
 * delayed by the waiting it can absorb without being later anywhere, so waiting before
 * the first stop is not paid. Duty = return - departure; cost = fixed (when used) +
 * km x costPerKm + duty hours x costPerHour (+ late minutes x lateCostPerMin under soft windows).
 * Breaks are placed by `scheduleRoute` and count in duty. Load leaves the depot as the sum of
 * the route's deliveries, falls by each delivery and rises by each pickup; capacity must hold
 * at every point. Working-time limits (driving, duty, km), break rules and pins are hard rules.
 *
 * @param problem - the problem the routes belong to
 * @param routes - `routes[v]` = stop indices of vehicle v in visiting order (one entry per vehicle)
 * @param unassigned - stops left out, with reasons; stops missing from both get "not in any route"
 * @returns the plan; `violations` lists the broken rules of the routes, and a plan that leaves a
 *   must-serve stop out is not `feasible` (its count is `totals.mustServeUnassigned`)
 * @throws RangeError when `routes` does not have one entry per vehicle or a stop index is out of range or repeated
 * @example evaluatePlan(problem, [[0, 2], [1]]).totals.distanceKm // => total km of both routes
 */
export function evaluatePlan(problem: Problem, routes: readonly (readonly number[])[], unassigned: readonly Unassigned[] = []): Plan {
  const n = problem.stops.length;
  if (routes.length !== problem.vehicles.length) {
    throw new RangeError(`routes must have ${problem.vehicles.length} entries (one per vehicle), got ${routes.length}`);
  }
  const seen = new Uint8Array(n);
  for (const r of routes) {
    for (const s of r) {
      if (!(Number.isInteger(s) && s >= 0 && s < n)) throw new RangeError(`routes holds stop index ${s}, outside 0..${n - 1}`);
      if (seen[s]) throw new RangeError(`routes holds stop index ${s} twice`);
      seen[s] = 1;
    }
  }
  const violations: string[] = [];
  const planRoutes = routes.map((r, v) => evaluateRoute(problem, v, r, violations));
  const left: Unassigned[] = [];
  for (const u of unassigned) {
    if (!seen[u.stop]) {
      seen[u.stop] = 1;
      left.push(u);
    }
  }
  for (let s = 0; s < n; s++) if (!seen[s]) left.push({ stop: s, reason: "not in any route" });
  let unservedCost = 0;
  let mustServeUnassigned = 0;
  for (const u of left) {
    const stop = problem.stops[u.stop]!;
    if (stop.unservedCost === undefined) mustServeUnassigned++;
    else unservedCost += stop.unservedCost;
  }
  const sum = (f: (r: Route) => number): number => planRoutes.reduce((a, r) => a + f(r), 0);
  return {
    routes: planRoutes,
    unassigned: left,
    totals: {
      vehiclesUsed: planRoutes.filter((r) => r.visits.length > 0).length,
      distanceKm: sum((r) => r.distanceKm),
      drivingMin: sum((r) => r.drivingMin),
      dutyMin: sum((r) => r.dutyMin),
      waitMin: sum((r) => r.waitMin),
      lateMin: sum((r) => r.lateMin),
      cost: sum((r) => r.cost) + unservedCost,
      unassigned: left.length,
      mustServeUnassigned,
      ...(problem.earlier ? { vehicleChanges: countVehicleChanges(problem.earlier.routes, routes) } : {}),
    },
    feasible: violations.length === 0 && mustServeUnassigned === 0,
    violations,
  };
}

/**
 * Evaluate one vehicle's route from scratch, as `evaluatePlan` does for each route.
 *
 * @param problem - the problem
 * @param v - index of the vehicle
 * @param stops - its stop indices in visiting order
 * @param violations - receives each broken rule of the route in words
 * @returns the route with its timing, load and cost
 * @example evaluateRoute(problem, 0, [2, 5], []).distanceKm
 */
export function evaluateRoute(problem: Problem, v: number, stops: readonly number[], violations: string[]): Route {
  const veh = problem.vehicles[v]!;
  const m = problem.matrix;
  const L = m.size;
  const dims = problem.loadDimensions.length;
  const load = new Array<number>(dims).fill(0);
  for (const s of stops) for (let d = 0; d < dims; d++) load[d] = load[d]! + (problem.stops[s]!.demand[d] ?? 0);
  if (stops.length === 0) {
    const t = veh.shiftStartMin;
    return {
      vehicle: v,
      visits: [],
      departureMin: t,
      returnMin: t,
      load,
      maxLoad: load,
      breaks: [],
      breakViolationMin: 0,
      distanceKm: 0,
      drivingMin: 0,
      dutyMin: 0,
      waitMin: 0,
      lateMin: 0,
      overtimeMin: 0,
      excessLoad: 0,
      cost: 0,
    };
  }
  const sim = scheduleRoute(problem, v, stops, stops.length, true);
  const visits: Visit[] = [];
  let onBoard = load.slice();
  const maxLoad = load.slice();
  let totalKm = 0;
  let prev = veh.startLocation;
  for (let k = 0; k < stops.length; k++) {
    const s = problem.stops[stops[k]!]!;
    const legKm = m.distanceKm[prev * L + s.location]!;
    totalKm += legKm;
    onBoard = onBoard.map((q, d) => q - (s.demand[d] ?? 0) + (s.pickup?.[d] ?? 0));
    for (let d = 0; d < dims; d++) maxLoad[d] = Math.max(maxLoad[d]!, onBoard[d]!);
    const t = sim.times[k]!;
    visits.push({ stop: stops[k]!, ...t, loadAfter: onBoard, legKm, totalKm });
    if (t.lateMin > 1e-9 && problem.hardWindows) {
      violations.push(`${veh.id}: arrives ${round(t.lateMin)} min late at stop ${s.id}`);
    }
    const missing = (s.requiredFeatures ?? []).filter((f) => !(veh.features ?? []).includes(f));
    if (missing.length > 0) violations.push(`${veh.id} lacks ${missing.join(", ")} needed at stop ${s.id}`);
    if (s.allowedVehicles !== undefined && !s.allowedVehicles.includes(veh.id)) {
      violations.push(`${veh.id} serves stop ${s.id}, which is pinned to ${s.allowedVehicles.join(" or ")}`);
    }
    if (s.excludedVehicles?.includes(veh.id)) violations.push(`${veh.id} serves stop ${s.id}, which excludes it`);
    prev = s.location;
  }
  let excessLoad = 0;
  for (let d = 0; d < dims; d++) {
    const over = maxLoad[d]! - (veh.capacity[d] ?? 0);
    if (over > 1e-9) {
      excessLoad += over;
      violations.push(`${veh.id}: ${round(over)} ${problem.loadDimensions[d]} over capacity`);
    }
  }
  const distanceKm = totalKm + m.distanceKm[prev * L + veh.endLocation]!;
  if (sim.overtimeMin > 1e-9) violations.push(`${veh.id}: back ${round(sim.overtimeMin)} min after the shift end`);
  if (veh.maxStops !== undefined && stops.length > veh.maxStops) {
    violations.push(`${veh.id}: ${stops.length} stops, more than its maximum of ${veh.maxStops}`);
  }
  const lateMin = sim.lateMin;
  const dutyMin = sim.returnMin - sim.departureMin;
  violations.push(...limitViolations(veh, sim.drivingMin, dutyMin, distanceKm, sim.breakViolationMin));
  const cost =
    veh.fixedCost +
    veh.costPerKm * distanceKm +
    (veh.costPerHour * dutyMin) / 60 +
    (problem.hardWindows ? 0 : problem.lateCostPerMin * lateMin);
  return {
    vehicle: v,
    visits,
    departureMin: sim.departureMin,
    returnMin: sim.returnMin,
    load,
    maxLoad,
    breaks: sim.breaks,
    breakViolationMin: sim.breakViolationMin,
    distanceKm,
    drivingMin: sim.drivingMin,
    dutyMin,
    waitMin: sim.waitMin,
    lateMin,
    overtimeMin: sim.overtimeMin,
    excessLoad,
    cost,
  };
}

/** Working-time limits and break rules broken by one route, in words. */
function limitViolations(veh: Vehicle, drivingMin: number, dutyMin: number, km: number, breakMin: number): string[] {
  const out: string[] = [];
  if (veh.maxDrivingMin !== undefined && drivingMin > veh.maxDrivingMin + 1e-9) {
    out.push(`${veh.id}: ${round(drivingMin - veh.maxDrivingMin)} min of driving over its maximum of ${round(veh.maxDrivingMin)} min`);
  }
  if (veh.maxDutyMin !== undefined && dutyMin > veh.maxDutyMin + 1e-9) {
    out.push(`${veh.id}: ${round(dutyMin - veh.maxDutyMin)} min of duty over its maximum of ${round(veh.maxDutyMin)} min`);
  }
  if (veh.maxKm !== undefined && km > veh.maxKm + 1e-9) {
    out.push(`${veh.id}: ${round(km - veh.maxKm)} km over its maximum of ${round(veh.maxKm)} km`);
  }
  if (breakMin > 1e-9) out.push(`${veh.id}: break rule broken by ${round(breakMin)} min (driving past the limit or a break window missed)`);
  return out;
}

function round(x: number): number {
  return Math.round(x * 100) / 100;
}

/** Stops that an earlier route held and another vehicle's route now holds. */
function countVehicleChanges(earlier: readonly (readonly number[])[], routes: readonly (readonly number[])[]): number {
  const home = new Map<number, number>();
  earlier.forEach((r, v) => r.forEach((s) => home.set(s, v)));
  let changed = 0;
  routes.forEach((r, v) => {
    for (const s of r) {
      const h = home.get(s);
      if (h !== undefined && h !== v) changed++;
    }
  });
  return changed;
}
