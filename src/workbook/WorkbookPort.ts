import type { CellValue, RouteChart, SheetGrid, SheetRead } from "../sheets/grid.js";

/**
 * What every front end needs from a workbook. Adapters: Office.js (Excel) and exceljs (files).
 * All methods are async; none ever modifies a sheet it did not create, except `appendRows`
 * on the Compare sheet.
 */
export interface WorkbookPort {
  /** Sheet names in tab order. */
  listSheets(): Promise<string[]>;
  /** The used range of a sheet; `undefined` when the sheet does not exist. */
  readSheet(name: string): Promise<SheetRead | undefined>;
  /** Add a new sheet (the name must be free; see `uniqueSheetName`) and write the grid at A1. */
  addSheet(name: string, grid: SheetGrid, chart?: RouteChart): Promise<void>;
  /**
   * Append rows below the last used row of `name`; create the sheet with `header` first
   * when it does not exist.
   */
  appendRows(name: string, header: SheetGrid, rows: SheetGrid): Promise<void>;
  /**
   * Write one run's output together: the new sheets (names must be free), then the record in the
   * settings store, then the rows appended to the Compare sheet. In Excel this is one `Excel.run`;
   * when it fails, the sheets it added are removed again, so no half plan is left behind.
   */
  writeRun(run: RunWrite): Promise<void>;
  /**
   * An id of the sheet that survives renaming it (Excel's `worksheet.id`; in a file, its sheet id),
   * or `undefined` when no sheet has that name.
   */
  sheetId(name: string): Promise<string | undefined>;
  /**
   * Replace the content of the very hidden sheet `name` with `values`, written as text (the
   * sheet is created very hidden when absent: users cannot unhide it from Excel's UI). For
   * data the add-in keeps in the workbook, such as the geocoding cache.
   */
  writeVeryHiddenSheet(name: string, values: readonly (readonly CellValue[])[]): Promise<void>;
  /**
   * Write `values` into the existing sheet `sheet` at 0-based `row`, `col`, but only into cells
   * that are empty: a cell holding anything is never overwritten, and `null` leaves a cell alone.
   * The one way the add-in writes into a user's sheet, and only on the user's explicit action.
   * @returns how many cells were written
   */
  fillEmptyCells(sheet: string, row: number, col: number, values: readonly (readonly CellValue[])[]): Promise<number>;
  /** The add-in's small key/value store of this workbook. */
  readSettings(): Promise<Record<string, string>>;
  writeSetting(key: string, value: string): Promise<void>;
}

/** One run's output for `WorkbookPort.writeRun`. */
export interface RunWrite {
  /** New sheets in the order they are added; the first is the plan sheet whose id the record keeps. */
  readonly sheets: readonly { readonly name: string; readonly grid: SheetGrid; readonly chart?: RouteChart }[];
  /** The settings-store entry, given the first sheet's id once it exists. */
  readonly record: (sheetId: string | undefined) => { readonly key: string; readonly value: string };
  /** Rows appended below the last used row of a sheet (created with `header` when missing). */
  readonly append: { readonly name: string; readonly header: SheetGrid; readonly rows: SheetGrid };
}

export type { CellValue, SheetRead };
