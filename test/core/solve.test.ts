import { describe, expect, it } from "vitest";
import { buildMatrix } from "../../src/core/geo/buildMatrix.js";
import type { Plan, Problem, Stop, Vehicle } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { createSolver, solve } from "../../src/core/solve.js";
import { sampleMeanUphill } from "../../src/core/anneal/sampleMeanUphill.js";
import { validateProblem } from "../../src/core/validateProblem.js";
import { randomInstance } from "./randomInstance.js";

function everyStopOnce(problem: Problem, plan: Plan): boolean {
  const seen = new Array<number>(problem.stops.length).fill(0);
  for (const r of plan.routes) for (const v of r.visits) seen[v.stop]!++;
  for (const u of plan.unassigned) seen[u.stop]!++;
  return plan.routes.length === problem.vehicles.length && seen.every((c) => c === 1);
}

/** Exhaustive optimum over all ordered splits of the stops between two vehicles. */
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

describe("solve", () => {
  it("same problem, seed and move budget give the identical plan", () => {
    const problem = randomInstance(11, { stops: 30, vehicles: 4, optional: true });
    const a = solve(problem, { seed: 5, budget: { moves: 40_000 } });
    const b = solve(problem, { seed: 5, budget: { moves: 40_000 } });
    expect(a.plan).toEqual(b.plan);
    expect(a.stats).toEqual(b.stats);
    const c = solve(problem, { seed: "another", budget: { moves: 40_000 } });
    expect(everyStopOnce(problem, c.plan)).toBe(true);
  });

  for (const [seed, stops] of [
    [21, 6],
    [22, 7],
    [23, 7],
    [24, 6],
  ] as const) {
    it(`finds the exhaustive-enumeration optimum on a ${stops}-stop, 2-vehicle instance with windows (seed ${seed})`, () => {
      const problem = randomInstance(seed, { stops, vehicles: 2 });
      const optimum = bruteForce(problem);
      expect(Number.isFinite(optimum)).toBe(true);
      const result = solve(problem, { seed, budget: { moves: 60_000 } });
      expect(result.plan.feasible).toBe(true);
      expect(result.plan.totals.cost).toBeCloseTo(optimum, 6);
    });
  }

  it("an already aborted signal still returns a valid plan", () => {
    const problem = randomInstance(31, { stops: 40, vehicles: 5 });
    const result = solve(problem, { signal: { aborted: true }, budget: { moves: 1_000_000 } });
    expect(result.stats.moves).toBe(0);
    expect(everyStopOnce(problem, result.plan)).toBe(true);
  });

  it("reports progress with rising move counts, paced by the clock it is given", () => {
    const problem = randomInstance(32, { stops: 40, vehicles: 5 });
    let clock = 0;
    const seen: number[] = [];
    solve(problem, {
      budget: { moves: 50_000 },
      now: () => (clock += 1),
      progressEveryMs: 50,
      onProgress: (p) => seen.push(p.moves),
    });
    expect(seen.length).toBeGreaterThan(3);
    for (let i = 1; i < seen.length; i++) expect(seen[i]!).toBeGreaterThan(seen[i - 1]!);
  });

  it("a seconds budget counts from the start it is given, so chains started late end together", () => {
    const problem = randomInstance(35, { stops: 30, vehicles: 4 });
    // A clock that advances 1 ms per reading: the run's own start gives it the full two seconds.
    let a = 10_000;
    const own = solve(problem, { seed: 4, budget: { seconds: 2 }, now: () => (a += 1) });
    // The same clock with a shared start 1.5 s earlier leaves a quarter of the budget.
    let b = 10_000;
    const late = solve(problem, { seed: 4, budget: { seconds: 2 }, now: () => (b += 1), startedAt: 8_500 });
    expect(late.stats.moves).toBeGreaterThan(0);
    expect(late.stats.moves).toBeLessThan(own.stats.moves / 2);
    // Both stop once the shared clock has passed the end: 12 000 ms for own, 10 500 ms for late.
    expect(a).toBeGreaterThanOrEqual(12_000);
    expect(b).toBeGreaterThanOrEqual(10_500);
    expect(b).toBeLessThan(12_000);
  });

  it("step(n) advances in slices and says when the budget is used", () => {
    const problem = randomInstance(33, { stops: 20, vehicles: 3 });
    const solver = createSolver(problem, { budget: { moves: 10_000 } });
    let slices = 0;
    while (!solver.step(1000)) slices++;
    expect(slices).toBe(10);
    expect(solver.progress.moves).toBe(10_000);
    expect(everyStopOnce(problem, solver.result().plan)).toBe(true);
  });

  it("puts stops no vehicle can serve into unassigned with the reason in words", () => {
    const base = randomInstance(34, { stops: 10, vehicles: 2 });
    const stops: Stop[] = base.stops.map((s, i) =>
      i === 0
        ? { ...s, demand: [900, 0] }
        : i === 1
          ? { ...s, requiredFeatures: ["fridge"] }
          : i === 2
            ? { ...s, windows: [{ earliestMin: 100, latestMin: 120 }] }
            : s,
    );
    const problem = { ...base, stops };
    const { plan } = solve(problem, { budget: { moves: 20_000 } });
    const reason = (k: number): string => plan.unassigned.find((u) => u.stop === k)?.reason ?? "";
    const largest = Math.max(...problem.vehicles.map((v) => v.capacity[0]!));
    expect(reason(0)).toBe(`demand 900 kg is more than the largest capacity, ${largest} kg`);
    expect(reason(1)).toMatch(/fridge/);
    expect(reason(2)).toMatch(/time window/);
    expect(everyStopOnce(problem, plan)).toBe(true);
  });

  it("the hierarchical objective prefers fewer vehicles; the weighted one the cheaper plan", () => {
    // Two depots 60 km apart, each beside its own cluster of three stops (invented data).
    const locations = [
      { lat: 52.0, lon: 0.0 },
      { lat: 52.0, lon: 0.88 },
    ];
    for (let i = 0; i < 3; i++) locations.push({ lat: 52.01 + 0.005 * i, lon: 0.01 });
    for (let i = 0; i < 3; i++) locations.push({ lat: 52.01 + 0.005 * i, lon: 0.87 });
    const stops: Stop[] = Array.from({ length: 6 }, (_, i) => ({
      id: `S${i}`,
      name: `S${i}`,
      location: i + 2,
      demand: [1],
      windows: [{ earliestMin: 0, latestMin: Infinity }],
      serviceMin: 5,
    }));
    const vehicle = (k: number): Vehicle => ({
      id: `V${k}`,
      capacity: [10],
      startLocation: k,
      endLocation: k,
      shiftStartMin: 480,
      shiftEndMin: 1080,
      fixedCost: 10,
      costPerKm: 1,
      costPerHour: 0,
      speedKmh: 50,
    });
    const problem: Problem = {
      locations,
      stops,
      vehicles: [vehicle(0), vehicle(1)],
      loadDimensions: ["kg"],
      matrix: buildMatrix(locations),
      referenceSpeedKmh: 40,
      hardWindows: true,
      lateCostPerMin: 0,
      objective: "weighted",
    };
    const weighted = solve(problem, { budget: { moves: 30_000 } }).plan;
    const hierarchical = solve({ ...problem, objective: "hierarchical" }, { budget: { moves: 30_000 } }).plan;
    expect(weighted.totals.vehiclesUsed).toBe(2);
    expect(hierarchical.totals.vehiclesUsed).toBe(1);
    expect(hierarchical.feasible).toBe(true);
    expect(weighted.totals.cost).toBeLessThan(hierarchical.totals.cost);
  });

  it("runs every acceptance rule and cooling schedule; a t0/tEnd given in the schedule wins over calibration", () => {
    const problem = randomInstance(37, { stops: 25, vehicles: 3 });
    const specs = [
      { kind: "geometric", alpha: 0.95, movesPerLevel: 500 },
      { kind: "linear", steps: 20 },
      { kind: "lundyMees", beta: 0.001 },
      { kind: "timeFraction", t0: 40, tEnd: 0.5 },
    ] as const;
    for (const cooling of specs) {
      for (const rule of ["metropolis", "logistic"] as const) {
        const r = solve(problem, { rule, cooling, budget: { moves: 15_000 } });
        expect(everyStopOnce(problem, r.plan)).toBe(true);
        if (cooling.kind === "timeFraction") {
          expect(r.stats.t0).toBe(40);
          expect(r.stats.tEnd).toBe(0.5);
        }
      }
    }
  });

  it("sampleMeanUphill gives a positive mean from the first plan", () => {
    const problem = randomInstance(35, { stops: 25, vehicles: 3 });
    const s = sampleMeanUphill(problem, { seed: 2, samples: 100 });
    expect(s.meanUphill).toBeGreaterThan(0);
    expect(s.samples).toBeGreaterThan(10);
  });
});

describe("validateProblem", () => {
  it("lists every defect as data instead of throwing", () => {
    const base = randomInstance(36, { stops: 4, vehicles: 1 });
    const bad: Problem = {
      ...base,
      stops: [
        { ...base.stops[0]!, demand: [1] },
        { ...base.stops[1]!, windows: [{ earliestMin: 600, latestMin: 500 }] },
        { ...base.stops[2]!, location: 99, serviceMin: -3 },
        base.stops[3]!,
      ],
    };
    const issues = validateProblem(bad);
    expect(issues.map((i) => `${i.sheet}.${i.cell}`)).toEqual([
      "stops[0].demand",
      "stops[1].windows",
      "stops[2].location",
      "stops[2].serviceMin",
    ]);
    expect(validateProblem(base)).toEqual([]);
    expect(() => solve(bad)).toThrow(RangeError);
  });
});
