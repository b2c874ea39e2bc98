import { isBlank } from "../sheets/cellValue.js";
import { findHeaderRow } from "../sheets/findHeaderRow.js";
import type { CellValue, SheetRead } from "../sheets/grid.js";
import type { TableKind } from "../sheets/matchHeaders.js";
import { matchText, type ReviewItem } from "./locateTables.js";

/** Header of the column that holds each geocoded row's match label. */
export const MATCH_HEADER = "Geocode match";

/**
 * What "Add coordinates to the sheet" writes into one table: the coordinates `applyGeocodes`
 * filled in (into blank Latitude/Longitude cells, or two new columns to the right of the
 * table) and each geocoded row's match label in a "Geocode match" column further right (the
 * existing one when the header row has it). Every cell that already holds a value is `null`:
 * the adapter's `fillEmptyCells` keeps it, so nothing typed is ever overwritten.
 *
 * @param original - the table as read from the sheet
 * @param filled - the same table with coordinates filled in (`LocatedTables.stops` or `.fleet`)
 * @param review - the review list (items of other tables are ignored)
 * @param kind - which table
 * @returns the block to write at (`row`, `col`) of the sheet, or `undefined` when there is nothing to add
 * @example const block = coordinateColumns(read, located.stops, located.review, "stops");
 * // await port.fillEmptyCells(read.sheet, block.row, block.col, block.values)
 */
export function coordinateColumns(
  original: SheetRead,
  filled: SheetRead,
  review: readonly ReviewItem[],
  kind: TableKind,
): { row: number; col: number; values: CellValue[][] } | undefined {
  const header = findHeaderRow(filled.values, kind);
  if (header === undefined) return undefined;
  const items = review.filter((r) => r.table === kind);
  if (items.length === 0) return undefined;
  const width = Math.max(0, ...filled.values.map((r) => r.length));
  const existing = (filled.values[header] ?? []).findIndex(
    (v) => typeof v === "string" && v.trim().toLowerCase() === MATCH_HEADER.toLowerCase(),
  );
  const labelCol = existing >= 0 ? existing : width;
  const values: CellValue[][] = filled.values.map((line, r) =>
    Array.from({ length: Math.max(width, labelCol + 1) }, (_, c) => {
      const now = line[c];
      const before = original.values[r]?.[c];
      if (isBlank(now) || !isBlank(before)) return null;
      return typeof now === "string" || typeof now === "number" || typeof now === "boolean" ? now : null;
    }),
  );
  values[header]![labelCol] = MATCH_HEADER;
  for (const item of items) {
    const r = item.sheetRow0 - filled.row;
    const line = values[r];
    if (!line) continue;
    // A vehicle whose start and end depots were both looked up gets both labels, the end one marked.
    const text = item.end ? `end depot ${matchText(item)}` : matchText(item);
    const before = line[labelCol];
    line[labelCol] = typeof before === "string" && before !== "" ? (item.end ? `${before}; ${text}` : `${text}; ${before}`) : text;
  }
  return { row: filled.row, col: filled.col, values };
}
