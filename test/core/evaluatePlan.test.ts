import { describe, expect, it } from "vitest";
import type { Problem } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";

/** A hand-made line of locations with a user matrix: 30 min and 20 km between neighbours (invented data). */
function lineProblem(windows: Problem["stops"][number]["windows"][], hard = true): Problem {
  const L = windows.length + 1;
  const distanceKm = new Float64Array(L * L);
  const travelMin = new Float64Array(L * L);
  for (let i = 0; i < L; i++)
    for (let j = 0; j < L; j++) {
      distanceKm[i * L + j] = 20 * Math.abs(i - j);
      travelMin[i * L + j] = 30 * Math.abs(i - j);
    }
  return {
    locations: Array.from({ length: L }, (_, i) => ({ lat: 50, lon: i / 10 })),
    stops: windows.map((w, k) => ({ id: `S${k + 1}`, name: `S${k + 1}`, location: k + 1, demand: [10], windows: w, serviceMin: 10 })),
    vehicles: [
      {
        id: "Van",
        capacity: [25],
        startLocation: 0,
        endLocation: 0,
        shiftStartMin: 420,
        shiftEndMin: 720,
        fixedCost: 5,
        costPerKm: 0.5,
        costPerHour: 30,
        speedKmh: 40,
      },
    ],
    loadDimensions: ["kg"],
    matrix: { size: L, distanceKm, travelMin, userSupplied: true },
    referenceSpeedKmh: 40,
    hardWindows: hard,
    lateCostPerMin: 2,
    objective: "weighted",
  };
}

describe("evaluatePlan (time-warp timing of Vidal et al. 2013, figures worked by hand)", () => {
  it("leaves late enough not to wait at the first stop and waits for the second window of a stop", () => {
    const p = lineProblem([
      [{ earliestMin: 480, latestMin: 500 }],
      [
        { earliestMin: 500, latestMin: 520 },
        { earliestMin: 560, latestMin: 600 },
      ],
    ]);
    const plan = evaluatePlan(p, [[0, 1]]);
    const r = plan.routes[0]!;
    // Depart 450, arrive S1 480, leave 490, arrive S2 520 (first window still open at 520).
    expect(r.departureMin).toBe(450);
    expect(r.visits.map((v) => [v.arrivalMin, v.startMin, v.waitMin])).toEqual([
      [480, 480, 0],
      [520, 520, 0],
    ]);
    expect(r.returnMin).toBe(590);
    expect(r.dutyMin).toBe(140);
    expect(r.distanceKm).toBe(80);
    expect(r.cost).toBeCloseTo(5 + 40 + 70, 9);
    expect(plan.feasible).toBe(true);

    // With S2's first window closing at 510, leaving at 420 would reach S2 at 520, in the gap.
    // The van may leave 50 min later (S1 closes at 500): S1 at 500, S2 at 540, waits 20 for 560.
    const q = lineProblem([
      [{ earliestMin: 480, latestMin: 500 }],
      [
        { earliestMin: 500, latestMin: 510 },
        { earliestMin: 560, latestMin: 600 },
      ],
    ]);
    const r2 = evaluatePlan(q, [[0, 1]]).routes[0]!;
    expect(r2.departureMin).toBe(470);
    expect(r2.visits[0]).toMatchObject({ arrivalMin: 500, startMin: 500, waitMin: 0 });
    expect(r2.visits[1]).toMatchObject({ arrivalMin: 540, startMin: 560, waitMin: 20 });
  });

  it("books lateness as time warp, lists it under hard windows and prices it under soft ones", () => {
    const windows = [[{ earliestMin: 0, latestMin: 440 }], [{ earliestMin: 0, latestMin: Infinity }]];
    const hard = evaluatePlan(lineProblem(windows), [[0, 1]]);
    const r = hard.routes[0]!;
    // Leave 420, arrive S1 450, 10 min late: service booked at 440 (time warp), S2 at 480.
    expect(r.visits[0]).toMatchObject({ arrivalMin: 450, startMin: 440, lateMin: 10 });
    expect(r.visits[1]).toMatchObject({ arrivalMin: 480, startMin: 480, lateMin: 0 });
    expect(hard.feasible).toBe(false);
    expect(hard.violations).toEqual(["Van: arrives 10 min late at stop S1"]);
    const soft = evaluatePlan(lineProblem(windows, false), [[0, 1]]);
    expect(soft.feasible).toBe(true);
    expect(soft.totals.cost - hard.totals.cost).toBeCloseTo(2 * 10, 9);
  });

  it("reports overtime and excess load as violations, and counts unserved must-serve stops", () => {
    const p = lineProblem([
      [{ earliestMin: 0, latestMin: Infinity }],
      [{ earliestMin: 0, latestMin: Infinity }],
      [{ earliestMin: 700, latestMin: 710 }],
    ]);
    const plan = evaluatePlan(p, [[0, 1, 2]]);
    expect(plan.routes[0]!.excessLoad).toBe(5);
    expect(plan.routes[0]!.overtimeMin).toBeGreaterThan(0);
    expect(plan.violations).toContain("Van: 5 kg over capacity");
    const partial = evaluatePlan(p, [[0]], [{ stop: 1, reason: "test" }]);
    expect(partial.violations).toEqual([]);
    expect(partial.totals.mustServeUnassigned).toBe(2);
    expect(partial.feasible).toBe(false);
    expect(partial.unassigned).toContainEqual({ stop: 2, reason: "not in any route" });
    expect(() => evaluatePlan(p, [[0, 0]])).toThrow(RangeError);
  });
});
