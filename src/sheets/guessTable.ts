import type { SheetRead } from "./grid.js";
import { cellAddress } from "./cellAddress.js";
import { isBlank, plainCell } from "./cellValue.js";
import { findHeaderRow, HEADER_SEARCH_ROWS } from "./findHeaderRow.js";
import { matchHeader, type TableKind } from "./matchHeaders.js";
import { headerCells } from "./readTable.js";

/** What a sheet looks like to the automatic sheet detection. */
export type TableGuess =
  | {
      readonly kind: TableKind;
      /** 0-based sheet row of the header the table reader will take. */
      readonly headerRow0: number;
    }
  | {
      readonly kind: undefined;
      /** Why the sheet is neither table, for the message that lists every sheet. */
      readonly reason: string;
    };

/**
 * Whether a sheet holds a stops table or a fleet table, judged with the same header-row search
 * (`findHeaderRow`: title rows, blank rows and merged group headers above the header are fine)
 * and header matcher as the table reader. A header that only a fleet has ("Capacity", "Shift
 * start", "Start latitude", "Depot") counts for the fleet, one that only stops have ("Stop",
 * "Demand", "Service min") for the stops; stops also need where they are (Latitude and
 * Longitude, Coordinates or Address). A table whose vehicle column is its only name column
 * ("Vehicle, Lat, Lon, Start, End") is a fleet.
 *
 * @param read - the sheet's used range
 * @returns the kind and header row, or why the sheet is neither
 * @example guessTable({ sheet: "Vans", row: 0, col: 0, values: [["Vehicle", "Capacity"], ["V1", 10]] }) // => { kind: "fleet", headerRow0: 0 }
 */
export function guessTable(read: SheetRead): TableGuess {
  if (read.values.every((row) => row.every(isBlank))) return { kind: undefined, reason: "it is empty" };
  const hs = findHeaderRow(read.values, "stops", read);
  const hf = findHeaderRow(read.values, "fleet", read);
  if (hs === undefined && hf === undefined) {
    return {
      kind: undefined,
      reason: `none of its first ${HEADER_SEARCH_ROWS} rows has two known column names (such as Stop, Latitude, Longitude or Vehicle, Capacity)`,
    };
  }
  const stops = hs === undefined ? undefined : columnsOf(read, hs, "stops");
  const fleet = hf === undefined ? undefined : columnsOf(read, hf, "fleet");
  const stopsOnly = stops?.only ?? 0;
  const fleetOnly = fleet?.only ?? 0;
  const s = stops?.fields ?? new Set<string>();
  const pinOnly = s.has("vehicle") && !s.has("id") && !s.has("name");
  if (hf !== undefined && (fleetOnly > stopsOnly || (pinOnly && fleetOnly >= stopsOnly))) {
    return { kind: "fleet", headerRow0: read.row + hf };
  }
  if (hs === undefined) {
    return {
      kind: undefined,
      reason: `its header on row ${read.row + hf! + 1} has no column only a fleet has (such as Capacity or Shift start)`,
    };
  }
  // An address may come in parts (Street, Postcode, Town), joined for geocoding.
  const located =
    (s.has("latitude") && s.has("longitude")) || ["coordinates", "address", "street", "postcode", "town"].some((f) => s.has(f));
  if (located) return { kind: "stops", headerRow0: read.row + hs };
  return {
    kind: undefined,
    reason: `its header on row ${read.row + hs + 1} (${cellAddress(read.row + hs, read.col)}) has no Latitude and Longitude, Coordinates or Address column`,
  };
}

/** The fields of a header row and how many of its headers only this kind of table has. */
function columnsOf(read: SheetRead, h: number, kind: TableKind): { fields: Set<string>; only: number } {
  const other: TableKind = kind === "stops" ? "fleet" : "stops";
  const fields = new Set<string>();
  let only = 0;
  for (const raw of headerCells(read, h)) {
    const v = plainCell(raw);
    if (typeof v !== "string") continue;
    const hit = matchHeader(v, kind);
    if (hit === undefined) continue;
    fields.add(hit.base);
    if (matchHeader(v, other) === undefined) only++;
  }
  return { fields, only };
}
