import type { ColumnMapEntry } from "./columnMap.js";
import { DAY_MIN, type Issue, type LatLon } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { plainCell } from "./cellValue.js";
import type { TableColumns } from "./matchHeaders.js";
import { readDegrees } from "./parseCoordinate.js";
import { parseFeatures } from "./parseFeatures.js";
import { parseLatLon } from "./parseLatLon.js";
import { parseYesNo } from "./parseYesNo.js";
import { cellIssue, readTable } from "./readTable.js";
import { readWorkRules, type WorkRules } from "./readWorkRules.js";
import { rowReader, type RowReader } from "./rowReader.js";

/** Cost per km of a vehicle row that gives none, so that a fleet without costs minimises km. */
export const DEFAULT_COST_PER_KM = 1;

/** One vehicle as read (after `Count` expansion), before it is placed in a `Problem`. */
export interface ParsedVehicle {
  readonly id: string;
  /** The Driver cell of its row (trimmed), when the fleet has a Driver column and the cell is filled. */
  readonly driver?: string;
  /** The Vehicle cell of its row before `Count` expansion ("Van A" for "Van A 2"). */
  readonly rowName: string;
  /** Capacity per load column: "" for a plain Capacity column, else the unit word. */
  readonly capacity: ReadonlyMap<string, number>;
  readonly start: LatLon;
  readonly end: LatLon;
  readonly shiftStartMin: number;
  readonly shiftEndMin: number;
  readonly fixedCost: number;
  readonly costPerKm: number;
  readonly costPerHour: number;
  /** `undefined` when blank (the settings speed applies). */
  readonly speedKmh?: number;
  readonly maxStops?: number;
  readonly features?: readonly string[];
  /** Working-time limits and break rules of the row. */
  readonly rules: WorkRules;
  /** 0-based sheet row of the fleet row it came from. */
  readonly sheetRow0: number;
  /** A1 address of its Lock cell when that cell says yes (keep its route when re-planning from a plan sheet). */
  readonly lockCell?: string;
}

/** What `parseFleet` found. */
export interface ParsedFleet {
  readonly vehicles: readonly ParsedVehicle[];
  readonly columns: TableColumns | undefined;
  readonly headerRow0: number;
  readonly col0: number;
  /** Unit words of the capacity columns ("" for a plain Capacity), in sheet order. */
  readonly dimensions: readonly string[];
  readonly issues: readonly Issue[];
}

/**
 * Read the fleet table: one row per vehicle type, expanded by `Count`.
 *
 * Columns (DESIGN.md §5): Vehicle, Count, Capacity (or Capacity kg, ...), Start latitude,
 * Start longitude (or one Depot column with "lat, lon"), End latitude, End longitude (blank:
 * back to the start depot), Shift start, Shift end (blank: 00:00 and 24:00; an end before the
 * start rolls over midnight), Fixed cost (blank 0), Cost per km (blank 1), Cost per hour
 * (blank 0), Speed km/h (blank: the settings speed), Max stops, Features, and the working-time
 * columns of `readWorkRules` (Drive before break, Break min, Break from, Break to, Max driving h,
 * Max duty h, Max km), Driver (who drives it, for route sheets; names the vehicles when there is no
 * Vehicle column), Lock (yes/no, blank no: keep the vehicle's route when re-planning from a plan
 * sheet; `parseYesNo`). A Count of 2 or more
 * makes "Van A 1", "Van A 2", ...; a Count of 0 leaves the row out; blank keeps one vehicle
 * with the row's name. Without a Vehicle column vehicles are named "Vehicle 1", "Vehicle 2"...
 *
 * @param read - the fleet range
 * @param columnMap - the user's column mappings
 * @returns the vehicles and every issue found
 * @example parseFleet({ sheet: "Fleet", row: 0, col: 0, values: [["Van", "Count", "Lat", "Lon"], ["A", 2, 45, 4]] }).vehicles.map((v) => v.id)
 * // => ["A 1", "A 2"]
 */
export function parseFleet(read: SheetRead, columnMap: readonly ColumnMapEntry[] = []): ParsedFleet {
  const { table, issues } = readTable(read, "fleet", columnMap);
  const base = { vehicles: [], columns: table?.columns, headerRow0: table?.headerRow0 ?? read.row, col0: read.col, dimensions: [] };
  if (!table) return { ...base, issues };
  const f = table.columns.fields;
  if (!(f.has("startLatitude") && f.has("startLongitude")) && !f.has("startCoordinates")) {
    issues.push(
      cellIssue(
        read.sheet,
        table.headerRow0,
        read.col,
        `the header row has no depot coordinate columns; add Start latitude and Start longitude columns in decimal degrees (or one Depot column holding "lat, lon").`,
      ),
    );
    return { ...base, issues };
  }
  const dimensions = [...f.keys()]
    .filter((k) => k === "capacity" || k.startsWith("capacity:"))
    .map((k) => (k === "capacity" ? "" : k.slice(9)));
  const vehicles: ParsedVehicle[] = [];
  const seen = new Map<string, number>();
  table.rows.forEach((row, ordinal) => {
    const r = rowReader(table, row, issues);
    const before = issues.length;
    // A fleet that names its vehicles only by driver keeps those names as vehicle names.
    const driver = r.text("driver");
    const name = r.text("id") ?? (f.has("id") ? undefined : driver) ?? `Vehicle ${ordinal + 1}`;
    const count = r.num("count", "count", { min: 0, integer: true, example: "3" }) ?? 1;
    const capacity = new Map<string, number>();
    for (const dim of dimensions) {
      const key = dim === "" ? "capacity" : `capacity:${dim}`;
      const label = dim === "" ? "capacity" : `capacity (${dim})`;
      if (r.blank(key) && !r.excelErrorAt(key))
        r.fail(key, `${label} is missing for vehicle "${name}"; type how much it can carry, such as 800.`);
      capacity.set(dim, r.num(key, label, { min: 0, example: "800" }) ?? 0);
    }
    const start = readPoint(r, "startLatitude", "startLongitude", "startCoordinates", "start depot");
    const endGiven = ["endLatitude", "endLongitude", "endCoordinates"].some((k) => r.has(k) && !r.blank(k));
    const end = endGiven ? readPoint(r, "endLatitude", "endLongitude", "endCoordinates", "end depot") : start;
    // An end depot typed only as an address is never replaced by the start depot in silence.
    if (!endGiven && r.has("endAddress") && !r.blank("endAddress"))
      r.fail(
        "endAddress",
        `the end depot of vehicle "${name}" is an address without coordinates; type its End latitude and End longitude in decimal degrees (such as 45.76 and 4.83), or set up a geocoding service (--geocoder, or Geocoding in the pane) to look the address up.`,
      );
    const shiftStartMin = r.time("shiftStart", "shift start") ?? 0;
    let shiftEndMin = r.time("shiftEnd", "shift end") ?? DAY_MIN;
    if (shiftEndMin < shiftStartMin) shiftEndMin += DAY_MIN;
    if (shiftEndMin === shiftStartMin) {
      // A blank end means 24:00, so a shift that starts at 24:00 (or 0:00 with end 24:00 typed) is empty.
      const field = r.blank("shiftEnd") ? "shiftStart" : "shiftEnd";
      r.fail(field, `the shift of vehicle "${name}" ends when it starts; type a shift start before its shift end.`);
    }
    const fixedCost = r.num("fixedCost", "fixed cost", { min: 0, example: "50" }) ?? 0;
    const costPerKm = r.num("costPerKm", "cost per km", { min: 0, example: "0.4" }) ?? DEFAULT_COST_PER_KM;
    const costPerHour = r.num("costPerHour", "cost per hour", { min: 0, example: "25" }) ?? 0;
    const speedKmh = r.num("speedKmh", "speed (km/h)", { above: 0, example: "40" });
    const maxStops = r.num("maxStops", "max stops", { min: 1, integer: true, example: "20" });
    const featureText = r.text("features");
    const rules = readWorkRules(r, name);
    const lockCell = readLock(r, name);
    if (issues.length > before || start === undefined || end === undefined) return;
    for (let k = 1; k <= count; k++) {
      const id = count > 1 ? `${name} ${k}` : name;
      const first = seen.get(id);
      if (first !== undefined) {
        r.fail("id", `vehicle name "${id}" is used twice (also from row ${first}); give every vehicle its own name.`);
        continue;
      }
      seen.set(id, r.sheetRow);
      vehicles.push({
        id,
        ...(driver !== undefined ? { driver } : {}),
        rowName: name,
        capacity,
        start,
        end,
        shiftStartMin,
        shiftEndMin,
        fixedCost,
        costPerKm,
        costPerHour,
        ...(speedKmh !== undefined ? { speedKmh } : {}),
        ...(maxStops !== undefined ? { maxStops } : {}),
        ...(featureText !== undefined ? { features: parseFeatures(featureText) } : {}),
        rules,
        sheetRow0: row.sheetRow0,
        ...(lockCell !== undefined ? { lockCell } : {}),
      });
    }
  });
  return { ...base, vehicles, dimensions, issues };
}

/** The A1 address of the row's Lock cell when it says yes; a cell that is neither yes nor no is an issue there. */
function readLock(r: RowReader, name: string): string | undefined {
  if (!r.has("lock") || r.blank("lock") || r.excelErrorAt("lock")) return undefined;
  const locked = parseYesNo(r.raw("lock"));
  if (locked === undefined) {
    r.fail(
      "lock",
      `Lock ${JSON.stringify(String(plainCell(r.raw("lock"))))} for vehicle "${name}" is not yes or no; type yes to keep this vehicle's route as published when re-planning from a plan sheet, or leave the cell blank.`,
    );
    return undefined;
  }
  return locked ? r.cell("lock") : undefined;
}

/** A depot point from a latitude/longitude pair or one "lat, lon" column. */
function readPoint(r: RowReader, latKey: string, lonKey: string, pairKey: string, what: string): LatLon | undefined {
  const pairBlank = (!r.has(latKey) || r.blank(latKey)) && (!r.has(lonKey) || r.blank(lonKey));
  if (pairBlank && r.has(pairKey) && !r.blank(pairKey)) {
    if (r.excelErrorAt(pairKey)) return undefined;
    const p = parseLatLon(r.raw(pairKey));
    if (p === undefined || Math.abs(p.lat) > 90 || Math.abs(p.lon) > 180) {
      const text = String(plainCell(r.raw(pairKey)));
      // Words in the cell: an address typed where the coordinates go, which a geocoder can look up.
      const address =
        p === undefined && /\p{L}{2,}/u.test(text)
          ? `, or, as it reads as an address, set up a geocoding service (--geocoder, or Geocoding in the pane) to look it up`
          : "";
      r.fail(
        pairKey,
        `the ${what} ${JSON.stringify(text)} is not "latitude, longitude"; type decimal degrees such as "45.76, 4.83" (latitude -90..90, longitude -180..180)${address}.`,
      );
      return undefined;
    }
    return p;
  }
  const lat = axis(r, r.has(latKey) ? latKey : pairKey, "lat", what);
  const lon = axis(r, r.has(lonKey) ? lonKey : pairKey, "lon", what);
  return lat === undefined || lon === undefined ? undefined : { lat, lon };
}

function axis(r: RowReader, key: string, which: "lat" | "lon", what: string): number | undefined {
  const word = which === "lat" ? "latitude" : "longitude";
  if (r.blank(key)) {
    r.fail(key, `the ${what} ${word} is empty; fill it in decimal degrees (such as ${which === "lat" ? "45.76" : "4.83"}).`);
    return undefined;
  }
  if (r.excelErrorAt(key)) return undefined;
  const d = readDegrees(r.raw(key), which);
  const limit = which === "lat" ? 90 : 180;
  if (d === undefined) {
    r.fail(
      key,
      `${what} ${word} ${JSON.stringify(String(plainCell(r.raw(key))))} is not a coordinate; type decimal degrees such as ${which === "lat" ? "45.76" : "4.83"}.`,
    );
  } else if (Math.abs(d) > limit) {
    r.fail(
      key,
      `${what} ${word} ${d} is outside -${limit}..${limit}; type decimal degrees${which === "lat" ? ", north positive" : ", east positive"}.`,
    );
    return undefined;
  }
  return d;
}
