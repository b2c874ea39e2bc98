import type { Issue } from "../core/index.js";
import { cellAddress } from "./cellAddress.js";
import { isBlank, plainCell, readNumber } from "./cellValue.js";
import type { SheetRead } from "./grid.js";
import { BREAK_STOP, DEPOT_END_NAME, ROUTE_TABLE_HEADER } from "./routeTableRows.js";

/** Rows searched for the route table's header (the layout puts it on row 7). */
const HEADER_SEARCH_ROWS = 30;

/** One stop of a plan sheet's route table, with the cell it was read from. */
export interface PlanStopCell {
  readonly id: string;
  /** A1 address of its Stop cell, for messages. */
  readonly cell: string;
}

/** One vehicle's route as a plan sheet shows it. */
export interface PlanRouteCells {
  readonly vehicle: string;
  /** A1 address of the Vehicle cell of its first row. */
  readonly cell: string;
  readonly stops: readonly PlanStopCell[];
}

/**
 * Whether a sheet reads as a Kiln plan: its route table's header (`ROUTE_TABLE_HEADER`) is in its
 * first rows. The same test `readPlanRoutes` makes, so a sheet offered as a plan to start from is
 * one the CLI's `--from-plan` takes too.
 *
 * @param read - a sheet as read
 * @returns true when the sheet has a plan's route table
 * @example looksLikePlanSheet(stopsSheet) // => false
 */
export function looksLikePlanSheet(read: SheetRead): boolean {
  return routeTableHeaderRow(read) >= 0;
}

/**
 * Read the routes back from a plan sheet written by Kiln (`layoutPlan`): the route table is
 * found by its own header (`ROUTE_TABLE_HEADER`: Vehicle, Seq, Stop, ... in the layout's
 * order); depot rows (Seq 0 and the closing `Depot end` row) and break rows (`Break` in Stop,
 * no Seq) are skipped; the table ends at the first empty row. A sheet without that header is
 * not a Kiln plan and comes back as one issue naming the sheet and what to choose instead.
 *
 * @param read - the plan sheet as read
 * @returns the routes in the sheet's order, or the issues (each with its sheet and cell)
 * @example readPlanRoutes(planSheet) // => { routes: [{ vehicle: "Van 1", cell: "A8", stops: [{ id: "S3", cell: "C9" }, ...] }] }
 */
export function readPlanRoutes(read: SheetRead): { routes: PlanRouteCells[] } | { issues: Issue[] } {
  const at = (r: number, c: number): string => cellAddress(read.row + r, read.col + c);
  const text = (r: number, c: number): string => {
    const v = plainCell(read.values[r]?.[c]);
    return v === null ? "" : String(v).trim();
  };
  const width = ROUTE_TABLE_HEADER.indexOf("Name") + 1;
  const header = routeTableHeaderRow(read);
  if (header < 0) {
    return {
      issues: [
        {
          sheet: read.sheet,
          cell: "",
          message: `this sheet is not a Kiln plan sheet: no route table with the header ${ROUTE_TABLE_HEADER.slice(0, width).join(" | ")} in its first ${HEADER_SEARCH_ROWS} rows; choose a sheet that Kiln wrote (its title starts "Kiln plan:").`,
        },
      ],
    };
  }
  const [V, SEQ, STOP, NAME] = [0, 1, 2, 3];
  const issues: Issue[] = [];
  const routes: { vehicle: string; cell: string; stops: PlanStopCell[] }[] = [];
  const seen = new Map<string, string>();
  for (let r = header + 1; r < read.values.length; r++) {
    const row = read.values[r] ?? [];
    if (row.every((v) => isBlank(v))) break;
    const vehicle = text(r, V);
    const seqRaw = read.values[r]?.[SEQ];
    const seq = readNumber(seqRaw);
    const stop = text(r, STOP);
    if (stop === BREAK_STOP && isBlank(seqRaw)) continue;
    if (vehicle === "") {
      issues.push({
        sheet: read.sheet,
        cell: at(r, V),
        message: `the route table row has no vehicle; this is not how Kiln writes a plan, so choose an unedited plan sheet or fill the vehicle.`,
      });
      continue;
    }
    let route = routes[routes.length - 1];
    if (!route || route.vehicle !== vehicle) {
      route = { vehicle, cell: at(r, V), stops: [] };
      routes.push(route);
    }
    if (seq === 0) continue;
    const next = text(r + 1, V);
    if (text(r, NAME) === DEPOT_END_NAME && next !== vehicle) continue;
    if (stop === "") {
      issues.push({
        sheet: read.sheet,
        cell: at(r, STOP),
        message: `the route of ${vehicle} has a row without a stop id; fill the stop id or choose an unedited plan sheet.`,
      });
      continue;
    }
    const before = seen.get(stop);
    if (before !== undefined) {
      issues.push({
        sheet: read.sheet,
        cell: at(r, STOP),
        message: `stop "${stop}" is in the plan twice (also at ${before}); a plan serves each stop once, so choose an unedited plan sheet.`,
      });
      continue;
    }
    seen.set(stop, at(r, STOP));
    route.stops.push({ id: stop, cell: at(r, STOP) });
  }
  const twice = new Map<string, string>();
  for (const route of routes) {
    const other = twice.get(route.vehicle);
    if (other !== undefined)
      issues.push({
        sheet: read.sheet,
        cell: route.cell,
        message: `vehicle "${route.vehicle}" has two separate blocks of rows (also from ${other}); keep its rows together or choose an unedited plan sheet.`,
      });
    twice.set(route.vehicle, route.cell);
  }
  return issues.length > 0 ? { issues } : { routes };
}

/** Row (within `read.values`) of the route table's header, or -1. */
function routeTableHeaderRow(read: SheetRead): number {
  const width = ROUTE_TABLE_HEADER.indexOf("Name") + 1;
  const text = (r: number, c: number): string => {
    const v = plainCell(read.values[r]?.[c]);
    return v === null ? "" : String(v).trim();
  };
  for (let r = 0; r < Math.min(read.values.length, HEADER_SEARCH_ROWS); r++) {
    if (ROUTE_TABLE_HEADER.slice(0, width).every((h, c) => text(r, c) === h)) return r;
  }
  return -1;
}
