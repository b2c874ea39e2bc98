// Every user-data defect comes back as an Issue naming sheet and cell, with a fix; nothing throws.
// Small invented tables; cell addresses follow A1 notation (ECMA-376 Part 1, §18.3.1.4).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { Issue } from "../../src/core/model.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import type { SheetRead } from "../../src/sheets/grid.js";

const sheet = (name: string, values: unknown[][], row = 0, col = 0): SheetRead => ({ sheet: name, row, col, values });
const STOP_HEADER = ["Stop", "Name", "Address", "Latitude", "Longitude", "Demand", "Earliest", "Latest"];
const FLEET_HEADER = ["Vehicle", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"];
const OK_STOP = ["S1", "Bakery", "1 Main St", 45.76, 4.83, 10, "09:00", "11:00"];
const OK_VAN = ["Van", 100, 45.75, 4.85, "07:00", "17:00"];

function read(stopRows: unknown[][], fleetRows: unknown[][] = [OK_VAN], extra: Partial<Parameters<typeof readProblem>[0]> = {}) {
  return readProblem({ stops: sheet("Stops", [STOP_HEADER, ...stopRows]), fleet: sheet("Fleet", [FLEET_HEADER, ...fleetRows]), ...extra });
}

function issues(r: ReturnType<typeof readProblem>): readonly Issue[] {
  if (r.ok) throw new Error("expected issues, got a problem");
  return r.issues;
}

function expectIssue(list: readonly Issue[], sheetName: string, cell: string, phrase: string): void {
  const hit = list.find((i) => i.sheet === sheetName && i.cell === cell && i.message.includes(phrase));
  expect(hit, `no issue at ${sheetName}!${cell} with "${phrase}" in ${JSON.stringify(list, null, 1)}`).toBeDefined();
  expect(hit!.message.startsWith(`${sheetName}!${cell}: `)).toBe(true);
}

describe("readProblem reports defects by sheet and cell", () => {
  it("latitude 123.4 is outside -90..90 (the message example of DESIGN.md §5), longitude outside -180..180", () => {
    const list = issues(read([OK_STOP, ["S2", "B", "", 123.4, 4.8, 1, "", ""], ["S3", "C", "", 45, -181, 1, "", ""]]));
    expectIssue(list, "Stops", "D3", "latitude 123.4 is outside -90..90");
    expectIssue(list, "Stops", "E4", "longitude -181 is outside -180..180");
  });

  it("uses the sheet's real addresses when the range does not start at A1", () => {
    const stops = sheet("Stops", [STOP_HEADER, ["S1", "B", "", 123.4, 4.8, 1, "", ""]], 5, 2);
    const r = readProblem({ stops, fleet: sheet("Fleet", [FLEET_HEADER, OK_VAN]) });
    expectIssue(issues(r), "Stops", "F7", "outside -90..90");
  });

  it("non-numeric and negative demand", () => {
    const list = issues(
      read([
        ["S1", "A", "", 45, 4, "ten", "", ""],
        ["S2", "B", "", 45, 4, -3, "", ""],
      ]),
    );
    expectIssue(list, "Stops", "F2", `demand "ten" is not a number`);
    expectIssue(list, "Stops", "F3", "demand -3 is below 0");
  });

  it("negative, missing and non-numeric capacity", () => {
    const list = issues(
      read(
        [OK_STOP],
        [
          ["A", -5, 45, 4, "", ""],
          ["B", "", 45, 4, "", ""],
          ["C", "lots", 45, 4, "", ""],
        ],
      ),
    );
    expectIssue(list, "Fleet", "B2", "capacity -5 is below 0");
    expectIssue(list, "Fleet", "B3", `capacity is missing for vehicle "B"`);
    expectIssue(list, "Fleet", "B4", `capacity "lots" is not a number`);
  });

  it("every Excel error value (#N/A, #VALUE!, #REF!, #DIV/0!, #NAME?, #NUM!, #NULL!) in a read cell", () => {
    const errors = ["#N/A", "#VALUE!", "#REF!", "#DIV/0!", "#NAME?", "#NUM!", "#NULL!"];
    const rows = errors.map((e, i) => [`S${i}`, "A", "", i % 2 === 0 ? e : 45, i % 2 === 0 ? 4 : e, 1, "", ""]);
    const list = issues(read(rows, [["Van", { error: "#N/A" }, 45, 4, "", ""]]));
    errors.forEach((e, i) => expectIssue(list, "Stops", `${i % 2 === 0 ? "D" : "E"}${i + 2}`, `Excel error ${e}`));
    expectIssue(list, "Fleet", "B2", "Excel error #N/A");
  });

  it("duplicate stop ids name both rows; a blank id in a Stop column is an issue", () => {
    const list = issues(read([OK_STOP, ["S1", "Again", "", 45, 4, 1, "", ""], ["", "Nameless", "", 45, 4, 1, "", ""]]));
    expectIssue(list, "Stops", "A3", `stop id "S1" is used twice (also on row 2)`);
    expectIssue(list, "Stops", "A4", "stop id is empty");
  });

  it("a row with an address but no coordinates says how to add them", () => {
    const list = issues(read([["S1", "A", "5 High St", "", "", 1, "", ""]]));
    expectIssue(list, "Stops", "D2", "has an address but no coordinates");
    expectIssue(list, "Stops", "D2", "geography option");
  });

  it("a depot address typed where the depot's coordinates go says a geocoding service can look it up; a bad number does not", () => {
    const fleet = sheet("Fleet", [
      ["Vehicle", "Capacity", "Depot", "End depot", "Shift start", "Shift end"],
      ["Van 1", 30, "1 Oven Row, Crustwick", "8 Flour Quay, Crustwick", "05:00", "13:00"],
      ["Van 2", 30, "95, 4.3", "", "05:00", "13:00"],
    ]);
    const list = issues(readProblem({ stops: sheet("Stops", [STOP_HEADER, OK_STOP]), fleet }));
    expectIssue(list, "Fleet", "C2", "set up a geocoding service (--geocoder, or Geocoding in the pane)");
    expectIssue(list, "Fleet", "D2", "set up a geocoding service (--geocoder, or Geocoding in the pane)");
    expectIssue(list, "Fleet", "C3", '"95, 4.3" is not "latitude, longitude"');
    expect(list.find((i) => i.cell === "C3")!.message).not.toContain("geocoding");
  });

  it("a header row with no coordinate columns, and an address-only table", () => {
    const stops = sheet("Stops", [
      ["Stop", "Name", "Address"],
      ["S1", "A", "5 High St"],
    ]);
    const list = issues(readProblem({ stops, fleet: sheet("Fleet", [FLEET_HEADER, OK_VAN]) }));
    expectIssue(list, "Stops", "A1", "no coordinate columns");
    expectIssue(list, "Stops", "A1", "geography option");
  });

  it("an empty table, an empty sheet and a sheet without a header row", () => {
    expectIssue(issues(read([])), "Stops", "A2", "no stops");
    const empty = readProblem({ stops: sheet("Stops", [[""]]), fleet: sheet("Fleet", [FLEET_HEADER, OK_VAN]) });
    expectIssue(issues(empty), "Stops", "A1", "the sheet is empty");
    const noHeader = readProblem({
      stops: sheet("Stops", [
        ["hello", "world"],
        [1, 2],
      ]),
      fleet: sheet("Fleet", [FLEET_HEADER]),
    });
    expectIssue(issues(noHeader), "Stops", "A1", "no header row found");
    expectIssue(issues(noHeader), "Fleet", "A2", "no vehicles");
  });

  it("a fleet without depot columns, and a demand column without a capacity column", () => {
    const r = readProblem({
      stops: sheet("Stops", [STOP_HEADER, OK_STOP]),
      fleet: sheet("Fleet", [
        ["Vehicle", "Shift start", "Shift end"],
        ["Van", "07:00", "17:00"],
      ]),
    });
    expectIssue(issues(r), "Fleet", "A1", "no depot coordinate columns");
    const noCap = readProblem({
      stops: sheet("Stops", [STOP_HEADER, OK_STOP]),
      fleet: sheet("Fleet", [
        ["Vehicle", "Lat", "Lon"],
        ["Van", 45, 4],
      ]),
    });
    expectIssue(issues(noCap), "Fleet", "A1", "no Capacity column");
  });

  it("demand units without a matching capacity unit", () => {
    const r = readProblem({
      stops: sheet("Stops", [
        ["Stop", "Lat", "Lon", "Demand kg", "Demand crates"],
        ["S1", 45, 4, 1, 1],
      ]),
      fleet: sheet("Fleet", [
        ["Van", "Lat", "Lon", "Capacity kg"],
        ["A", 45, 4, 10],
      ]),
    });
    expectIssue(issues(r), "Stops", "E1", `"Demand crates" has no matching capacity column`);
  });

  it("a stop whose every window closes before every shift starts, or opens after every shift ends, is planned around: a warning naming the cell (one rule for bad data)", () => {
    const r = read([["S8", "A", "", 45, 4, 1, "05:00", "06:00"], ["S9", "B", "", 45, 4, 1, "18:00", "19:00"], OK_STOP]);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const at = (cell: string): string => r.warnings.find((w) => w.cell === cell)?.message ?? "";
    expect(at("G2")).toContain("closes before any vehicle's shift starts (first shift start 07:00)");
    expect(at("G2")).toContain("left unassigned");
    expect(at("G3")).toContain("opens after every vehicle's shift ends (last shift end 17:00)");
    expect(r.warnings).toHaveLength(2);
  });

  it("the same window is only a warning under soft windows (it can be served late)", () => {
    const r = read([["S1", "A", "", 45, 4, 1, "05:00", "06:00"]], [OK_VAN], { settings: sheet("Settings", [["Windows", "Soft"]]) });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.warnings.some((w) => w.cell === "G2" && w.message.includes("served late"))).toBe(true);
  });

  it("a stop whose demand exceeds every vehicle's capacity is a warning, not an error", () => {
    const r = read([OK_STOP, ["S2", "Big", "", 45, 4, 150, "", ""]], [OK_VAN, ["Small", 50, 45, 4, "", ""]]);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.stops.length).toBe(2);
    expect(r.warnings).toHaveLength(1);
    expect(r.warnings[0]).toMatchObject({ sheet: "Stops", cell: "F3" });
    expect(r.warnings[0]!.message).toContain("exceeds every vehicle's capacity");
  });

  it("bad times, durations, counts and shift ends", () => {
    const stops = sheet("Stops", [
      ["Stop", "Lat", "Lon", "Earliest", "Latest", "Service min"],
      ["S1", 45, 4, "25:00", "abc", "long"],
    ]);
    const fleet = sheet("Fleet", [
      ["Van", "Count", "Lat", "Lon", "Shift start", "Shift end", "Speed km/h"],
      ["A", 1.5, 45, 4, "08:00", "08:00", 0],
    ]);
    const list = issues(readProblem({ stops, fleet }));
    expectIssue(list, "Stops", "D2", `earliest time "25:00" is not a time of day`);
    expectIssue(list, "Stops", "E2", `latest time "abc" is not a time of day`);
    expectIssue(list, "Stops", "F2", `service time "long" is not a duration`);
    expectIssue(list, "Fleet", "B2", "count 1.5 is not a whole number");
    expectIssue(list, "Fleet", "F2", "ends when it starts");
    expectIssue(list, "Fleet", "G2", "speed (km/h) 0 must be above 0");
  });

  it("unknown setting keys and unknown setting values", () => {
    const settings = sheet(
      "Settings",
      [
        ["Setting", "Value"],
        ["Colour", "blue"],
        ["Schedule", "quadratic"],
        ["Acceptance", "greedy"],
        ["Detour factor", 0.8],
        ["Windows", "maybe"],
      ],
      2,
      3,
    );
    const list = issues(read([OK_STOP], [OK_VAN], { settings }));
    expectIssue(list, "Settings", "D4", `unknown setting "Colour"`);
    expectIssue(
      list,
      "Settings",
      "E5",
      `Cooling schedule "quadratic" is not valid: enter one of geometric, linear, lundy-mees, time-based.`,
    );
    expectIssue(list, "Settings", "E6", `Acceptance rule "greedy" is not valid: enter one of metropolis, logistic.`);
    expectIssue(list, "Settings", "E7", "Detour factor 0.8 is not valid: enter a number from 1 to 3, such as 1.3.");
    expectIssue(list, "Settings", "E8", "hard, soft");
  });

  it("schedule parameters that do not fit", () => {
    const settings = sheet("Settings", [
      ["Schedule", "Lundy-Mees"],
      ["Alpha", 0.9],
    ]);
    const list = issues(read([OK_STOP], [OK_VAN], { settings }));
    expectIssue(list, "Settings", "B2", "Alpha does not apply to the Lundy–Mees schedule; clear it or choose the Geometric schedule.");
    // Lundy-Mees without Beta is no longer an issue: beta is fitted to the run's budget.
    expect(list.filter((i) => /Beta/.test(i.message))).toEqual([]);
  });

  it("a matrix sheet missing a location or holding a bad distance", () => {
    const matrix = sheet("Km", [
      ["km", "Depot", "S1"],
      ["Depot", 0, "far"],
    ]);
    const list = issues(read([OK_STOP], [OK_VAN], { matrix }));
    expectIssue(list, "Km", "A1", `location "S1" has no row`);
    const bad = sheet("Km", [
      ["km", "Depot", "S1"],
      ["Depot", 0, "far"],
      ["S1", 3, 0],
    ]);
    expectIssue(issues(read([OK_STOP], [OK_VAN], { matrix: bad })), "Km", "C2", `"far" is not a distance`);
  });

  it("a Count of 0 leaves a row out; a fleet with no vehicle left is an issue", () => {
    const fleet = sheet("Fleet", [
      ["Van", "Count", "Capacity", "Lat", "Lon"],
      ["A", 0, 10, 45, 4],
      ["B", 2, 10, 45, 4],
    ]);
    const two = readProblem({ stops: sheet("Stops", [STOP_HEADER, OK_STOP]), fleet });
    if (!two.ok) throw new Error(JSON.stringify(two.issues));
    expect(two.problem.vehicles.map((v) => v.id)).toEqual(["B 1", "B 2"]);
    const none = sheet("Fleet", [
      ["Van", "Count", "Capacity", "Lat", "Lon"],
      ["A", 0, 10, 45, 4],
    ]);
    expectIssue(
      issues(readProblem({ stops: sheet("Stops", [STOP_HEADER, OK_STOP]), fleet: none })),
      "Fleet",
      "A1",
      "no vehicle is available",
    );
  });

  it("reports all defects of the tables at once", () => {
    const list = issues(
      read(
        [
          ["S1", "A", "", 123.4, 4, "x", "", ""],
          ["S1", "B", "", 45, 4, 1, "", ""],
        ],
        [["Van", -1, 45, 4, "", ""]],
      ),
    );
    expect(list.map((i) => `${i.sheet}!${i.cell}`).sort()).toEqual(["Fleet!B2", "Stops!A3", "Stops!D2", "Stops!F2"]);
  });

  it("never throws on arbitrary cell grids (property, fast-check)", () => {
    const cell = fc.oneof(
      fc.string(),
      fc.double(),
      fc.integer(),
      fc.boolean(),
      fc.constant(""),
      fc.constant(null),
      fc.constantFrom("Stop", "Latitude", "Longitude", "Demand", "Earliest", "Latest", "Capacity", "#N/A", "08:00", "45°N", "Count"),
    );
    const grid = fc.array(fc.array(cell, { maxLength: 8 }), { maxLength: 8 });
    fc.assert(
      fc.property(grid, grid, grid, (s, f, t) => {
        const r = readProblem({ stops: sheet("Stops", s), fleet: sheet("Fleet", f), settings: sheet("Settings", t) });
        // Issues name the user's sheets; a model path ("stops[3]") would mean the reader let a defect through.
        if (!r.ok) expect(r.issues.length).toBeGreaterThan(0);
        if (!r.ok) for (const i of r.issues) expect(["Stops", "Fleet", "Settings", "options"]).toContain(i.sheet);
      }),
      { numRuns: 300 },
    );
  });

  it("a shift that starts at 24:00 with a blank end (24:00) is empty: the cell says so (found by the property below)", () => {
    const r = read([OK_STOP], [["Late van", 100, 45.75, 4.85, "24:00", ""]]);
    expectIssue(issues(r), "Fleet", "E2", "ends when it starts");
  });

  it("near-valid random tables give either a consistent problem or cell issues, never model-level ones (property, fast-check)", () => {
    const time = fc.oneof(
      fc.constant(""),
      fc.integer({ min: 0, max: 26 }).map((h) => `${h}:${h % 2 === 0 ? "00" : "30"}`),
      fc.double({ min: 0, max: 1, noNaN: true }),
    );
    const stopRow = fc.tuple(
      fc.constantFrom("S1", "S2", "S3", "S4", "S5", ""),
      fc.constant("n"),
      fc.constant(""),
      fc.double({ min: -100, max: 100, noNaN: true }),
      fc.double({ min: -200, max: 200, noNaN: true }),
      fc.oneof(fc.integer({ min: -2, max: 120 }), fc.constant("x"), fc.constant("")),
      time,
      time,
    );
    const vanRow = fc.tuple(fc.constantFrom("A", "B", "C"), fc.integer({ min: -1, max: 150 }), fc.constant(45), fc.constant(4), time, time);
    fc.assert(
      fc.property(fc.array(stopRow, { minLength: 1, maxLength: 6 }), fc.array(vanRow, { minLength: 1, maxLength: 3 }), (srows, vrows) => {
        const r = readProblem({ stops: sheet("Stops", [STOP_HEADER, ...srows]), fleet: sheet("Fleet", [FLEET_HEADER, ...vrows]) });
        if (r.ok) {
          expect(r.problem.stops.length).toBe(srows.length);
          for (const st of r.problem.stops) expect(st.windows.every((w) => w.latestMin >= w.earliestMin)).toBe(true);
        } else {
          for (const i of r.issues) expect(["Stops", "Fleet"]).toContain(i.sheet);
          for (const i of r.issues) expect(i.message.startsWith(`${i.sheet}!${i.cell}: `)).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });
});
