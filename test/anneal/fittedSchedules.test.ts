import { describe, expect, it } from "vitest";
import { measureMoveRate } from "../../src/core/anneal/measureMoveRate.js";
import { resolveCooling, temperatureAt } from "../../src/core/anneal/resolveCooling.js";
import { profile } from "../../src/core/anneal/profile.js";

// Closed forms: Lundy & Mees (1986), T_k = T_{k-1} / (1 + beta T_{k-1}), so after M moves
// 1/T_M = 1/T_0 + M beta; geometric cooling (Kirkpatrick et al. 1983) after M/L levels
// T = T_0 alpha^(M/L). A fitted parameter must land on T_end exactly at the end of the budget.
const BUDGETS = [1_000, 37_501, 2_000_000, 123_456_789];

describe("schedule parameters fitted to the move budget", () => {
  it.each(BUDGETS)("Lundy-Mees without beta reaches T end after %i moves (1/T_end = 1/T_0 + M beta)", (m) => {
    const c = resolveCooling({ kind: "lundyMees" }, { t0: 250, tEnd: 0.4, budgetMoves: m });
    if (c.kind !== "lundyMees") throw new Error("kind");
    expect(1 / 0.4).toBeCloseTo(1 / 250 + m * c.beta, 9);
    expect(Math.abs(temperatureAt(c, m, 1) - 0.4) / 0.4).toBeLessThan(1e-9);
    // Halfway it is still warmer than the end.
    expect(temperatureAt(c, Math.floor(m / 2), 0.5)).toBeGreaterThan(0.4);
  });

  it.each(BUDGETS)("geometric with moves per level but no factor reaches T end after %i moves", (m) => {
    const L = Math.max(1, Math.floor(m / 300));
    const c = resolveCooling({ kind: "geometric", movesPerLevel: L }, { t0: 80, tEnd: 0.05, budgetMoves: m });
    if (c.kind !== "geometric") throw new Error("kind");
    const levels = Math.floor(m / L);
    expect(Math.abs(80 * Math.pow(c.alpha, levels) - 0.05) / 0.05).toBeLessThan(1e-9);
    expect(Math.abs(temperatureAt(c, levels * L, 1) - 0.05) / 0.05).toBeLessThan(1e-9);
  });

  it("a T end typed for Lundy-Mees now changes the schedule (it was ignored before)", () => {
    const t = { t0: 100, tEnd: 1, budgetMoves: 10_000 };
    const a = resolveCooling({ kind: "lundyMees" }, t);
    const b = resolveCooling({ kind: "lundyMees", tEnd: 0.1 }, t);
    expect(temperatureAt(b, 10_000, 1)).toBeCloseTo(0.1, 9);
    expect(temperatureAt(a, 10_000, 1)).toBeCloseTo(1, 9);
  });

  it("a typed beta or alpha wins over the fitted one", () => {
    const t = { t0: 100, tEnd: 1, budgetMoves: 10_000 };
    expect(resolveCooling({ kind: "lundyMees", beta: 1e-3 }, t)).toMatchObject({ beta: 1e-3 });
    expect(resolveCooling({ kind: "geometric", alpha: 0.9, movesPerLevel: 10 }, t)).toMatchObject({ alpha: 0.9 });
  });

  it("a fitted parameter without a move budget is refused, not guessed", () => {
    expect(() => resolveCooling({ kind: "lundyMees" }, { t0: 10, tEnd: 1, budgetMoves: 0 })).toThrow(RangeError);
  });

  it("the default Lundy-Mees preview ends at the calibrated acceptance, not far colder", () => {
    // Before fitting, beta 1e-4 over 2 M moves ended near T = 1/(1e-4 * 2e6) whatever the landscape.
    const pts = profile({ kind: "lundyMees" }, "metropolis", 20, 2_000_000, { points: 5 });
    expect(pts[0]!.pAccept).toBeCloseTo(0.5, 9);
    expect(pts[4]!.pAccept).toBeCloseTo(0.001, 9);
  });
});

describe("moves per second measured by a timed burst", () => {
  it("counts moves over the clock it is given and stops after the burst", async () => {
    const { compileProblem } = await import("../../src/core/schedule/compileProblem.js");
    const { SearchState } = await import("../../src/core/moves/SearchState.js");
    const { buildNeighbours } = await import("../../src/core/neighbours/buildNeighbours.js");
    const { constructPlan } = await import("../../src/core/construct/constructPlan.js");
    const { initialWeights } = await import("../../src/core/anneal/initialWeights.js");
    const { randomInstance } = await import("../core/randomInstance.js");
    const cp = compileProblem(randomInstance(1, { stops: 30, vehicles: 4 }));
    const w = initialWeights(cp);
    const state = new SearchState(cp, w.wTime, w.wLoad);
    const nb = buildNeighbours(cp, 10);
    constructPlan(state, nb);
    const active = Int32Array.from({ length: cp.n }, (_, i) => i);
    const before = state.total();
    // A fake clock advancing 1 ms per read: the burst of 10 ms reads it 11 times, 512 moves apart.
    let t = 0;
    const rate = measureMoveRate(state, nb, active, { seed: 1, now: () => t++, rule: "metropolis", temperature: 5, burstMs: 10 });
    expect(rate).toBe((10 * 512 * 1000) / 10);
    expect(state.total()).toBe(before);
  });
});
