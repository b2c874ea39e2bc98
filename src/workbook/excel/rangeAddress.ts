import type { CellBlock } from "../../sheets/grid.js";

/**
 * A1-style addresses for the Office.js adapter (Excel's A1 reference style: columns
 * A..Z, AA.., rows from 1; a sheet name with anything but letters, digits and `_`
 * is quoted with apostrophes, an apostrophe inside it doubled).
 */

/**
 * The A1 address of one cell.
 * @param row0 - 0-based row
 * @param col0 - 0-based column
 * @returns e.g. "B3"
 * @throws RangeError when a coordinate is not an integer inside Excel's grid
 *   (1 048 576 rows by 16 384 columns, Excel specifications and limits)
 * @example cellA1(2, 1) // "B3"
 */
export function cellA1(row0: number, col0: number): string {
  if (!Number.isInteger(row0) || row0 < 0 || row0 >= MAX_ROWS)
    throw new RangeError(`row0 must be an integer in 0..${MAX_ROWS - 1}, got ${row0}`);
  if (!Number.isInteger(col0) || col0 < 0 || col0 >= MAX_COLS)
    throw new RangeError(`col0 must be an integer in 0..${MAX_COLS - 1}, got ${col0}`);
  let letters = "";
  for (let c = col0 + 1; c > 0; c = Math.floor((c - 1) / 26)) letters = String.fromCharCode(65 + ((c - 1) % 26)) + letters;
  return `${letters}${row0 + 1}`;
}

/**
 * The A1 address of a block of cells.
 * @param block - 0-based start, size in rows and columns (both at least 1)
 * @returns e.g. "A1:P80" (a single cell gives "C4")
 * @throws RangeError when the block is empty
 * @example blockA1({ row: 0, col: 0, rows: 80, cols: 16 }) // "A1:P80"
 */
export function blockA1(block: CellBlock): string {
  if (!(block.rows >= 1) || !(block.cols >= 1))
    throw new RangeError(`block must have at least one row and column, got ${block.rows}x${block.cols}`);
  const start = cellA1(block.row, block.col);
  const end = cellA1(block.row + block.rows - 1, block.col + block.cols - 1);
  return start === end ? start : `${start}:${end}`;
}

/**
 * Splits a sheet-qualified address such as "Stops!A1:J81" or "'Run 2'!B3".
 * @param address - sheet name, "!", then a cell or range in A1 style
 * @returns the unquoted sheet name and the local range, or `undefined` when malformed
 * @example parseRangeAddress("'Bob''s van'!A1:B2") // { sheet: "Bob's van", range: "A1:B2" }
 */
export function parseRangeAddress(address: string): { sheet: string; range: string } | undefined {
  const m = /^(?:'((?:[^']|'')+)'|([^'!]+))!(\$?[A-Z]{1,3}\$?[0-9]{1,7}(?::\$?[A-Z]{1,3}\$?[0-9]{1,7})?)$/i.exec(address.trim());
  if (!m) return undefined;
  const sheet = m[1] !== undefined ? m[1].replace(/''/g, "'") : (m[2] ?? "");
  return { sheet, range: (m[3] ?? "").replace(/\$/g, "").toUpperCase() };
}

/**
 * Whether `inner` lies wholly inside `outer` (both 0-based blocks).
 * @example blockContains({ row: 0, col: 0, rows: 10, cols: 5 }, { row: 2, col: 1, rows: 1, cols: 1 }) // true
 */
export function blockContains(outer: CellBlock, inner: CellBlock): boolean {
  return (
    inner.row >= outer.row &&
    inner.col >= outer.col &&
    inner.row + inner.rows <= outer.row + outer.rows &&
    inner.col + inner.cols <= outer.col + outer.cols
  );
}

const MAX_ROWS = 1_048_576;
const MAX_COLS = 16_384;

/**
 * The block of a local A1 range such as "C2:D81" or "B3" (no sheet name, no "$").
 * @returns 0-based start and size, or `undefined` when malformed
 * @example parseBlock("C2:D81") // { row: 1, col: 2, rows: 80, cols: 2 }
 */
export function parseBlock(range: string): CellBlock | undefined {
  const m = /^([A-Z]{1,3})([0-9]{1,7})(?::([A-Z]{1,3})([0-9]{1,7}))?$/.exec(range);
  if (!m) return undefined;
  const col = (letters: string): number => [...letters].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
  const r1 = Number(m[2]) - 1;
  const c1 = col(m[1]!);
  const r2 = m[4] !== undefined ? Number(m[4]) - 1 : r1;
  const c2 = m[3] !== undefined ? col(m[3]) : c1;
  if (r1 < 0 || r2 < r1 || c2 < c1) return undefined;
  return { row: r1, col: c1, rows: r2 - r1 + 1, cols: c2 - c1 + 1 };
}
