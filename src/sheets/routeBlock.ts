/**
 * One vehicle's block of a driver route sheet (see `layoutRouteSheets`): the stop-row columns
 * shared by every block, and the block's rows, from its header rows to the caution line.
 */
import type { BreakVisit, Problem, Route, TimeWindow } from "../core/index.js";
import { CAUTION_TEXT } from "./caution.js";
import { formatClock } from "./formatClock.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import type { RunRecord } from "./PlanSettings.js";
import type { StopRow } from "./ReadResult.js";
import {
  ADDRESS_HEADER,
  BREAK_NAMES,
  BREAK_STOP,
  COLLECT_PREFIX,
  DROP_PREFIX,
  extraCells,
  loadHeaders,
  type Cell,
} from "./routeTableRows.js";
import { windowUsed } from "./windowUsed.js";

/** Header of the sign-off column at the right of the stop rows. */
export const SIGN_OFF_HEADER = "Done";
/** What each stop row shows in the sign-off column: an empty box to tick on paper (plain ASCII, prints in any font). */
export const SIGN_OFF_BOX = "[  ]";
/** Text in the Stop column of the return row. */
export const RETURN_STOP = "Return";
/** Labels of the block's totals row (the load per dimension follows). */
export const ROUTE_TOTALS_LABELS = ["Stops", "Km", "Driving hours", "Duty hours"] as const;

/** The stop-row columns of every block. */
export interface Columns {
  readonly header: readonly string[];
  readonly dims: readonly string[];
  readonly collect: boolean;
  readonly withAddress: boolean;
  readonly extraHeaders: readonly string[];
  readonly byStop: ReadonlyMap<number, StopRow>;
}

/** The stop-row columns of every block: the fixed ones, the load columns per dimension, the carried columns and the sign-off box. */
export function sheetColumns(problem: Problem, stopRows: readonly StopRow[], extraHeaders: readonly string[]): Columns {
  const dims = problem.loadDimensions;
  const collect = problem.stops.some((s) => (s.pickup ?? []).some((q) => q > 0));
  const withAddress = stopRows.some((r) => r.address !== undefined);
  const header = [
    "Seq",
    "Arrival",
    "Window",
    "Stop",
    "Name",
    ...(withAddress ? [ADDRESS_HEADER] : []),
    ...loadHeaders(DROP_PREFIX, dims),
    ...(collect ? loadHeaders(COLLECT_PREFIX, dims) : []),
    "Service min",
    ...extraHeaders,
    SIGN_OFF_HEADER,
  ];
  return { header, dims, collect, withAddress, extraHeaders, byStop: new Map(stopRows.map((r) => [r.stop, r])) };
}

/** One vehicle's block: header rows, stop and break rows, the return, totals and the caution line. */
export function blockRows(
  route: Route,
  input: { readonly problem: Problem; readonly run: Pick<RunRecord, "scenario" | "createdSerial"> },
  columns: Columns,
): { rows: Cell[][]; bold: number[]; long: number[]; spill: [number, number][] } {
  const { problem, run } = input;
  const v = vehicleOf(problem, route);
  const rows: Cell[][] = [];
  const bold: number[] = [];
  const long: number[] = [];
  const text = (t: string): Cell => [t, F.text];
  const depot = locationOf(problem, v.startLocation).name || "Depot";
  // Labels sit in columns 0, 2 and 4 and values beside them; names may spill over the empty cells
  // to their right, so they do not widen the narrow Arrival column (see `spill`).
  bold.push(rows.length);
  rows.push([text("Vehicle"), text(v.id), BLANK, BLANK, ...(v.driver !== undefined ? [text("Driver"), text(v.driver)] : [])]);
  rows.push([text("Scenario"), text(run.scenario), BLANK, BLANK, text("Date"), [dateOnly(run.createdSerial), F.date]]);
  rows.push([
    text("Leave"),
    [dayFraction(route.departureMin), F.timeOfDay],
    text("Shift end"),
    [dayFraction(v.shiftEndMin), F.timeOfDay],
    text("Depot"),
    text(depot),
  ]);
  const spill: [number, number][] = [
    [0, 1],
    [0, 5],
    [1, 1],
    [2, 5],
  ];
  const at = (h: string): number => columns.header.indexOf(h);
  const line = (cells: Record<string, Cell>, extras: readonly Cell[] = []): Cell[] => {
    const row: Cell[] = columns.header.map((h) => cells[h] ?? BLANK);
    const firstExtra = at("Service min") + 1;
    extras.forEach((c, k) => (row[firstExtra + k] = c));
    return row;
  };
  const breakLine = (b: BreakVisit): Cell[] =>
    line({
      Arrival: [dayFraction(b.startMin), F.timeOfDay],
      Window: b.kind === "window" && v.windowBreak ? text(windowText(v.windowBreak)) : BLANK,
      Stop: text(BREAK_STOP),
      Name: text(`${BREAK_NAMES[b.kind]} ${formatClock(b.startMin)}-${formatClock(b.endMin)}`),
    });
  route.visits.forEach((visit, i) => {
    const stop = problem.stops[visit.stop];
    if (!stop) throw new RangeError(`layoutRouteSheets: plan visits stop ${visit.stop}, problem has ${problem.stops.length}`);
    const source = columns.byStop.get(visit.stop);
    for (const b of route.breaks) if (b.at === i && b.beforeService) rows.push(breakLine(b));
    const w = windowUsed(stop, visit);
    rows.push(
      line(
        {
          Seq: [i + 1, F.integer],
          Arrival: [dayFraction(visit.arrivalMin), F.timeOfDay],
          Window: text(windowText(w)),
          Stop: text(stop.id),
          Name: text(stop.name),
          [ADDRESS_HEADER]: source?.address ? text(source.address) : BLANK,
          ...amounts(DROP_PREFIX, columns.dims, stop.demand),
          ...(columns.collect ? amounts(COLLECT_PREFIX, columns.dims, stop.pickup ?? columns.dims.map(() => 0)) : {}),
          "Service min": [roundTo(stop.serviceMin, 1), F.minutes],
          [SIGN_OFF_HEADER]: text(SIGN_OFF_BOX),
        },
        extraCells(source?.extra, columns.extraHeaders),
      ),
    );
    for (const b of route.breaks) if (b.at === i && !b.beforeService) rows.push(breakLine(b));
  });
  const end = locationOf(problem, v.endLocation).name || "Depot";
  rows.push(
    line({
      Seq: [route.visits.length + 1, F.integer],
      Arrival: [dayFraction(route.returnMin), F.timeOfDay],
      Window: text(`by ${formatClock(v.shiftEndMin)}`),
      Stop: text(RETURN_STOP),
      Name: text(end),
    }),
  );
  bold.push(rows.length);
  rows.push([...ROUTE_TOTALS_LABELS, ...loadHeaders("Load", columns.dims)].map(text));
  rows.push([
    [route.visits.length, F.integer],
    [roundTo(route.distanceKm, 1), F.km],
    [dayFraction(route.drivingMin), F.duration],
    [dayFraction(route.dutyMin), F.duration],
    ...route.load.map((q): Cell => [roundTo(q, 2), null]),
  ]);
  long.push(rows.length);
  rows.push([text(CAUTION_TEXT)]);
  rows.push([]);
  return { rows, bold, long, spill };
}

const BLANK: Cell = [null, null];

/** A window as "08:00-10:00", "from 08:00", or "any time" for a stop without one. */
function windowText(w: TimeWindow): string {
  if (!Number.isFinite(w.latestMin)) return w.earliestMin <= 0 ? "any time" : `from ${formatClock(w.earliestMin)}`;
  return `${formatClock(w.earliestMin)}-${formatClock(w.latestMin)}`;
}

function amounts(prefix: string, dims: readonly string[], load: readonly number[]): Record<string, Cell> {
  const headers = loadHeaders(prefix, dims);
  return Object.fromEntries(headers.map((h, k) => [h, [roundTo(load[k] ?? 0, 2), null] as Cell]));
}

function dateOnly(serial: number): number {
  return Math.floor(serial);
}

export function vehicleOf(problem: Problem, route: Route) {
  const v = problem.vehicles[route.vehicle];
  if (!v) throw new RangeError(`layoutRouteSheets: plan uses vehicle ${route.vehicle}, problem has ${problem.vehicles.length}`);
  return v;
}

function locationOf(problem: Problem, index: number) {
  const loc = problem.locations[index];
  if (!loc) throw new RangeError(`layoutRouteSheets: location ${index} is outside 0..${problem.locations.length - 1}`);
  return loc;
}
