import { describe, expect, it } from "vitest";
import { PLAN_SETTINGS_DEFAULTS } from "../../src/sheets/PlanSettings.js";
import { formatTemperaturePlan, parseTemperaturePlan, withTemperaturePlan } from "../../src/sheets/temperaturePlan.js";

describe("temperature plan notation", () => {
  it("reads a bare schedule name as that schedule with its defaults, as --schedule does", () => {
    expect(parseTemperaturePlan("geometric")).toEqual({ plan: { text: "geometric", cooling: { kind: "geometric", alpha: 0.94 } } });
    expect(parseTemperaturePlan(" Lundy-Mees ")).toEqual({ plan: { text: "Lundy-Mees", cooling: { kind: "lundyMees" } } });
    expect(parseTemperaturePlan("linear")).toEqual({ plan: { text: "linear", cooling: { kind: "linear", steps: 20 } } });
    expect(parseTemperaturePlan("time-based")).toEqual({ plan: { text: "time-based", cooling: { kind: "timeFraction" } } });
  });

  it("reads settings by their kiln plan flag names, and a Settings-sheet key word such as moves-per-level", () => {
    expect(parseTemperaturePlan("geometric:alpha=0.95,level=2000")).toEqual({
      plan: { text: "geometric:alpha=0.95,level=2000", cooling: { kind: "geometric", alpha: 0.95, movesPerLevel: 2000 } },
    });
    expect(parseTemperaturePlan("geometric: moves-per-level = 500")).toEqual({
      plan: { text: "geometric: moves-per-level = 500", cooling: { kind: "geometric", movesPerLevel: 500 } },
    });
    expect(parseTemperaturePlan("time-based:t0=50,tend=0.5,rule=logistic")).toEqual({
      plan: { text: "time-based:t0=50,tend=0.5,rule=logistic", cooling: { kind: "timeFraction", t0: 50, tEnd: 0.5 }, rule: "logistic" },
    });
    expect(parseTemperaturePlan("linear:steps=50,p0=0.3,pend=0.0001")).toEqual({
      plan: { text: "linear:steps=50,p0=0.3,pend=0.0001", cooling: { kind: "linear", steps: 50 }, p0: 0.3, pEnd: 0.0001 },
    });
  });

  it("writes a plan back in the notation, and reads that text back to the same plan", () => {
    const plans = [
      { cooling: { kind: "geometric" as const, alpha: 0.95, movesPerLevel: 2000 } },
      { cooling: { kind: "lundyMees" as const, beta: 0.0002, t0: 40, tEnd: 0.1 }, rule: "logistic" as const },
      { cooling: { kind: "timeFraction" as const }, p0: 0.3, pEnd: 0.0005 },
      { cooling: { kind: "linear" as const, steps: 12 } },
    ];
    expect(formatTemperaturePlan(plans[0]!)).toBe("geometric:alpha=0.95,level=2000");
    expect(formatTemperaturePlan(plans[2]!)).toBe("time-based:p0=0.3,pend=0.0005");
    for (const plan of plans) {
      const text = formatTemperaturePlan(plan);
      expect(parseTemperaturePlan(text)).toEqual({ plan: { text, ...plan } });
    }
  });

  it("refuses what it cannot read with a message saying how to write it", () => {
    const error = (t: string): string => {
      const r = parseTemperaturePlan(t);
      return "error" in r ? r.error : "accepted";
    };
    expect(error("")).toMatch(/schedule name is missing/);
    expect(error("geometric:")).toMatch(/nothing follows the colon/);
    expect(error("cubic")).toMatch(/Cooling schedule "cubic" is not valid: enter one of geometric, linear, lundy-mees, time-based/);
    expect(error("lundy-mees:beta=-1")).toMatch(/Beta -1 is not valid/);
    expect(error("time-based:t0=1,tend=5")).toMatch(/T end 5 must be below T0 1/);
    expect(error("time-based:steps=5")).toMatch(/Steps does not apply to the Time-based schedule/);
  });

  it("applies a plan over the shared settings: its own rule and targets win, the rest stays", () => {
    const base = { ...PLAN_SETTINGS_DEFAULTS, p0: 0.4, seed: 9 };
    const parsed = parseTemperaturePlan("linear:pend=0.01");
    if (!("plan" in parsed)) throw new Error(parsed.error);
    expect(withTemperaturePlan(base, parsed.plan)).toEqual({ settings: { ...base, cooling: { kind: "linear", steps: 20 }, pEnd: 0.01 } });
    const crossed = parseTemperaturePlan("linear:pend=0.45");
    if (!("plan" in crossed)) throw new Error(crossed.error);
    expect(withTemperaturePlan(base, crossed.plan)).toEqual({ error: "Final acceptance 0.45 must be below the initial acceptance 0.4." });
  });
});
