import ExcelJS from "exceljs";
import type { CellValue, RouteChart, SheetGrid } from "../../sheets/grid.js";
import type { RunWrite, SheetRead, WorkbookPort } from "../WorkbookPort.js";
import { pinZipDates } from "./pinZipDates.js";
import { rawCellValue } from "./rawCellValue.js";
import { writeGrid } from "./writeGrid.js";
import { writePrintSetup } from "./writePrintSetup.js";
import { checkPrintSetup } from "../../sheets/printSetup.js";
import { checkSheetName } from "../../sheets/uniqueSheetName.js";
import { MAX_CELL_TEXT, readSettingRows, SETTINGS_SHEET, writeSettingRow } from "./settingsSheet.js";
import { lastUsedRow, readUsedRange } from "./usedRange.js";

export { SETTINGS_SHEET };

/**
 * A `WorkbookPort` over an .xlsx file held in memory, through exceljs. It takes and gives
 * bytes (no file system), so the CLI and the standalone page share it.
 *
 * exceljs cannot write charts: `addSheet` writes the grid and records the sheet in
 * `skippedCharts` instead of drawing the route chart (the Excel adapter draws it).
 *
 * @example
 * const book = await ExcelJsWorkbook.fromBuffer(bytes);
 * const stops = await book.readSheet("Stops"); // { sheet: "Stops", row: 0, col: 0, values: [...] }
 * const out = await book.toBuffer();
 */
export class ExcelJsWorkbook implements WorkbookPort {
  /** Sheets whose route chart was not drawn because exceljs cannot write charts. */
  readonly skippedCharts: string[] = [];
  private pinnedDate: Date | undefined;

  private constructor(private readonly book: ExcelJS.Workbook) {}

  /**
   * Open an .xlsx file from its bytes.
   *
   * @param data - the file's content
   * @returns the workbook
   * @throws TypeError when `data` is not bytes; exceljs' error when the bytes are not an .xlsx file
   * @example const book = await ExcelJsWorkbook.fromBuffer(await readFile("plan.xlsx"));
   */
  static async fromBuffer(data: ArrayBuffer | Uint8Array): Promise<ExcelJsWorkbook> {
    if (!(data instanceof ArrayBuffer) && !(data instanceof Uint8Array)) {
      throw new TypeError("data must be an ArrayBuffer or Uint8Array");
    }
    const book = new ExcelJS.Workbook();
    // exceljs accepts an ArrayBuffer in both Node and the browser (JSZip reads it).
    const bytes = data instanceof Uint8Array ? toArrayBuffer(data) : data;
    await book.xlsx.load(bytes);
    return new ExcelJsWorkbook(book);
  }

  /**
   * A new workbook from plain tables, one sheet each (for CSV input).
   *
   * @param sheets - sheet names and their rows; values are strings, numbers, booleans, or empty (null/undefined/"")
   * @returns the workbook
   * @throws RangeError on an invalid or repeated sheet name; TypeError on a value of another type
   * @example ExcelJsWorkbook.fromGrids([{ name: "Stops", values: [["Stop", "Latitude"], ["S1", 52.1]] }])
   */
  static fromGrids(sheets: readonly { readonly name: string; readonly values: readonly (readonly unknown[])[] }[]): ExcelJsWorkbook {
    const result = new ExcelJsWorkbook(new ExcelJS.Workbook());
    for (const sheet of sheets) {
      const ws = result.newSheet(sheet.name);
      sheet.values.forEach((row, r) => {
        row.forEach((value, c) => {
          if (value === null || value === undefined || value === "") return;
          if (typeof value !== "string" && typeof value !== "number" && typeof value !== "boolean") {
            throw new TypeError(`sheets["${sheet.name}"].values[${r}][${c}] must be a string, number or boolean`);
          }
          ws.getCell(r + 1, c + 1).value = value;
        });
      });
    }
    return result;
  }

  /**
   * The workbook as .xlsx bytes. After `setDocumentDates`, the archive's entry times are
   * pinned to the modified date too, so equal content gives equal bytes.
   *
   * @returns the file's content
   * @example await writeFile("out.xlsx", await book.toBuffer());
   */
  async toBuffer(): Promise<Uint8Array> {
    const out = await this.book.xlsx.writeBuffer();
    const bytes = new Uint8Array(out as ArrayBuffer);
    return this.pinnedDate ? pinZipDates(bytes, this.pinnedDate) : bytes;
  }

  /**
   * Fix the file's created/modified dates (document properties and ZIP entry times), for
   * reproducible files such as the demo.
   *
   * @param created - creation date-time (UTC)
   * @param modified - last-modified date-time (UTC), default `created`
   * @example book.setDocumentDates(new Date(Date.UTC(2026, 0, 5)));
   */
  setDocumentDates(created: Date, modified: Date = created): void {
    this.book.created = created;
    this.book.modified = modified;
    this.pinnedDate = modified;
  }

  /**
   * Sheet names in tab order, hidden ones included (as Excel's worksheet collection lists them).
   * @example await book.listSheets() // => ["Stops", "Fleet", "Settings"]
   */
  async listSheets(): Promise<string[]> {
    return this.book.worksheets.map((ws) => ws.name);
  }

  /**
   * The used range of a sheet as raw values (see `rawCellValue`): from the first to the last
   * row and column holding a value; formatted but empty cells do not count.
   *
   * @param name - sheet name, matched ignoring case
   * @returns the values with their 0-based offset, or `undefined` when there is no such sheet
   * @example await book.readSheet("Stops") // => { sheet: "Stops", row: 0, col: 0, values: [["Stop", ...], ...] }
   */
  async readSheet(name: string): Promise<SheetRead | undefined> {
    const ws = this.findSheet(name);
    return ws ? readUsedRange(ws) : undefined;
  }

  /**
   * Add a sheet at the end and write the grid at A1. The chart is not drawn (exceljs cannot
   * write charts); the sheet is listed in `skippedCharts` instead.
   *
   * @param name - a free, valid sheet name (see `uniqueSheetName`)
   * @param grid - values and their formats
   * @param chart - the route chart the Excel adapter would draw
   * @throws RangeError when the name is taken or invalid; TypeError on a value that is not a cell value
   * @example await book.addSheet("Plan", layout.grid, layout.chart)
   */
  async addSheet(name: string, grid: SheetGrid, chart?: RouteChart): Promise<void> {
    if (grid.print) checkPrintSetup(grid.print, grid.values.length);
    const ws = this.newSheet(name);
    writeGrid(ws, grid, 1, { date1904: this.date1904 });
    if (grid.print) writePrintSetup(ws, grid.print);
    if (chart) this.skippedCharts.push(ws.name);
  }

  /**
   * Write one run's output: the sheets (placed before an existing Compare sheet, as the Excel
   * adapter places them, so Compare stays after the plans it lists), the rows appended to the
   * Compare sheet, then the record (keeping the plan sheet's id). Everything is in memory until
   * `toBuffer`, so nothing is ever half written to a file.
   *
   * @param run - the sheets, the record and the rows to append
   * @example await book.writeRun({ sheets: [{ name: "Plan", grid }], record: (id) => ({ key, value }), append })
   */
  async writeRun(run: RunWrite): Promise<void> {
    const compare = this.findSheet(run.append.name);
    for (const sheet of run.sheets) await this.addSheet(sheet.name, sheet.grid, sheet.chart);
    if (compare)
      this.moveBefore(
        run.sheets.map((s) => s.name),
        compare,
      );
    await this.appendRows(run.append.name, run.append.header, run.append.rows);
    const first = run.sheets[0];
    const { key, value } = run.record(first ? await this.sheetId(first.name) : undefined);
    await this.writeSetting(key, value);
  }

  /**
   * The sheet's id in the file (`sheetId` of ECMA-376 workbook.xml, kept when the sheet is renamed).
   *
   * @param name - sheet name, matched ignoring case
   * @returns the id as text, or `undefined` when no sheet has that name
   * @example await book.sheetId("Plan") // => "4"
   */
  async sheetId(name: string): Promise<string | undefined> {
    const ws = this.findSheet(name);
    return ws ? String(ws.id) : undefined;
  }

  /**
   * Append rows below the last row holding a value; create the sheet with `header` (and its
   * widths and frozen rows) first when it does not exist.
   *
   * @param name - sheet name, matched ignoring case
   * @param header - written only when the sheet is created
   * @param rows - the rows to append, with their formats
   * @example await book.appendRows("Compare", layoutCompareHeader(), layoutCompareRow(run, plan))
   */
  async appendRows(name: string, header: SheetGrid, rows: SheetGrid): Promise<void> {
    let ws = this.findSheet(name);
    if (!ws) {
      ws = this.newSheet(name);
      writeGrid(ws, header, 1, { date1904: this.date1904 });
    }
    writeGrid(ws, rows, lastUsedRow(ws) + 1, { layout: false, date1904: this.date1904 });
  }

  /**
   * Replace the content of a very hidden sheet (ECMA-376 Part 1, 18.18.68 ST_SheetState
   * "veryHidden"), creating it when absent. Values are stored as text cells.
   *
   * @param name - the sheet name
   * @param values - rows of cell values (`null` for empty)
   * @throws RangeError when the name breaks Excel's sheet-name rules or a text is over 32,767 characters
   * @example await book.writeVeryHiddenSheet("kiln-geocodes", [["Key", "Answer"], ["k", "[]"]])
   */
  async writeVeryHiddenSheet(name: string, values: readonly (readonly CellValue[])[]): Promise<void> {
    for (const row of values)
      for (const v of row)
        if (typeof v === "string" && v.length > MAX_CELL_TEXT)
          throw new RangeError(`a value of ${v.length} characters is over Excel's ${MAX_CELL_TEXT}`);
    let ws = this.findSheet(name);
    if (ws) this.book.removeWorksheet(ws.id);
    ws = this.newSheet(name);
    ws.state = "veryHidden";
    const formats = values.map((r) => r.map((v) => (typeof v === "string" ? "@" : null)));
    writeGrid(ws, { values, numberFormats: formats }, 1, { layout: false });
  }

  /**
   * Write values into empty cells of an existing sheet only; a cell holding a value is kept.
   *
   * @param sheet - sheet name, matched ignoring case
   * @param row - 0-based row of `values[0][0]`
   * @param col - 0-based column of `values[0][0]`
   * @param values - the values; `null` leaves a cell alone
   * @returns how many cells were written
   * @throws RangeError when the sheet does not exist
   * @example await book.fillEmptyCells("Stops", 0, 7, [["Latitude"], [52.09]]) // => 2
   */
  async fillEmptyCells(sheet: string, row: number, col: number, values: readonly (readonly CellValue[])[]): Promise<number> {
    const ws = this.findSheet(sheet);
    if (!ws) throw new RangeError(`sheet "${sheet}" does not exist in this workbook`);
    let written = 0;
    values.forEach((line, r) =>
      line.forEach((v, c) => {
        if (v === null || v === "") return;
        const cell = ws.getCell(row + r + 1, col + c + 1);
        if (rawCellValue(cell.value) !== "") return;
        cell.value = v;
        written++;
      }),
    );
    return written;
  }

  /**
   * The key/value rows of the very hidden settings sheet (`SETTINGS_SHEET`).
   * @returns every stored key and its text; `{}` when the file has none
   * @example await book.readSettings() // => { "kiln.scenario.Plan": "{...}" }
   */
  async readSettings(): Promise<Record<string, string>> {
    const ws = this.findSheet(SETTINGS_SHEET);
    return ws ? readSettingRows(ws) : {};
  }

  /**
   * Store one key on the very hidden settings sheet, replacing its row when the key exists.
   *
   * @param key - non-empty key
   * @param value - text of at most 32,767 characters (Excel's cell limit)
   * @throws TypeError on a missing key or a non-string value; RangeError on a too long value
   * @example await book.writeSetting(scenarioSettingsKey("Plan"), JSON.stringify(run))
   */
  async writeSetting(key: string, value: string): Promise<void> {
    if (typeof key !== "string" || key === "") throw new TypeError("key must be a non-empty string");
    if (typeof value !== "string") throw new TypeError("value must be a string");
    if (value.length > MAX_CELL_TEXT) throw new RangeError(`value must be at most ${MAX_CELL_TEXT} characters, got ${value.length}`);
    let ws = this.findSheet(SETTINGS_SHEET);
    if (!ws) {
      ws = this.newSheet(SETTINGS_SHEET);
      ws.state = "veryHidden";
      writeGrid(ws, { values: [["Key", "Value"]], boldRows: [0] }, 1);
    }
    writeSettingRow(ws, key, value);
  }

  /** True for a workbook in the 1904 date system (old Mac files). */
  private get date1904(): boolean {
    return Boolean((this.book.properties as { date1904?: boolean }).date1904);
  }

  private findSheet(name: string): ExcelJS.Worksheet | undefined {
    const wanted = name.toLowerCase();
    return this.book.worksheets.find((ws) => ws.name.toLowerCase() === wanted);
  }

  /**
   * Put the sheets `names` (in that order) just before `anchor` in the tab order. exceljs writes
   * the sheets in the order of their `orderNo`, which its typings do not declare.
   */
  private moveBefore(names: readonly string[], anchor: ExcelJS.Worksheet): void {
    const moving = names.map((n) => this.findSheet(n)).filter((ws): ws is ExcelJS.Worksheet => ws !== undefined);
    const rest = this.book.worksheets.filter((ws) => !moving.includes(ws));
    const order = rest.flatMap((ws) => (ws === anchor ? [...moving, ws] : [ws]));
    order.forEach((ws, i) => ((ws as ExcelJS.Worksheet & { orderNo: number }).orderNo = i + 1));
  }

  private newSheet(name: string): ExcelJS.Worksheet {
    checkSheetName(name);
    if (this.findSheet(name)) throw new RangeError(`name "${name}" is already a sheet of this workbook (see uniqueSheetName)`);
    return this.book.addWorksheet(name);
  }
}

function toArrayBuffer(bytes: Uint8Array): ArrayBuffer {
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  return copy.buffer;
}
