import { describe, expect, it } from "vitest";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import type { CellBlock, CellValue } from "../../src/sheets/grid.js";
import { COMPARE_HEADER, layoutCompareHeader, layoutCompareRow } from "../../src/sheets/layoutCompare.js";
import { layoutPlan } from "../../src/sheets/layoutPlan.js";
import { extraHeaders, plan, problem, run, stopRows, CREATED_SERIAL } from "../fixtures/writerPlan.js";

/**
 * The route-table header of DESIGN.md §5 as issue 8 widens it: Address beside Name, and Load as
 * one numeric column per load dimension followed by the Drop columns.
 */
const DESIGN_ROUTE_HEADER =
  "Vehicle | Seq | Stop | Name | Address | Arrival | Wait min | Start | Departure | Load kg | Load crates | Drop kg | Drop crates | Leg km | Total km | Earliest | Latest | Late min | Latitude | Longitude";
/** DESIGN.md §5's Compare header plus "Must-serve left out" after Unassigned (issue 9 asks Compare to say it). */
const DESIGN_COMPARE_HEADER =
  "Scenario | Vehicles | Km | Hours | Cost | Late min | Unassigned | Must-serve left out | Schedule | Seed | Created | Changed vehicle";

/** The layout as the golden file holds it: indented JSON. `npx vitest run -u` rewrites the files; review the diff by eye. */
const goldenJson = (actual: unknown): string => JSON.stringify(actual, null, 1) + "\n";

const layout = layoutPlan({ problem, plan, run, stopRows, extraHeaders });
const { values, numberFormats } = layout.grid;
const at = (r: number, c: number): CellValue => values[r]![c]!;
const fmt = (r: number, c: number): string | null => numberFormats![r]![c]!;
const col = (name: string): number => values[layout.routeTable.row]!.indexOf(name);
const routeRows = (): (readonly CellValue[])[] => values.slice(layout.routeTable.row + 1, layout.routeTable.row + layout.routeTable.rows);
const blockCells = (b: CellBlock): CellValue[] => {
  const out: CellValue[] = [];
  for (let r = b.row; r < b.row + b.rows; r++) for (let c = b.col; c < b.col + b.cols; c++) out.push(at(r, c));
  return out;
};

describe("layoutPlan golden files (invented data: layout rules only)", () => {
  it("the scenario sheet matches test/fixtures/writePlanLayout.golden.json", async () => {
    await expect(goldenJson(layout)).toMatchFileSnapshot("../fixtures/writePlanLayout.golden.json");
  });
  it("the Compare header and row match test/fixtures/writeCompare.golden.json", async () => {
    const compare = { header: layoutCompareHeader(), row: layoutCompareRow(run, plan) };
    await expect(goldenJson(compare)).toMatchFileSnapshot("../fixtures/writeCompare.golden.json");
  });
});

describe("scenario sheet layout (DESIGN.md §5)", () => {
  it("the title says when stops that must be served are left out", () => {
    const short = { ...plan, totals: { ...plan.totals, mustServeUnassigned: 3 } };
    expect(layoutPlan({ problem, plan: short, run }).grid.values[0]![0]).toBe(
      "Kiln plan: -Tuesday late. 3 stops that must be served are NOT served; see the unassigned table below",
    );
  });

  it("has a title line, then the caution line", () => {
    expect(at(0, 0)).toBe("Kiln plan: -Tuesday late");
    expect(at(1, 0)).toBe(CAUTION_TEXT);
    expect(layout.grid.boldRows).toContain(0);
  });

  it("route-table header is DESIGN.md §5's as issue 8 widens it, then the carried-through columns", () => {
    const header = values[layout.routeTable.row]!;
    expect(header.slice(0, 20).join(" | ")).toBe(DESIGN_ROUTE_HEADER);
    expect(header.slice(20, 22)).toEqual(["Phone", "Door code"]);
    expect(layout.routeTable).toEqual({ row: layout.routeTable.row, col: 0, rows: 1 + 5 + 3, cols: 22 });
    expect(layout.grid.boldRows).toContain(layout.routeTable.row);
  });

  it("freezes through the route-table header, with compact blocks above it", () => {
    expect(layout.grid.freezeRows).toBe(layout.routeTable.row + 1);
    expect(layout.routeTable.row).toBeLessThanOrEqual(8);
  });

  it("settings block carries scenario, created, seed, schedule, rule, moves, run time, sources, detour, speed, windows", () => {
    const labels = values[2]!.filter((v) => v !== null);
    expect(labels).toEqual([
      "Scenario",
      "Created",
      "Seed",
      "Cooling schedule",
      "Acceptance rule",
      "Moves",
      "Run seconds",
      "Stops source",
      "Fleet source",
      "Detour factor",
      "Speed km/h",
      "Windows",
      "Distances",
      "Columns mapped",
      "Re-planned from",
      "Workers",
    ]);
    // One chain when the run record names no workers (the CLI's default).
    expect(values[3]![15]).toBe(1);
    // No column mapping was given, and the block says so; nor was it a re-plan.
    expect(values[3]![13]).toBe("none");
    expect(values[3]![14]).toBe("none");
    // Without a matrix sheet the kilometres are the great-circle estimate times the detour factor.
    expect(values[3]![12]).toBe("great-circle x 1.3 (estimate)");
    expect(values[3]!.slice(0, 12)).toEqual([
      "-Tuesday late",
      CREATED_SERIAL,
      7,
      "geometric ×0.94 every 1000 moves, acceptance from 0.50",
      "Metropolis",
      200000,
      4.3,
      "Stops!A1:H6",
      "Fleet!A1:N4",
      1.3,
      40,
      "soft, 1 per min late",
    ]);
    // ECMA-376 1900 system: 2026-12-01 is serial 46357 (from memory, checked: 25569 = 1970-01-01).
    expect(Math.floor(CREATED_SERIAL)).toBe(46357);
    expect(fmt(3, 1)).toBe("yyyy-mm-dd hh:mm");
  });

  it("totals block: vehicles, km to 0.1, driving/duty/waiting as [h]:mm durations, late, cost, unassigned, must-serve left out", () => {
    expect(values[4]!.slice(0, 9)).toEqual([
      "Vehicles used",
      "Km",
      "Driving hours",
      "Duty hours",
      "Waiting hours",
      "Late min",
      "Cost",
      "Unassigned",
      "Must-serve left out",
    ]);
    expect(values[5]!.slice(0, 9)).toEqual([2, 27.1, 76.5 / 1440, 255 / 1440, 30 / 1440, 10, 298.57, 1, 0]);
    expect(numberFormats![5]!.slice(0, 9)).toEqual(["0", "0.0", "[h]:mm", "[h]:mm", "[h]:mm", "0.0", "0.00", "0", "0"]);
  });

  it("510 minutes is written as 0.3541666... with format hh:mm (ECMA-376: time of day is the day fraction)", () => {
    const r = layout.routeTable.row + 1 + 2; // Van 1: depot, S1, S2
    expect(at(r, col("Stop"))).toBe("S2");
    expect(at(r, col("Arrival"))).toBeCloseTo(0.3541666666666667, 15);
    expect(fmt(r, col("Arrival"))).toBe("hh:mm");
  });

  it("a time past midnight is a day fraction above 1", () => {
    const night = routeRows().find((row) => row[col("Stop")] === "S4")!;
    expect(night[col("Arrival")]).toBeCloseTo(1510 / 1440, 15);
    expect(night[col("Arrival")] as number).toBeGreaterThan(1);
    expect(night[col("Late min")]).toBe(10);
  });

  it("each used route starts with a Seq 0 depot row and ends with a Seq n+1 depot row; unused vehicles are left out", () => {
    const rows = routeRows();
    expect(rows.map((r) => [r[0], r[1], r[2]])).toEqual([
      ["Van 1", 0, "Kiln Yard"],
      ["Van 1", 1, "S1"],
      ["Van 1", 2, "S2"],
      ["Van 1", 3, "3-4"],
      ["Van 1", 4, "Kiln Yard"],
      ["=Night", 0, "North Gate"],
      ["=Night", 1, "S4"],
      ["=Night", 2, "Kiln Yard"],
    ]);
  });

  it("Load is the load after the stop, one number per dimension; the start depot shows the full load", () => {
    const rows = routeRows();
    // Hand-worked from the fixture: Van 1 leaves with S1 40+S2 30+3-4 50 = 120 kg and 3+2+3 = 8 crates.
    expect(rows.map((r) => [r[col("Load kg")], r[col("Load crates")]]).slice(0, 5)).toEqual([
      [120, 8],
      [80, 5],
      [50, 3],
      [0, 0],
      [0, 0],
    ]);
    expect(fmt(layout.routeTable.row + 1, col("Load kg"))).toBeNull();
  });

  it("Drop is each stop's demand per dimension; the drops of a route add up to the load leaving the depot", () => {
    const rows = routeRows();
    const drops = rows.slice(1, 4).map((r) => [r[col("Drop kg")], r[col("Drop crates")]]);
    expect(drops).toEqual([
      [40, 3],
      [30, 2],
      [50, 3],
    ]);
    expect([rows[0]![col("Drop kg")], rows[4]![col("Drop kg")]]).toEqual([null, null]);
    const sum = (k: number): number => drops.reduce((a, d) => a + (d[k] as number), 0);
    expect([sum(0), sum(1)]).toEqual([rows[0]![col("Load kg")], rows[0]![col("Load crates")]]);
  });

  it("km are rounded to 0.1 with format 0.0; the end row carries the leg back and the route total", () => {
    const rows = routeRows();
    expect(rows.slice(0, 5).map((r) => [r[col("Leg km")], r[col("Total km")]])).toEqual([
      [0, 0],
      [3.4, 3.4],
      [2.2, 5.6],
      [1.9, 7.4],
      [2.6, 10],
    ]);
    expect(fmt(layout.routeTable.row + 1, col("Leg km"))).toBe("0.0");
  });

  it("Earliest/Latest show the window used: the second window of S2, blank for a stop without a window", () => {
    const rows = routeRows();
    const s2 = rows.find((r) => r[col("Stop")] === "S2")!;
    expect([s2[col("Earliest")], s2[col("Latest")]]).toEqual([540 / 1440, 660 / 1440]);
    const open = rows.find((r) => r[col("Stop")] === "3-4")!;
    expect([open[col("Earliest")], open[col("Latest")]]).toEqual([null, null]);
  });

  it("negative coordinates and numeric extras stay numbers; text extras are carried through exactly, formatted @", () => {
    const s1 = routeRows().find((r) => r[col("Stop")] === "S1")!;
    expect(s1[col("Longitude")]).toBe(-0.0922);
    expect(s1[col("Door code")]).toBe(-5);
    expect(s1[col("Phone")]).toBe("+44 20 7946 0000");
    const r = values.indexOf(s1);
    expect(fmt(r, col("Phone"))).toBe("@");
  });

  it("the stop's address sits beside its name, exactly as typed and formatted @; blank where the stop has none", () => {
    const rows = routeRows();
    expect(col("Address")).toBe(col("Name") + 1);
    const s2 = rows.find((r) => r[col("Stop")] === "S2")!;
    expect(s2[col("Address")]).toBe("=Unit 4, Yard Road");
    expect(fmt(values.indexOf(s2), col("Address"))).toBe("@");
    expect(rows.find((r) => r[col("Stop")] === "3-4")![col("Address")]).toBeNull();
    expect(rows[0]![col("Address")]).toBeNull();
  });

  it("unassigned table Stop | Name | Reason lists the stops not served", () => {
    const h = values.findIndex((row, i) => i > layout.routeTable.row && row[0] === "Stop" && row[2] === "Reason");
    expect(values[h]!.slice(0, 3)).toEqual(["Stop", "Name", "Reason"]);
    expect(values[h + 1]!.slice(0, 3)).toEqual(["S5", "Corner shop", "demand 500 kg / 30 crates exceeds every vehicle's capacity"]);
    expect(values.length).toBe(h + 2);
  });

  it("all rows have the same length and formats have the grid's shape", () => {
    const width = values[0]!.length;
    expect(values.every((r) => r.length === width)).toBe(true);
    expect(numberFormats!.length).toBe(values.length);
    expect(numberFormats!.every((r) => r.length === width)).toBe(true);
    expect(layout.grid.columnWidths!.length).toBe(width);
  });
});

describe("route chart spec", () => {
  it("one series per used vehicle over its Longitude (x) and Latitude (y) cells, depot rows included", () => {
    expect(layout.chart.series.map((s) => s.name)).toEqual(["Van 1", "=Night"]);
    const [van1, night] = layout.chart.series;
    expect(van1!.x.col).toBe(col("Longitude"));
    expect(van1!.y.col).toBe(col("Latitude"));
    expect(blockCells(van1!.x)).toEqual([-0.1276, -0.0922, -0.1195, -0.1357, -0.1276]);
    expect(blockCells(van1!.y)).toEqual([51.5072, 51.5155, 51.5033, 51.4975, 51.5072]);
    expect(blockCells(night!.x)).toEqual([-0.1, -0.1652, -0.1276]);
  });

  it("is anchored to the right of the route table", () => {
    expect(layout.chart.anchor.row).toBe(layout.routeTable.row);
    expect(layout.chart.anchor.col).toBeGreaterThanOrEqual(layout.routeTable.col + layout.routeTable.cols);
  });
});

describe("Compare sheet (DESIGN.md §5)", () => {
  it("header is exactly DESIGN.md §5's and frozen", () => {
    const header = layoutCompareHeader();
    expect(header.values[0]!.join(" | ")).toBe(DESIGN_COMPARE_HEADER);
    expect(COMPARE_HEADER.join(" | ")).toBe(DESIGN_COMPARE_HEADER);
    expect(header.freezeRows).toBe(1);
  });

  it("row: scenario, vehicles, km, duty hours, cost, late, unassigned, schedule with rule, seed, created", () => {
    const row = layoutCompareRow(run, plan);
    expect(row.values).toEqual([
      [
        "-Tuesday late",
        2,
        27.1,
        255 / 1440,
        298.57,
        10,
        1,
        0,
        "geometric ×0.94 every 1000 moves, acceptance from 0.50, Metropolis",
        7,
        CREATED_SERIAL,
        null,
      ],
    ]);
    expect(row.numberFormats).toEqual([["@", "0", "0.0", "[h]:mm", "0.00", "0.0", "0", "0", "@", null, "yyyy-mm-dd hh:mm", null]]);
  });
});

describe("layoutPlan programming errors", () => {
  it("throws TypeError without a plan", () => {
    expect(() => layoutPlan({ problem, run } as never)).toThrow(TypeError);
  });
  it("throws RangeError naming the vehicle a plan refers to but the problem lacks", () => {
    const bad = { ...plan, routes: [{ ...plan.routes[0]!, vehicle: 9 }] };
    expect(() => layoutPlan({ problem, plan: bad, run })).toThrow(/vehicle 9/);
  });
});
