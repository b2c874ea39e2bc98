import { COORDINATE_FIELDS, END_DEPOT_FIELDS } from "../sheets/addressRows.js";
import { isBlank } from "../sheets/cellValue.js";
import { findHeaderRow } from "../sheets/findHeaderRow.js";
import type { CellValue, SheetRead } from "../sheets/grid.js";
import { mapColumns, type TableKind } from "../sheets/matchHeaders.js";
import { matchText, type ReviewItem } from "./locateTables.js";

/** Header of the column that holds each geocoded row's match label. */
export const MATCH_HEADER = "Geocode match";

/**
 * What "Add coordinates to the sheet" writes into one table: the coordinates `applyGeocodes`
 * filled in (into blank Latitude/Longitude cells, or two new columns to the right of the
 * table) and each geocoded row's match label in a "Geocode match" column further right (the
 * existing one when the header row has it). Where the address itself sat in the one coordinates
 * column (a fleet's "Depot" or "End depot" cell holding address text, a stops "Location" cell),
 * the copy replaced it in memory; on the sheet that cell keeps its text and the point goes into
 * two new columns to the right instead ("Latitude"/"Longitude" for stops, "Start latitude"/
 * "Start longitude" and "End latitude"/"End longitude" for depots), which the readers take as
 * typed coordinates next time. Every cell that already holds a value is `null`: the adapter's
 * `fillEmptyCells` keeps it, so nothing typed is ever overwritten.
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
  let width = Math.max(0, ...filled.values.map((r) => r.length));
  const moved = replacedAddressCells(original, filled, header, items, kind);
  // Each pair of new coordinate columns goes to the right of the table, in start, end order.
  const pairAt = new Map<string, number>();
  for (const m of moved) {
    if (pairAt.has(m.pair.lat)) continue;
    pairAt.set(m.pair.lat, width);
    width += 2;
  }
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
  for (const m of moved) {
    const at = pairAt.get(m.pair.lat)!;
    values[header]![at] = m.pair.lat;
    values[header]![at + 1] = m.pair.lon;
    values[m.r]![at] = m.lat;
    values[m.r]![at + 1] = m.lon;
  }
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

/** Headers of the columns a replaced address cell's point is written to, by the cell's field. */
const NEW_PAIR: Readonly<Record<string, { lat: string; lon: string }>> = {
  [COORDINATE_FIELDS.stops.both]: { lat: "Latitude", lon: "Longitude" },
  [COORDINATE_FIELDS.fleet.both]: { lat: "Start latitude", lon: "Start longitude" },
  [END_DEPOT_FIELDS.both]: { lat: "End latitude", lon: "End longitude" },
};

/**
 * The geocoded rows whose point the in-memory copy wrote over the address text in a coordinates
 * column (`fillGeographyCoordinates`): on the sheet that text stays, so the point needs columns
 * of its own.
 */
function replacedAddressCells(
  original: SheetRead,
  filled: SheetRead,
  header: number,
  items: readonly ReviewItem[],
  kind: TableKind,
): { r: number; lat: number; lon: number; pair: { lat: string; lon: string } }[] {
  const { fields } = mapColumns(original.values[header] ?? [], kind, {
    sheet: original.sheet,
    row: original.row + header,
    col: original.col,
  });
  const out: { r: number; lat: number; lon: number; pair: { lat: string; lon: string } }[] = [];
  for (const item of items) {
    if (!item.best) continue;
    const field = kind === "stops" ? COORDINATE_FIELDS.stops.both : item.end ? END_DEPOT_FIELDS.both : COORDINATE_FIELDS.fleet.both;
    const c = fields.get(field);
    const r = item.sheetRow0 - filled.row;
    if (c === undefined || r <= header) continue;
    const before = original.values[r]?.[c];
    if (isBlank(before) || filled.values[r]?.[c] === before) continue;
    out.push({ r, lat: item.best.lat, lon: item.best.lon, pair: NEW_PAIR[field]! });
  }
  return out;
}
