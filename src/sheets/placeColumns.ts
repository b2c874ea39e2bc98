import type { SheetRead } from "./grid.js";
import { isBlank } from "./cellValue.js";
import { findHeaderRow } from "./findHeaderRow.js";
import { mapColumns } from "./matchHeaders.js";

/**
 * Columns of a stops table that may hold places typed as linked entities (Excel's Geography
 * data type), so that only they are read through `valuesAsJson`, whose cells are large. A
 * linked entity reads through `values` as its display text, so: the address and coordinates
 * columns when the header names them, otherwise every column whose filled body cells are all
 * text (numbers, times and the id column are left out).
 *
 * @param read - the stops table as read
 * @returns 0-based offsets into `read.values[r]`, left to right; [] when there is no header row
 * @example placeColumns({ sheet: "Stops", row: 0, col: 0, values: [["Stop", "City", "Demand"], ["S1", "Oslo", 4]] }) // => [1]
 */
export function placeColumns(read: SheetRead): number[] {
  const headerAt = findHeaderRow(read.values, "stops", read);
  if (headerAt === undefined) return [];
  const header = read.values[headerAt] ?? [];
  const { fields } = mapColumns(header, "stops", { sheet: read.sheet, row: read.row + headerAt, col: read.col });
  const named = ["address", "coordinates"].map((f) => fields.get(f)).filter((c): c is number => c !== undefined);
  if (named.length > 0) return [...new Set(named)].sort((a, b) => a - b);
  const body = read.values.slice(headerAt + 1);
  const mapped = new Set(["id", "latitude", "longitude"].map((f) => fields.get(f)));
  const out: number[] = [];
  for (let c = 0; c < header.length; c++) {
    if (mapped.has(c)) continue;
    const filled = body.map((r) => r[c]).filter((v) => !isBlank(v));
    if (filled.length > 0 && filled.every((v) => typeof v === "string" && !Number.isFinite(Number(v.replace(",", "."))))) out.push(c);
  }
  return out;
}
