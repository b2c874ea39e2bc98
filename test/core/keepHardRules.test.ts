import { describe, expect, it } from "vitest";
import type { Problem, Stop, Vehicle } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { keepHardRules } from "../../src/core/schedule/keepHardRules.js";
import { solve } from "../../src/core/solve.js";
import { checkPlan } from "./checkPlan.js";
import { randomInstance } from "./randomInstance.js";

/** A line of locations 10 min apart with a user matrix (invented data); location 0 is the depot. */
function line(stops: Omit<Stop, "location" | "name">[], vehicles: Partial<Vehicle>[], hardWindows = true): Problem {
  const L = stops.length + 1;
  const distanceKm = new Float64Array(L * L);
  const travelMin = new Float64Array(L * L);
  for (let i = 0; i < L; i++)
    for (let j = 0; j < L; j++) {
      distanceKm[i * L + j] = 5 * Math.abs(i - j);
      travelMin[i * L + j] = 10 * Math.abs(i - j);
    }
  return {
    locations: Array.from({ length: L }, (_, i) => ({ lat: 50, lon: i / 100 })),
    stops: stops.map((s, k) => ({ ...s, name: s.id, location: k + 1 })),
    vehicles: vehicles.map((v, k) => ({
      id: `Van ${k + 1}`,
      capacity: [300],
      startLocation: 0,
      endLocation: 0,
      shiftStartMin: 480,
      shiftEndMin: 1080,
      fixedCost: 10,
      costPerKm: 1,
      costPerHour: 20,
      speedKmh: 40,
      ...v,
    })),
    loadDimensions: ["kg"],
    matrix: { size: L, distanceKm, travelMin, userSupplied: true },
    referenceSpeedKmh: 40,
    hardWindows,
    lateCostPerMin: 1,
    objective: "weighted",
  };
}

const anyTime = [{ earliestMin: 0, latestMin: Infinity }];

describe("keepHardRules: a plan written as the result never breaks a hard rule", () => {
  it("more demand than the fleet carries: serves what fits and says so in a dispatcher's words", () => {
    // 10 stops x 100 kg = 1 000 kg against 2 vans x 300 kg (worked by hand: 6 served, 4 left out, 400 kg).
    const stops = Array.from({ length: 10 }, (_, i) => ({ id: `S${i + 1}`, demand: [100], windows: anyTime, serviceMin: 5 }));
    const problem = line(stops, [{}, {}]);
    const { plan } = solve(problem, { seed: 3, budget: { moves: 20_000 } });
    expect(checkPlan(problem, plan)).toEqual([]);
    expect(plan.violations).toEqual([]);
    expect(plan.totals.mustServeUnassigned).toBe(4);
    expect(plan.feasible).toBe(false);
    for (const u of plan.unassigned) {
      expect(u.reason).toBe("total demand 1 000 kg is more than the fleet's 600 kg; not served: 4 stops, 400 kg");
    }
  });

  it("a route over capacity loses the smallest stop that clears the excess, and keeps the rest", () => {
    const stops = [30, 80, 200, 40].map((q, i) => ({ id: `S${i + 1}`, demand: [q], windows: anyTime, serviceMin: 5 }));
    const problem = line(stops, [{ capacity: [300] }]);
    const overloaded = evaluatePlan(problem, [[0, 1, 2, 3]]);
    expect(overloaded.violations).toEqual(["Van 1: 50 kg over capacity"]);
    const kept = keepHardRules(problem, overloaded);
    // 350 kg on a 300 kg van: dropping S2 (80 kg) is the smallest single stop that clears 50 kg.
    expect(kept.routes[0]!.visits.map((v) => v.stop)).toEqual([0, 2, 3]);
    expect(kept.unassigned.map((u) => u.stop)).toEqual([1]);
    expect(kept.unassigned[0]!.reason).toBe("total demand 350 kg is more than the fleet's 300 kg; not served: 1 stop, 80 kg");
    expect(checkPlan(problem, kept)).toEqual([]);
  });

  it("two stops with the same short window at opposite ends: one is left out with a time reason", () => {
    const w = [{ earliestMin: 540, latestMin: 545 }];
    const stops = [
      { id: "A", demand: [1], windows: w, serviceMin: 5 },
      { id: "B", demand: [1], windows: anyTime, serviceMin: 5 },
      { id: "C", demand: [1], windows: anyTime, serviceMin: 5 },
      { id: "D", demand: [1], windows: w, serviceMin: 5 },
    ];
    const problem = line(stops, [{}]);
    const { plan } = solve(problem, { seed: 1, budget: { moves: 5_000 } });
    expect(checkPlan(problem, plan)).toEqual([]);
    expect(plan.unassigned).toHaveLength(1);
    expect(plan.unassigned[0]!.reason).toMatch(/window/);
    expect(plan.totals.mustServeUnassigned).toBe(1);
  });

  it("under soft windows lateness stays allowed at its cost: nothing is left out", () => {
    const w = [{ earliestMin: 540, latestMin: 545 }];
    const stops = ["A", "B"].map((id) => ({ id, demand: [1], windows: w, serviceMin: 5 }));
    const problem = line([stops[0]!, { id: "M", demand: [1], windows: anyTime, serviceMin: 5 }, stops[1]!], [{}], false);
    const { plan } = solve(problem, { seed: 1, budget: { moves: 5_000 } });
    expect(plan.unassigned).toEqual([]);
    expect(plan.totals.lateMin).toBeGreaterThan(0);
    expect(plan.feasible).toBe(true);
  });

  it("random tight fleets: every solved plan passes the independent checker", () => {
    for (const seed of [41, 42, 43]) {
      const base = randomInstance(seed, { stops: 40, vehicles: 2 });
      const problem = { ...base, vehicles: base.vehicles.map((v) => ({ ...v, capacity: [150, 6] })) };
      const { plan } = solve(problem, { seed, budget: { moves: 20_000 } });
      expect(checkPlan(problem, plan)).toEqual([]);
      expect(plan.totals.mustServeUnassigned).toBe(plan.unassigned.filter((u) => problem.stops[u.stop]!.unservedCost === undefined).length);
    }
  });
});
