import type { BreakVisit, Problem, Plan, Route } from "../core/index.js";
import { formatLoad } from "./formatLoad.js";
import type { CellValue } from "./grid.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import type { StopRow } from "./ReadResult.js";
import { windowUsed } from "./windowUsed.js";

/** The route table's header row (DESIGN.md §5), before the carried-through stop columns. */
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

/** Column of Latitude and Longitude in the route table (0-based). */
export const LATITUDE_COL = ROUTE_TABLE_HEADER.indexOf("Latitude");
export const LONGITUDE_COL = ROUTE_TABLE_HEADER.indexOf("Longitude");

/** Text in the Name column of the depot rows. */
export const DEPOT_START_NAME = "Depot start";
export const DEPOT_END_NAME = "Depot end";
/** Text in the Stop column of a break row, and in its Name column by kind. */
export const BREAK_STOP = "Break";
export const BREAK_NAMES = { driving: "Driving break", window: "Break in its window" } as const;
/** Header of the column showing what to collect at each stop (present only when some stop collects). */
export const COLLECT_HEADER = "Collect";

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
}

/**
 * The rows of the route table: for each used vehicle a start-depot row (Seq 0, the full
 * load, departure), one row per visit, and an end-depot row (Seq n+1, return time, the
 * distance back, minutes back after the shift end in Late min). Depot rows show the shift as
 * Earliest/Latest. A break is a row of its own ("Break" in Stop, its start in Start and its end
 * in Departure, its window in Earliest/Latest), before or after the visit it is taken at. When
 * some stop collects, a Collect column after Longitude shows what to collect, and Load is the
 * load on board after each stop (deliveries off, pickups on). Unused vehicles are left out. Times are day fractions (`hh:mm`),
 * kilometres rounded to 0.1, user text made safe and marked `@`.
 *
 * @param problem - the problem the plan solves
 * @param plan - the plan
 * @param stopRows - where each stop came from, with its extra columns
 * @param extraHeaders - headers of the extra columns, in sheet order
 * @returns header, rows and per-vehicle row ranges
 * @throws RangeError when the plan refers to a vehicle or stop the problem does not have
 * @example routeTableRows(problem, plan).rows[0].values[1] // => 0 (the start depot)
 */
export function routeTableRows(
  problem: Problem,
  plan: Plan,
  stopRows: readonly StopRow[] = [],
  extraHeaders: readonly string[] = [],
): RouteTableRows {
  const extraByStop = new Map(stopRows.map((r) => [r.stop, r.extra]));
  const collect = problem.stops.some((s) => (s.pickup ?? []).some((q) => q > 0));
  const tail = extraHeaders.length + (collect ? 1 : 0);
  const rows: FormattedRow[] = [];
  const routes: { vehicle: number; name: string; first: number; count: number }[] = [];
  for (const route of plan.routes) {
    if (route.visits.length === 0) continue;
    const first = rows.length;
    const name = vehicleOf(problem, route).id;
    rows.push(depotRow(problem, route, "start", tail));
    route.visits.forEach((visit, i) => {
      const stop = problem.stops[visit.stop];
      if (!stop) throw new RangeError(`routeTableRows: plan visits stop ${visit.stop}, problem has ${problem.stops.length}`);
      const w = windowUsed(stop, visit);
      const { lat, lon } = locationOf(problem, stop.location);
      for (const b of route.breaks) if (b.at === i && b.beforeService) rows.push(breakRow(problem, route, b, lat, lon, tail));
      rows.push(
        cells([
          [name, F.text],
          [i + 1, F.integer],
          [stop.id, F.text],
          [stop.name, F.text],
          [dayFraction(visit.arrivalMin), F.timeOfDay],
          [roundTo(visit.waitMin, 1), F.minutes],
          [dayFraction(visit.startMin), F.timeOfDay],
          [dayFraction(visit.departureMin), F.timeOfDay],
          loadCell(visit.loadAfter, problem.loadDimensions),
          [roundTo(visit.legKm, 1), F.km],
          [roundTo(visit.totalKm, 1), F.km],
          windowEdge(w.earliestMin, w.latestMin === Infinity && w.earliestMin === 0),
          windowEdge(w.latestMin, false),
          [roundTo(visit.lateMin, 1), F.minutes],
          [lat, null],
          [lon, null],
          ...(collect ? [loadCell(stop.pickup ?? problem.loadDimensions.map(() => 0), problem.loadDimensions)] : []),
          ...extraCells(extraByStop.get(visit.stop), extraHeaders),
        ]),
      );
      for (const b of route.breaks) if (b.at === i && !b.beforeService) rows.push(breakRow(problem, route, b, lat, lon, tail));
    });
    rows.push(depotRow(problem, route, "end", tail));
    routes.push({ vehicle: route.vehicle, name, first, count: rows.length - first });
  }
  const header = [...ROUTE_TABLE_HEADER, ...(collect ? [COLLECT_HEADER] : []), ...extraHeaders];
  return { header, rows, routes };
}

/** A break as a row of its own: "Break" in Stop, its start in Start and its end in Departure. */
function breakRow(problem: Problem, route: Route, b: BreakVisit, lat: number, lon: number, extras: number): FormattedRow {
  const v = vehicleOf(problem, route);
  const blank: Cell = [null, null];
  const w = b.kind === "window" ? v.windowBreak : undefined;
  const row: Cell[] = [
    [v.id, F.text],
    blank,
    [BREAK_STOP, F.text],
    [BREAK_NAMES[b.kind], F.text],
    blank,
    blank,
    [dayFraction(b.startMin), F.timeOfDay],
    [dayFraction(b.endMin), F.timeOfDay],
    blank,
    blank,
    blank,
    w ? [dayFraction(w.earliestMin), F.timeOfDay] : blank,
    w ? [dayFraction(w.latestMin), F.timeOfDay] : blank,
    blank,
    [lat, null],
    [lon, null],
  ];
  for (let i = 0; i < extras; i++) row.push(blank);
  return cells(row);
}

type Cell = readonly [CellValue, string | null];

function depotRow(problem: Problem, route: Route, end: "start" | "end", extras: number): FormattedRow {
  const v = vehicleOf(problem, route);
  const at = end === "start" ? v.startLocation : v.endLocation;
  const { lat, lon, name } = locationOf(problem, at);
  const last = route.visits[route.visits.length - 1]!;
  const blank: Cell = [null, null];
  const shift: Cell[] = [
    [dayFraction(v.shiftStartMin), F.timeOfDay],
    [dayFraction(v.shiftEndMin), F.timeOfDay],
  ];
  const head: Cell[] = [[v.id, F.text]];
  const row: Cell[] =
    end === "start"
      ? [
          ...head,
          [0, F.integer],
          [name || "Depot", F.text],
          [DEPOT_START_NAME, F.text],
          blank,
          blank,
          blank,
          [dayFraction(route.departureMin), F.timeOfDay],
          loadCell(route.load, problem.loadDimensions),
          [0, F.km],
          [0, F.km],
          ...shift,
          blank,
        ]
      : [
          ...head,
          [route.visits.length + 1, F.integer],
          [name || "Depot", F.text],
          [DEPOT_END_NAME, F.text],
          [dayFraction(route.returnMin), F.timeOfDay],
          blank,
          blank,
          blank,
          loadCell(last.loadAfter, problem.loadDimensions),
          [roundTo(route.distanceKm - last.totalKm, 1), F.km],
          [roundTo(route.distanceKm, 1), F.km],
          ...shift,
          [roundTo(route.overtimeMin, 1), F.minutes],
        ];
  row.push([lat, null], [lon, null]);
  for (let i = 0; i < extras; i++) row.push(blank);
  return cells(row);
}

function cells(list: readonly Cell[]): FormattedRow {
  return { values: list.map((c) => c[0]), formats: list.map((c) => c[1]) };
}

function loadCell(load: readonly number[], dims: readonly string[]): Cell {
  const v = formatLoad(load, dims);
  return [v, typeof v === "string" ? F.text : null];
}

/** An open window edge (no latest, or the whole day of a stop without a window) stays empty. */
function windowEdge(min: number, open: boolean): Cell {
  return open || !Number.isFinite(min) ? [null, null] : [dayFraction(min), F.timeOfDay];
}

function extraCells(extra: Readonly<Record<string, CellValue>> | undefined, headers: readonly string[]): Cell[] {
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
