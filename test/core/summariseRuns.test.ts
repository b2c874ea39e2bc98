import { describe, expect, it } from "vitest";
import { summariseRuns, type Plan, type Problem } from "../../src/core/index.js";

/** A finished plan reduced to what the summary reads: cost, vehicles, must-serve stops left out. */
function plan(cost: number, vehiclesUsed: number, mustServeUnassigned = 0): Plan {
  return {
    routes: [],
    unassigned: [],
    totals: {
      vehiclesUsed,
      distanceKm: 0,
      drivingMin: 0,
      dutyMin: 0,
      waitMin: 0,
      lateMin: 0,
      cost,
      unassigned: mustServeUnassigned,
      mustServeUnassigned,
    },
    feasible: mustServeUnassigned === 0,
    violations: [],
  };
}
const weighted = { objective: "weighted" } as Problem;

describe("summariseRuns", () => {
  it("gives the median, best and worst cost of an odd number of feasible runs (hand-worked: 5, 3, 4 -> 4, 3, 5)", () => {
    const s = summariseRuns(weighted, [
      { seed: 1, plan: plan(5, 3) },
      { seed: 2, plan: plan(3, 4) },
      { seed: 3, plan: plan(4, 3) },
    ]);
    expect(s).toEqual({
      seeds: [1, 2, 3],
      costs: [5, 3, 4],
      vehicles: [3, 4, 3],
      feasibleBySeed: [true, true, true],
      feasible: 3,
      median: 4,
      best: 3,
      worst: 5,
      bestSeed: 2,
      worstSeed: 1,
    });
  });

  it("takes the mean of the two middle costs for an even count (the usual definition of the median)", () => {
    const s = summariseRuns(
      weighted,
      [10, 40, 20, 30].map((c, i) => ({ seed: i, plan: plan(c, 2) })),
    );
    expect(s.median).toBe(25);
  });

  it("never ranks a cheap plan that leaves a must-serve stop out above a feasible one", () => {
    const s = summariseRuns(weighted, [
      { seed: 1, plan: plan(100, 3) },
      { seed: 2, plan: plan(50, 2, 1) },
      { seed: 3, plan: plan(120, 3) },
    ]);
    expect(s.feasible).toBe(2);
    expect(s.feasibleBySeed).toEqual([true, false, true]);
    expect([s.best, s.median, s.worst]).toEqual([100, 120, 50]);
    expect(s.worstSeed).toBe(2);
  });

  it("ranks by vehicles first under the hierarchical objective, as the solver does", () => {
    const s = summariseRuns({ objective: "hierarchical" } as Problem, [
      { seed: 1, plan: plan(90, 4) },
      { seed: 2, plan: plan(110, 3) },
    ]);
    expect(s.best).toBe(110);
    expect(s.worst).toBe(90);
  });

  it("refuses an empty list", () => {
    expect(() => summariseRuns(weighted, [])).toThrow(RangeError);
  });
});
