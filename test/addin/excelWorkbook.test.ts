/**
 * The Office.js adapter against office-addin-mock, through the fake host of
 * `officeMockHost.ts` (recorders for what the adapter writes, loads checked like Excel).
 */
import { afterEach, describe, expect, it } from "vitest";
import { ExcelWorkbook } from "../../src/workbook/excel/ExcelWorkbook.js";
import { OfficeActionError } from "../../src/workbook/excel/OfficeActionError.js";
import type { SheetGrid, RouteChart } from "../../src/sheets/grid.js";
import { readFileSync } from "node:fs";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { readScenarioInput, writeScenarioResult } from "../../src/workbook/scenario.js";
import { solve } from "../../src/core/solve.js";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import { scenarioSettingsKey } from "../../src/sheets/scenarioSettingsKey.js";
import { entries, host, install, neverNotLoaded, uninstall } from "./officeMockHost.js";
import { findHeaderRow } from "../../src/sheets/findHeaderRow.js";

afterEach(uninstall);

describe("reading (office-addin-mock; one Excel.run per read: its size, then its values, OFFICE-NOTES.md)", () => {
  it("readSelection returns the selected values, address and position after two syncs (where and how big, then the values)", async () => {
    const book = install({
      excelApi: "1.7",
      selection: {
        sheet: "Stops",
        address: "Stops!B3:C4",
        values: [
          ["S1", 52.1],
          ["S2", 52.2],
        ],
        rowIndex: 2,
        columnIndex: 1,
      },
    });
    const got = await book.readSelection();
    expect(got).toEqual({
      read: {
        sheet: "Stops",
        row: 2,
        col: 1,
        values: [
          ["S1", 52.1],
          ["S2", 52.2],
        ],
      },
      address: "Stops!B3:C4",
    });
    expect(host().syncs()).toBe(2);
    expect(entries("getTables")).toEqual([]); // ExcelApi 1.9 missing: plain selection, no table lookup
    neverNotLoaded(got);
  });

  it("readSelection of whole columns reads only the filled rows (clipped to the used range)", async () => {
    const book = install({
      excelApi: "1.7",
      selection: {
        sheet: "Fleet",
        selected: "Fleet!A:B",
        address: "Fleet!A1:B3",
        values: [
          ["Vehicle", "Count"],
          ["Van", 2],
          ["Truck", 1],
        ],
        rowIndex: 0,
        columnIndex: 0,
      },
    });
    const got = await book.readSelection();
    expect(got.address).toBe("Fleet!A1:B3");
    expect(got.read.values).toHaveLength(3);
    expect(entries("getIntersectionOrNullObject")).toEqual([["getIntersectionOrNullObject", "used range"]]);
    expect(entries("getUsedRange")).toEqual([["getUsedRange", true]]);
    expect(host().syncs()).toBe(2);
  });

  it("readSelection of empty cells returns no values and the selected address", async () => {
    const book = install({
      excelApi: "1.7",
      selection: { sheet: "Stops", selected: "Stops!Z90", address: "", values: [], rowIndex: 89, columnIndex: 25 },
    });
    expect(await book.readSelection()).toEqual({ read: { sheet: "Stops", row: 89, col: 25, values: [] }, address: "Stops!Z90" });
  });

  it("readSelection reads the merged areas of the selection (ExcelApi 1.13), so a merged group-header row is not taken as the header", async () => {
    // A dispatcher's selection B2:E5: a title row, a row of merged group headers ("Customer" over
    // B3:C3, "Location" over D3:E3), the header, one stop. Excel reads the other cells of a merge as "".
    const values = [
      ["Bakery round", "", "", ""],
      ["Customer", "", "Location", ""],
      ["Client", "Phone", "Address", "Note"],
      ["Corner Café", "555 0101", "1 Kiln Lane, Brickfield", "back door"],
    ];
    const merges = [
      { rowIndex: 2, columnIndex: 1, rowCount: 1, columnCount: 2 },
      { rowIndex: 2, columnIndex: 3, rowCount: 1, columnCount: 2 },
    ];
    const selection = { sheet: "Round", address: "Round!B2:E5", values, rowIndex: 1, columnIndex: 1, merges };
    const got = await install({ excelApi: "1.13", selection }).readSelection();
    expect(got.read.merges).toEqual([
      { row: 2, col: 1, rows: 1, cols: 2 },
      { row: 2, col: 3, rows: 1, cols: 2 },
    ]);
    expect(entries("areas.load")).toEqual([["areas.load", "items/rowIndex, items/columnIndex, items/rowCount, items/columnCount"]]);
    expect(host().syncs()).toBe(3);
    neverNotLoaded(got);
    // The header search then takes row 4 of the sheet (index 2 of the read); without the merged
    // areas the group row ties with it (two known words each) and, being upper, would win.
    expect(findHeaderRow(got.read.values, "stops", got.read)).toBe(2);
    expect(findHeaderRow(values, "stops")).toBe(1);

    // Below ExcelApi 1.13 the merged areas are not asked for (OFFICE-NOTES.md: requirement sets).
    const older = await install({ excelApi: "1.12", selection }).readSelection();
    expect(older.read.merges).toBeUndefined();
    expect(entries("getMergedAreasOrNullObject")).toEqual([]);
    expect(host().syncs()).toBe(2);
  });

  it("readSelection widens a selection inside an Excel table to the whole table (ExcelApi 1.9)", async () => {
    const book = install({
      selection: { sheet: "Stops", address: "Stops!B3", values: [["Bakery"]], rowIndex: 2, columnIndex: 1 },
      table: {
        name: "StopsTable",
        address: "Stops!A1:C4",
        values: [
          ["Stop", "Name", "Lat"],
          ["S1", "Mill", 1],
          ["S2", "Bakery", 2],
          ["S3", "Dock", 3],
        ],
        rowIndex: 0,
        columnIndex: 0,
      },
    });
    const got = await book.readSelection();
    expect(got.tableName).toBe("StopsTable");
    expect(got.address).toBe("Stops!A1:C4");
    expect(got.read.values).toHaveLength(4);
    expect(entries("tables.load")).toEqual([["tables.load", "items/name"]]);
    expect(host().syncs()).toBe(3);
    neverNotLoaded(got);
  });

  it("readSheet reads the used range (values only) and reports where it starts", async () => {
    const book = install({
      sheets: {
        Fleet: {
          values: [
            ["Vehicle", "Count"],
            ["Van", 2],
          ],
          rowIndex: 3,
          columnIndex: 1,
        },
      },
    });
    const got = await book.readSheet("Fleet");
    expect(got).toEqual({
      sheet: "Fleet",
      row: 3,
      col: 1,
      values: [
        ["Vehicle", "Count"],
        ["Van", 2],
      ],
    });
    expect(entries("getUsedRangeOrNullObject")).toEqual([["getUsedRangeOrNullObject", "Fleet", true]]);
    expect(host().syncs()).toBe(2);
    neverNotLoaded(got);
  });

  it("reads a large used range in row blocks of at most readBlockCells cells, one sync each (the 5 MB response cap on the web)", async () => {
    const values = Array.from({ length: 10 }, (_, r) => [`S${r + 1}`, r, r * 2]);
    // The blocks the adapter must ask for: 4 rows of 3 columns (12 cells <= 13) from B3, then the rest.
    const ranges: Record<string, Record<string, unknown>> = {
      "Stops!B3:D6": { values: values.slice(0, 4) },
      "Stops!B7:D10": { values: values.slice(4, 8) },
      "Stops!B11:D12": { values: values.slice(8) },
    };
    const book = install({ sheets: { Stops: { values, rowIndex: 2, columnIndex: 1 } }, ranges }, { readBlockCells: 13 });
    const read = await book.readSheet("Stops");
    expect(read).toEqual({ sheet: "Stops", row: 2, col: 1, values });
    expect(host().syncs()).toBe(4); // where and how big, then three blocks
  });

  it("readSheet gives undefined for a missing sheet (Office error code ItemNotFound) and [] for an empty one", async () => {
    const book = install({ sheets: { Blank: "empty" } });
    expect(await book.readSheet("Nope")).toBeUndefined();
    expect(await book.readSheet("Blank")).toEqual({ sheet: "Blank", row: 0, col: 0, values: [] });
  });

  it("listSheets loads only the names; activeSheetName reads the active sheet", async () => {
    const book = install({ sheets: { Stops: "empty", Fleet: "empty" } });
    expect(await book.listSheets()).toEqual(["Stops", "Fleet"]);
    expect(entries("worksheets.load")).toEqual([["worksheets.load", "items/name"]]);
    expect(await book.activeSheetName()).toBe("Fleet");
  });

  it("readRange reads a sheet-qualified address and rejects a malformed one", async () => {
    const book = install({
      sheets: { "Bob's van": "empty" },
      ranges: {
        "Bob's van!B2:C3": {
          values: [
            [1, 2],
            [3, 4],
          ],
          rowIndex: 1,
          columnIndex: 1,
        },
      },
    });
    const got = await book.readRange("'Bob''s van'!B2:C3");
    expect(got).toEqual({
      sheet: "Bob's van",
      row: 1,
      col: 1,
      values: [
        [1, 2],
        [3, 4],
      ],
    });
    expect(host().syncs()).toBe(1);
    neverNotLoaded(got);
    await expect(book.readRange("A1:B2")).rejects.toThrow(RangeError);
    await expect(book.readRange("Gone!A1:B2")).rejects.toThrow(/Could not read Gone!A1:B2: .*ItemNotFound/);
  });
});

describe("writing a scenario sheet (office-addin-mock recorders; batching per STYLE.md §8)", () => {
  const grid: SheetGrid = {
    values: [
      ["Scenario", "=SUM(A1)", null],
      ["Vehicle", "Longitude", "Latitude"],
      ["Van 1", 10.7, 59.9],
      ["Van 1", 10.8, 59.95],
      ["Van 2", 10.6, 59.8],
      ["Van 2", 10.65, 59.85],
    ],
    numberFormats: [
      [null, null, null],
      [null, null, null],
      [null, "0.0000", "0.0000"],
      [null, "0.0000", "0.0000"],
      [null, "0.0000", "0.0000"],
      [null, "0.0000", "0.0000"],
    ],
    columnWidths: [12, 10, 10],
    freezeRows: 2,
    boldRows: [0, 1],
  };
  const chart: RouteChart = {
    title: "Routes",
    series: [
      { name: "Van 1", x: { row: 2, col: 1, rows: 2, cols: 1 }, y: { row: 2, col: 2, rows: 2, cols: 1 } },
      { name: "Van 2", x: { row: 4, col: 1, rows: 2, cols: 1 }, y: { row: 4, col: 2, rows: 2, cols: 1 } },
    ],
    anchor: { row: 0, col: 5 },
  };

  it("checks the name, then writes formats before values, widths, bold, frozen rows and the chart in one sync", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    await book.addSheet("Run 1", grid, chart);
    expect(host().syncs()).toBe(3); // one read (is the name free?), one write, one read-back of "=SUM(A1)"
    const kinds = host().log.map((e) => e[0]);
    expect(kinds.slice(0, 3)).toEqual(["getItemOrNullObject", "sync", "add"]);
    expect(kinds.indexOf("numberFormat")).toBeLessThan(kinds.indexOf("values"));
    expect(kinds.indexOf("charts.add")).toBeLessThan(kinds.indexOf("sync", kinds.indexOf("add")));
    expect(kinds.lastIndexOf("sync")).toBe(kinds.length - 1);
    const [, , address, values] = entries("values")[0]!;
    expect(address).toBe("A1:C6");
    expect((values as unknown[][])[0]).toEqual(["Scenario", "=SUM(A1)", ""]);
    const formats = entries("numberFormat")[0]![3] as string[][];
    expect(formats[0]).toEqual(["@", "@", "General"]);
    expect(formats[2]).toEqual(["@", "0.0000", "0.0000"]);
    // 12 characters -> 12 * 7 + 5 = 89 px -> 66.75 pt (ECMA-376 column width, 96 dpi)
    expect(entries("columnWidth")).toEqual([
      ["columnWidth", "Run 1", "A:A", 66.75],
      ["columnWidth", "Run 1", "B:B", 56.25],
      ["columnWidth", "Run 1", "C:C", 56.25],
    ]);
    expect(entries("bold").map((e) => e[2])).toEqual(["A1:C1", "A2:C2"]);
    expect(entries("freezeRows")).toEqual([["freezeRows", "Run 1", 2]]);
  });

  it("draws an XY scatter-with-lines chart with one series per vehicle from cell ranges (ExcelApi 1.7)", async () => {
    const book = install({});
    await book.addSheet("Run 1", grid, chart);
    const add = entries("charts.add")[0]!;
    expect(add[1]).toBe("XYScatterLines");
    expect(add[3]).toBe("Columns");
    expect(entries("series.getItemAt")).toEqual([["series.getItemAt", 0]]);
    expect(entries("series.name")).toEqual([["series.name", "Van 1"]]);
    expect(entries("series.add")).toEqual([["series.add", "Van 2"]]);
    expect(entries("series.x")).toHaveLength(2);
    expect(entries("series.y")).toHaveLength(2);
    expect(entries("chart.title")).toEqual([["chart.title", "Routes"]]);
    expect(entries("chart.position")).toEqual([["chart.position", "F1"]]);
    expect(host().notices).toEqual([]);
  });

  it("skips the chart and frozen rows on ExcelApi 1.4 and says so", async () => {
    const book = install({ excelApi: "1.4" });
    await book.addSheet("Run 1", grid, chart);
    expect(entries("charts.add")).toEqual([]);
    expect(entries("freezeRows")).toEqual([]);
    expect(host().notices.join(" ")).toMatch(/chart .* skipped: it needs .*ExcelApi 1\.7/);
    expect(entries("values")).toHaveLength(1);
  });

  it("splits a large grid into row chunks with one sync each, formats before values in every chunk", async () => {
    install({});
    const rows = Array.from({ length: 10 }, (_, r) => [`S${r}`, r, r]);
    const small = new ExcelWorkbook({ budgetBytes: 125 }); // 4 + 39 bytes a row (33 of cells, 6 of brackets): 3 rows per chunk
    await small.addSheet("Big", { values: rows });
    expect(entries("values").map((e) => e[2])).toEqual(["A1:C3", "A4:C6", "A7:C9", "A10:C10"]);
    expect(host().syncs()).toBe(1 + 4);
    const kinds = host()
      .log.filter((e) => ["numberFormat", "values", "sync"].includes(e[0]))
      .map((e) => e[0]);
    expect(kinds).toEqual(["sync", ...Array(4).fill(["numberFormat", "values", "sync"]).flat()]);
  });

  it("keeps user text that starts with = + - @ or ' as text: format '@' before the unchanged values, then a read-back", async () => {
    const book = install({});
    await book.addSheet("Inject", { values: [["=SUM(A1)", "+1", "-x", "@cmd", "'s-Hertogenbosch", "plain", 5]] });
    expect(entries("numberFormat")[0]![3]).toEqual([["@", "@", "@", "@", "@", "@", "General"]]);
    expect(entries("values")[0]![3]).toEqual([["=SUM(A1)", "+1", "-x", "@cmd", "'s-Hertogenbosch", "plain", 5]]);
    const kinds = host().log.map((e) => e[0]);
    expect(kinds.indexOf("numberFormat")).toBeLessThan(kinds.indexOf("values"));
    expect(entries("range.load").map((e) => e[2])).toEqual(["A1", "B1", "C1", "D1", "E1"]);
    expect(host().notices).toEqual([]);
  });

  it("names the cells whose text Excel did not keep (here: a leading apostrophe taken as Excel's text marker)", async () => {
    const book = install({ textStored: (t) => (t.startsWith("'") ? t.slice(1) : t) });
    await book.addSheet("Towns", { values: [["Town"], ["'s-Hertogenbosch"], ["Oss"]] });
    expect(host().notices.join(" ")).toMatch(/Excel did not keep a text cell as written: Towns!A2 .*"'s-Hertogenbosch".*"s-Hertogenbosch"/);
  });

  it("a failing write sync deletes the half-written sheet in a new batch and keeps Office's debugInfo", async () => {
    const book = install({});
    host().failSync(2, { code: "InvalidArgument", message: "The argument is invalid.", debugInfo: { errorLocation: "Range.values" } });
    const error = await book.addSheet("Run 2", grid, chart).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(OfficeActionError);
    expect((error as OfficeActionError).message).toMatch(
      /Could not write the sheet "Run 2" \(the half-written sheet was removed\): The argument is invalid\. \(InvalidArgument\)/,
    );
    expect((error as OfficeActionError).debugInfo).toEqual({ errorLocation: "Range.values" });
    expect(entries("delete")).toEqual([["delete", "Run 2"]]);
    const kinds = host().log.map((e) => e[0]);
    expect(kinds.indexOf("delete")).toBeGreaterThan(kinds.indexOf("add"));
    expect(kinds[kinds.length - 1]).toBe("sync"); // the deletion was synced
  });

  it("refuses a taken name and one Excel forbids, without adding anything", async () => {
    const book = install({ sheets: { "Run 1": "empty" } });
    await expect(book.addSheet("Run 1", grid)).rejects.toThrow(/already exists/);
    await expect(book.addSheet("Run [2]", grid)).rejects.toThrow(RangeError);
    await expect(book.addSheet("x".repeat(32), grid)).rejects.toThrow(RangeError);
    expect(entries("add")).toEqual([]);
  });
});

describe("the Compare sheet (office-addin-mock)", () => {
  const header: SheetGrid = { values: [["Scenario", "Km"]], boldRows: [0], freezeRows: 1 };
  const row: SheetGrid = { values: [["Run 3", 41.5]] };

  it("appends below the last used row, without rewriting the header, in one read and one write", async () => {
    const book = install({
      sheets: {
        Compare: {
          values: [
            ["Scenario", "Km"],
            ["Run 1", 40],
            ["Run 2", 38],
          ],
          rowIndex: 0,
        },
      },
    });
    await book.appendRows("Compare", header, row);
    expect(entries("values")).toEqual([["values", "Compare", "A4:B4", [["Run 3", 41.5]]]]);
    expect(entries("add")).toEqual([]);
    expect(host().syncs()).toBe(2);
  });

  it("creates a missing Compare sheet with the header first", async () => {
    const book = install({});
    await book.appendRows("Compare", header, row);
    expect(entries("add")).toEqual([["add", "Compare"]]);
    expect(entries("values").map((e) => [e[2], e[3]])).toEqual([
      ["A1:B1", [["Scenario", "Km"]]],
      ["A2:B2", [["Run 3", 41.5]]],
    ]);
    expect(entries("freezeRows")).toEqual([["freezeRows", "Compare", 1]]);
  });
});

describe("settings, selection of issue cells, Geography cells (office-addin-mock)", () => {
  it("writeSetting stores through workbook.settings.add in one sync; readSettings returns text", async () => {
    const book = install({
      settings: [
        { key: "kiln.scenario.Run 1", value: '{"seed":1}' },
        { key: "n", value: 3 },
      ],
    });
    await book.writeSetting("kiln.scenario.Run 2", '{"seed":2}');
    expect(entries("settings.add")).toEqual([["settings.add", "kiln.scenario.Run 2", '{"seed":2}']]);
    expect(host().syncs()).toBe(1);
    const got = await book.readSettings();
    expect(got).toEqual({ "kiln.scenario.Run 1": '{"seed":1}', n: "3" });
    neverNotLoaded(got);
  });

  it("selectCell activates the sheet and selects the cell; rejects a non-address", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    await book.selectCell("Stops", "E7");
    expect(host().log.filter((e) => e[0] === "activate" || e[0] === "select")).toEqual([
      ["activate", "Stops"],
      ["select", "Stops", "E7"],
    ]);
    await expect(book.selectCell("Stops", "=E7")).rejects.toThrow(RangeError);
  });

  it("readGeography says it is unavailable below ExcelApi 1.16", async () => {
    const book = install({ excelApi: "1.9" });
    const got = await book.readGeography("Stops!C2:C3");
    expect(got.available).toBe(false);
    expect(host().syncs()).toBe(0);
  });

  it("readGeography reads valuesAsJson linked entities (shape of Excel.LinkedEntityCellValue in @types/office-js)", async () => {
    const book = install({
      sheets: { Stops: "empty" },
      ranges: {
        "Stops!C2:C3": {
          valuesAsJson: [
            [
              {
                type: "LinkedEntity",
                text: "Oslo",
                properties: { Latitude: { type: "Double", basicValue: 59.91 }, Longitude: { type: "Double", basicValue: 10.75 } },
              },
            ],
            [{ type: "String", basicValue: "Depot" }],
          ],
          rowIndex: 1,
          columnIndex: 2,
        },
      },
    });
    const got = await book.readGeography("Stops!C2:C3");
    expect(got).toEqual({
      available: true,
      sheet: "Stops",
      row: 1,
      col: 2,
      cells: [[{ kind: "place", label: "Oslo", at: { lat: 59.91, lon: 10.75 } }], [{ kind: "notEntity" }]],
    });
    expect(host().syncs()).toBe(1);
  });
});

describe("a whole scenario through the adapter (demo workbook read with exceljs, the reference library)", () => {
  it("reads the inputs, then writes the plan sheet with its chart, a Compare row and the run record, loading nothing it does not read", async () => {
    const demo = await ExcelJsWorkbook.fromBuffer(readFileSync(new URL("../../demo/kiln-demo.xlsx", import.meta.url)));
    const sheets: Record<string, { values: unknown[][] }> = {};
    for (const name of ["Stops", "Fleet", "Settings"]) sheets[name] = { values: (await demo.readSheet(name))!.values.map((r) => [...r]) };
    const book = install({ sheets });
    const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet", settingsSheet: "Settings" });
    if (!read.ok) throw new Error(read.issues.map((i) => i.message).join("; "));
    const readSyncs = host().syncs();
    const result = solve(read.problem, { seed: 7, budget: { moves: 3000 } });
    const { sheetName, routeSheets } = await writeScenarioResult(book, {
      read,
      result,
      scenario: "=Monday",
      createdAt: new Date(Date.UTC(2026, 0, 5, 18)),
      runSeconds: 1,
      stopsSource: "Stops!A1:N85",
      fleetSource: "Fleet!A1:O6",
      locale: "en-GB",
    });
    // readSettings 1 (a record left under this name?), listSheets 1, then writeRun in one Excel.run: names 1,
    // write of both sheets 1, the plan sheet's id 1, Compare missing 1, create it with the record 1, closing
    // sync 1, read-backs of the scenario text "=Monday" on the plan sheet, the route sheet and in the Compare
    // row 3, the route sheet's print setup in its own sync 1
    expect(host().syncs() - readSyncs).toBe(12);
    const planWrites = entries("values").filter((e) => e[1] === sheetName);
    expect(planWrites).toHaveLength(1); // one assignment of the whole grid
    const written = planWrites[0]![3] as unknown[][];
    const formats = entries("numberFormat").find((e) => e[1] === sheetName)![3] as string[][];
    expect(written.flat()).toContain(CAUTION_TEXT);
    const scenarioCells = written
      .flatMap((row, r) => row.map((v, c) => ({ v, f: formats[r]![c] })))
      .filter((x) => String(x.v).replace(/^'/, "") === "=Monday");
    expect(scenarioCells.length).toBeGreaterThan(0);
    for (const cell of scenarioCells) expect(cell).toEqual({ v: "=Monday", f: "@" }); // raw text, kept by the '@' format
    const used = result.plan.routes.filter((r) => r.visits.length > 0).length;
    expect(entries("series.name").length + entries("series.add").length).toBe(used);
    expect(entries("add").map((e) => e[1])).toEqual([sheetName, ...routeSheets, "Compare"]);
    expect(host().notices).toEqual([]);
    expect(
      entries("values")
        .filter((e) => e[1] === "Compare")
        .map((e) => e[2]),
    ).toEqual(["A1:L1", "A2:L2"]); // COMPARE_HEADER: 12 columns, the last one Changed vehicle
    const [, key, value] = entries("settings.add")[0]!;
    expect(key).toBe(scenarioSettingsKey(sheetName));
    expect(JSON.parse(value as string).scenario).toBe(sheetName);
    expect(JSON.parse(value as string).sheetId).toBe(`{id-${sheetName}}`);
    neverNotLoaded(read);
  });
});

describe("route sheets through the adapter (office-addin-mock; PageLayout and horizontalPageBreaks of ExcelApi 1.9)", () => {
  async function planned(excelApi: string) {
    const demo = await ExcelJsWorkbook.fromBuffer(readFileSync(new URL("../../demo/kiln-demo.xlsx", import.meta.url)));
    const sheets: Record<string, { values: unknown[][] }> = {};
    for (const name of ["Stops", "Fleet"]) sheets[name] = { values: (await demo.readSheet(name))!.values.map((r) => [...r]) };
    const book = install({ sheets, excelApi });
    const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet" });
    if (!read.ok) throw new Error(read.issues.map((i) => i.message).join("; "));
    const result = solve(read.problem, { seed: 5, budget: { moves: 3000 } });
    const out = await writeScenarioResult(book, {
      read,
      result,
      scenario: "Tue",
      createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
      runSeconds: 1,
      stopsSource: "Stops!A1:N85",
      fleetSource: "Fleet!A1:O6",
      locale: "en-US",
    });
    return { read, result, out };
  }

  it("writes the route sheet in one assignment, every served stop once in plan order, then Letter, title rows, breaks, footer and fit to width", async () => {
    const { read, result, out } = await planned("1.9");
    const name = out.routeSheets[0]!;
    expect(name).toBe("Tue routes");
    const writes = entries("values").filter((e) => e[1] === name);
    expect(writes).toHaveLength(1);
    const grid = writes[0]![3] as unknown[][];
    const header = grid[1] as string[];
    const seq = header.indexOf("Seq");
    const stopCol = header.indexOf("Stop");
    const blockRows = grid.flatMap((r, i) => (r[0] === "Vehicle" ? [i] : []));
    const served = grid
      .filter((r) => typeof r[seq] === "number" && typeof r[stopCol] === "string" && r[stopCol] !== "Return")
      .map((r) => r[stopCol]);
    const used = result.plan.routes.filter((r) => r.visits.length > 0);
    expect(served).toEqual(used.flatMap((r) => r.visits.map((v) => read.problem.stops[v.stop]!.id)));
    expect(blockRows).toHaveLength(used.length);
    expect(entries("paperSize")).toEqual([["paperSize", name, "Letter"]]);
    expect(entries("printTitleRows")).toEqual([["printTitleRows", name, "$1:$2"]]);
    // A break above each block but the first: horizontalPageBreaks.add on the block's first cell.
    expect(entries("pageBreak")).toEqual(blockRows.slice(1).map((r) => ["pageBreak", name, `A${r + 1}`]));
    expect(entries("zoom")).toEqual([["zoom", name, { horizontalFitToPages: 1, verticalFitToPages: 0 }]]);
    expect(entries("leftFooter")).toEqual([["leftFooter", name, "Tue"]]);
    expect(entries("rightFooter")).toEqual([["rightFooter", name, "Page &P of &N"]]);
    expect(host().notices).toEqual([]);
    neverNotLoaded(read);
  });

  it("below ExcelApi 1.9 still writes the route sheet and tells the pane its print settings need setting by hand", async () => {
    const { out } = await planned("1.7");
    expect(entries("values").filter((e) => e[1] === out.routeSheets[0])).toHaveLength(1);
    expect(entries("pageBreak")).toEqual([]);
    expect(host().notices.join(" ")).toMatch(/Print settings of "Tue routes".*ExcelApi 1\.9 or later.*Page Layout/);
  });
});
