import type { Issue, Problem } from "./model.js";

/**
 * Every defect of a problem as data, never thrown: demand and capacity sizes against the
 * load dimensions, window order, negative or non-finite values, location indices in range,
 * matrix size, shift order, duplicate ids. `sheet` is a model path ("stops[3]"), `cell` the field.
 *
 * @param problem - the problem to check
 * @returns the issues; empty when the problem can be solved
 * @example validateProblem(problem) // => [] or [{ sheet: "stops[3]", cell: "windows", message: "..." }]
 */
export function validateProblem(problem: Problem): Issue[] {
  const issues: Issue[] = [];
  const add = (sheet: string, cell: string, message: string): void => {
    issues.push({ sheet, cell, message });
  };
  const L = problem.locations.length;
  const dims = problem.loadDimensions.length;
  const m = problem.matrix;
  if (m.size !== L) add("matrix", "size", `matrix size ${m.size} differs from ${L} locations; build the matrix from the same locations`);
  if (m.distanceKm.length !== m.size * m.size || m.travelMin.length !== m.size * m.size) {
    add("matrix", "", `matrix arrays must hold ${m.size} x ${m.size} = ${m.size * m.size} numbers`);
  } else {
    let bad = 0;
    for (let i = 0; i < m.distanceKm.length; i++) {
      if (!(m.distanceKm[i]! >= 0) || !(m.travelMin[i]! >= 0) || !Number.isFinite(m.travelMin[i]!)) bad++;
    }
    if (bad > 0) add("matrix", "", `${bad} distance or time entries are negative or not numbers; use 0 or more`);
  }
  if (!(problem.referenceSpeedKmh > 0)) add("problem", "referenceSpeedKmh", `reference speed ${problem.referenceSpeedKmh} must be above 0`);
  if (!(problem.lateCostPerMin >= 0)) add("problem", "lateCostPerMin", `late cost ${problem.lateCostPerMin} must be 0 or more`);
  if (problem.vehicles.length === 0) add("vehicles", "", "there is no vehicle; add at least one to the fleet");
  const inRange = (x: number): boolean => Number.isInteger(x) && x >= 0 && x < L;
  const ids = new Set<string>();
  problem.stops.forEach((s, i) => {
    const at = `stops[${i}]`;
    if (ids.has(s.id)) add(at, "id", `stop id "${s.id}" is used twice; give every stop its own id`);
    ids.add(s.id);
    if (!inRange(s.location)) add(at, "location", `location ${s.location} is outside 0..${L - 1}`);
    if (s.demand.length !== dims)
      add(
        at,
        "demand",
        `stop ${s.id} has ${s.demand.length} demand values for ${dims} load dimensions (${problem.loadDimensions.join(", ")})`,
      );
    s.demand.forEach((q) => {
      if (!(q >= 0) || !Number.isFinite(q)) add(at, "demand", `stop ${s.id}: demand ${q} must be a number, 0 or more`);
    });
    if (s.pickup !== undefined) {
      if (s.pickup.length !== dims) add(at, "pickup", `stop ${s.id} has ${s.pickup.length} pickup values for ${dims} load dimensions`);
      s.pickup.forEach((q) => {
        if (!(q >= 0) || !Number.isFinite(q)) add(at, "pickup", `stop ${s.id}: pickup ${q} must be a number, 0 or more`);
      });
    }
    for (const [field, list] of [
      ["allowedVehicles", s.allowedVehicles],
      ["excludedVehicles", s.excludedVehicles],
    ] as const) {
      for (const id of list ?? []) {
        if (!problem.vehicles.some((v) => v.id === id)) add(at, field, `stop ${s.id} names vehicle "${id}", which the fleet does not have`);
      }
    }
    if (s.windows.length === 0) add(at, "windows", `stop ${s.id} has no time window; use [0, Infinity] for "any time"`);
    let prevLatest = -Infinity;
    for (const w of s.windows) {
      if (!(w.latestMin >= w.earliestMin)) {
        add(at, "windows", `stop ${s.id}: window ${w.earliestMin}..${w.latestMin} ends before it starts; swap or correct them`);
      }
      if (!(w.earliestMin > prevLatest) && prevLatest !== -Infinity) {
        add(at, "windows", `stop ${s.id}: windows overlap or are not in time order; sort them and merge overlaps`);
      }
      if (Number.isNaN(w.earliestMin) || Number.isNaN(w.latestMin)) add(at, "windows", `stop ${s.id}: a window bound is not a number`);
      prevLatest = w.latestMin;
    }
    if (!(s.serviceMin >= 0) || !Number.isFinite(s.serviceMin))
      add(at, "serviceMin", `stop ${s.id}: service ${s.serviceMin} min must be 0 or more`);
    if (s.unservedCost !== undefined && !(s.unservedCost >= 0))
      add(at, "unservedCost", `stop ${s.id}: unserved cost ${s.unservedCost} must be 0 or more`);
  });
  const vids = new Set<string>();
  problem.vehicles.forEach((v, k) => {
    const at = `vehicles[${k}]`;
    if (vids.has(v.id)) add(at, "id", `vehicle id "${v.id}" is used twice; give every vehicle its own id`);
    vids.add(v.id);
    if (v.capacity.length !== dims) add(at, "capacity", `vehicle ${v.id} has ${v.capacity.length} capacities for ${dims} load dimensions`);
    if (v.capacity.some((c) => !(c >= 0))) add(at, "capacity", `vehicle ${v.id}: capacities must be 0 or more`);
    if (!inRange(v.startLocation)) add(at, "startLocation", `start location ${v.startLocation} is outside 0..${L - 1}`);
    if (!inRange(v.endLocation)) add(at, "endLocation", `end location ${v.endLocation} is outside 0..${L - 1}`);
    if (!(v.shiftEndMin > v.shiftStartMin))
      add(at, "shiftEndMin", `vehicle ${v.id}: shift end ${v.shiftEndMin} must be after shift start ${v.shiftStartMin}`);
    if (!Number.isFinite(v.shiftStartMin)) add(at, "shiftStartMin", `vehicle ${v.id}: shift start must be a number of minutes`);
    for (const [name, x] of [
      ["fixedCost", v.fixedCost],
      ["costPerKm", v.costPerKm],
      ["costPerHour", v.costPerHour],
    ] as const) {
      if (!(x >= 0) || !Number.isFinite(x)) add(at, name, `vehicle ${v.id}: ${name} ${x} must be 0 or more`);
    }
    if (!(v.speedKmh > 0) || !Number.isFinite(v.speedKmh)) add(at, "speedKmh", `vehicle ${v.id}: speed ${v.speedKmh} km/h must be above 0`);
    for (const [name, x] of [
      ["maxDrivingMin", v.maxDrivingMin],
      ["maxDutyMin", v.maxDutyMin],
      ["maxKm", v.maxKm],
      ["drivingBreak.driveMin", v.drivingBreak?.driveMin],
      ["drivingBreak.breakMin", v.drivingBreak?.breakMin],
      ["windowBreak.breakMin", v.windowBreak?.breakMin],
    ] as const) {
      if (x !== undefined && !(x >= 0)) add(at, name, `vehicle ${v.id}: ${name} ${x} must be 0 or more`);
    }
    if (v.drivingBreak !== undefined && !(v.drivingBreak.driveMin > 0))
      add(at, "drivingBreak.driveMin", `vehicle ${v.id}: driving before a break must be above 0 minutes`);
    const wb = v.windowBreak;
    if (wb !== undefined && !(wb.latestMin - wb.earliestMin >= wb.breakMin))
      add(
        at,
        "windowBreak",
        `vehicle ${v.id}: the break window ${wb.earliestMin}..${wb.latestMin} is shorter than the break (${wb.breakMin} min)`,
      );
    if (v.maxStops !== undefined && !(Number.isInteger(v.maxStops) && v.maxStops >= 0))
      add(at, "maxStops", `vehicle ${v.id}: max stops ${v.maxStops} must be a whole number, 0 or more`);
  });
  if (problem.earlier) checkEarlier(problem, add);
  return issues;
}

/** The earlier plan of a re-plan: one route per vehicle, stops in range and at most once, a cost of 0 or more. */
function checkEarlier(problem: Problem, add: (sheet: string, cell: string, message: string) => void): void {
  const e = problem.earlier!;
  const n = problem.stops.length;
  const V = problem.vehicles.length;
  if (e.routes.length !== V)
    add("earlier", "routes", `the earlier plan has ${e.routes.length} routes for ${V} vehicles; give one per vehicle`);
  if (!(e.stabilityCost >= 0) || !Number.isFinite(e.stabilityCost))
    add("earlier", "stabilityCost", `stability cost ${e.stabilityCost} must be a number, 0 or more`);
  const seen = new Uint8Array(n);
  e.routes.forEach((r, v) =>
    r.forEach((s, k) => {
      if (!(Number.isInteger(s) && s >= 0 && s < n)) add("earlier", `routes[${v}][${k}]`, `stop index ${s} is outside 0..${n - 1}`);
      else if (seen[s]) add("earlier", `routes[${v}][${k}]`, `stop ${problem.stops[s]!.id} is in the earlier plan twice`);
      else seen[s] = 1;
    }),
  );
  for (const v of e.locked)
    if (!(Number.isInteger(v) && v >= 0 && v < V)) add("earlier", "locked", `locked vehicle index ${v} is outside 0..${V - 1}`);
}
