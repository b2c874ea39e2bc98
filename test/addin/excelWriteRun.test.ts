/**
 * One run's output in one `Excel.run` (ExcelWorkbook.writeRun) and Rerun after a rename,
 * against office-addin-mock. Office.js facts used: `worksheet.id` is kept when a sheet is
 * renamed (ExcelApi 1.1 reference: "Returns a value that uniquely identifies the worksheet in a
 * given workbook. The value of the identifier remains the same even when the worksheet is
 * renamed or moved"); GeneralException is the code Excel.ErrorCodes gives for an internal error.
 */
import { afterEach, describe, expect, it } from "vitest";
import type { SheetGrid } from "../../src/sheets/grid.js";
import { PLAN_SETTINGS_DEFAULTS, type RunRecord } from "../../src/sheets/PlanSettings.js";
import type { RunWrite } from "../../src/workbook/WorkbookPort.js";
import { OfficeActionError } from "../../src/workbook/excel/OfficeActionError.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { storedRunRecord } from "../../src/taskpane/storedRunRecord.js";
import { entries, host, install, uninstall } from "./officeMockHost.js";

afterEach(uninstall);

const plan: SheetGrid = {
  values: [
    ["Vehicle", "Stop"],
    ["Van 1", "S1"],
  ],
  boldRows: [0],
};
const route: SheetGrid = {
  values: [
    ["Seq", "Stop"],
    [1, "S1"],
  ],
};
const record0: RunRecord = {
  scenario: "Plan",
  createdSerial: 46000,
  settings: PLAN_SETTINGS_DEFAULTS,
  moves: 1000,
  runSeconds: 1,
  stopsSource: "Stops!A1:F9",
  fleetSource: "Fleet!A1:E3",
};
const record = (id: string | undefined) => ({ key: "kiln.scenario.Plan", value: JSON.stringify({ ...record0, sheetId: id }) });
const run: RunWrite = {
  sheets: [
    { name: "Plan", grid: plan },
    { name: "Plan routes", grid: route },
  ],
  record,
  append: { name: "Compare", header: { values: [["Scenario"]] }, rows: { values: [["Plan"]] } },
};

describe("writeRun: sheets, run record and Compare row in one Excel.run", () => {
  it("adds every sheet, keys the record to the plan sheet's worksheet.id and appends the Compare row", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    await book.writeRun(run);
    expect(entries("add").map((e) => e[1])).toEqual(["Plan", "Plan routes", "Compare"]);
    expect(entries("settings.add")).toEqual([["settings.add", "kiln.scenario.Plan", JSON.stringify({ ...record0, sheetId: "{id-Plan}" })]]);
    expect(entries("sheet.load")).toEqual([["sheet.load", "Plan", "id"]]);
    const order = host().log.map((e) => `${e[0]} ${String(e[1])}`);
    expect(order.indexOf("settings.add kiln.scenario.Plan")).toBeGreaterThan(order.indexOf("add Plan routes"));
    expect(order.indexOf("settings.add kiln.scenario.Plan")).toBeLessThan(order.indexOf("add Compare"));
    expect(entries("delete")).toEqual([]);
    // syncs: sheet names, the sheets' cells, the plan sheet's id, Compare's end (missing), the new Compare sheet
    // with the record, the closing sync; no read-back, as no cell holds formula-like text
    expect(host().syncs()).toBe(6);
  });

  it("places the new sheets just before an existing Compare sheet (worksheet.position, ExcelApi 1.1)", async () => {
    // Tabs: Stops 0, Fleet 1, Compare 2. Setting position p moves a sheet there and shifts the rest right.
    const book = install({ sheets: { Stops: "empty", Fleet: "empty", Compare: "empty" } });
    await book.writeRun(run);
    expect(entries("position")).toEqual([
      ["position", "Plan", 2],
      ["position", "Plan routes", 3],
    ]);
    // Without a Compare sheet yet, the sheets stay where add puts them (the end) and Compare follows.
    const fresh = install({ sheets: { Stops: "empty" } });
    await fresh.writeRun(run);
    expect(entries("position")).toEqual([]);
  });

  it("removes every sheet it added when a later step fails, and names them in the error", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    // syncs: 1 names, 2 the sheets' cells, 3 the plan sheet's id, 4 Compare's end (missing), 5 the new Compare sheet: fail there
    host().failSync(5, { code: "InvalidArgument", message: "The argument is invalid." });
    const error = await book.writeRun(run).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(OfficeActionError);
    expect((error as Error).message).toMatch(/Could not write the plan \(the sheets it had added were removed\).*InvalidArgument/);
    // Compare is removed by its own first write's clean-up, then the run's sheets (the mock names the last one looked up)
    expect(entries("delete")).toHaveLength(3);
  });

  it("retries once on GeneralException (desktop Excel when another workbook takes focus) and then succeeds", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    host().failSync(2, { code: "GeneralException", message: "An internal error has occurred." });
    await book.writeRun(run);
    expect(entries("settings.add")).toHaveLength(1);
    // the first attempt's sheets were removed before the second attempt added them again
    const kinds = host()
      .log.map((e) => (e[0] === "add" || e[0] === "delete" ? `${e[0]} ${String(e[1])}` : undefined))
      .filter(Boolean);
    expect(kinds.slice(0, 2)).toEqual(["add Plan", "add Plan routes"]);
    expect(kinds.filter((k) => k === "add Plan")).toHaveLength(2);
  });

  it("does not retry other errors, and gives up after a second GeneralException", async () => {
    const book = install({ sheets: { Stops: "empty" } });
    host().failSync(2, { code: "GeneralException", message: "An internal error has occurred." });
    host().failSync(7, { code: "GeneralException", message: "An internal error has occurred." });
    const error = await book.writeRun(run).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(OfficeActionError);
    expect((error as OfficeActionError).code).toBe("GeneralException");
    expect(entries("settings.add")).toHaveLength(0);
  });

  it("refuses a taken name before adding anything", async () => {
    const book = install({ sheets: { Plan: "empty" } });
    await expect(book.writeRun(run)).rejects.toThrow(/"Plan" already exists/);
    expect(entries("add")).toEqual([]);
  });
});

describe("Rerun finds a renamed plan sheet by its id", () => {
  it("Excel: the record stored under the old name is found through worksheet.id", async () => {
    const stored = { ...record0, sheetId: "{id-live}" };
    const book = install({ sheets: { Monday: "empty" }, settings: [{ key: "kiln.scenario.Plan", value: JSON.stringify(stored) }] });
    expect(await storedRunRecord(book, "Monday")).toEqual({ record: stored });
    const other = install({
      sheets: { Monday: "empty" },
      settings: [{ key: "kiln.scenario.Plan", value: JSON.stringify({ ...stored, sheetId: "{x}" }) }],
    });
    expect(await storedRunRecord(other, "Monday")).toEqual({ message: expect.stringMatching(/not a plan sheet made by Kiln/) });
  });

  it("a file: the record keeps the sheet id, which survives a rename and a save (exceljs, ECMA-376 sheetId)", async () => {
    const { runRecordText } = await import("../../src/taskpane/storedRunRecord.js");
    const book = await ExcelJsWorkbook.fromBuffer(await (await ExcelJsWorkbook.fromBuffer(await emptyBook())).toBuffer());
    await book.writeRun({ ...run, sheets: [{ name: "Plan", grid: plan }] });
    const id = await book.sheetId("Plan");
    expect(id).toBeDefined();
    const text = JSON.stringify({ ...record0, sheetId: id });
    expect((await book.readSettings())["kiln.scenario.Plan"]).toBe(text);
    // The user renames the sheet in another program and saves (here: exceljs itself).
    const ExcelJS = (await import("exceljs")).default;
    const raw = new ExcelJS.Workbook();
    await raw.xlsx.load((await book.toBuffer()) as unknown as ArrayBuffer);
    raw.getWorksheet("Plan")!.name = "Renamed";
    const renamed = await ExcelJsWorkbook.fromBuffer(Buffer.from(await raw.xlsx.writeBuffer()));
    expect(await renamed.sheetId("Renamed")).toBe(id);
    expect(runRecordText(await renamed.readSettings(), "Renamed", id)).toBe(text);
    expect(await storedRunRecord(renamed, "Renamed")).toEqual({ record: { ...record0, sheetId: id } });
    expect(runRecordText(await renamed.readSettings(), "Renamed", "999")).toBeUndefined();
  });
});

async function emptyBook(): Promise<Buffer> {
  const ExcelJS = (await import("exceljs")).default;
  const wb = new ExcelJS.Workbook();
  wb.addWorksheet("Stops").getCell("A1").value = "Stop";
  return Buffer.from(await wb.xlsx.writeBuffer());
}
