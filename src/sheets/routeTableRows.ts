import { PLAIN_DIMENSION, type BreakVisit, type Problem, type Plan, type Route } from "../core/index.js";
import type { CellValue } from "./grid.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import type { StopRow } from "./ReadResult.js";
import { windowUsed } from "./windowUsed.js";

/**
 * The route table's fixed columns (DESIGN.md §5, widened by issue 8): `Address` follows `Name`
 * when the stops table has addresses, and `Load` stands for one numeric column per load
 * dimension ("Load kg", "Load crates"), followed by as many `Drop` columns.
 */
export const ROUTE_TABLE_HEADER = [
  "Vehicle",
  "Seq",
  "Stop",
  "Name",
  "Arrival",
  "Wait min",
  "Start",
  "Departure",
  "Load",
  "Leg km",
  "Total km",
  "Earliest",
  "Latest",
  "Late min",
  "Latitude",
  "Longitude",
] as const;

/** Header of the stops' address column, placed beside Name. */
export const ADDRESS_HEADER = "Address";
/** Prefixes of the per-dimension load columns: on board after the stop, dropped there, collected there. */
export const LOAD_PREFIX = "Load";
export const DROP_PREFIX = "Drop";
export const COLLECT_PREFIX = "Collect";

/** Text in the Name column of the depot rows. */
export const DEPOT_START_NAME = "Depot start";
export const DEPOT_END_NAME = "Depot end";
/** Text in the Stop column of a break row, and in its Name column by kind. */
export const BREAK_STOP = "Break";
export const BREAK_NAMES = { driving: "Driving break", window: "Break in its window" } as const;
/** Header of the column showing what to collect at each stop (present only when some stop collects). */
export const COLLECT_HEADER = COLLECT_PREFIX;

/** One row of cells with the number format of each. */
export interface FormattedRow {
  readonly values: CellValue[];
  readonly formats: (string | null)[];
}

/** The route table body and where each used vehicle's rows are. */
export interface RouteTableRows {
  readonly header: readonly string[];
  readonly rows: readonly FormattedRow[];
  /** Per used vehicle: its safe name and its rows (`first` = index into `rows`). */
  readonly routes: readonly { readonly vehicle: number; readonly name: string; readonly first: number; readonly count: number }[];
  /** Columns (0-based) of Latitude and Longitude, for the route chart. */
  readonly latitudeCol: number;
  readonly longitudeCol: number;
}

/**
 * Header of one load column per dimension: the prefix and the unit ("Load kg", "Drop crates");
 * the prefix alone for the plain dimension of a table whose Demand column has no unit.
 *
 * @param prefix - "Load", "Drop" or "Collect"
 * @param dimensions - `Problem.loadDimensions`
 * @returns one header per dimension
 * @example loadHeaders("Drop", ["kg", "crates"]) // => ["Drop kg", "Drop crates"]
 */
export function loadHeaders(prefix: string, dimensions: readonly string[]): string[] {
  return dimensions.map((d) => (d === PLAIN_DIMENSION ? prefix : `${prefix} ${d}`));
}

/**
 * The rows of the route table: for each used vehicle a start-depot row (Seq 0, the full
 * load, departure), one row per visit, and an end-depot row (Seq n+1, return time, the
 * distance back, minutes back after the shift end in Late min). Depot rows carry the name of
 * their own depot (`Problem.locations[i].name`) and show the shift as Earliest/Latest. A break
 * is a row of its own ("Break" in Stop, its start in Start and its end in Departure, its window
 * in Earliest/Latest), before or after the visit it is taken at. Loads are numbers, one column
 * per load dimension so they add up: Load (on board after the stop: deliveries off, pickups
 * on), Drop (the stop's demand) and, when some stop collects, Collect after Longitude. The
 * stop's address sits beside its name when the stops table has an Address column. Unused
 * vehicles are left out. Times are day fractions (`hh:mm`), kilometres rounded to 0.1, user
 * text carried raw and marked `@`.
 *
 * @param problem - the problem the plan solves
 * @param plan - the plan
 * @param stopRows - where each stop came from, with its address and extra columns
 * @param extraHeaders - headers of the extra columns, in sheet order
 * @returns header, rows, per-vehicle row ranges and the coordinate columns
 * @throws RangeError when the plan refers to a vehicle or stop the problem does not have
 * @example routeTableRows(problem, plan).rows[0].values[1] // => 0 (the start depot)
 */
export function routeTableRows(
  problem: Problem,
  plan: Plan,
  stopRows: readonly StopRow[] = [],
  extraHeaders: readonly string[] = [],
): RouteTableRows {
  const dims = problem.loadDimensions;
  const byStop = new Map(stopRows.map((r) => [r.stop, r]));
  const collect = problem.stops.some((s) => (s.pickup ?? []).some((q) => q > 0));
  const withAddress = stopRows.some((r) => r.address !== undefined);
  const fixed = [
    ...ROUTE_TABLE_HEADER.slice(0, 4),
    ...(withAddress ? [ADDRESS_HEADER] : []),
    ...ROUTE_TABLE_HEADER.slice(4, 8),
    ...loadHeaders(LOAD_PREFIX, dims),
    ...loadHeaders(DROP_PREFIX, dims),
    ...ROUTE_TABLE_HEADER.slice(9),
    ...(collect ? loadHeaders(COLLECT_PREFIX, dims) : []),
  ];
  const header = [...fixed, ...extraHeaders];
  const blankExtras = extraHeaders.map(() => BLANK);
  const row = (cells: Cells, extras: readonly Cell[] = blankExtras): FormattedRow => {
    const list = [...fixed.map((h) => cells[h] ?? BLANK), ...extras];
    return { values: list.map((c) => c[0]), formats: list.map((c) => c[1]) };
  };
  const rows: FormattedRow[] = [];
  const routes: { vehicle: number; name: string; first: number; count: number }[] = [];
  for (const route of plan.routes) {
    if (route.visits.length === 0) continue;
    const first = rows.length;
    const name = vehicleOf(problem, route).id;
    rows.push(row(depotCells(problem, route, "start")));
    route.visits.forEach((visit, i) => {
      const stop = problem.stops[visit.stop];
      if (!stop) throw new RangeError(`routeTableRows: plan visits stop ${visit.stop}, problem has ${problem.stops.length}`);
      const w = windowUsed(stop, visit);
      const { lat, lon } = locationOf(problem, stop.location);
      const source = byStop.get(visit.stop);
      for (const b of route.breaks) if (b.at === i && b.beforeService) rows.push(row(breakCells(problem, route, b, lat, lon)));
      const cells: Cells = {
        Vehicle: [name, F.text],
        Seq: [i + 1, F.integer],
        Stop: [stop.id, F.text],
        Name: [stop.name, F.text],
        [ADDRESS_HEADER]: source?.address ? [source.address, F.text] : BLANK,
        Arrival: [dayFraction(visit.arrivalMin), F.timeOfDay],
        "Wait min": [roundTo(visit.waitMin, 1), F.minutes],
        Start: [dayFraction(visit.startMin), F.timeOfDay],
        Departure: [dayFraction(visit.departureMin), F.timeOfDay],
        "Leg km": [roundTo(visit.legKm, 1), F.km],
        "Total km": [roundTo(visit.totalKm, 1), F.km],
        Earliest: windowEdge(w.earliestMin, w.latestMin === Infinity && w.earliestMin === 0),
        Latest: windowEdge(w.latestMin, false),
        "Late min": [roundTo(visit.lateMin, 1), F.minutes],
        Latitude: [lat, null],
        Longitude: [lon, null],
        ...amounts(LOAD_PREFIX, dims, visit.loadAfter),
        ...amounts(DROP_PREFIX, dims, stop.demand),
        ...(collect ? amounts(COLLECT_PREFIX, dims, stop.pickup ?? dims.map(() => 0)) : {}),
      };
      rows.push(row(cells, extraCells(source?.extra, extraHeaders)));
      for (const b of route.breaks) if (b.at === i && !b.beforeService) rows.push(row(breakCells(problem, route, b, lat, lon)));
    });
    rows.push(row(depotCells(problem, route, "end")));
    routes.push({ vehicle: route.vehicle, name, first, count: rows.length - first });
  }
  return { header, rows, routes, latitudeCol: header.indexOf("Latitude"), longitudeCol: header.indexOf("Longitude") };
}

/** A value with its number format. */
export type Cell = readonly [CellValue, string | null];
/** A row's cells by fixed header; a header without a cell is blank. Carried columns go by position, so their names never clash. */
type Cells = Record<string, Cell>;
const BLANK: Cell = [null, null];

/** A break as a row of its own: "Break" in Stop, its start in Start and its end in Departure. */
function breakCells(problem: Problem, route: Route, b: BreakVisit, lat: number, lon: number): Cells {
  const v = vehicleOf(problem, route);
  const w = b.kind === "window" ? v.windowBreak : undefined;
  return {
    Vehicle: [v.id, F.text],
    Stop: [BREAK_STOP, F.text],
    Name: [BREAK_NAMES[b.kind], F.text],
    Start: [dayFraction(b.startMin), F.timeOfDay],
    Departure: [dayFraction(b.endMin), F.timeOfDay],
    Earliest: w ? [dayFraction(w.earliestMin), F.timeOfDay] : BLANK,
    Latest: w ? [dayFraction(w.latestMin), F.timeOfDay] : BLANK,
    Latitude: [lat, null],
    Longitude: [lon, null],
  };
}

function depotCells(problem: Problem, route: Route, end: "start" | "end"): Cells {
  const v = vehicleOf(problem, route);
  const { lat, lon, name } = locationOf(problem, end === "start" ? v.startLocation : v.endLocation);
  const last = route.visits[route.visits.length - 1]!;
  const common: Cells = {
    Vehicle: [v.id, F.text],
    Stop: [name || "Depot", F.text],
    Earliest: [dayFraction(v.shiftStartMin), F.timeOfDay],
    Latest: [dayFraction(v.shiftEndMin), F.timeOfDay],
    Latitude: [lat, null],
    Longitude: [lon, null],
  };
  if (end === "start") {
    return {
      ...common,
      Seq: [0, F.integer],
      Name: [DEPOT_START_NAME, F.text],
      Departure: [dayFraction(route.departureMin), F.timeOfDay],
      ...amounts(LOAD_PREFIX, problem.loadDimensions, route.load),
      "Leg km": [0, F.km],
      "Total km": [0, F.km],
    };
  }
  return {
    ...common,
    Seq: [route.visits.length + 1, F.integer],
    Name: [DEPOT_END_NAME, F.text],
    Arrival: [dayFraction(route.returnMin), F.timeOfDay],
    ...amounts(LOAD_PREFIX, problem.loadDimensions, last.loadAfter),
    "Leg km": [roundTo(route.distanceKm - last.totalKm, 1), F.km],
    "Total km": [roundTo(route.distanceKm, 1), F.km],
    "Late min": [roundTo(route.overtimeMin, 1), F.minutes],
  };
}

/** One numeric cell per load dimension, rounded to 0.01 so sums of fractional demands show no floating-point noise. */
function amounts(prefix: string, dims: readonly string[], load: readonly number[]): Cells {
  if (load.length !== dims.length) throw new RangeError(`routeTableRows: load has ${load.length} values for ${dims.length} dimensions`);
  const headers = loadHeaders(prefix, dims);
  return Object.fromEntries(headers.map((h, k) => [h, [roundTo(load[k]!, 2), null] as Cell]));
}

/** An open window edge (no latest, or the whole day of a stop without a window) stays empty. */
function windowEdge(min: number, open: boolean): Cell {
  return open || !Number.isFinite(min) ? BLANK : [dayFraction(min), F.timeOfDay];
}

/**
 * The carried-through cells of a stop, in header order: text marked `@`, other values as read.
 *
 * @param extra - the stop row's carried columns by header
 * @param headers - the carried headers, in sheet order
 * @returns one [value, format] pair per header
 * @example extraCells({ Phone: "0123" }, ["Phone"]) // => [["0123", "@"]]
 */
export function extraCells(extra: Readonly<Record<string, CellValue>> | undefined, headers: readonly string[]): Cell[] {
  return headers.map((h) => {
    const v = extra?.[h] ?? null;
    return typeof v === "string" ? [v, F.text] : [v, null];
  });
}

function vehicleOf(problem: Problem, route: Route) {
  const v = problem.vehicles[route.vehicle];
  if (!v) throw new RangeError(`routeTableRows: plan uses vehicle ${route.vehicle}, problem has ${problem.vehicles.length}`);
  return v;
}

function locationOf(problem: Problem, index: number) {
  const loc = problem.locations[index];
  if (!loc) throw new RangeError(`routeTableRows: location ${index} is outside 0..${problem.locations.length - 1}`);
  return loc;
}
