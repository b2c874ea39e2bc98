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
  /** The add-in's small key/value store of this workbook. */
  readSettings(): Promise<Record<string, string>>;
  writeSetting(key: string, value: string): Promise<void>;
}

export type { CellValue, SheetRead };
