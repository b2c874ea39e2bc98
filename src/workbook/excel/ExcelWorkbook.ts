import type { CellValue, RouteChart, SheetGrid } from "../../sheets/grid.js";
import { checkPrintSetup } from "../../sheets/printSetup.js";
import type { RunWrite, SheetRead, WorkbookPort } from "../WorkbookPort.js";
import { addSheetIn } from "./addSheetIn.js";
import { applyPrintSetup } from "./applyPrintSetup.js";
import { excelCapabilities, type ExcelCapabilities } from "./excelCapabilities.js";
import { readMerges, readSelectionIn, readUsedRange, readValues, toRead, type SelectionRead } from "./excelReads.js";
import { checkSheetName, writeVeryHiddenSheetIn } from "./excelSheetWrite.js";
import { fillEmptyCellsIn } from "./fillEmptyCellsIn.js";
import { OfficeActionError } from "./OfficeActionError.js";
import { planGridWrite } from "./planGridWrite.js";
import { queueAppend } from "./queueAppend.js";
import { parseBlock, parseRangeAddress } from "./rangeAddress.js";
import { readGeographyIn, type GeographyRead } from "./readGeographyIn.js";
import { checkWrittenText } from "./verifyTextCells.js";
import { watchSheetsIn, type SheetChange } from "./watchSheetsIn.js";
import { writeRunIn } from "./writeRunIn.js";

export type { ExcelCapabilities, GeographyRead, SelectionRead };

export type { SheetChange };

/** Options of `ExcelWorkbook`. */
export interface ExcelWorkbookOptions {
  /** Estimated request bytes above which writes are split into row chunks (default `PAYLOAD_BUDGET_BYTES`, 2 MB). */
  readonly budgetBytes?: number;
  /** Cells read per sync above which reads go in row blocks (default `READ_BLOCK_CELLS`, 50 000). */
  readonly readBlockCells?: number;
  /** Told, in a sentence for the pane, when a feature is skipped because this Excel lacks it. */
  readonly onNotice?: (message: string) => void;
}

/**
 * `WorkbookPort` over Office.js, the only code that touches the `Excel` and `Office` globals.
 * Follows STYLE.md §8: one `Excel.run` per call, only the properties read are loaded, one
 * sync per read and one per write (plus one per row chunk above the payload budget, and one to read back formula-like text). It writes
 * only to sheets it creates, and to the end of the Compare sheet in `appendRows`.
 *
 * @example
 * const book = new ExcelWorkbook({ onNotice: (m) => pane.note(m) });
 * const stops = await book.readSheet("Stops"); // { sheet: "Stops", row: 0, col: 0, values: [...] }
 */
export class ExcelWorkbook implements WorkbookPort {
  readonly #budgetBytes: number | undefined;
  readonly #readBlockCells: number | undefined;
  readonly #notice: (message: string) => void;

  /** @param options - chunk threshold and the notice callback */
  constructor(options: ExcelWorkbookOptions = {}) {
    this.#budgetBytes = options.budgetBytes;
    this.#readBlockCells = options.readBlockCells;
    this.#notice = options.onNotice ?? (() => undefined);
  }

  /** Optional features of the running Excel; all false outside Office. */
  capabilities(): ExcelCapabilities {
    return excelCapabilities();
  }

  /** Sheet names in tab order. @throws OfficeActionError when Excel fails */
  async listSheets(): Promise<string[]> {
    return this.#run("list the sheets", async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      return sheets.items.map((s) => s.name);
    });
  }

  /** The used range of `name` (values only), or `undefined` when no such sheet exists. */
  async readSheet(name: string): Promise<SheetRead | undefined> {
    return this.#run(`read the sheet "${name}"`, async (context) => {
      const used = await readUsedRange(context, name, "isNullObject, rowIndex, columnIndex, rowCount, columnCount");
      if (used === undefined) return undefined;
      if (used.isNullObject) return { sheet: name, row: 0, col: 0, values: [] };
      const read = await readValues(context, name, used, this.#readBlockCells);
      const merges = this.capabilities().merges ? await readMerges(context, used) : [];
      return merges.length > 0 ? { ...read, merges } : read;
    });
  }

  /**
   * Adds the sheet `name` and writes `grid` at A1, then the route chart when Excel has
   * ExcelApi 1.7 (otherwise a notice). If a write fails the half-written sheet is deleted.
   * @throws RangeError when `name` breaks Excel's sheet-name rules
   * @throws OfficeActionError when the name is taken or Excel fails
   */
  async addSheet(name: string, grid: SheetGrid, chart?: RouteChart): Promise<void> {
    checkSheetName(name);
    if (grid.print) checkPrintSetup(grid.print, grid.values.length);
    const plan = planGridWrite(grid, { budgetBytes: this.#budgetBytes });
    const caps = this.capabilities();
    await this.#run(`add the sheet "${name}"`, (context) => addSheetIn(context, name, grid, chart, plan, caps, this.#notice));
  }

  /**
   * Appends `rows` below the last used row of `name`; creates the sheet with `header` first
   * when it does not exist (and writes `header` first when the sheet is empty).
   * @throws OfficeActionError when Excel fails
   */
  async appendRows(name: string, header: SheetGrid, rows: SheetGrid): Promise<void> {
    checkSheetName(name);
    const caps = this.capabilities();
    await this.#run(`append rows to the sheet "${name}"`, async (context) => {
      const rowsPlan = await queueAppend(context, name, header, rows, caps.freezePanes, this.#budgetBytes);
      await context.sync();
      await checkWrittenText(context, name, rowsPlan, this.#notice);
    });
  }

  /**
   * Writes one run's output in one `Excel.run`: the new sheets (with charts), the run record
   * keyed to the plan sheet's `worksheet.id` (ExcelApi 1.1; it survives renaming), and the
   * Compare rows. If any of it fails, the sheets it added are deleted in a new batch; a
   * GeneralException (which desktop Excel raises when another workbook takes focus, OFFICE-NOTES.md)
   * is retried once. Print settings and the text read-back follow; what they cannot do is a notice.
   * @throws RangeError when a name breaks Excel's sheet-name rules
   * @throws OfficeActionError when a name is taken or Excel fails twice
   */
  async writeRun(run: RunWrite): Promise<void> {
    for (const sheet of run.sheets) {
      checkSheetName(sheet.name);
      if (sheet.grid.print) checkPrintSetup(sheet.grid.print, sheet.grid.values.length);
    }
    checkSheetName(run.append.name);
    const plans = run.sheets.map((sheet) => planGridWrite(sheet.grid, { budgetBytes: this.#budgetBytes }));
    const caps = this.capabilities();
    const action = `write the plan "${run.sheets[0]?.name ?? ""}"`;
    const attempt = (): Promise<void> =>
      this.#run(action, async (context) => {
        const appended = await writeRunIn(context, run, plans, caps, { budgetBytes: this.#budgetBytes, notice: this.#notice });
        for (const [i, sheet] of run.sheets.entries()) await checkWrittenText(context, sheet.name, plans[i]!, this.#notice);
        await checkWrittenText(context, run.append.name, appended, this.#notice);
        for (const sheet of run.sheets)
          if (sheet.grid.print) await applyPrintSetup(context, sheet.name, sheet.grid.print, caps.printLayout, this.#notice);
      });
    try {
      await attempt();
    } catch (error) {
      if (!(error instanceof OfficeActionError) || error.code !== "GeneralException") throw error;
      await attempt();
    }
  }

  /**
   * `worksheet.id` of `name` (ExcelApi 1.1), which stays the same when the sheet is renamed.
   * @returns the id, or `undefined` when no sheet has that name
   * @throws OfficeActionError when Excel fails
   */
  async sheetId(name: string): Promise<string | undefined> {
    return this.#run(`find the sheet "${name}"`, async (context) => {
      const ws = context.workbook.worksheets.getItemOrNullObject(name);
      ws.load("isNullObject, id");
      await context.sync();
      return ws.isNullObject ? undefined : ws.id;
    });
  }

  /**
   * Replaces the content of the very hidden sheet `name` (`Excel.SheetVisibility.veryHidden`,
   * ExcelApi 1.1), adding it when absent; values are written as text ("@"). One sync to find
   * the sheet, one to write.
   * @throws OfficeActionError when Excel fails
   */
  async writeVeryHiddenSheet(name: string, values: readonly (readonly CellValue[])[]): Promise<void> {
    checkSheetName(name);
    await this.#run(`store the sheet "${name}"`, (context) => writeVeryHiddenSheetIn(context, name, values));
  }

  /**
   * Writes values into the empty cells of a block of an existing sheet: one sync reads the
   * block, one writes it with `null` for every cell to keep (Office.js leaves a cell given
   * `null` in a 2-D array unchanged: "Blank and null values in Excel add-ins").
   * @returns how many cells were written
   * @throws OfficeActionError when the sheet does not exist or Excel fails
   */
  async fillEmptyCells(sheet: string, row: number, col: number, values: readonly (readonly CellValue[])[]): Promise<number> {
    const width = Math.max(0, ...values.map((r) => r.length));
    if (values.length === 0 || width === 0) return 0;
    return this.#run(`add values to the sheet "${sheet}"`, (context) => fillEmptyCellsIn(context, sheet, row, col, values, width));
  }

  /** The add-in's settings of this workbook (`workbook.settings`, ExcelApi 1.4), as text. */
  async readSettings(): Promise<Record<string, string>> {
    return this.#run("read the add-in settings", async (context) => {
      const settings = context.workbook.settings;
      settings.load("items");
      await context.sync();
      const out: Record<string, string> = {};
      for (const item of settings.items) out[item.key] = typeof item.value === "string" ? item.value : JSON.stringify(item.value);
      return out;
    });
  }

  /** Stores (adds or replaces) one setting. @throws TypeError when `key` is empty */
  async writeSetting(key: string, value: string): Promise<void> {
    if (typeof key !== "string" || key === "") throw new TypeError("key must be a non-empty string");
    if (typeof value !== "string") throw new TypeError("value must be a string");
    await this.#run(`store the setting "${key}"`, async (context) => {
      context.workbook.settings.add(key, value);
      await context.sync();
    });
  }

  /**
   * Reads the selected block, or the whole Excel table it lies inside (ExcelApi 1.9;
   * without it, the plain selection). The selection is clipped to the sheet's used range
   * first, so selecting whole columns (A:N) reads only the filled rows instead of a million.
   * Two syncs only when a table is involved; with ExcelApi 1.13 one more for the merged areas of
   * what was read (a row of merged group headers above the header), as `readSheet` does.
   * @throws OfficeActionError when several blocks are selected or Excel fails
   */
  async readSelection(): Promise<SelectionRead> {
    const caps = this.capabilities();
    return this.#run("read the selection (select one block of cells)", (context) =>
      readSelectionIn(context, caps.tables, this.#readBlockCells, caps.merges),
    );
  }

  /**
   * Reads a sheet-qualified range such as "Stops!A1:J81".
   * @throws RangeError when `address` is not sheet-qualified A1 style
   * @throws OfficeActionError when the sheet does not exist or Excel fails
   */
  async readRange(address: string): Promise<SheetRead> {
    const parsed = parseRangeAddress(address);
    if (!parsed) throw new RangeError(`address must look like "Stops!A1:J81", got "${address}"`);
    return this.#run(`read ${address}`, async (context) => {
      const range = context.workbook.worksheets.getItem(parsed.sheet).getRange(parsed.range);
      range.load("values, rowIndex, columnIndex");
      await context.sync();
      return toRead(parsed.sheet, range);
    });
  }

  /**
   * Reads Geography (linked entity) cells of `address` through `valuesAsJson` (ExcelApi 1.16)
   * in row blocks and returns their latitude/longitude where the entity exposes them. Guarded
   * by `isSetSupported` and by the member being present; any failure is `available: false`
   * with a reason for the pane, never an exception, so the plain values stay usable.
   * @throws RangeError when `address` is not sheet-qualified A1 style
   */
  async readGeography(address: string): Promise<GeographyRead> {
    const parsed = parseRangeAddress(address);
    if (!parsed) throw new RangeError(`address must look like "Stops!C2:C81", got "${address}"`);
    if (!this.capabilities().geography) {
      return {
        available: false,
        reason: "Geography cells need Excel with ExcelApi 1.16 (Microsoft 365); type latitude and longitude into two columns instead.",
      };
    }
    const block = parseBlock(parsed.range);
    if (!block) throw new RangeError(`address must look like "Stops!C2:C81", got "${address}"`);
    try {
      return await Excel.run((context) => readGeographyIn(context, parsed.sheet, block));
    } catch (error) {
      return { available: false, reason: new OfficeActionError(`read the Geography cells of ${address}`, error).message };
    }
  }

  /**
   * Activates `sheet` and selects `cell` (for clickable issue addresses); an empty `cell`
   * only activates the sheet.
   * @throws RangeError when `cell` is not an A1 cell or range address
   */
  async selectCell(sheet: string, cell: string): Promise<void> {
    if (cell !== "" && !/^[A-Z]{1,3}[0-9]{1,7}(:[A-Z]{1,3}[0-9]{1,7})?$/i.test(cell)) {
      throw new RangeError(`cell must be an A1 address such as "E7", got "${cell}"`);
    }
    await this.#run(`select ${sheet}!${cell}`, async (context) => {
      const ws = context.workbook.worksheets.getItem(sheet);
      ws.activate();
      if (cell !== "") ws.getRange(cell).select();
      await context.sync();
    });
  }

  /**
   * Call `listener` whenever a sheet is added, deleted (ExcelApi 1.7) or renamed (ExcelApi 1.17)
   * in the workbook, by the user or by a co-author, so lists of sheets can follow. The handlers
   * last as long as the pane (Excel drops them when the add-in closes).
   *
   * @param listener - told what changed; for a rename, the old and new name
   * @returns which events are watched; none below ExcelApi 1.7
   * @throws OfficeActionError when Excel fails
   * @example await book.watchSheets((c) => c.kind === "renamed" && console.log(c.from, "->", c.to))
   */
  async watchSheets(listener: (change: SheetChange) => void): Promise<{ added: boolean; deleted: boolean; renamed: boolean }> {
    const caps = this.capabilities();
    if (!caps.sheetEvents) return { added: false, deleted: false, renamed: false };
    return this.#run("watch the sheets for changes", (context) => watchSheetsIn(context, caps, listener));
  }

  /** Name of the active worksheet. */
  async activeSheetName(): Promise<string> {
    return this.#run("find the active sheet", async (context) => {
      const ws = context.workbook.worksheets.getActiveWorksheet();
      ws.load("name");
      await context.sync();
      return ws.name;
    });
  }

  async #run<T>(action: string, batch: (context: Excel.RequestContext) => Promise<T>): Promise<T> {
    try {
      return await Excel.run(batch);
    } catch (error) {
      if (error instanceof OfficeActionError || error instanceof RangeError || error instanceof TypeError) throw error;
      throw new OfficeActionError(action, error);
    }
  }
}
