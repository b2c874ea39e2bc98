import { describe, expect, it } from "vitest";
import type { Problem } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { solve } from "../../src/core/solve.js";
import { rulesInstance } from "./rulesInstance.js";

/** Exhaustive optimum over all ordered splits of the stops between two vehicles (every rule checked by evaluatePlan). */
function bruteForce(problem: Problem): number {
  const n = problem.stops.length;
  let best = Infinity;
  const perm = Array.from({ length: n }, (_, i) => i);
  const visit = (k: number): void => {
    if (k === n) {
      for (let cut = 0; cut <= n; cut++) {
        const plan = evaluatePlan(problem, [perm.slice(0, cut), perm.slice(cut)]);
        if (plan.feasible && plan.totals.cost < best) best = plan.totals.cost;
      }
      return;
    }
    for (let i = k; i < n; i++) {
      [perm[k], perm[i]] = [perm[i]!, perm[k]!];
      visit(k + 1);
      [perm[k], perm[i]] = [perm[i]!, perm[k]!];
    }
  };
  visit(0);
  return best;
}

describe("the annealer's best equals the exhaustive optimum with pickups, breaks, limits and pins", () => {
  // Seed 43's limits (200 min driving, 400 min duty, 115 km) sit just above its best route (189 min, 110 km): tighter ones leave no feasible plan.
  for (const [seed, stops, breaks, limits] of [
    [41, 6, true, false],
    [44, 7, true, false],
    [43, 7, false, true],
  ] as const) {
    it(`${stops} stops, 2 vehicles, breaks ${breaks ? "on" : "off"}, limits ${limits ? "on" : "off"} (seed ${seed})`, () => {
      const problem = rulesInstance(seed, stops, 2, { breaks, limits, driveMin: 90, maxDrivingMin: 200, maxDutyMin: 400, maxKm: 115 });
      expect(problem.stops.some((s) => s.allowedVehicles || s.excludedVehicles)).toBe(true);
      const optimum = bruteForce(problem);
      expect(Number.isFinite(optimum)).toBe(true);
      const result = solve(problem, { seed, budget: { moves: 60_000 } });
      expect(result.plan.feasible).toBe(true);
      expect(result.plan.totals.cost).toBeCloseTo(optimum, 6);
    });
  }
});
