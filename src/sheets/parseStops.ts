import type { ColumnMapEntry } from "./columnMap.js";
import type { Issue, LatLon, TimeWindow } from "../core/index.js";
import type { CellValue } from "./grid.js";
import { plainCell } from "./cellValue.js";
import { cellIssue, readTable } from "./readTable.js";
import { rowReader, type RowReader } from "./rowReader.js";
import { readDegrees } from "./parseCoordinate.js";
import { parseLatLon } from "./parseLatLon.js";
import { mergeWindows, parseWindows, rollWindow } from "./parseWindows.js";
import { parseFeatures } from "./parseFeatures.js";
import type { SheetRead } from "./grid.js";
import type { TableColumns } from "./matchHeaders.js";

/** One stop row as read, before it is placed in a `Problem`. */
export interface ParsedStop {
  readonly id: string;
  readonly name: string;
  /** Where the stop is; absent for a stop left out with `unplannedReason` (its address was not found). */
  readonly position?: LatLon;
  /** Why the stop cannot be planned (its address was not found); it is listed unassigned with this reason. */
  readonly unplannedReason?: string;
  /** Demand per load column: "" for a plain Demand column, else the unit word. */
  readonly demand: ReadonlyMap<string, number>;
  /** Amount to collect per pickup column: "" for a plain Pickup (or Collect, Returns), else the unit word. */
  readonly pickup: ReadonlyMap<string, number>;
  /** Names in the Vehicle (pin) and Not vehicle cells, as typed. */
  readonly vehicleNames?: readonly string[];
  readonly notVehicleNames?: readonly string[];
  readonly windows: readonly TimeWindow[];
  /** Service minutes, `undefined` when blank (the settings default applies). */
  readonly serviceMin?: number;
  readonly unservedCost?: number;
  readonly requiredFeatures?: readonly string[];
  /** 1-based sheet row. */
  readonly sheetRow: number;
  /** 0-based sheet row (for issue addresses). */
  readonly sheetRow0: number;
  readonly extra: Readonly<Record<string, CellValue>>;
  /** The Address cell as typed (trimmed; "" when blank); absent when the table has no Address column. */
  readonly address?: string;
}

/** What `parseStops` found. */
export interface ParsedStops {
  readonly stops: readonly ParsedStop[];
  readonly columns: TableColumns | undefined;
  /** 0-based sheet column of the range's first cell. */
  readonly col0: number;
  /** 0-based sheet row of the header row. */
  readonly headerRow0: number;
  readonly extraHeaders: readonly string[];
  /** Unit words of the demand columns ("" for a plain Demand), in sheet order. */
  readonly dimensions: readonly string[];
  /** Unit words of the pickup columns ("" for a plain Pickup), in sheet order. */
  readonly pickupDimensions: readonly string[];
  readonly issues: readonly Issue[];
}

/**
 * Read the stops table: one stop per non-blank row below the header row.
 *
 * Columns (DESIGN.md §5; headers matched with synonyms): Stop, Name, Address, Latitude,
 * Longitude (or one Coordinates column with "lat, lon"), Demand (or Demand kg, Demand crates,
 * ...), Earliest, Latest (repeatable: Earliest 2 / Latest 2, or a Windows column with
 * "08:00-10:00; 14:00-16:00"), Service min, Priority, Features, Pickup (or Pickup kg, Collect
 * crates, Returns, ...: what to collect), Vehicle (a pin: one or more vehicle names) and Not
 * vehicle (vehicles that must not serve it). Only the coordinates are
 * required. Without a Stop column the id of a stop is its sheet row number ("7"); a Stop
 * column with an empty cell is an issue. Name defaults to the id. Blank demand is 0, a blank
 * Priority means the stop must be served, blank windows mean open all day.
 *
 * A row listed in `unlocated` (an address the geocoder did not find) and without coordinates is
 * read as a stop without a position that carries the reason, so the plan lists it unassigned.
 *
 * @param read - the stops range
 * @param columnMap - the user's column mappings
 * @param unlocated - reasons by 0-based sheet row for rows whose address was not found
 * @returns the stops and every issue found (all at once)
 * @example parseStops({ sheet: "Stops", row: 0, col: 0, values: [["Stop", "Lat", "Lon"], ["a", 45, 4]] }).stops[0]?.position
 * // => { lat: 45, lon: 4 }
 */
export function parseStops(
  read: SheetRead,
  columnMap: readonly ColumnMapEntry[] = [],
  unlocated: ReadonlyMap<number, string> = new Map(),
): ParsedStops {
  const { table, issues } = readTable(read, "stops", columnMap);
  const empty = {
    stops: [],
    columns: table?.columns,
    col0: read.col,
    headerRow0: table?.headerRow0 ?? read.row,
    extraHeaders: [],
    dimensions: [],
    pickupDimensions: [],
    issues,
  };
  if (!table) return empty;
  const f = table.columns.fields;
  const hasPair = f.has("latitude") && f.has("longitude");
  if (!hasPair && !f.has("coordinates")) {
    const address = ["address", "street", "postcode", "town"].some((k) => f.has(k))
      ? " To get coordinates from the addresses, use the pane's geography option in Excel, or set up a geocoding service (--geocoder, or Geocoding in the pane)."
      : "";
    issues.push(
      cellIssue(
        read.sheet,
        table.headerRow0,
        read.col,
        `the header row has no coordinate columns; add Latitude and Longitude columns in decimal degrees (or one Coordinates column holding "lat, lon").${address}`,
      ),
    );
    return { ...empty, issues };
  }
  const dimensions = [...f.keys()].filter((k) => k === "demand" || k.startsWith("demand:")).map((k) => (k === "demand" ? "" : k.slice(7)));
  const pickupDimensions = [...f.keys()]
    .filter((k) => k === "pickup" || k.startsWith("pickup:"))
    .map((k) => (k === "pickup" ? "" : k.slice(7)));
  const windowIndexes = [...f.keys()].flatMap((k) => {
    const m = /^(earliest|latest|windows)(?::(\d+))?$/.exec(k);
    return m ? [m[2] === undefined ? 1 : Number(m[2])] : [];
  });
  const maxWindow = Math.max(0, ...windowIndexes);
  const stops: ParsedStop[] = [];
  const seen = new Map<string, number>();
  for (const row of table.rows) {
    const r = rowReader(table, row, issues);
    const before = issues.length;
    let id = String(r.sheetRow);
    if (r.has("id")) {
      const text = r.text("id");
      if (text === undefined && !r.excelErrorAt("id"))
        r.fail("id", "the stop id is empty; type a unique id (text or number) for this stop.");
      id = text ?? id;
      const first = seen.get(id);
      if (text !== undefined && first !== undefined) {
        r.fail("id", `stop id "${id}" is used twice (also on row ${first}); give every stop its own id.`);
      }
      if (text !== undefined && first === undefined) seen.set(id, r.sheetRow);
    }
    const name = r.text("name") ?? id;
    const unplannedReason = unlocated.get(row.sheetRow0);
    const position = unplannedReason !== undefined && coordinatesBlank(r) ? undefined : readPosition(r, id);
    const demand = new Map<string, number>();
    for (const dim of dimensions) {
      const key = dim === "" ? "demand" : `demand:${dim}`;
      demand.set(dim, r.num(key, dim === "" ? "demand" : `demand (${dim})`, { min: 0, example: "12" }) ?? 0);
    }
    const pickup = new Map<string, number>();
    for (const dim of pickupDimensions) {
      const key = dim === "" ? "pickup" : `pickup:${dim}`;
      pickup.set(dim, r.num(key, dim === "" ? "pickup" : `pickup (${dim})`, { min: 0, example: "4" }) ?? 0);
    }
    const vehicleText = r.text("vehicle");
    const notVehicleText = r.text("notVehicle");
    const windows: TimeWindow[] = [];
    for (let i = 1; i <= maxWindow; i++) windows.push(...readWindowPair(r, i));
    const serviceMin = r.duration("serviceMin", "service time");
    const unservedCost = r.num("priority", "priority (cost of leaving the stop unassigned)", { min: 0, example: "500" });
    const featureText = r.text("features");
    const extra: Record<string, CellValue> = {};
    for (const x of table.columns.extras) extra[x.header] = plainCell(row.cells[x.col]);
    const address = r.has("address") ? (r.text("address") ?? "") : undefined;
    if (issues.length > before || (position === undefined && unplannedReason === undefined)) continue;
    stops.push({
      id,
      name,
      ...(position !== undefined ? { position } : { unplannedReason: unplannedReason! }),
      demand,
      pickup,
      ...(vehicleText !== undefined ? { vehicleNames: splitNames(vehicleText) } : {}),
      ...(notVehicleText !== undefined ? { notVehicleNames: splitNames(notVehicleText) } : {}),
      windows: mergeWindows(windows),
      ...(serviceMin !== undefined ? { serviceMin } : {}),
      ...(unservedCost !== undefined ? { unservedCost } : {}),
      ...(featureText !== undefined ? { requiredFeatures: parseFeatures(featureText) } : {}),
      sheetRow: r.sheetRow,
      sheetRow0: row.sheetRow0,
      extra,
      ...(address !== undefined ? { address } : {}),
    });
  }
  const extraHeaders = table.columns.extras.map((x) => x.header);
  return {
    stops,
    columns: table.columns,
    col0: read.col,
    headerRow0: table.headerRow0,
    extraHeaders,
    dimensions,
    pickupDimensions,
    issues,
  };
}

/** Vehicle names of a pin cell: one name, or several separated by ";" or ",". */
function splitNames(text: string): string[] {
  return text
    .split(/[;,]/)
    .map((x) => x.trim())
    .filter((x) => x !== "");
}

function coordinatesBlank(r: RowReader): boolean {
  return ["latitude", "longitude", "coordinates"].every((k) => !r.has(k) || r.blank(k));
}

/** Latitude/longitude of a row from the two columns or the one Coordinates column. */
function readPosition(r: RowReader, id: string): LatLon | undefined {
  const pairBlank = (!r.has("latitude") || r.blank("latitude")) && (!r.has("longitude") || r.blank("longitude"));
  if (pairBlank && r.has("coordinates") && !r.blank("coordinates")) {
    if (r.excelErrorAt("coordinates")) return undefined;
    const p = parseLatLon(r.raw("coordinates"));
    if (p === undefined) {
      r.fail(
        "coordinates",
        `coordinates ${JSON.stringify(String(plainCell(r.raw("coordinates"))))} cannot be read; type "latitude, longitude" in decimal degrees, such as "45.76, 4.83".`,
      );
      return undefined;
    }
    return checkRange(r, "coordinates", p.lat, p.lon);
  }
  if (pairBlank) {
    const key = r.has("latitude") ? "latitude" : "coordinates";
    const hasAddress = ["address", "street", "postcode", "town"].some((k) => r.has(k) && !r.blank(k));
    r.fail(
      key,
      hasAddress
        ? `stop "${id}" has an address but no coordinates; fill its Latitude and Longitude in decimal degrees (such as 45.76 and 4.83), or in Excel use the pane's geography option to turn addresses into coordinates, or set up a geocoding service (--geocoder, or Geocoding in the pane) to look the address up.`
        : `stop "${id}" has no coordinates; fill its Latitude and Longitude in decimal degrees (such as 45.76 and 4.83).`,
    );
    return undefined;
  }
  const lat = readAxis(r, "latitude", "lat");
  const lon = readAxis(r, "longitude", "lon");
  return lat === undefined || lon === undefined ? undefined : checkRange(r, "latitude", lat, lon, "longitude");
}

function readAxis(r: RowReader, key: string, axis: "lat" | "lon"): number | undefined {
  if (r.blank(key)) {
    r.fail(key, `the ${key} is empty; fill it in decimal degrees${axis === "lat" ? " (such as 45.76)" : " (such as 4.83)"}.`);
    return undefined;
  }
  if (r.excelErrorAt(key)) return undefined;
  const d = readDegrees(r.raw(key), axis);
  if (d === undefined) {
    r.fail(
      key,
      `${key} ${JSON.stringify(String(plainCell(r.raw(key))))} is not a coordinate; type decimal degrees such as ${axis === "lat" ? `45.76 or 45°45'36"N` : `4.83 or 4°50'E`}.`,
    );
  }
  return d;
}

function checkRange(r: RowReader, latKey: string, lat: number, lon: number, lonKey = latKey): LatLon | undefined {
  let ok = true;
  if (Math.abs(lat) > 90) {
    r.fail(
      latKey,
      `latitude ${lat} is outside -90..90; type decimal degrees, north positive (check that latitude and longitude are not swapped).`,
    );
    ok = false;
  }
  if (Math.abs(lon) > 180) {
    r.fail(lonKey, `longitude ${lon} is outside -180..180; type decimal degrees, east positive.`);
    ok = false;
  }
  return ok ? { lat, lon } : undefined;
}

/** The windows of the i-th Earliest/Latest pair and of the i-th Windows column. */
function readWindowPair(r: RowReader, i: number): TimeWindow[] {
  const suffix = i > 1 ? `:${i}` : "";
  const out: TimeWindow[] = [];
  const listKey = `windows${suffix}`;
  if (r.has(listKey) && !r.blank(listKey) && !r.excelErrorAt(listKey)) {
    const list = parseWindows(r.raw(listKey));
    if (list === undefined)
      r.fail(
        listKey,
        `time windows ${JSON.stringify(String(plainCell(r.raw(listKey))))} cannot be read; type ranges such as "08:00-10:00; 14:00-16:00".`,
      );
    else out.push(...list);
  }
  const eKey = `earliest${suffix}`;
  const lKey = `latest${suffix}`;
  const eRaw = plainCell(r.raw(eKey));
  // A whole list typed into the Earliest cell ("08:00-10:00; 14:00-16:00") is read as such.
  if (typeof eRaw === "string" && /[-–—]|\bto\b/i.test(eRaw) && r.blank(lKey)) {
    const list = parseWindows(eRaw);
    if (list === undefined)
      r.fail(
        eKey,
        `time windows ${JSON.stringify(eRaw)} cannot be read; type ranges such as "08:00-10:00; 14:00-16:00", or one time here and one in the Latest column.`,
      );
    else out.push(...list);
    return out;
  }
  const e = r.time(eKey, "earliest time");
  const l = r.time(lKey, "latest time");
  const eBad = !r.blank(eKey) && e === undefined;
  const lBad = !r.blank(lKey) && l === undefined;
  if (eBad || lBad || (e === undefined && l === undefined)) return out;
  out.push(rollWindow(e ?? 0, l ?? Infinity));
  return out;
}
