import { tsplibGeoDegrees } from "../geo/tsplibDistance.js";
import type { Problem, Stop } from "../model.js";
import type { TsplibInstance } from "./parseTsplib.js";
import { tsplibEdge } from "./tsplibEdge.js";

/**
 * Travel speed of the benchmark problems: 60 km/h makes one distance unit one minute, so
 * `travelMin` equals `distanceKm` as the matrix states.
 */
const UNIT_SPEED_KMH = 60;

/**
 * A TSP instance as a routing problem: one vehicle that starts and ends at node 1
 * (location 0) and must visit nodes 2..n, no windows, no loads, cost = tour length.
 * The matrix holds the TSPLIB integer distances as both km and minutes (`userSupplied`),
 * so the solver's distance of a plan is the TSPLIB tour length.
 *
 * Stop ids are the node numbers as text ("2", "3", ...), so a route maps back to the file.
 * Locations: GEO coordinates in decimal degrees; other types lat = y, lon = x as written
 * (only for display; they need not be valid degrees).
 *
 * @param inst - a parsed instance with no issues
 * @returns the problem (objective "weighted", costPerKm 1, every other cost 0)
 * @throws RangeError when `inst` has issues
 * @example tsplibToProblem(parseTsplib(burma14Text)).stops.length // => 13
 */
export function tsplibToProblem(inst: TsplibInstance): Problem {
  if (inst.issues.length > 0) throw new RangeError(`inst has ${inst.issues.length} issues; fix the file first`);
  const n = inst.dimension;
  const distanceKm = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const d = tsplibEdge(inst, i, j);
      distanceKm[i * n + j] = d;
      distanceKm[j * n + i] = d;
    }
  }
  const locations = Array.from({ length: n }, (_, i) => {
    const p = inst.nodes[i] ?? { x: 0, y: 0 };
    const name = String(i + 1);
    return inst.edgeWeightType === "GEO" ? { lat: tsplibGeoDegrees(p.x), lon: tsplibGeoDegrees(p.y), name } : { lat: p.y, lon: p.x, name };
  });
  const stops: Stop[] = [];
  for (let i = 1; i < n; i++) {
    stops.push({
      id: String(i + 1),
      name: String(i + 1),
      location: i,
      demand: [],
      windows: [{ earliestMin: 0, latestMin: Infinity }],
      serviceMin: 0,
    });
  }
  return {
    locations,
    stops,
    vehicles: [
      {
        id: "1",
        capacity: [],
        startLocation: 0,
        endLocation: 0,
        shiftStartMin: 0,
        shiftEndMin: Infinity,
        fixedCost: 0,
        costPerKm: 1,
        costPerHour: 0,
        speedKmh: UNIT_SPEED_KMH,
      },
    ],
    loadDimensions: [],
    matrix: { size: n, distanceKm, travelMin: distanceKm.slice(), userSupplied: true },
    referenceSpeedKmh: UNIT_SPEED_KMH,
    hardWindows: true,
    lateCostPerMin: 0,
    objective: "weighted",
  };
}
