import { describe, expect, it } from "vitest";
import type { Problem, Stop, Vehicle } from "../../src/core/model.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { keepHardRules } from "../../src/core/schedule/keepHardRules.js";

/** Depot and three stops on a line, 20 km and 30 min apart (invented data). */
function line(stops: Partial<Stop>[], vehicle: Partial<Vehicle> = {}): Problem {
  const L = stops.length + 1;
  const km = new Float64Array(L * L);
  const min = new Float64Array(L * L);
  for (let i = 0; i < L; i++)
    for (let j = 0; j < L; j++) {
      km[i * L + j] = 20 * Math.abs(i - j);
      min[i * L + j] = 30 * Math.abs(i - j);
    }
  const base: Vehicle = {
    id: "Van",
    capacity: [10],
    startLocation: 0,
    endLocation: 0,
    shiftStartMin: 480,
    shiftEndMin: 1080,
    fixedCost: 0,
    costPerKm: 1,
    costPerHour: 0,
    speedKmh: 40,
  };
  return {
    locations: Array.from({ length: L }, (_, i) => ({ lat: 50, lon: i / 10 })),
    stops: stops.map((s, k) => ({
      id: `S${k + 1}`,
      name: `S${k + 1}`,
      location: k + 1,
      demand: [0],
      windows: [{ earliestMin: 0, latestMin: Infinity }],
      serviceMin: 0,
      ...s,
    })),
    vehicles: [
      { ...base, ...vehicle },
      { ...base, id: "Truck" },
    ],
    loadDimensions: ["crates"],
    matrix: { size: L, distanceKm: km, travelMin: min, userSupplied: true },
    referenceSpeedKmh: 40,
    hardWindows: true,
    lateCostPerMin: 1,
    objective: "weighted",
  };
}

describe("simultaneous pickup and delivery, limits and pins (figures worked by hand)", () => {
  it("checks capacity at every point: the load rises with each pickup", () => {
    // Deliver 6, 2, 0 and collect 0, 5, 4 crates: on board 8 at the depot, then 2, 5, 9.
    const p = line([
      { demand: [6], pickup: [0] },
      { demand: [2], pickup: [5] },
      { demand: [0], pickup: [4] },
    ]);
    const plan = evaluatePlan(p, [[0, 1, 2], []]);
    const r = plan.routes[0]!;
    expect(r.load).toEqual([8]);
    expect(r.visits.map((v) => v.loadAfter[0])).toEqual([2, 5, 9]);
    expect(r.maxLoad).toEqual([9]);
    expect(plan.feasible).toBe(true);
    // The reverse order collects first: 8 + 4 = 12 after S3, 12 - 2 + 5 = 15 after S2, 9 after S1;
    // the depot load (8) fits, yet the van is 5 over its 10 crates after S2.
    const bad = evaluatePlan(p, [[2, 1, 0], []]);
    expect(bad.routes[0]!.visits.map((v) => v.loadAfter[0])).toEqual([12, 15, 9]);
    expect(bad.routes[0]!.maxLoad).toEqual([15]);
    expect(bad.routes[0]!.excessLoad).toBe(5);
    expect(bad.violations).toEqual(["Van: 5 crates over capacity"]);
  });

  it("reports driving, duty and km beyond the vehicle's limits", () => {
    // Out to S3 and back: 120 km, 180 min driving, duty 180 min.
    const p = line([{}, {}, {}], { maxDrivingMin: 150, maxDutyMin: 170, maxKm: 100 });
    const plan = evaluatePlan(p, [[0, 1, 2], []]);
    expect(plan.routes[0]!.drivingMin).toBe(180);
    expect(plan.violations).toEqual([
      "Van: 30 min of driving over its maximum of 150 min",
      "Van: 10 min of duty over its maximum of 170 min",
      "Van: 20 km over its maximum of 100 km",
    ]);
  });

  it("pins and excluded vehicles: compiled as compatibility, reported when broken", () => {
    const p = line([{ allowedVehicles: ["Truck"] }, { excludedVehicles: ["Truck"] }, {}]);
    const cp = compileProblem(p);
    expect(Array.from(cp.compatible)).toEqual([0, 1, 1, 0, 1, 1]);
    const plan = evaluatePlan(p, [[0, 1], [2]]);
    expect(plan.violations).toEqual(["Van serves stop S1, which is pinned to Truck"]);
    const swapped = evaluatePlan(p, [[2], [0, 1]]);
    expect(swapped.violations).toEqual(["Truck serves stop S2, which excludes it"]);
  });

  it("a plan cut back to the rules keeps limits, pins and the load at every point", () => {
    // Van limited to 100 km cannot reach S3 and back (120 km); the Truck may not take S2 and S3 is pinned to the Van.
    const p = line(
      [{ demand: [6], pickup: [0] }, { demand: [2], pickup: [5], excludedVehicles: ["Truck"] }, { allowedVehicles: ["Van"] }],
      {
        maxKm: 100,
      },
    );
    const kept = keepHardRules(p, evaluatePlan(p, [[2, 1, 0], []]));
    expect(kept.violations).toEqual([]);
    expect(kept.unassigned.map((u) => u.stop)).toEqual([2]);
    expect(kept.routes[0]!.visits.map((v) => v.stop)).toContain(1);
  });
});
