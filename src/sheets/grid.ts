import type { PrintSetup } from "./printSetup.js";

export type { PrintHeaderFooter, PrintSetup } from "./printSetup.js";

/**
 * A sheet's content as pure data: what the layout functions produce and every
 * `WorkbookPort` adapter writes. One grid = one rectangular block starting at A1
 * (or at the next free row when appended).
 */

/** Values read from a sheet or range, with where they sit (what every workbook adapter returns). */
export interface SheetRead {
  readonly sheet: string;
  /** 0-based row and column of `values[0][0]` in the sheet (so "B3" is row 2, col 1). */
  readonly row: number;
  readonly col: number;
  /** Raw values: numbers (dates as serials), strings, booleans, "" for empty. */
  readonly values: readonly (readonly unknown[])[];
  /**
   * Merged areas whose top-left cell lies in the range, in sheet coordinates (0-based). Absent
   * when the adapter cannot tell. Adapters differ in what the other cells of a merge read as
   * (exceljs: the first cell's value; Excel: empty), so readers that care use this list.
   */
  readonly merges?: readonly CellBlock[];
}

/** A cell value as written: text, number, boolean or empty (`null`). */
export type CellValue = string | number | boolean | null;

/** A block of cells plus how to show them. */
export interface SheetGrid {
  /** Rows of equal length. Strings are literal text: adapters never turn them into formulas. */
  readonly values: readonly (readonly CellValue[])[];
  /**
   * Excel number format per cell (same shape as `values`), e.g. "hh:mm", "0.0", "@".
   * `null` leaves the cell's format as "General".
   */
  readonly numberFormats?: readonly (readonly (string | null)[])[];
  /** Column widths in characters, left to right; missing entries keep the default. */
  readonly columnWidths?: readonly number[];
  /** Rows (from the top) to freeze; 0 or absent freezes none. */
  readonly freezeRows?: number;
  /** 0-based rows to show bold (titles, headers). */
  readonly boldRows?: readonly number[];
  /**
   * How the sheet prints (orientation, paper, fit to width, title rows, page breaks, header
   * and footer). Applied by `addSheet` only; Excel without ExcelApi 1.9 skips it with a notice.
   */
  readonly print?: PrintSetup;
}

/** A rectangle of cells, 0-based, inclusive start, exclusive end. */
export interface CellBlock {
  readonly row: number;
  readonly col: number;
  readonly rows: number;
  readonly cols: number;
}

/** An XY scatter chart of routes to place beside the route table. */
export interface RouteChart {
  readonly title: string;
  /** One series per used vehicle: name and the block of its [longitude, latitude] cells. */
  readonly series: readonly { readonly name: string; readonly x: CellBlock; readonly y: CellBlock }[];
  /** Where to anchor the chart (top-left cell). */
  readonly anchor: { readonly row: number; readonly col: number };
}
