// The dispatcher's rule columns (pickups, pins, breaks, working-time limits): read into the model,
// and every defect reported at its cell with a fix. Small invented tables; cell addresses follow
// A1 notation (ECMA-376 Part 1, §18.3.1.4).
import { describe, expect, it } from "vitest";
import type { Issue } from "../../src/core/model.js";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });
const STOPS = ["Stop", "Latitude", "Longitude", "Demand crates", "Collect crates", "Van", "Not vehicle"];
const FLEET = [
  "Vehicle",
  "Count",
  "Capacity crates",
  "Start latitude",
  "Start longitude",
  "Drive before break (h)",
  "Break min",
  "Break from",
  "Break to",
  "Max driving h",
  "Max duty h",
  "Max km",
];

function read(stopRows: unknown[][], fleetRows: unknown[][]) {
  return readProblem({ stops: sheet("Stops", [STOPS, ...stopRows]), fleet: sheet("Fleet", [FLEET, ...fleetRows]) });
}

function issues(r: ReturnType<typeof readProblem>): readonly Issue[] {
  if (r.ok) throw new Error("expected issues, got a problem");
  return r.issues;
}

function expectIssue(list: readonly Issue[], sheetName: string, cell: string, phrase: string): void {
  const hit = list.find((i) => i.sheet === sheetName && i.cell === cell && i.message.includes(phrase));
  expect(hit, `no issue at ${sheetName}!${cell} with "${phrase}" in ${JSON.stringify(list, null, 1)}`).toBeDefined();
}

const VAN = ["Van A", 2, 20, 45.75, 4.85, 4.5, 45, "12:00", "13:30", 9, "10:30", 250];
const TRUCK = ["Truck", 1, 40, 45.75, 4.85, "", "", "", "", "", "", ""];

describe("readProblem: pickups, pins, breaks and working-time limits", () => {
  it("reads the columns into the model (hours to minutes, a row name pins every vehicle of its row)", () => {
    const r = read(
      [
        ["S1", 45.76, 4.83, 5, 3, "Van A", ""],
        ["S2", 45.77, 4.84, 2, "", "", "Truck; Van A 1"],
      ],
      [VAN, TRUCK],
    );
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const [s1, s2] = r.problem.stops;
    expect(s1!.pickup).toEqual([3]);
    expect(s1!.allowedVehicles).toEqual(["Van A 1", "Van A 2"]);
    expect(s2!.pickup).toBeUndefined();
    expect(s2!.excludedVehicles).toEqual(["Truck", "Van A 1"]);
    const van = r.problem.vehicles[0]!;
    expect(van.drivingBreak).toEqual({ driveMin: 270, breakMin: 45 });
    expect(van.windowBreak).toEqual({ earliestMin: 720, latestMin: 810, breakMin: 45 });
    expect([van.maxDrivingMin, van.maxDutyMin, van.maxKm]).toEqual([540, 630, 250]);
    const truck = r.problem.vehicles[2]!;
    expect(truck.drivingBreak).toBeUndefined();
    expect(truck.maxKm).toBeUndefined();
  });

  it("names the cell of an unknown pin and of a pin no vehicle can serve", () => {
    const list = issues(
      read(
        [
          ["S1", 45.76, 4.83, 5, 0, "Van Z", ""],
          ["S2", 45.77, 4.84, 30, 0, "Van A", ""],
          ["S3", 45.77, 4.84, 1, 0, "Truck", "Truck"],
        ],
        [VAN, TRUCK],
      ),
    );
    expectIssue(list, "Stops", "F2", 'names vehicle "Van Z", which the fleet does not have');
    expectIssue(list, "Stops", "F3", "pinned to vehicles that cannot serve it (Van A 1 carries at most 20, the stop needs 30");
    expectIssue(list, "Stops", "F4", "no vehicle left");
  });

  it("names the cell of a break rule without its length, half a break window and hours that are not hours", () => {
    const list = issues(
      read(
        [["S1", 45.76, 4.83, 5, 0, "", ""]],
        [
          ["Van A", 1, 20, 45.75, 4.85, 4.5, "", "12:00", "", "", "", ""],
          ["Truck", 1, 40, 45.75, 4.85, "", 30, "", "", "x", "", ""],
        ],
      ),
    );
    expectIssue(list, "Fleet", "G2", "no break length");
    expectIssue(list, "Fleet", "I2", "only one end of its break window");
    expectIssue(list, "Fleet", "G3", "no rule that uses it");
    expectIssue(list, "Fleet", "J3", 'max driving "x" is not a number of hours');
  });

  it("a Collect column without a matching load dimension is reported at its header", () => {
    const r = readProblem({
      stops: sheet("Stops", [
        ["Stop", "Latitude", "Longitude", "Demand kg", "Returns crates"],
        ["S1", 45.76, 4.83, 5, 1],
      ]),
      fleet: sheet("Fleet", [
        ["Vehicle", "Capacity kg", "Start latitude", "Start longitude"],
        ["Van", 100, 45.75, 4.85],
      ]),
    });
    expectIssue(issues(r), "Stops", "E1", 'pickup column "crates" has no load dimension of that name');
  });
});
