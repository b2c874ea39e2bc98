import type { BreakVisit, Plan, Problem, Route, TimeWindow } from "../core/index.js";
import { CAUTION_TEXT } from "./caution.js";
import { columnWidths } from "./columnWidths.js";
import { formatClock } from "./formatClock.js";
import type { CellValue, SheetGrid } from "./grid.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import type { RunRecord } from "./PlanSettings.js";
import type { PrintSetup } from "./printSetup.js";
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
import { uniqueSheetName } from "./uniqueSheetName.js";
import { windowUsed } from "./windowUsed.js";

/** Input of `layoutRouteSheets`. */
export interface LayoutRouteSheetsInput {
  readonly problem: Problem;
  readonly plan: Plan;
  /** The run: its scenario (the plan sheet's name) and when it was made. */
  readonly run: Pick<RunRecord, "scenario" | "createdSerial">;
  /** Where each stop came from: its address and carried-through columns (e.g. Phone, Notes). */
  readonly stopRows?: readonly StopRow[];
  /** Headers of the carried-through columns, in sheet order. */
  readonly extraHeaders?: readonly string[];
  /** One sheet per vehicle instead of one sheet per scenario with a block per vehicle. */
  readonly sheetPerVehicle?: boolean;
  /** Paper to print on (see `paperSizeForLocale`); A4 when absent. */
  readonly paperSize?: "A4" | "Letter";
  /** Sheets already in the workbook (the plan sheet included), so the new names are free. */
  readonly existingSheets?: readonly string[];
}

/** One route sheet: a free name, its grid (print setup included) and where each vehicle's block is. */
export interface RouteSheet {
  readonly name: string;
  readonly grid: SheetGrid;
  /** Per vehicle on this sheet: its id and its block's first row and row count (0-based grid rows). */
  readonly blocks: readonly { readonly vehicle: string; readonly row: number; readonly rows: number }[];
}

/** Header of the sign-off column at the right of the stop rows. */
export const SIGN_OFF_HEADER = "Done";
/** What each stop row shows in the sign-off column: an empty box to tick on paper (plain ASCII, prints in any font). */
export const SIGN_OFF_BOX = "[  ]";
/** Text in the Stop column of the return row. */
export const RETURN_STOP = "Return";
/** Labels of the block's totals row (the load per dimension follows). */
export const ROUTE_TOTALS_LABELS = ["Stops", "Km", "Driving hours", "Duty hours"] as const;

/**
 * The driver route sheets of a plan (issue 8): by default one sheet for the scenario with one
 * block per used vehicle and a page break before every block but the first; with
 * `sheetPerVehicle` one sheet per vehicle. Names follow the sheet-name rules (31 characters,
 * unique against `existingSheets` and each other): "<scenario> routes" or "<scenario> <vehicle>".
 *
 * Top of every sheet, repeated on every printed page (print titles): a title row (scenario,
 * planned on) and the column header `Seq | Arrival | Window | Stop | Name | [Address] | Drop
 * <unit>... | [Collect <unit>...] | Service min | <carried columns> | Done` (a box to tick on each
 * stop row). Each block, top to
 * bottom: Vehicle (and Driver when the fleet has one), Scenario and Date, Leave time, Shift end
 * and Depot; one row per stop with the planned arrival, the window used (text "08:00-10:00"),
 * the quantity to drop per load dimension as numbers; a row per break (start in Arrival, the
 * break in Name); the return to the depot; the totals (stops, km, driving and duty time, load
 * leaving the depot per dimension); and the caution line. Text cells carry the user's text
 * raw, marked `@` (adapters keep it text). Print: paper from the caller, fit to one page wide,
 * footer "scenario | vehicle(s) | Page n of m".
 *
 * @param input - problem, plan, run and options
 * @returns one or more route sheets; none when no vehicle is used
 * @throws TypeError when problem, plan or run is missing; RangeError when the plan refers to a
 *   vehicle, stop or location the problem lacks
 * @example layoutRouteSheets({ problem, plan, run }).map((s) => s.name) // => ["Monday routes"]
 */
export function layoutRouteSheets(input: LayoutRouteSheetsInput): RouteSheet[] {
  const { problem, plan, run } = input ?? ({} as LayoutRouteSheetsInput);
  if (!problem || !plan || !run) throw new TypeError("layoutRouteSheets: input.problem, input.plan and input.run are required");
  const used = plan.routes.filter((r) => r.visits.length > 0);
  if (used.length === 0) return [];
  const columns = sheetColumns(problem, input.stopRows ?? [], input.extraHeaders ?? []);
  const taken = [...(input.existingSheets ?? [])];
  const groups = input.sheetPerVehicle ? used.map((r) => [r]) : [used];
  return groups.map((routes) => {
    const wanted =
      routes.length === 1 && input.sheetPerVehicle ? `${run.scenario} ${vehicleOf(problem, routes[0]!).id}` : `${run.scenario} routes`;
    const name = uniqueSheetName(wanted, taken);
    taken.push(name);
    return sheetOf(name, routes, input, columns);
  });
}

/** The stop-row columns of every block. */
interface Columns {
  readonly header: readonly string[];
  readonly dims: readonly string[];
  readonly collect: boolean;
  readonly withAddress: boolean;
  readonly extraHeaders: readonly string[];
  readonly byStop: ReadonlyMap<number, StopRow>;
}

function sheetColumns(problem: Problem, stopRows: readonly StopRow[], extraHeaders: readonly string[]): Columns {
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

function sheetOf(name: string, routes: readonly Route[], input: LayoutRouteSheetsInput, columns: Columns): RouteSheet {
  const { problem, run } = input;
  const rows: Cell[][] = [];
  const bold: number[] = [];
  const longRows: number[] = [];
  const spill: [number, number][] = [];
  const blocks: { vehicle: string; row: number; rows: number }[] = [];
  const add = (row: Cell[], isBold = false): void => {
    if (isBold) bold.push(rows.length);
    rows.push(row);
  };
  const vehicles = routes.map((r) => vehicleOf(problem, r).id);
  const title = `Route sheet${routes.length > 1 ? "s" : ""}: ${run.scenario}${routes.length === 1 ? `, ${vehicles[0]!}` : ""}`;
  longRows.push(rows.length);
  add([[title, F.text]], true);
  add(
    columns.header.map((h) => [h, F.text] as Cell),
    true,
  );
  for (const route of routes) {
    const first = rows.length;
    const block = blockRows(route, input, columns);
    block.rows.forEach((row, i) => add(row, block.bold.includes(i)));
    for (const i of block.long) longRows.push(first + i);
    for (const [r, c] of block.spill) spill.push([first + r, c]);
    blocks.push({ vehicle: vehicleOf(problem, route).id, row: first, rows: block.rows.length });
  }
  const width = Math.max(...rows.map((r) => r.length));
  const values = rows.map((r) =>
    pad(
      r.map((c) => c[0]),
      width,
      null,
    ),
  );
  const numberFormats = rows.map((r) =>
    pad(
      r.map((c) => c[1]),
      width,
      null,
    ),
  );
  const print: PrintSetup = {
    orientation: "portrait",
    paperSize: input.paperSize ?? "A4",
    fitToWidth: true,
    printTitleRows: { first: 0, last: 1 },
    rowBreaks: blocks.slice(1).map((b) => b.row),
    footer: { left: run.scenario, center: vehicleList(vehicles), pageNumbers: true },
  };
  return {
    name,
    grid: {
      values,
      numberFormats,
      columnWidths: columnWidths(withoutSpill(values, spill), numberFormats, longRows),
      freezeRows: 2,
      boldRows: bold,
      print,
    },
    blocks,
  };
}

/** One vehicle's block: header rows, stop and break rows, the return, totals and the caution line. */
function blockRows(
  route: Route,
  input: LayoutRouteSheetsInput,
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

/** The footer's middle: the vehicle, or the vehicles of a combined sheet (at most three named). */
function vehicleList(vehicles: readonly string[]): string {
  if (vehicles.length <= 3) return vehicles.join(", ");
  return `${vehicles.slice(0, 3).join(", ")} + ${vehicles.length - 3} more`;
}

/** Names in the block headers spill over empty neighbours: they must not widen their column. */
function withoutSpill(values: readonly (readonly CellValue[])[], spill: readonly [number, number][]): CellValue[][] {
  const out = values.map((r) => [...r]);
  for (const [r, c] of spill) if (out[r] && c < out[r].length) out[r][c] = null;
  return out;
}

function dateOnly(serial: number): number {
  return Math.floor(serial);
}

function pad<T>(row: readonly T[], width: number, fill: T): T[] {
  return [...row, ...new Array<T>(Math.max(0, width - row.length)).fill(fill)];
}

function vehicleOf(problem: Problem, route: Route) {
  const v = problem.vehicles[route.vehicle];
  if (!v) throw new RangeError(`layoutRouteSheets: plan uses vehicle ${route.vehicle}, problem has ${problem.vehicles.length}`);
  return v;
}

function locationOf(problem: Problem, index: number) {
  const loc = problem.locations[index];
  if (!loc) throw new RangeError(`layoutRouteSheets: location ${index} is outside 0..${problem.locations.length - 1}`);
  return loc;
}
