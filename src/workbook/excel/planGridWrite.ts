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
  /** One chunk unless the grid's estimated payload exceeds `budgetBytes` (each chunk then gets its own sync). */
  readonly chunks: readonly GridChunk[];
  /**
   * 0-based sheet rows and columns of text cells Excel might not keep as typed through the API
   * (starting with = + - @ or an apostrophe): the adapter reads them back after writing.
   */
  readonly checkCells: readonly { readonly row: number; readonly col: number; readonly text: string }[];
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
  /** Estimated request bytes above which the write is split into row chunks (default `PAYLOAD_BUDGET_BYTES`). */
  readonly budgetBytes?: number;
}

/**
 * Estimated bytes per request before a write is split: Excel on the web caps one request at
 * 5 MB (Microsoft, "Resource limits and performance optimization"); about 2 MB leaves room
 * for the request's own JSON around the values and formats.
 */
export const PAYLOAD_BUDGET_BYTES = 2_000_000;

/**
 * Bytes a cell's value and number format add to a request, estimated as their JSON text in
 * UTF-8 plus the separators: what Office.js sends for `values` and `numberFormat`.
 * @example cellPayloadBytes("Mill", "@") // => 12
 */
export function cellPayloadBytes(value: string | number | boolean, format: string): number {
  return utf8Length(JSON.stringify(value)) + utf8Length(JSON.stringify(format)) + 2;
}

/** A row's brackets and separator in the values and the formats arrays: "[", "]", ",". */
const ROW_BYTES = 6;
/** The outer brackets of the values and the formats arrays. */
const CHUNK_BYTES = 4;

function utf8Length(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      n += 4; // a surrogate pair is one 4-byte character
      i++;
    } else n += 3;
  }
  return n;
}

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
 * Turns a `SheetGrid` into the assignments the adapter makes. Text is kept as text by one
 * documented mechanism: every text cell gets the number format "@" (Text), assigned before
 * the values in the same batch, and the text itself is sent exactly as the user typed it (no
 * apostrophe is added: Office.js has no quote-prefix property, OFFICE-NOTES.md). Text that
 * starts with = + - @ or an apostrophe is listed in `checkCells` for a read-back check.
 * `null` becomes "" and a missing format "General". Rows are grouped into chunks whose
 * estimated payload (`cellPayloadBytes`) stays within `budgetBytes`.
 *
 * @param grid - the pure layout (rows of equal length)
 * @param options - start row and payload budget
 * @returns the chunks, cells to read back, column widths in points, bold rows and frozen rows
 * @throws RangeError when rows differ in length, a format row does not match, or a number is not finite
 * @example planGridWrite({ values: [["=1+1", 2]] }).chunks[0]
 *   // { row: 0, address: "A1:B1", values: [["=1+1", 2]], numberFormats: [["@", "General"]] }
 */
export function planGridWrite(grid: SheetGrid, options: PlanGridWriteOptions = {}): GridWritePlan {
  const startRow = options.startRow ?? 0;
  const budget = options.budgetBytes ?? PAYLOAD_BUDGET_BYTES;
  if (!Number.isInteger(startRow) || startRow < 0) throw new RangeError(`options.startRow must be a non-negative integer, got ${startRow}`);
  if (!(budget >= 1)) throw new RangeError(`options.budgetBytes must be at least 1, got ${budget}`);
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
  const checkCells: { row: number; col: number; text: string }[] = [];
  let from = 0;
  let bytes = CHUNK_BYTES;
  const flush = (to: number): void => {
    if (to === from || cols === 0) return;
    chunks.push({
      row: startRow + from,
      address: blockA1({ row: startRow + from, col: 0, rows: to - from, cols }),
      values: values.slice(from, to),
      numberFormats: formats.slice(from, to),
    });
    from = to;
    bytes = CHUNK_BYTES;
  };
  for (let r = 0; r < rows; r++) {
    let rowBytes = ROW_BYTES;
    for (let c = 0; c < cols; c++) {
      const v = values[r]![c]!;
      rowBytes += cellPayloadBytes(v, formats[r]![c]!);
      if (typeof v === "string" && (isFormulaLike(v) || v.startsWith("'"))) checkCells.push({ row: startRow + r, col: c, text: v });
    }
    if (r > from && bytes + rowBytes > budget) flush(r);
    bytes += rowBytes;
  }
  flush(rows);
  const columnWidths = (grid.columnWidths ?? []).map((w, c) => {
    const letter = cellA1(0, c).replace(/[0-9]+$/, "");
    return { address: `${letter}:${letter}`, widthPt: columnWidthPoints(w) };
  });
  const boldRanges =
    cols === 0
      ? []
      : (grid.boldRows ?? []).filter((r) => r >= 0 && r < rows).map((r) => blockA1({ row: startRow + r, col: 0, rows: 1, cols }));
  return { rows, cols, chunks, checkCells, columnWidths, boldRanges, freezeRows: Math.max(0, Math.min(grid.freezeRows ?? 0, rows)) };
}

function cellValue(v: CellValue, r: number, c: number): string | number | boolean {
  if (v === null) return "";
  if (typeof v === "number" && !Number.isFinite(v))
    throw new RangeError(`grid.values[${r}][${c}] is ${v}: Excel cells hold finite numbers only`);
  return v;
}

function cellFormat(v: CellValue, format: string | null): string {
  if (typeof v === "string" && v !== "" && (isFormulaLike(v) || v.startsWith("'") || format === null || format === "General")) return "@";
  return format ?? "General";
}
