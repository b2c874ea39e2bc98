import { createRandom } from "../../src/core/anneal/createRandom.js";
import type { Problem, Vehicle } from "../../src/core/model.js";
import { randomInstance } from "./randomInstance.js";

/** A random instance with the dispatcher's rules added (invented data). */
export function rulesInstance(
  seed: number,
  stops: number,
  vehicles: number,
  rules: { breaks: boolean; limits: boolean; driveMin?: number; maxDrivingMin?: number; maxDutyMin?: number; maxKm?: number },
): Problem {
  const base = randomInstance(seed, { stops, vehicles, windows: seed % 2 === 0, hard: true });
  const rng = createRandom(seed * 7 + 1);
  const ids = base.vehicles.map((v) => v.id);
  return {
    ...base,
    stops: base.stops.map((s, i) => ({
      ...s,
      pickup: [Math.floor(rng.next() * 30), rng.next() < 0.5 ? Math.floor(rng.next() * 4) : 0],
      ...(i % 5 === 1 ? { allowedVehicles: [ids[i % ids.length]!] } : {}),
      ...(i % 7 === 3 ? { excludedVehicles: [ids[0]!] } : {}),
    })),
    vehicles: base.vehicles.map((v, k): Vehicle => ({
      ...v,
      ...(rules.breaks && k % 2 === 0 ? { drivingBreak: { driveMin: rules.driveMin ?? 60, breakMin: 15 } } : {}),
      ...(rules.breaks && k % 3 !== 1 ? { windowBreak: { earliestMin: 720, latestMin: 810, breakMin: 30 } } : {}),
      ...(rules.limits
        ? { maxDrivingMin: rules.maxDrivingMin ?? 150, maxDutyMin: rules.maxDutyMin ?? 330, maxKm: rules.maxKm ?? 90 + 10 * k }
        : {}),
    })),
  };
}
