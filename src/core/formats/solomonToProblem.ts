import type { Problem, Stop, Vehicle } from "../model.js";
import type { SolomonInstance } from "./parseSolomon.js";

/** 60 km/h makes one distance unit one minute: Solomon's travel time equals distance. */
const UNIT_SPEED_KMH = 60;

/**
 * A Solomon VRPTW instance as a routing problem, by the benchmark's conventions
 * (Solomon 1987): the depot is customer 0 (location 0); VEHICLE NUMBER identical vehicles of
 * CAPACITY with shift [depot READY TIME, depot DUE DATE]; hard windows [READY TIME, DUE DATE]
 * for the start of service; Euclidean distance in double precision (no rounding) as both
 * distance and travel time; cost = distance; objective "hierarchical" (vehicles, then
 * distance). Stop ids are the customer numbers as text. Locations: lat = y, lon = x.
 *
 * @param inst - a parsed instance with no issues
 * @returns the problem
 * @throws RangeError when `inst` has issues
 * @example solomonToProblem(parseSolomon(c101Text)).vehicles.length // => 25
 */
export function solomonToProblem(inst: SolomonInstance): Problem {
  if (inst.issues.length > 0) throw new RangeError(`inst has ${inst.issues.length} issues; fix the file first`);
  const c = inst.customers;
  const n = c.length;
  const distanceKm = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const d = solomonDistance(c[i]!, c[j]!);
      distanceKm[i * n + j] = d;
      distanceKm[j * n + i] = d;
    }
  }
  const depot = c[0]!;
  const stops: Stop[] = c.slice(1).map((cu, k) => ({
    id: String(cu.id),
    name: String(cu.id),
    location: k + 1,
    demand: [cu.demand],
    windows: [{ earliestMin: cu.readyTime, latestMin: cu.dueDate }],
    serviceMin: cu.serviceTime,
  }));
  const vehicles: Vehicle[] = Array.from({ length: inst.vehicleCount }, (_, v) => ({
    id: String(v + 1),
    capacity: [inst.capacity],
    startLocation: 0,
    endLocation: 0,
    shiftStartMin: depot.readyTime,
    shiftEndMin: depot.dueDate,
    fixedCost: 0,
    costPerKm: 1,
    costPerHour: 0,
    speedKmh: UNIT_SPEED_KMH,
  }));
  return {
    locations: c.map((cu) => ({ lat: cu.y, lon: cu.x, name: String(cu.id) })),
    stops,
    vehicles,
    loadDimensions: ["demand"],
    matrix: { size: n, distanceKm, travelMin: distanceKm.slice(), userSupplied: true },
    referenceSpeedKmh: UNIT_SPEED_KMH,
    hardWindows: true,
    lateCostPerMin: 0,
    objective: "hierarchical",
  };
}

/**
 * Euclidean distance between two Solomon customers in double precision (no rounding, the
 * convention of the best-known tables of the hierarchical objective).
 *
 * @param a - a customer (x, y as in the file)
 * @param b - another customer
 * @returns the distance (= travel time)
 * @example solomonDistance({ x: 0, y: 0 }, { x: 3, y: 4 }) // => 5
 */
export function solomonDistance(a: { readonly x: number; readonly y: number }, b: { readonly x: number; readonly y: number }): number {
  return Math.sqrt((a.x - b.x) ** 2 + (a.y - b.y) ** 2);
}
