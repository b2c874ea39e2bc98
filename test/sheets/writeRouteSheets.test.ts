// Driver route sheets as a pure layout, on the invented writer fixture (layout rules only). The
// expected stops, drops and windows are hand-worked from the fixture's tables, not from the code
// under test; times are Excel day fractions (ECMA-376 Part 1, 18.17.4.1: the fraction of the
// serial is the time of day).
import { describe, expect, it } from "vitest";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import type { CellValue } from "../../src/sheets/grid.js";
import { layoutRouteSheets, RETURN_STOP, SIGN_OFF_BOX, SIGN_OFF_HEADER } from "../../src/sheets/layoutRouteSheets.js";
import { paperSizeForLocale } from "../../src/sheets/printSetup.js";
import { MAX_SHEET_NAME_LENGTH } from "../../src/sheets/uniqueSheetName.js";
import { extraHeaders, plan, problem, run, stopRows } from "../fixtures/writerPlan.js";

const [sheet] = layoutRouteSheets({ problem, plan, run, stopRows, extraHeaders, existingSheets: [run.scenario] });
const values = sheet!.grid.values;
const header = values[1]!;
const col = (h: string): number => header.indexOf(h);
const blockRows = (i: number): (readonly CellValue[])[] => {
  const b = sheet!.blocks[i]!;
  return values.slice(b.row, b.row + b.rows);
};
const stopLines = (i: number): (readonly CellValue[])[] =>
  blockRows(i).filter((r) => typeof r[col("Seq")] === "number" && typeof r[col("Stop")] === "string" && r[col("Stop")] !== RETURN_STOP);

describe("route sheets: one sheet per scenario, one block per used vehicle", () => {
  it("is one sheet named after the scenario, with a block for Van 1 and =Night but none for the unused Van 2", () => {
    expect(layoutRouteSheets({ problem, plan, run, stopRows, extraHeaders })).toHaveLength(1);
    expect(sheet!.name).toBe("-Tuesday late routes");
    expect(sheet!.blocks.map((b) => b.vehicle)).toEqual(["Van 1", "=Night"]);
  });

  it("has the column header of issue 8: Seq, arrival, window, stop, name, address, drop per unit, service, carried columns, sign-off", () => {
    expect(header).toEqual([
      "Seq",
      "Arrival",
      "Window",
      "Stop",
      "Name",
      "Address",
      "Drop kg",
      "Drop crates",
      "Service min",
      "Phone",
      "Door code",
      SIGN_OFF_HEADER,
    ]);
  });

  it("lists every served stop exactly once, in plan order, and never the unassigned S5", () => {
    expect(stopLines(0).map((r) => r[col("Stop")])).toEqual(["S1", "S2", "3-4"]);
    expect(stopLines(1).map((r) => r[col("Stop")])).toEqual(["S4"]);
    expect(values.flat()).not.toContain("S5");
  });

  it("drops per dimension add up to the load leaving the depot and to the stops' demand (hand-worked: 120 kg, 8 crates)", () => {
    const sum = (rows: (readonly CellValue[])[], h: string): number => rows.reduce((a, r) => a + (r[col(h)] as number), 0);
    expect([sum(stopLines(0), "Drop kg"), sum(stopLines(0), "Drop crates")]).toEqual([120, 8]);
    const totalsAt = blockRows(0).findIndex((r) => r[0] === "Stops");
    const totals = blockRows(0)[totalsAt + 1]!;
    expect(blockRows(0)[totalsAt]!.slice(0, 6)).toEqual(["Stops", "Km", "Driving hours", "Duty hours", "Load kg", "Load crates"]);
    expect(totals.slice(0, 6)).toEqual([3, 10, 38.5 / 1440, 110 / 1440, 120, 8]);
  });

  it("block header: vehicle, scenario and date, leave time, shift end and depot", () => {
    const b = blockRows(0);
    expect(b[0]!.slice(0, 2)).toEqual(["Vehicle", "Van 1"]);
    expect(b[1]!.slice(0, 6)).toEqual(["Scenario", "-Tuesday late", null, null, "Date", Math.floor(run.createdSerial)]);
    // Van 1 leaves at 07:50 (470 min) and its shift ends 17:00 (1020 min).
    expect(b[2]!.slice(0, 6)).toEqual(["Leave", 470 / 1440, "Shift end", 1020 / 1440, "Depot", "Kiln Yard"]);
  });

  it("long names in the block header do not widen the Arrival column (they spill over empty cells)", () => {
    expect(sheet!.grid.columnWidths![col("Arrival")]).toBeLessThanOrEqual(10);
  });

  it("stop rows: planned arrival, the window used as text, the user's text exactly, numbers as numbers", () => {
    const [s1, s2, open] = stopLines(0);
    expect(s1!.slice(0, 9)).toEqual([1, 490 / 1440, "08:00-10:00", "S1", "=SUM(A1)", "1 Kiln Lane", 40, 3, 10]);
    expect(s2![col("Window")]).toBe("09:00-11:00"); // the second window of S2, the one used
    expect(s2![col("Address")]).toBe("=Unit 4, Yard Road");
    expect(open![col("Window")]).toBe("any time");
    expect(s1![col("Phone")]).toBe("+44 20 7946 0000");
    expect(s1![col(SIGN_OFF_HEADER)]).toBe(SIGN_OFF_BOX);
    const r = values.indexOf(s1!);
    expect(sheet!.grid.numberFormats![r]![col("Name")]).toBe("@");
    expect(sheet!.grid.numberFormats![r]![col("Arrival")]).toBe("hh:mm");
  });

  it("ends each block with the return to its end depot, then totals and the caution line", () => {
    const night = blockRows(1);
    const back = night.find((r) => r[col("Stop")] === RETURN_STOP)!;
    // =Night starts at North Gate and ends at Kiln Yard; back at 01:45 next day (1545 min).
    expect(back.slice(0, 5)).toEqual([2, 1545 / 1440, "by 06:00+1d", RETURN_STOP, "Kiln Yard"]);
    expect(night[2]!.slice(4, 6)).toEqual(["Depot", "North Gate"]);
    expect(night.map((r) => r[0])).toContain(CAUTION_TEXT);
  });

  it("prints one page wide with the title and header rows repeated, a break before every block but the first, and a footer", () => {
    const print = sheet!.grid.print!;
    expect(print.fitToWidth).toBe(true);
    expect(print.printTitleRows).toEqual({ first: 0, last: 1 });
    expect(print.rowBreaks).toEqual([sheet!.blocks[1]!.row]);
    expect(print.footer).toEqual({ left: "-Tuesday late", center: "Van 1, =Night", pageNumbers: true });
    expect(print.paperSize).toBe("A4");
    expect(sheet!.grid.freezeRows).toBe(2);
  });

  it("all rows have one length and formats the grid's shape", () => {
    const width = values[0]!.length;
    expect(values.every((r) => r.length === width)).toBe(true);
    expect(sheet!.grid.numberFormats!.every((r) => r.length === width)).toBe(true);
  });
});

describe("route sheets: one sheet per vehicle", () => {
  const sheets = layoutRouteSheets({
    problem,
    plan,
    run,
    stopRows,
    extraHeaders,
    sheetPerVehicle: true,
    paperSize: "Letter",
    existingSheets: ["-Tuesday late Van 1"],
  });

  it("writes one sheet per used vehicle, names free and within Excel's 31 characters", () => {
    expect(sheets.map((s) => s.name)).toEqual(["-Tuesday late Van 1 (2)", "-Tuesday late =Night"]);
    for (const s of sheets) expect(s.name.length).toBeLessThanOrEqual(MAX_SHEET_NAME_LENGTH);
    expect(sheets.map((s) => s.grid.print!.footer!.center)).toEqual(["Van 1", "=Night"]);
    expect(sheets.every((s) => s.grid.print!.rowBreaks!.length === 0 && s.grid.print!.paperSize === "Letter")).toBe(true);
  });
});

describe("paper size from the locale", () => {
  it("Letter in the US, Canada, Mexico and the Philippines; A4 elsewhere (Unicode CLDR paperSize, from memory)", () => {
    expect(["en-US", "fr-CA", "es-MX", "en_PH.UTF-8", "en-Latn-US"].map(paperSizeForLocale)).toEqual(Array(5).fill("Letter"));
    expect(["en-GB", "de-DE", "fr", "C.UTF-8", "", undefined, "zh-Hant-TW"].map(paperSizeForLocale)).toEqual(Array(7).fill("A4"));
  });
});
