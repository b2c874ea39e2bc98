// Break defaults in the Settings sheet (and as CLI options): the user's own rule for every vehicle
// when the Fleet has no break columns. Hand-worked conversions (hours to minutes, 12:00 = 720 min
// from midnight); the values are invented test data, not a legal rule.
import { describe, expect, it } from "vitest";
import type { Issue } from "../../src/core/model.js";
import { settingFlags } from "../../src/cli/settingFlags.js";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });
const STOPS = sheet("Stops", [
  ["Stop", "Latitude", "Longitude", "Demand"],
  ["S1", 45.76, 4.83, 5],
]);
const PLAIN_FLEET = sheet("Fleet", [
  ["Vehicle", "Count", "Capacity", "Start latitude", "Start longitude"],
  ["Van", 2, 20, 45.75, 4.85],
]);
const BREAK_FLEET = sheet("Fleet", [
  ["Vehicle", "Capacity", "Start latitude", "Start longitude", "Drive before break", "Break min"],
  ["Own rule", 20, 45.75, 4.85, 3, 20],
  ["No rule", 20, 45.75, 4.85, "", ""],
]);
const settings = (rows: unknown[][]): SheetRead => sheet("Settings", [["Setting", "Value"], ...rows]);

function issues(r: ReturnType<typeof readProblem>): readonly Issue[] {
  if (r.ok) throw new Error("expected issues, got a problem");
  return r.issues;
}

describe("break defaults (Settings sheet and options)", () => {
  it("give every vehicle the Settings' rule when the Fleet has no break columns (4.5 h = 270 min; 0.5 day = 12:00 = 720 min)", () => {
    const r = readProblem({
      stops: STOPS,
      fleet: PLAIN_FLEET,
      settings: settings([
        ["Drive before break", 4.5],
        ["Break min", 45],
        ["Break from", 0.5],
        ["Break to", "13:30"],
        ["Window break min", 30],
      ]),
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    for (const v of r.problem.vehicles) {
      expect(v.drivingBreak).toEqual({ driveMin: 270, breakMin: 45 });
      expect(v.windowBreak).toEqual({ earliestMin: 720, latestMin: 810, breakMin: 30 });
    }
  });

  it("leave a Fleet with break columns alone: its rows' own rules, and none for a blank row", () => {
    const r = readProblem({
      stops: STOPS,
      fleet: BREAK_FLEET,
      settings: settings([
        ["Drive before break", 4.5],
        ["Break min", 45],
      ]),
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.vehicles.map((v) => v.drivingBreak)).toEqual([{ driveMin: 180, breakMin: 20 }, undefined]);
  });

  it("have no value unless the user gives one: no vehicle gets a break from the defaults", () => {
    const r = readProblem({ stops: STOPS, fleet: PLAIN_FLEET });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.vehicles.every((v) => v.drivingBreak === undefined && v.windowBreak === undefined)).toBe(true);
  });

  it("refuse half a rule at the Settings row that needs its other half", () => {
    const list = issues(readProblem({ stops: STOPS, fleet: PLAIN_FLEET, settings: settings([["Drive before break", 4.5]]) }));
    expect(list.some((i) => i.sheet === "Settings" && i.cell === "Drive before break" && i.message.includes("needs a Break min"))).toBe(
      true,
    );
    const window = issues(
      readProblem({
        stops: STOPS,
        fleet: PLAIN_FLEET,
        settings: settings([
          ["Break from", "12:00"],
          ["Break to", "12:20"],
          ["Break min", 30],
        ]),
      }),
    );
    expect(window.some((i) => i.cell === "Break to" && i.message.includes("shorter than the 30 min break"))).toBe(true);
  });

  it("come from CLI options too, read by the same schema (times as h:mm)", () => {
    const flags = settingFlags({ "break-from": "12:00", "break-to": "13:30", "break-min": "30" });
    expect(flags.errors).toEqual([]);
    expect(flags.overrides).toMatchObject({ breakFrom: 720, breakTo: 810, breakMin: 30 });
    const bad = settingFlags({ "break-from": "25:00" });
    expect(bad.errors[0]).toMatch(/^--break-from: Break from "25:00" is not valid/);
    const r = readProblem({ stops: STOPS, fleet: PLAIN_FLEET }, flags.overrides);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.vehicles[0]!.windowBreak).toEqual({ earliestMin: 720, latestMin: 810, breakMin: 30 });
  });
});
