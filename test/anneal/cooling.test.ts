import { describe, expect, it } from "vitest";
import { acceptanceProbability } from "../../src/core/anneal/acceptanceProbability.js";
import { calibrateTemperatures } from "../../src/core/anneal/calibrateTemperatures.js";
import { describeProfile } from "../../src/core/anneal/describeProfile.js";
import { profile } from "../../src/core/anneal/profile.js";
import { alphaToReach, betaToReach, resolveCooling, temperatureAt } from "../../src/core/anneal/resolveCooling.js";

describe("cooling schedules follow their published definitions", () => {
  it("geometric: T <- alpha T every L moves (Kirkpatrick et al. 1983), alpha 0.94 (common practice)", () => {
    const c = resolveCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 10 }, { t0: 100, tEnd: 1, budgetMoves: 1000 });
    let t = 100;
    for (let m = 0; m < 1000; m++) {
      if (m > 0 && m % 10 === 0) t *= 0.94;
      expect(temperatureAt(c, m, m / 1000)).toBeCloseTo(t, 9);
    }
  });

  it("Lundy-Mees: T_k = T_{k-1} / (1 + beta T_{k-1}) (Lundy & Mees 1986)", () => {
    const c = resolveCooling({ kind: "lundyMees", beta: 0.001 }, { t0: 50, tEnd: 1, budgetMoves: 500 });
    let t = 50;
    for (let m = 0; m <= 500; m++) {
      expect(temperatureAt(c, m, m / 500)).toBeCloseTo(t, 9);
      t = t / (1 + 0.001 * t);
    }
  });

  it("linear steps go from t0 to tEnd in equal steps", () => {
    const c = resolveCooling({ kind: "linear", steps: 5 }, { t0: 90, tEnd: 10, budgetMoves: 100 });
    const levels = [0, 0.2, 0.4, 0.6, 0.8, 0.999, 1].map((f) => temperatureAt(c, f * 100, f));
    expect(levels).toEqual([90, 70, 50, 30, 10, 10, 10]);
  });

  it("time fraction: T(f) = t0 (tEnd/t0)^f", () => {
    const c = resolveCooling({ kind: "timeFraction" }, { t0: 100, tEnd: 1, budgetMoves: 1 });
    expect(temperatureAt(c, 0, 0)).toBe(100);
    expect(temperatureAt(c, 0, 0.5)).toBeCloseTo(10, 12);
    expect(temperatureAt(c, 0, 1)).toBeCloseTo(1, 12);
  });

  it("a spec's own t0 wins over the calibrated one", () => {
    const c = resolveCooling({ kind: "timeFraction", t0: 7, tEnd: 0.5 }, { t0: 100, tEnd: 1, budgetMoves: 1 });
    expect(c).toEqual({ kind: "timeFraction", t0: 7, tEnd: 0.5 });
  });

  it("alphaToReach and betaToReach land on tEnd at the end of the budget", () => {
    const alpha = alphaToReach(100, 1, 50, 10_000);
    const g = resolveCooling({ kind: "geometric", alpha, movesPerLevel: 50 }, { t0: 100, tEnd: 1, budgetMoves: 10_000 });
    expect(temperatureAt(g, 10_000, 1)).toBeCloseTo(1, 9);
    const beta = betaToReach(100, 1, 10_000);
    const l = resolveCooling({ kind: "lundyMees", beta }, { t0: 100, tEnd: 1, budgetMoves: 10_000 });
    expect(temperatureAt(l, 10_000, 1)).toBeCloseTo(1, 9);
  });

  it("a fitted β or α, for several budgets, matches the closed forms to 1e-9 and reaches T end at the last move when the recurrence is stepped move by move", () => {
    // Closed forms of the published recurrences: Lundy & Mees (1986) T(k+1) = T(k) / (1 + βT(k)),
    // so 1/T(M) = 1/T0 + Mβ; geometric (Kirkpatrick et al. 1983) T = T0 α^level, level = floor(k / L).
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    for (const [t0, tEnd] of [
      [100, 1],
      [37.5, 0.02],
    ] as const) {
      for (const budgetMoves of [1_000, 37_501, 250_000, 2_000_000]) {
        const l = resolveCooling({ kind: "lundyMees" }, { t0, tEnd, budgetMoves });
        if (l.kind !== "lundyMees") throw new Error("expected Lundy-Mees");
        expect(rel(l.beta, (1 / tEnd - 1 / t0) / budgetMoves), `β, M=${budgetMoves}`).toBeLessThan(1e-9);
        let t = t0;
        for (let k = 0; k < budgetMoves; k++) t = t / (1 + l.beta * t);
        expect(rel(t, tEnd), `Lundy-Mees stepped, M=${budgetMoves}`).toBeLessThan(1e-9);

        for (const movesPerLevel of [1, 50, 999]) {
          const g = resolveCooling({ kind: "geometric", movesPerLevel }, { t0, tEnd, budgetMoves });
          if (g.kind !== "geometric") throw new Error("expected geometric");
          const levels = Math.floor(budgetMoves / movesPerLevel);
          expect(rel(g.alpha, Math.pow(tEnd / t0, 1 / levels)), `α, M=${budgetMoves}, L=${movesPerLevel}`).toBeLessThan(1e-9);
          let tg = t0;
          for (let level = 0; level < levels; level++) tg *= g.alpha;
          expect(rel(tg, tEnd), `geometric stepped, M=${budgetMoves}, L=${movesPerLevel}`).toBeLessThan(1e-9);
        }
      }
    }
  });

  it("rejects parameters outside their ranges", () => {
    const t = { t0: 10, tEnd: 1, budgetMoves: 10 };
    expect(() => resolveCooling({ kind: "geometric", alpha: 1.2, movesPerLevel: 1 }, t)).toThrow(RangeError);
    expect(() => resolveCooling({ kind: "lundyMees", beta: 0 }, t)).toThrow(RangeError);
    expect(() => resolveCooling({ kind: "linear", steps: 0 }, t)).toThrow(RangeError);
  });
});

describe("calibration solves P(mean uphill, T) = p", () => {
  it("gives back the target probabilities under both rules", () => {
    for (const rule of ["metropolis", "logistic"] as const) {
      const { t0, tEnd } = calibrateTemperatures(20, rule, 0.4, 0.001);
      expect(acceptanceProbability(rule, 20, t0)).toBeCloseTo(0.4, 12);
      expect(acceptanceProbability(rule, 20, tEnd)).toBeCloseTo(0.001, 12);
    }
  });

  it("reads an unreachable logistic p0 of 0.5 as 0.49", () => {
    const { t0 } = calibrateTemperatures(20, "logistic", 0.5, 0.001);
    expect(acceptanceProbability("logistic", 20, t0)).toBeCloseTo(0.49, 12);
  });
});

describe("profile and its reading", () => {
  it("profile starts at p0 and ends at pEnd for a calibrated schedule", () => {
    const pts = profile({ kind: "timeFraction" }, "metropolis", 20, 10_000, { points: 11 });
    expect(pts).toHaveLength(11);
    expect(pts[0]!.pAccept).toBeCloseTo(0.5, 12);
    expect(pts[10]!.pAccept).toBeCloseTo(0.001, 12);
    for (let i = 1; i < pts.length; i++) expect(pts[i]!.temperature).toBeLessThan(pts[i - 1]!.temperature);
  });

  it("calls a schedule that barely cools a random walk", () => {
    const pts = profile({ kind: "geometric", alpha: 0.9999, movesPerLevel: 1000 }, "metropolis", 20, 100_000, { p0: 0.9 });
    expect(describeProfile(pts, "metropolis")).toMatch(/random walk/);
  });

  it("calls a cold start a greedy descent", () => {
    const pts = profile({ kind: "timeFraction", t0: 1, tEnd: 0.1 }, "metropolis", 20, 1000);
    expect(describeProfile(pts)).toMatch(/greedy descent/);
  });

  it("calls the default calibrated schedule balanced", () => {
    const pts = profile({ kind: "timeFraction" }, "metropolis", 20, 1000);
    expect(describeProfile(pts)).toMatch(/balanced/);
  });
});

describe("calibration on sampled changes (acceptance-ratio form, Ben-Ameur 2004)", () => {
  it("finds the temperature at which the mean acceptance of the samples is pEnd", () => {
    const uphill = [1, 2, 5, 50, 400];
    const mean = uphill.reduce((a, b) => a + b, 0) / uphill.length;
    const { tEnd } = calibrateTemperatures(mean, "metropolis", 0.5, 0.01, uphill);
    const rate = uphill.reduce((a, d) => a + acceptanceProbability("metropolis", d, tEnd), 0) / uphill.length;
    expect(rate).toBeCloseTo(0.01, 9);
  });

  it("is never hotter than the mean form (Jensen's inequality)", () => {
    for (const rule of ["metropolis", "logistic"] as const) {
      const uphill = [3, 3, 7, 90, 1200, 15];
      const mean = uphill.reduce((a, b) => a + b, 0) / uphill.length;
      const byMean = calibrateTemperatures(mean, rule, 0.4, 0.001);
      const bySamples = calibrateTemperatures(mean, rule, 0.4, 0.001, uphill);
      expect(bySamples.t0).toBeLessThanOrEqual(byMean.t0);
      expect(bySamples.tEnd).toBeLessThanOrEqual(byMean.tEnd);
    }
  });

  it("equals the mean form when every sample is the same", () => {
    const a = calibrateTemperatures(20, "metropolis", 0.5, 0.001, [20, 20, 20]);
    const b = calibrateTemperatures(20, "metropolis", 0.5, 0.001);
    expect(a.tEnd).toBeCloseTo(b.tEnd, 9);
    expect(a.t0).toBeCloseTo(b.t0, 9);
  });
});
