import type { Plan, Problem, Route } from "../core/index.js";
import { columnWidths } from "./columnWidths.js";
import type { CellValue, SheetGrid } from "./grid.js";
import { NUMBER_FORMATS as F } from "./numberFormats.js";
import type { RunRecord } from "./PlanSettings.js";
import type { PrintSetup } from "./printSetup.js";
import type { StopRow } from "./ReadResult.js";
import { blockRows, sheetColumns, vehicleOf, type Columns } from "./routeBlock.js";
import type { Cell } from "./routeTableRows.js";
import { uniqueSheetName } from "./uniqueSheetName.js";

export { RETURN_STOP, ROUTE_TOTALS_LABELS, SIGN_OFF_BOX, SIGN_OFF_HEADER } from "./routeBlock.js";

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

function pad<T>(row: readonly T[], width: number, fill: T): T[] {
  return [...row, ...new Array<T>(Math.max(0, width - row.length)).fill(fill)];
}
