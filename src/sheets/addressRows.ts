import type { LatLon } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { cellAddress } from "./cellAddress.js";
import { isBlank, plainCell } from "./cellValue.js";
import { findHeaderRow } from "./findHeaderRow.js";
import { mapColumns, type TableKind } from "./matchHeaders.js";
import { parseCoordinate } from "./parseCoordinate.js";
import { parseLatLon } from "./parseLatLon.js";

/** A row that has an address but no coordinates. */
export interface AddressRow {
  /** Index of the row in `read.values`. */
  readonly r: number;
  /** 0-based sheet row. */
  readonly sheetRow0: number;
  /** Index in `read.values[r]` of its first address cell. */
  readonly c: number;
  /** Where the address is, "Stops!C5". */
  readonly cell: string;
  /** The address parts joined (`joinAddress`). */
  readonly address: string;
}

/** The coordinate fields of each table: the pair and the one-column form. */
export const COORDINATE_FIELDS: Readonly<Record<TableKind, { lat: string; lon: string; both: string }>> = {
  stops: { lat: "latitude", lon: "longitude", both: "coordinates" },
  fleet: { lat: "startLatitude", lon: "startLongitude", both: "startCoordinates" },
};
const PARTS = ["address", "street", "postcode", "town", "country"] as const;

/**
 * The rows of a stops or fleet table (fleet: the start depot) that have an address and no
 * typed coordinates, with the address joined from its columns, and the points typed in the
 * others (for the far-from-others rule). Typed coordinates always win: a row with any
 * coordinate typed is not listed.
 *
 * @param read - the table as read
 * @param kind - which table
 * @param defaultCountry - country added to addresses whose row gives none
 * @returns the address rows and the typed points
 * @example addressRows({ sheet: "Stops", row: 0, col: 0, values: [["Stop", "Street", "Town", "Lat", "Lon"], ["a", "1 Kiln Lane", "Brickfield", "", ""]] }, "stops").rows[0].address
 * // => "1 Kiln Lane, Brickfield"
 */
export function addressRows(read: SheetRead, kind: TableKind, defaultCountry?: string): { rows: AddressRow[]; typed: LatLon[] } {
  const h = findHeaderRow(read.values, kind);
  if (h === undefined) return { rows: [], typed: [] };
  const { fields } = mapColumns(read.values[h] ?? [], kind, { sheet: read.sheet, row: read.row + h, col: read.col });
  const coord = COORDINATE_FIELDS[kind];
  const at = (row: readonly unknown[], field: string): unknown => {
    const c = fields.get(field);
    return c === undefined ? undefined : row[c];
  };
  const rows: AddressRow[] = [];
  const typed: LatLon[] = [];
  for (let r = h + 1; r < read.values.length; r++) {
    const row = read.values[r] ?? [];
    if (row.every(isBlank)) continue;
    const lat = at(row, coord.lat);
    const lon = at(row, coord.lon);
    const both = at(row, coord.both);
    if (!isBlank(lat) || !isBlank(lon) || !isBlank(both)) {
      const pair = !isBlank(both) ? parseLatLon(both) : { lat: parseCoordinate(lat, "lat"), lon: parseCoordinate(lon, "lon") };
      if (pair?.lat !== undefined && pair.lon !== undefined) typed.push({ lat: pair.lat, lon: pair.lon });
      continue;
    }
    const parts: Partial<Record<(typeof PARTS)[number], string>> = {};
    for (const p of PARTS) {
      const v = plainCell(at(row, p));
      if (v !== null && String(v).trim() !== "") parts[p] = String(v).trim();
    }
    if (parts.address === undefined && parts.street === undefined && parts.town === undefined && parts.postcode === undefined) continue;
    const first = PARTS.map((p) => fields.get(p)).find((c, i) => c !== undefined && parts[PARTS[i]!] !== undefined)!;
    rows.push({
      r,
      sheetRow0: read.row + r,
      c: first,
      cell: `${read.sheet}!${cellAddress(read.row + r, read.col + first)}`,
      address: joinAddress(parts, defaultCountry),
    });
  }
  return { rows, typed };
}

/**
 * Address parts as one line in the usual order: street (or the full address), then postcode
 * and town, then the country (the default country when the row gives none). A part already
 * contained in the full address is not repeated.
 *
 * @param parts - the non-blank parts
 * @param defaultCountry - used when `parts.country` is absent
 * @returns the address line
 * @example joinAddress({ street: "12 Glaze Street", postcode: "4021", town: "Potterton" }, "Kilnland")
 * // => "12 Glaze Street, 4021 Potterton, Kilnland"
 */
export function joinAddress(
  parts: Partial<Record<"address" | "street" | "postcode" | "town" | "country", string>>,
  defaultCountry?: string,
): string {
  const out: string[] = [];
  const has = (text: string): boolean => out.some((o) => o.toLowerCase().includes(text.toLowerCase()));
  for (const p of [parts.address, parts.street]) if (p !== undefined && !has(p)) out.push(p);
  const place = [parts.postcode, parts.town].filter((p): p is string => p !== undefined && !has(p)).join(" ");
  if (place !== "") out.push(place);
  const country = parts.country ?? (defaultCountry?.trim() || undefined);
  if (country !== undefined && !has(country)) out.push(country);
  return out.join(", ");
}
