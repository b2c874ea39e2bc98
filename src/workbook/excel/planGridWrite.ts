import type { CellValue, SheetGrid } from "../../sheets/grid.js";
import { blockA1, cellA1 } from "./rangeAddress.js";
import { columnWidthPoints } from "./columnWidthPoints.js";

/** One rectangular write: number formats first, then values, both of exactly the block's size. */
export interface GridChunk {
  /** 0-based sheet row of the chunk's first row. */
  readonly row: number;
  /** A1 address of the block, e.g. "A1:P80". */
  readonly address: string;
  readonly values: (string | number | boolean)[][];
  readonly numberFormats: string[][];
}

/** Everything the Office.js adapter assigns for one grid, computed without touching Excel. */
export interface GridWritePlan {
  readonly rows: number;
  readonly cols: number;
  /** One chunk unless the grid has more than `chunkCells` cells (each chunk then gets its own sync). */
  readonly chunks: readonly GridChunk[];
  /** Whole-column addresses ("C:C") and their widths in points. */
  readonly columnWidths: readonly { readonly address: string; readonly widthPt: number }[];
  /** A1 addresses of the rows to show bold. */
  readonly boldRanges: readonly string[];
  readonly freezeRows: number;
}

/** Options of `planGridWrite`. */
export interface PlanGridWriteOptions {
  /** 0-based sheet row where the grid's first row goes (default 0, i.e. A1). */
  readonly startRow?: number;
  /** Cells per sync above which the write is split into row chunks (default `CHUNK_CELLS_DEFAULT`). */
  readonly chunkCells?: number;
}

/**
 * Cells per request before the write is split: far below Excel on the web's 5 MB request
 * cap (OFFICE-NOTES.md) even with long text in every cell.
 */
export const CHUNK_CELLS_DEFAULT = 20_000;

/**
 * Whether Excel would read this text as a formula when assigned to `values`
 * (a leading `=`, `+`, `-`, `@`, tab or carriage return, per OFFICE-NOTES.md and OWASP "CSV Injection"
 * guidance, common practice).
 * @example isFormulaLike("=SUM(A1)") // true
 */
export function isFormulaLike(text: string): boolean {
  return /^[=+\-@\t\r]/.test(text);
}

/**
 * Turns a `SheetGrid` into the assignments the adapter makes: every text cell gets the
 * text format "@" (so Excel keeps it as typed: no formula, number or date conversion),
 * and formula-like text is also prefixed with an apostrophe, Excel's text marker, because
 * it is unverified which of the two Excel honours through the API (OFFICE-NOTES.md).
 * `null` becomes "" and a missing format "General".
 *
 * @param grid - the pure layout (rows of equal length)
 * @param options - start row and chunk threshold
 * @returns the chunks, column widths in points, bold rows and frozen rows
 * @throws RangeError when rows differ in length, a format row does not match, or a number is not finite
 * @example planGridWrite({ values: [["=1+1", 2]] }).chunks[0]
 *   // { row: 0, address: "A1:B1", values: [["'=1+1", 2]], numberFormats: [["@", "General"]] }
 */
export function planGridWrite(grid: SheetGrid, options: PlanGridWriteOptions = {}): GridWritePlan {
  const startRow = options.startRow ?? 0;
  const chunkCells = options.chunkCells ?? CHUNK_CELLS_DEFAULT;
  if (!Number.isInteger(startRow) || startRow < 0) throw new RangeError(`options.startRow must be a non-negative integer, got ${startRow}`);
  if (!(chunkCells >= 1)) throw new RangeError(`options.chunkCells must be at least 1, got ${chunkCells}`);
  const rows = grid.values.length;
  const cols = grid.values[0]?.length ?? 0;
  const values: (string | number | boolean)[][] = [];
  const formats: string[][] = [];
  grid.values.forEach((row, r) => {
    if (row.length !== cols) throw new RangeError(`grid.values[${r}] has ${row.length} cells, expected ${cols}`);
    const formatRow = grid.numberFormats?.[r];
    if (grid.numberFormats && formatRow?.length !== cols) throw new RangeError(`grid.numberFormats[${r}] must have ${cols} entries`);
    values.push(row.map((v, c) => cellValue(v, r, c)));
    formats.push(row.map((v, c) => cellFormat(v, formatRow?.[c] ?? null)));
  });
  const chunks: GridChunk[] = [];
  if (rows > 0 && cols > 0) {
    const rowsPerChunk = rows * cols > chunkCells ? Math.max(1, Math.floor(chunkCells / cols)) : rows;
    for (let r = 0; r < rows; r += rowsPerChunk) {
      const n = Math.min(rowsPerChunk, rows - r);
      chunks.push({
        row: startRow + r,
        address: blockA1({ row: startRow + r, col: 0, rows: n, cols }),
        values: values.slice(r, r + n),
        numberFormats: formats.slice(r, r + n),
      });
    }
  }
  const columnWidths = (grid.columnWidths ?? []).map((w, c) => {
    const letter = cellA1(0, c).replace(/[0-9]+$/, "");
    return { address: `${letter}:${letter}`, widthPt: columnWidthPoints(w) };
  });
  const boldRanges =
    cols === 0
      ? []
      : (grid.boldRows ?? []).filter((r) => r >= 0 && r < rows).map((r) => blockA1({ row: startRow + r, col: 0, rows: 1, cols }));
  return { rows, cols, chunks, columnWidths, boldRanges, freezeRows: Math.max(0, Math.min(grid.freezeRows ?? 0, rows)) };
}

function cellValue(v: CellValue, r: number, c: number): string | number | boolean {
  if (v === null) return "";
  if (typeof v === "number" && !Number.isFinite(v))
    throw new RangeError(`grid.values[${r}][${c}] is ${v}: Excel cells hold finite numbers only`);
  if (typeof v === "string" && isFormulaLike(v)) return `'${v}`;
  return v;
}

function cellFormat(v: CellValue, format: string | null): string {
  if (typeof v === "string" && v !== "" && (isFormulaLike(v) || format === null || format === "General")) return "@";
  return format ?? "General";
}
