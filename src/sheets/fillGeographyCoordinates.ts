import type { LatLon } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { isBlank } from "./cellValue.js";
import { findHeaderRow } from "./findHeaderRow.js";
import { mapColumns, type TableKind } from "./matchHeaders.js";
import { COORDINATE_FIELDS, END_DEPOT_FIELDS } from "./addressRows.js";

/**
 * Coordinates for stops whose place is a linked entity (Excel's Geography data type) rather
 * than typed numbers: wherever a row of the stops table holds a place with known latitude and
 * longitude and its own coordinate cells are empty, they are filled in. With Latitude/Longitude
 * columns the blank cells get the numbers; with one coordinates column ("Location") a place in
 * that column (or a place elsewhere in the row, when that column is blank) becomes "lat, lon" text; with neither, two columns "Latitude" and "Longitude" are
 * appended to the copy. Typed coordinates always win, and the user's sheet is never changed:
 * this works on a copy of the values read. The fleet table works the same way with its start
 * depot columns (Start latitude, Start longitude, Depot), so geocoded depots use it too, and with
 * `end` its end depot columns (End latitude, End longitude, End depot).
 *
 * @param read - the stops (or fleet) table as read (values with their top-left position)
 * @param places - per cell of `read.values` (same shape), the place it holds, if any
 * @param kind - which table (default stops)
 * @param end - fleet only: fill the end depot's columns instead of the start depot's
 * @returns a copy of `read` with coordinates filled in, and how many rows were filled
 * @example fillGeographyCoordinates(read, places).filled // => 12
 */
export function fillGeographyCoordinates(
  read: SheetRead,
  places: readonly (readonly (LatLon | undefined)[])[],
  kind: TableKind = "stops",
  end = false,
): { read: SheetRead; filled: number } {
  const headerAt = findHeaderRow(read.values, kind, read);
  if (headerAt === undefined) return { read, filled: 0 };
  const header = read.values[headerAt] ?? [];
  const { fields } = mapColumns(header, kind, { sheet: read.sheet, row: read.row + headerAt, col: read.col });
  const names = end && kind === "fleet" ? END_DEPOT_FIELDS : COORDINATE_FIELDS[kind];
  const lat = fields.get(names.lat);
  const lon = fields.get(names.lon);
  const both = fields.get(names.both);
  const rows = read.values.map((r) => [...r]);
  const width = Math.max(0, ...rows.map((r) => r.length));
  let appendAt: number | undefined;
  let filled = 0;
  for (let r = headerAt + 1; r < rows.length; r++) {
    const place = (places[r] ?? []).find((p): p is LatLon => p !== undefined);
    if (!place) continue;
    const row = rows[r]!;
    if (lat !== undefined && lon !== undefined) {
      if (!isBlank(row[lat]) || !isBlank(row[lon])) continue;
      row[lat] = place.lat;
      row[lon] = place.lon;
    } else if (both !== undefined && (places[r]?.[both] !== undefined || isBlank(row[both]))) {
      row[both] = `${place.lat}, ${place.lon}`;
    } else if (lat === undefined && lon === undefined && both === undefined) {
      if (appendAt === undefined) {
        appendAt = width;
        const prefix = kind === "stops" ? "" : end ? "End " : "Start ";
        rows[headerAt]![appendAt] = prefix ? `${prefix}latitude` : "Latitude";
        rows[headerAt]![appendAt + 1] = prefix ? `${prefix}longitude` : "Longitude";
      }
      row[appendAt] = place.lat;
      row[appendAt + 1] = place.lon;
    } else {
      continue;
    }
    filled++;
  }
  if (filled === 0) return { read, filled };
  const fullWidth = Math.max(...rows.map((r) => r.length));
  const values = rows.map((r) => Array.from({ length: fullWidth }, (_, c) => r[c] ?? ""));
  return { read: { ...read, values }, filled };
}
