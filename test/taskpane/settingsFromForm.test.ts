import { describe, expect, it } from "vitest";
import { PLAN_SETTINGS_DEFAULTS } from "../../src/sheets/PlanSettings.js";
import { formFromSettings, settingsFromForm, type PaneForm } from "../../src/taskpane/settingsFromForm.js";

const FORM: PaneForm = {
  scenario: "Plan 3",
  detour: "1.3",
  speed: "40",
  service: "5",
  windows: "hard",
  "late-cost": "1",
  seconds: "10",
  seed: "1",
  "stability-cost": "",
  workers: "1",
  rule: "metropolis",
  schedule: "timeFraction",
  alpha: "0.94",
  "moves-per-level": "20000",
  steps: "20",
  beta: "0.0001",
  temperatures: "calibrate",
  p0: "0.5",
  "p-end": "0.001",
  t0: "100",
  "t-end": "1",
};

describe("settingsFromForm", () => {
  it("the pane's initial fields give the plan-settings defaults (detour 1.3 and 40 km/h: common practice)", () => {
    const r = settingsFromForm(FORM);
    expect(r.issues).toEqual([]);
    expect(r.scenario).toBe("Plan 3");
    // The Workers field always says how many chains run (1 in this form).
    expect(r.settings).toEqual({ ...PLAN_SETTINGS_DEFAULTS, workers: 1 });
  });

  it("reads the Workers field with the settings schema's range (1 to 64) and message", () => {
    expect(settingsFromForm({ ...FORM, workers: "3" }).settings.workers).toBe(3);
    for (const bad of ["0", "65", "2.5", ""]) {
      const r = settingsFromForm({ ...FORM, workers: bad });
      expect(r.issues.map((i) => [i.cell, i.message])).toEqual([
        ["Workers", expect.stringMatching(/^Workers .*(is not valid|is empty): enter a whole number from 1 to 64, such as 2\.$/)],
      ]);
    }
    // A stored record without Workers (older plans) leaves the field as it is.
    expect(formFromSettings(PLAN_SETTINGS_DEFAULTS, "Plan 2", { ...FORM, workers: "5" }).workers).toBe("5");
  });

  it("reports every bad field at once, naming the field and the allowed range, and never throws", () => {
    const r = settingsFromForm({ ...FORM, detour: "0.8", speed: "", seconds: "abc" });
    expect(r.issues.map((i) => i.cell)).toEqual(["Detour factor", "Speed", "Time limit"]);
    expect(r.issues[0]!.message).toBe("Detour factor 0.8 is not valid: enter a number from 1 to 3, such as 1.3.");
    expect(r.issues[1]!.message).toBe("Speed is empty: enter a number from 1 to 200 km/h, such as 40.");
    expect(r.settings.detourFactor).toBe(PLAN_SETTINGS_DEFAULTS.detourFactor);
  });

  it("leaves blank factor, beta and typed temperatures to fitting and calibration", () => {
    const lundy = settingsFromForm({ ...FORM, schedule: "lundyMees", beta: "" });
    expect(lundy.issues).toEqual([]);
    expect(lundy.settings.cooling).toEqual({ kind: "lundyMees" });
    const geo = settingsFromForm({ ...FORM, schedule: "geometric", alpha: "", "moves-per-level": "500" });
    expect(geo.settings.cooling).toEqual({ kind: "geometric", movesPerLevel: 500 });
    const blankTemps = settingsFromForm({ ...FORM, temperatures: "manual", t0: "", "t-end": "" });
    expect(blankTemps.issues).toEqual([]);
    expect(blankTemps.settings.cooling).toEqual({ kind: "timeFraction" });
  });

  it("builds each cooling schedule with its own parameters; manual temperatures override calibration", () => {
    expect(settingsFromForm({ ...FORM, schedule: "geometric" }).settings.cooling).toEqual({
      kind: "geometric",
      alpha: 0.94,
      movesPerLevel: 20000,
    });
    expect(settingsFromForm({ ...FORM, schedule: "linear", temperatures: "manual" }).settings.cooling).toEqual({
      kind: "linear",
      steps: 20,
      t0: 100,
      tEnd: 1,
    });
    expect(settingsFromForm({ ...FORM, schedule: "lundyMees" }).settings.cooling).toEqual({ kind: "lundyMees", beta: 0.0001 });
    const upside = settingsFromForm({ ...FORM, temperatures: "manual", t0: "1", "t-end": "5" });
    expect(upside.issues.map((i) => i.cell)).toEqual(["T end"]);
  });

  it("formFromSettings then settingsFromForm gives the stored settings back (Rerun)", () => {
    const stored = {
      ...PLAN_SETTINGS_DEFAULTS,
      detourFactor: 1.4,
      hardWindows: false,
      lateCostPerMin: 2.5,
      seed: 42,
      seconds: 30,
      rule: "logistic" as const,
      cooling: { kind: "geometric" as const, alpha: 0.9, movesPerLevel: 500 },
      p0: 0.4,
      pEnd: 0.01,
      stabilityCost: 500,
      workers: 3,
    };
    const back = settingsFromForm(formFromSettings(stored, "Plan 7", FORM));
    expect(back.issues).toEqual([]);
    expect(back.scenario).toBe("Plan 7");
    expect(back.settings).toEqual(stored);
  });
});
