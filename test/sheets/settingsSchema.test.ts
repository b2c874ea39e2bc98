// One settings schema for every input path: the Settings sheet, the CLI options and the pane form
// accept and refuse the same value with the same message, and a run record the CLI stored loads
// in the pane. Ranges are the product's own rules (invented for this project, not a standard).
import { readFile } from "node:fs/promises";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { settingFlags } from "../../src/cli/settingFlags.js";
import { main } from "../../src/cli/main.js";
import { parseSettingsSheet } from "../../src/sheets/parseSettingsSheet.js";
import { PLAN_SETTINGS_DEFAULTS } from "../../src/sheets/PlanSettings.js";
import { scenarioSettingsKey } from "../../src/sheets/scenarioSettingsKey.js";
import { SETTING_FIELDS } from "../../src/sheets/settingFields.js";
import { type SettingKey } from "../../src/sheets/settingFieldTypes.js";
import { parseRunRecord, planSettingsSchema } from "../../src/sheets/settingsSchema.js";
import { formFromSettings, settingsFromForm, type PaneForm } from "../../src/taskpane/settingsFromForm.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { captureIO, demoCopy } from "../workbook/harness.js";

const FORM: PaneForm = {
  scenario: "Plan 1",
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
  schedule: "geometric",
  alpha: "0.94",
  "moves-per-level": "",
  steps: "20",
  beta: "0.0001",
  temperatures: "calibrate",
  p0: "0.5",
  "p-end": "0.001",
  t0: "100",
  "t-end": "1",
};
const PANE_FIELD: Partial<Record<SettingKey, keyof PaneForm>> = {
  detourFactor: "detour",
  speedKmh: "speed",
  serviceMin: "service",
  seed: "seed",
  seconds: "seconds",
  alpha: "alpha",
  p0: "p0",
  pEnd: "p-end",
  rule: "rule",
};

/** The message of the sheet's issue without its "Settings!B1: " place. */
function sheetMessage(key: SettingKey, value: unknown): string[] {
  const r = parseSettingsSheet({
    sheet: "Settings",
    row: 0,
    col: 0,
    values: [[SETTING_FIELDS[key].label, value], ...(key === "alpha" ? [["Schedule", "geometric"]] : [])],
  });
  return r.issues.map((i) => i.message.replace(/^Settings!B\d+: /, ""));
}
function cliMessage(key: SettingKey, value: string): string[] {
  const flag = SETTING_FIELDS[key].flag;
  return settingFlags({ [flag]: value }).errors.map((e) => e.replace(`--${flag}: `, ""));
}
function paneMessage(key: SettingKey, value: string): string[] {
  const r = settingsFromForm({ ...FORM, [PANE_FIELD[key]!]: value });
  return r.issues.filter((i) => i.cell === SETTING_FIELDS[key].label).map((i) => i.message);
}

describe("one settings schema", () => {
  // Each value below was refused by one path and accepted (or worded differently) by another before.
  const cases: [SettingKey, string, string][] = [
    ["alpha", "0.3", ""], // accepted everywhere now: the pane used to refuse below 0.5
    ["alpha", "1", "Alpha 1 is not valid: enter a number above 0 and below 1, such as 0.94."],
    ["detourFactor", "3.5", "Detour factor 3.5 is not valid: enter a number from 1 to 3, such as 1.3."],
    ["detourFactor", "0.8", "Detour factor 0.8 is not valid: enter a number from 1 to 3, such as 1.3."],
    ["seed", "-4", "Seed -4 is not valid: enter a whole number from 0 to 4294967295, such as 1."],
    ["seed", "2.5", "Seed 2.5 is not valid: enter a whole number from 0 to 4294967295, such as 1."],
    ["speedKmh", "0", "Speed 0 is not valid: enter a number from 1 to 200 km/h, such as 40."],
    ["seconds", "abc", 'Time limit "abc" is not valid: enter a number above 0 up to 86400 seconds, such as 10.'],
    ["serviceMin", "-1", "Service time -1 is not valid: enter a number from 0 to 600 minutes, such as 5."],
    ["p0", "1", "Initial acceptance 1 is not valid: enter a number above 0 and below 1, such as 0.5."],
    ["rule", "greedy", 'Acceptance rule "greedy" is not valid: enter one of metropolis, logistic.'],
  ];
  for (const [key, value, message] of cases) {
    it(`${SETTING_FIELDS[key].label} ${value}: the same answer from the sheet, the CLI and the pane`, () => {
      const want = message === "" ? [] : [message];
      expect(sheetMessage(key, value)).toEqual(want);
      expect(cliMessage(key, value)).toEqual(want);
      expect(paneMessage(key, value)).toEqual(want);
    });
  }

  it("a number typed in a cell and the same number as text read alike", () => {
    expect(sheetMessage("detourFactor", 0.8)).toEqual(sheetMessage("detourFactor", "0.8"));
  });

  it("old schedule tokens stay accepted on input: time (CLI) and time-fraction (sheet) mean time-based", () => {
    for (const token of ["time", "time-fraction", "time-based", "Time-based"]) {
      expect(settingFlags({ schedule: token }).schedule.kind).toBe("timeFraction");
      expect(parseSettingsSheet({ sheet: "S", row: 0, col: 0, values: [["Schedule", token]] }).settings.cooling).toEqual({
        kind: "timeFraction",
      });
    }
  });

  it("the defaults satisfy the schema", () => {
    expect(planSettingsSchema.safeParse(PLAN_SETTINGS_DEFAULTS).success).toBe(true);
  });

  it("a run record the CLI wrote loads in the pane's Rerun path and gives the same settings back", async () => {
    const { dir, path } = await demoCopy();
    const out = join(dir, "odd.xlsx");
    // Values at the edges of the ranges that the paths used to disagree on.
    const flags = ["--moves", "3000", "--seed", "0", "--detour", "2.5", "--schedule", "geometric", "--alpha", "0.3"];
    const cap = captureIO();
    expect(await main(["plan", path, ...flags, "--scenario", "Odd", "--out", out], cap.io)).toBe(0);
    const book = await ExcelJsWorkbook.fromBuffer(await readFile(out));
    const stored = (await book.readSettings())[scenarioSettingsKey("Odd")];
    expect(stored).toBeDefined();
    const loaded = parseRunRecord(stored!);
    if (!loaded.ok) throw new Error(loaded.message);
    const back = settingsFromForm(formFromSettings(loaded.record.settings, loaded.record.scenario, FORM));
    expect(back.issues).toEqual([]);
    // The pane runs on a time limit; everything else comes back as the CLI ran it.
    const { moves: _moves, ...rest } = loaded.record.settings;
    expect(back.settings).toEqual(rest);
    expect(back.settings).toMatchObject({ seed: 0, detourFactor: 2.5, cooling: { kind: "geometric", alpha: 0.3 } });
  });

  it("a damaged run record is refused with the field that is wrong", () => {
    const bad = parseRunRecord(JSON.stringify({ scenario: "x", settings: { detourFactor: 9 } }));
    expect(bad.ok).toBe(false);
    expect(parseRunRecord("not json")).toEqual({ ok: false, message: "the stored text is not JSON" });
  });
});
