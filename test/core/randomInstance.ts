import { buildMatrix } from "../../src/core/geo/buildMatrix.js";
import type { Problem, Stop, Vehicle } from "../../src/core/model.js";
import seedrandom from "seedrandom";

/**
 * Invented test instances (demo data, not a reference): stops scattered around a depot,
 * windows, two load dimensions, vehicles of different speeds, capacities and shifts.
 */
export function randomInstance(
  seed: number,
  options: { stops: number; vehicles: number; windows?: boolean; optional?: boolean; hard?: boolean; multiWindow?: boolean },
): Problem {
  const rng = seedrandom(String(seed));
  const n = options.stops;
  const locations = [
    { lat: 51.5, lon: -0.12, name: "Depot" },
    { lat: 51.52, lon: -0.1, name: "Depot B" },
  ];
  for (let i = 0; i < n; i++) locations.push({ lat: 51.5 + (rng() - 0.5) * 0.3, lon: -0.12 + (rng() - 0.5) * 0.4, name: `S${i}` });
  const stops: Stop[] = [];
  for (let i = 0; i < n; i++) {
    const e = 480 + Math.floor(rng() * 360);
    const width = 30 + Math.floor(rng() * 180);
    let windows = options.windows === false ? [{ earliestMin: 0, latestMin: Infinity }] : [{ earliestMin: e, latestMin: e + width }];
    if (options.multiWindow && rng() < 0.3)
      windows = [
        { earliestMin: e - 200, latestMin: e - 120 },
        { earliestMin: e, latestMin: e + width },
      ];
    stops.push({
      id: `S${i}`,
      name: `Stop ${i}`,
      location: i + 2,
      demand: [1 + Math.floor(rng() * 30), Math.floor(rng() * 4)],
      windows,
      serviceMin: 5 + Math.floor(rng() * 10),
      ...(options.optional && rng() < 0.3 ? { unservedCost: 20 + rng() * 80 } : {}),
    });
  }
  const vehicles: Vehicle[] = [];
  for (let v = 0; v < options.vehicles; v++) {
    const depot = v % 2;
    vehicles.push({
      id: `Van ${v + 1}`,
      capacity: [60 + Math.floor(rng() * 80), 8],
      startLocation: depot,
      endLocation: v % 3 === 2 ? 1 - depot : depot,
      shiftStartMin: 420 + Math.floor(rng() * 60),
      shiftEndMin: 900 + Math.floor(rng() * 200),
      fixedCost: 20 + Math.floor(rng() * 30),
      costPerKm: 0.5 + rng(),
      costPerHour: 10 + rng() * 20,
      speedKmh: 25 + Math.floor(rng() * 30),
      ...(v === 0 ? { maxStops: Math.max(2, Math.floor(n / 3)) } : {}),
    });
  }
  return {
    locations,
    stops,
    vehicles,
    loadDimensions: ["kg", "crates"],
    matrix: buildMatrix(locations, { speedKmh: 40 }),
    referenceSpeedKmh: 40,
    hardWindows: options.hard ?? true,
    lateCostPerMin: 2,
    objective: "weighted",
  };
}
