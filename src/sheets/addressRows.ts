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
  /** Set for a fleet row's end depot (End address, or an address typed in the End depot column). */
  readonly end?: true;
}

/** The coordinate fields of each table: the pair and the one-column form. */
export const COORDINATE_FIELDS: Readonly<Record<TableKind, { lat: string; lon: string; both: string }>> = {
  stops: { lat: "latitude", lon: "longitude", both: "coordinates" },
  fleet: { lat: "startLatitude", lon: "startLongitude", both: "startCoordinates" },
};
/** The coordinate fields of the fleet's end depot. */
export const END_DEPOT_FIELDS = { lat: "endLatitude", lon: "endLongitude", both: "endCoordinates" } as const;
const PARTS = ["address", "street", "postcode", "town", "country"] as const;

/**
 * The rows of a stops or fleet table (fleet: the start depot, or with `end` the end depot) that
 * have an address and no typed coordinates, with the address joined from its columns, and the
 * points typed in the others (for the far-from-others rule). Typed coordinates always win: a row
 * with any coordinate typed is not listed. Text in the one-column coordinates cell ("Depot",
 * "End depot", "Location") that is not a "lat, lon" pair is taken as the address. A fleet's end
 * depot is an address in its End address column (or End depot column); a row without one ends
 * at its start depot and is not listed.
 *
 * @param read - the table as read
 * @param kind - which table
 * @param defaultCountry - country added to addresses whose row gives none
 * @param end - fleet only: the end depots instead of the start depots
 * @returns the address rows and the typed points
 * @example addressRows({ sheet: "Stops", row: 0, col: 0, values: [["Stop", "Street", "Town", "Lat", "Lon"], ["a", "1 Kiln Lane", "Brickfield", "", ""]] }, "stops").rows[0].address
 * // => "1 Kiln Lane, Brickfield"
 */
export function addressRows(
  read: SheetRead,
  kind: TableKind,
  defaultCountry?: string,
  end = false,
): { rows: AddressRow[]; typed: LatLon[] } {
  const h = findHeaderRow(read.values, kind, read);
  if (h === undefined) return { rows: [], typed: [] };
  const { fields } = mapColumns(read.values[h] ?? [], kind, { sheet: read.sheet, row: read.row + h, col: read.col });
  const coord = end && kind === "fleet" ? END_DEPOT_FIELDS : COORDINATE_FIELDS[kind];
  const at = (row: readonly unknown[], field: string): unknown => {
    const c = fields.get(field);
    return c === undefined ? undefined : row[c];
  };
  // The end depot has one address column; its street, postcode and town columns are the start's.
  const partFields: Partial<Record<(typeof PARTS)[number], string>> =
    end && kind === "fleet" ? { address: "endAddress" } : Object.fromEntries(PARTS.map((p) => [p, p]));
  const rows: AddressRow[] = [];
  const typed: LatLon[] = [];
  for (let r = h + 1; r < read.values.length; r++) {
    const row = read.values[r] ?? [];
    if (row.every(isBlank)) continue;
    const lat = at(row, coord.lat);
    const lon = at(row, coord.lon);
    const both = at(row, coord.both);
    const bothText = isBlank(lat) && isBlank(lon) ? addressText(both) : undefined;
    if (bothText === undefined && (!isBlank(lat) || !isBlank(lon) || !isBlank(both))) {
      const pair = !isBlank(both) ? parseLatLon(both) : { lat: parseCoordinate(lat, "lat"), lon: parseCoordinate(lon, "lon") };
      if (pair?.lat !== undefined && pair.lon !== undefined) typed.push({ lat: pair.lat, lon: pair.lon });
      continue;
    }
    const parts: Partial<Record<(typeof PARTS)[number], string>> = {};
    for (const p of PARTS) {
      const field = partFields[p];
      const v = field === undefined ? null : plainCell(at(row, field));
      if (v !== null && String(v).trim() !== "") parts[p] = String(v).trim();
    }
    if (bothText !== undefined && parts.address === undefined && parts.street === undefined) parts.address = bothText;
    if (parts.address === undefined && parts.street === undefined && parts.town === undefined && parts.postcode === undefined) continue;
    // The coordinates go where the address text was typed when it was typed in the coordinates column.
    const first =
      bothText !== undefined
        ? fields.get(coord.both)!
        : PARTS.map((p) => (partFields[p] === undefined ? undefined : fields.get(partFields[p]!))).find(
            (c, i) => c !== undefined && parts[PARTS[i]!] !== undefined,
          )!;
    rows.push({
      r,
      sheetRow0: read.row + r,
      c: first,
      cell: `${read.sheet}!${cellAddress(read.row + r, read.col + first)}`,
      address: joinAddress(parts, defaultCountry),
      ...(end && kind === "fleet" ? { end: true as const } : {}),
    });
  }
  return { rows, typed };
}

/** Text in a coordinates cell that is an address rather than a "lat, lon" pair: it has a letter and does not read as a pair. */
function addressText(value: unknown): string | undefined {
  const v = plainCell(value);
  if (typeof v !== "string" || !/\p{L}/u.test(v) || parseLatLon(v) !== undefined) return undefined;
  return v.trim();
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
