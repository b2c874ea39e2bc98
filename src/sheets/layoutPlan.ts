import { formatColumnMap } from "./columnMap.js";
import type { Plan, Problem } from "../core/index.js";
import { CAUTION_TEXT } from "./caution.js";
import { columnWidths } from "./columnWidths.js";
import { formatCooling, formatRule } from "./formatCooling.js";
import { TERMS } from "./terms.js";
import type { CellBlock, CellValue, RouteChart, SheetGrid } from "./grid.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import { STABILITY_COST_DEFAULT, type RunRecord } from "./PlanSettings.js";
import type { StopRow } from "./ReadResult.js";
import { routeTableRows, type FormattedRow } from "./routeTableRows.js";

/** A scenario sheet as data: the grid, the route chart and where the route table sits. */
export interface PlanLayout {
  readonly grid: SheetGrid;
  readonly chart: RouteChart;
  /** The route table: header row plus one row per stop and depot. */
  readonly routeTable: CellBlock;
}

/** Input of `layoutPlan`. */
export interface LayoutPlanInput {
  readonly problem: Problem;
  readonly plan: Plan;
  readonly run: RunRecord;
  /** Where each stop came from, with its carried-through columns (e.g. Phone). */
  readonly stopRows?: readonly StopRow[];
  /** Headers of the carried-through columns, in sheet order. */
  readonly extraHeaders?: readonly string[];
}

/** Labels of the settings block (one label row, one value row). */
export const SETTINGS_LABELS = [
  "Scenario",
  "Created",
  "Seed",
  "Cooling schedule",
  "Acceptance rule",
  "Moves",
  "Run seconds",
  "Stops source",
  "Fleet source",
  "Detour factor",
  "Speed km/h",
  "Windows",
  "Distances",
  "Columns mapped",
  "Re-planned from",
  "Workers",
] as const;

/** Labels of the totals block. */
export const TOTALS_LABELS = [
  "Vehicles used",
  "Km",
  "Driving hours",
  "Duty hours",
  "Waiting hours",
  "Late min",
  "Cost",
  TERMS.unassigned,
  TERMS.mustServeLeftOut,
] as const;

/** Header of the unassigned table. */
export const UNASSIGNED_HEADER = ["Stop", "Name", "Reason"] as const;

/**
 * Lay out a scenario sheet (DESIGN.md §5), top to bottom: a title, the caution line, the
 * settings block, the totals block, the route table and the unassigned table.
 *
 * The two blocks are written across (a bold label row over a value row) rather than down,
 * so the route-table header lands on row 7 and `freezeRows = 7` keeps title, caution,
 * totals and column headers in view while the dispatcher scrolls the stops; Excel freezes
 * from the top of the sheet, so stacked blocks would freeze 20+ rows and leave little room.
 *
 * Times are Excel day fractions (`hh:mm`, past midnight > 1), durations `[h]:mm`, km rounded
 * to 0.1 (`0.0`), created as a date-time serial (`yyyy-mm-dd hh:mm`). Every user text goes
 * through `safeText` and gets the text format `@` (ids such as "3-4" would otherwise also
 * turn into dates). The chart has one XY series per used vehicle over its Longitude (x) and
 * Latitude (y) cells, depot rows included so the loop closes, anchored right of the table.
 *
 * @param input - problem, plan, run record, and optionally the stop rows and extra headers
 * @returns the grid, the chart spec and the route-table block
 * @throws TypeError when problem, plan or run is missing; RangeError when the plan refers
 *   to a vehicle, stop or location the problem lacks
 * @example layoutPlan({ problem, plan, run }).grid.values[6][0] // => "Vehicle"
 */
export function layoutPlan(input: LayoutPlanInput): PlanLayout {
  const { problem, plan, run } = input ?? ({} as LayoutPlanInput);
  if (!problem || !plan || !run) throw new TypeError("layoutPlan: input.problem, input.plan and input.run are required");
  const table = routeTableRows(problem, plan, input.stopRows ?? [], input.extraHeaders ?? []);
  const width = Math.max(table.header.length, SETTINGS_LABELS.length, TOTALS_LABELS.length);

  const rows: FormattedRow[] = [];
  const bold: number[] = [];
  const reasonRows: number[] = [];
  const add = (row: FormattedRow, isBold = false): number => {
    if (isBold) bold.push(rows.length);
    rows.push(row);
    return rows.length - 1;
  };
  const titleRow = add(textRow([planTitle(run.scenario, plan)]), true);
  const cautionRow = add(textRow([CAUTION_TEXT]));
  add(textRow(SETTINGS_LABELS), true);
  add(settingsValues(run));
  add(textRow(TOTALS_LABELS), true);
  add(totalsValues(plan));
  const headerRow = add(textRow(table.header), true);
  for (const r of table.rows) add(r);
  add(textRow([]));
  add(textRow(UNASSIGNED_HEADER), true);
  for (const u of plan.unassigned) {
    const stop = problem.stops[u.stop];
    if (!stop) throw new RangeError(`layoutPlan: unassigned stop ${u.stop} is outside the problem`);
    reasonRows.push(add(textRow([stop.id, stop.name, u.reason])));
  }

  const values = rows.map((r) => pad(r.values, width, null));
  const numberFormats = rows.map((r) => pad(r.formats, width, null));
  const first = headerRow + 1;
  const series = table.routes.map((r) => ({
    name: r.name,
    x: { row: first + r.first, col: table.longitudeCol, rows: r.count, cols: 1 },
    y: { row: first + r.first, col: table.latitudeCol, rows: r.count, cols: 1 },
  }));
  const routeTable: CellBlock = { row: headerRow, col: 0, rows: 1 + table.rows.length, cols: table.header.length };
  return {
    grid: {
      values,
      numberFormats,
      columnWidths: columnWidths(withoutReasons(values, reasonRows), numberFormats, [titleRow, cautionRow]),
      freezeRows: headerRow + 1,
      boldRows: bold,
    },
    chart: {
      title: `Routes: ${run.scenario} (longitude, latitude)`,
      series,
      anchor: { row: headerRow, col: routeTable.col + routeTable.cols + 1 },
    },
    routeTable,
  };
}

function settingsValues(run: RunRecord): FormattedRow {
  const s = run.settings;
  return cellRow([
    [run.scenario, F.text],
    [run.createdSerial, F.dateTime],
    [s.seed, null],
    [formatCooling(s.cooling, undefined, s), F.text],
    [formatRule(s.rule), F.text],
    [run.moves, F.integer],
    [roundTo(run.runSeconds, 1), F.minutes],
    [run.stopsSource, F.text],
    [run.fleetSource, F.text],
    [s.detourFactor, F.factor],
    [s.speedKmh, null],
    [s.hardWindows ? "hard" : `soft, ${s.lateCostPerMin} per min late`, F.text],
    [distancesText(run), F.text],
    [formatColumnMap(s.columnMap ?? []) || "none", F.text],
    [replanText(run), F.text],
    // Chains run at once; with several, Moves above is the kept chain's.
    [run.settings.workers ?? 1, F.integer],
  ]);
}

/** The plan sheet a re-plan started from, its stability cost and the locked routes; "none" for a plan from scratch. */
function replanText(run: RunRecord): string {
  if (run.fromPlan === undefined) return "none";
  const locked = run.locked ?? [];
  const cost = run.settings.stabilityCost ?? STABILITY_COST_DEFAULT;
  return `${run.fromPlan}, stability cost ${cost} per stop moved${locked.length > 0 ? `, locked: ${locked.join(", ")}` : ""}`;
}

/** Where the plan's kilometres come from: the road-distance matrix sheet, or great-circle times the detour factor. */
function distancesText(run: RunRecord): string {
  return run.matrixSource !== undefined
    ? `road-distance matrix ${run.matrixSource}`
    : `great-circle x ${run.settings.detourFactor} (estimate)`;
}

function totalsValues(plan: Plan): FormattedRow {
  const t = plan.totals;
  return cellRow([
    [t.vehiclesUsed, F.integer],
    [roundTo(t.distanceKm, 1), F.km],
    [dayFraction(t.drivingMin), F.duration],
    [dayFraction(t.dutyMin), F.duration],
    [dayFraction(t.waitMin), F.duration],
    [roundTo(t.lateMin, 1), F.minutes],
    [roundTo(t.cost, 2), F.money],
    [t.unassigned, F.integer],
    [t.mustServeUnassigned, F.integer],
  ]);
}

/**
 * The title says at a glance when stops that must be served are missing, so a plan that
 * leaves them out never looks complete (the count is also in the totals and on Compare).
 */
function planTitle(scenario: string, plan: Plan): string {
  const n = plan.totals.mustServeUnassigned;
  if (n === 0) return `Kiln plan: ${scenario}`;
  return `Kiln plan: ${scenario}. ${n} stop${n === 1 ? "" : "s"} that must be served ${n === 1 ? "is" : "are"} NOT served; see the unassigned table below`;
}

/** A row of text cells, all marked `@`; user text in it was made safe by the caller. */
function textRow(texts: readonly string[]): FormattedRow {
  return { values: [...texts], formats: texts.map(() => F.text) };
}

function cellRow(cells: readonly (readonly [CellValue, string | null])[]): FormattedRow {
  return { values: cells.map((c) => c[0]), formats: cells.map((c) => c[1]) };
}

function pad<T>(row: readonly T[], width: number, fill: T): T[] {
  return [...row, ...new Array<T>(Math.max(0, width - row.length)).fill(fill)];
}

/** Reasons are long sentences with empty cells to their right to spill into: they must not widen the Stop column. */
function withoutReasons(values: readonly (readonly CellValue[])[], reasonRows: readonly number[]): CellValue[][] {
  return values.map((row, r) => (reasonRows.includes(r) ? row.map((v, c) => (c === 2 ? null : v)) : [...row]));
}
