import type { CellValue } from "./grid.js";

/** Narrowest and widest column hints, in characters. */
const MIN_WIDTH = 6;
const MAX_WIDTH = 40;

/**
 * Column-width hints from the content: the longest shown text per column plus a margin,
 * between 6 and 40 characters. Rows listed in `skipRows` (long title and caution lines that
 * may spill over empty neighbours) do not widen columns.
 *
 * @param values - the grid's rows (equal length)
 * @param formats - number formats of the same shape (decide how numbers show)
 * @param skipRows - 0-based rows to ignore
 * @returns one width per column
 * @example columnWidths([["Vehicle", 12.5]], [[null, "0.0"]]) // => [9, 6]
 */
export function columnWidths(
  values: readonly (readonly CellValue[])[],
  formats: readonly (readonly (string | null)[])[],
  skipRows: readonly number[] = [],
): number[] {
  const cols = values[0]?.length ?? 0;
  const widths = new Array<number>(cols).fill(0);
  values.forEach((row, r) => {
    if (skipRows.includes(r)) return;
    row.forEach((v, c) => {
      widths[c] = Math.max(widths[c]!, shownLength(v, formats[r]?.[c] ?? null));
    });
  });
  return widths.map((w) => Math.min(MAX_WIDTH, Math.max(MIN_WIDTH, w + 2)));
}

function shownLength(v: CellValue, format: string | null): number {
  if (v === null) return 0;
  if (typeof v === "string") return v.length;
  if (typeof v === "boolean") return v ? 4 : 5;
  switch (format) {
    case "hh:mm":
      return 5;
    case "[h]:mm":
      return String(Math.floor(v * 24)).length + 3;
    case "yyyy-mm-dd hh:mm":
      return 16;
    case "0.0":
      return v.toFixed(1).length;
    case "0.00":
      return v.toFixed(2).length;
    case "0":
      return v.toFixed(0).length;
    default:
      return Math.min(String(v).length, 12);
  }
}
