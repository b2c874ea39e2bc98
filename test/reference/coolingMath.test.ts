import { describe, expect, it } from "vitest";
import { acceptanceProbability } from "../../src/core/anneal/acceptanceProbability.js";
import { calibrateTemperatures } from "../../src/core/anneal/calibrateTemperatures.js";
import { profile } from "../../src/core/anneal/profile.js";
import { resolveCooling, temperatureAt } from "../../src/core/anneal/resolveCooling.js";

describe("acceptance rules (common practice)", () => {
  it("Metropolis accepts an uphill change of 20 at T = 90 with about 0.80 (exp(-20/90) = 0.8007)", () => {
    expect(acceptanceProbability("metropolis", 20, 90)).toBeCloseTo(Math.exp(-20 / 90), 12);
    expect(acceptanceProbability("metropolis", 20, 90)).toBeCloseTo(0.8, 2);
  });
  it("the logistic (Barker) rule gives about 0.44 for the same change (1 / (1 + exp(20/90)) = 0.4447)", () => {
    expect(acceptanceProbability("logistic", 20, 90)).toBeCloseTo(1 / (1 + Math.exp(20 / 90)), 12);
    expect(acceptanceProbability("logistic", 20, 90)).toBeCloseTo(0.44, 2);
  });
  it("as dE/T -> 0 the logistic rule tends to 0.5 while Metropolis tends to 1", () => {
    for (const t of [1e3, 1e6, 1e9]) {
      expect(acceptanceProbability("logistic", 1, t)).toBeCloseTo(0.5, Math.log10(t) - 1);
      expect(acceptanceProbability("metropolis", 1, t)).toBeCloseTo(1, Math.log10(t) - 1);
    }
  });
  it("Metropolis always accepts an improvement; the logistic rule accepts it with more than 0.5", () => {
    expect(acceptanceProbability("metropolis", -5, 1)).toBe(1);
    expect(acceptanceProbability("logistic", -5, 10)).toBeGreaterThan(0.5);
    expect(acceptanceProbability("logistic", -5, 10)).toBeLessThan(1);
  });
  it("calibration inverts the rule: the mean uphill change is accepted with p0 at t0 and pEnd at tEnd", () => {
    for (const rule of ["metropolis", "logistic"] as const) {
      const { t0, tEnd } = calibrateTemperatures(20, rule, 0.4, 0.001);
      expect(acceptanceProbability(rule, 20, t0)).toBeCloseTo(0.4, 9);
      expect(acceptanceProbability(rule, 20, tEnd)).toBeCloseTo(0.001, 9);
    }
  });
});

describe("geometric cooling (common practice: alpha 0.94 is a usual choice)", () => {
  it("with alpha 0.94 the temperature falls by 6% per level of L moves", () => {
    const cooling = resolveCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 100 }, { t0: 50, tEnd: 1, budgetMoves: 10_000 });
    for (let level = 0; level < 10; level++) {
      const before = temperatureAt(cooling, level * 100, 0);
      const after = temperatureAt(cooling, (level + 1) * 100, 0);
      expect(after / before).toBeCloseTo(0.94, 12);
      // constant within a level
      expect(temperatureAt(cooling, level * 100 + 99, 0)).toBe(before);
    }
  });
  it("the profile preview of a geometric schedule shows the same 6% fall per level", () => {
    const points = profile({ kind: "geometric", alpha: 0.94, movesPerLevel: 100 }, "metropolis", 20, 1000, { points: 11 });
    for (let k = 1; k < points.length; k++) {
      expect(points[k]!.temperature / points[k - 1]!.temperature).toBeCloseTo(0.94, 12);
    }
  });
});
