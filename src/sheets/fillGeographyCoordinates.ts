import type { LatLon } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { isBlank } from "./cellValue.js";
import { findHeaderRow } from "./findHeaderRow.js";
import { mapColumns } from "./matchHeaders.js";

/**
 * Coordinates for stops whose place is a linked entity (Excel's Geography data type) rather
 * than typed numbers: wherever a row of the stops table holds a place with known latitude and
 * longitude and its own coordinate cells are empty, they are filled in. With Latitude/Longitude
 * columns the blank cells get the numbers; with one coordinates column ("Location") a place in
 * that column becomes "lat, lon" text; with neither, two columns "Latitude" and "Longitude" are
 * appended to the copy. Typed coordinates always win, and the user's sheet is never changed:
 * this works on a copy of the values read.
 *
 * @param read - the stops table as read (values with their top-left position)
 * @param places - per cell of `read.values` (same shape), the place it holds, if any
 * @returns a copy of `read` with coordinates filled in, and how many rows were filled
 * @example fillGeographyCoordinates(read, places).filled // => 12
 */
export function fillGeographyCoordinates(
  read: SheetRead,
  places: readonly (readonly (LatLon | undefined)[])[],
): { read: SheetRead; filled: number } {
  const headerAt = findHeaderRow(read.values, "stops", read);
  if (headerAt === undefined) return { read, filled: 0 };
  const header = read.values[headerAt] ?? [];
  const { fields } = mapColumns(header, "stops", { sheet: read.sheet, row: read.row + headerAt, col: read.col });
  const lat = fields.get("latitude");
  const lon = fields.get("longitude");
  const both = fields.get("coordinates");
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
    } else if (both !== undefined && places[r]?.[both] !== undefined) {
      row[both] = `${place.lat}, ${place.lon}`;
    } else if (lat === undefined && lon === undefined && both === undefined) {
      if (appendAt === undefined) {
        appendAt = width;
        rows[headerAt]![appendAt] = "Latitude";
        rows[headerAt]![appendAt + 1] = "Longitude";
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
