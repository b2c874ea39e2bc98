import { createRandom } from "../src/core/anneal/createRandom.js";
import { buildMatrix } from "../src/core/geo/buildMatrix.js";
import type { Problem, Stop, Vehicle } from "../src/core/model.js";

/**
 * The invented day of `bench/moveEvaluations.ts` (demo data, not a reference): `n` stops
 * scattered around two depots, each with a window, two load dimensions, a vehicle per 12 stops
 * at two speeds. The same day for every bench that measures the move loop.
 *
 * @param n - number of stops
 * @returns the problem
 * @example moveEvaluationsDay(100).vehicles.length // => 9
 */
export function moveEvaluationsDay(n: number): Problem {
  const rng = createRandom(`bench-${n}`);
  const locations = [
    { lat: 53.96, lon: -1.08 },
    { lat: 53.99, lon: -1.0 },
  ];
  for (let i = 0; i < n; i++) locations.push({ lat: 53.96 + (rng.next() - 0.5) * 0.5, lon: -1.08 + (rng.next() - 0.5) * 0.8 });
  const stops: Stop[] = Array.from({ length: n }, (_, i) => {
    const e = 480 + rng.int(420);
    return {
      id: `S${i}`,
      name: `S${i}`,
      location: i + 2,
      demand: [1 + rng.int(20), rng.int(3)],
      windows: [{ earliestMin: e, latestMin: e + 60 + rng.int(180) }],
      serviceMin: 5 + rng.int(10),
    };
  });
  const vehicleCount = Math.max(2, Math.ceil(n / 12));
  const vehicles: Vehicle[] = Array.from({ length: vehicleCount }, (_, k) => ({
    id: `V${k}`,
    capacity: [150, 20],
    startLocation: k % 2,
    endLocation: k % 2,
    shiftStartMin: 420,
    shiftEndMin: 1140,
    fixedCost: 50,
    costPerKm: 0.8,
    costPerHour: 20,
    speedKmh: k % 3 === 0 ? 35 : 45,
  }));
  return {
    locations,
    stops,
    vehicles,
    loadDimensions: ["kg", "crates"],
    matrix: buildMatrix(locations),
    referenceSpeedKmh: 40,
    hardWindows: true,
    lateCostPerMin: 0,
    objective: "weighted",
  };
}
