import type { Plan } from "../core/index.js";
import { formatCooling } from "./formatCooling.js";
import type { SheetGrid } from "./grid.js";
import { NUMBER_FORMATS as F, dayFraction, roundTo } from "./numberFormats.js";
import type { RunRecord } from "./PlanSettings.js";
import { TERMS } from "./terms.js";

/** Name of the sheet that collects one row per scenario. */
export const COMPARE_SHEET = "Compare";

/** The Compare sheet's header row (DESIGN.md §5). */
export const COMPARE_HEADER = [
  "Scenario",
  "Vehicles",
  "Km",
  "Hours",
  "Cost",
  "Late min",
  TERMS.unassigned,
  TERMS.mustServeLeftOut,
  "Schedule",
  "Seed",
  "Created",
  "Changed vehicle",
] as const;

/** Width hints of the Compare columns, in characters. */
const COMPARE_WIDTHS = [24, 9, 9, 8, 11, 9, 11, 11, 40, 8, 17, 10];

/**
 * The header of the Compare sheet: written once when the sheet is created, frozen and bold.
 *
 * @returns a one-row grid with `COMPARE_HEADER`
 * @example layoutCompareHeader().values[0][0] // => "Scenario"
 */
export function layoutCompareHeader(): SheetGrid {
  return {
    values: [[...COMPARE_HEADER]],
    numberFormats: [COMPARE_HEADER.map(() => F.text)],
    columnWidths: COMPARE_WIDTHS,
    freezeRows: 1,
    boldRows: [0],
  };
}

/**
 * One Compare row for a finished scenario, to append below the existing ones (rows are
 * never rewritten, so earlier scenarios stay as they were). Hours are duty hours as a
 * duration (`[h]:mm`, a fleet can pass 24 h); km rounded to 0.1; Created is the run's
 * date-time serial; Changed vehicle, for a re-plan only, counts the stops of the earlier plan now
 * on another vehicle. Pass the final sheet name as `run.scenario` so the row names its sheet.
 *
 * @param run - the run record of the scenario
 * @param plan - its plan
 * @returns a one-row grid in the column order of `COMPARE_HEADER`
 * @throws TypeError when `run` or `plan` is missing
 * @example layoutCompareRow(run, plan).values[0][8] // => "geometric a=0.94 L=1000, Metropolis"
 */
export function layoutCompareRow(run: RunRecord, plan: Plan): SheetGrid {
  if (!run || !plan) throw new TypeError("layoutCompareRow: run and plan are required");
  const t = plan.totals;
  const cells: [string | number | null, string | null][] = [
    [run.scenario, F.text],
    [t.vehiclesUsed, F.integer],
    [roundTo(t.distanceKm, 1), F.km],
    [dayFraction(t.dutyMin), F.duration],
    [roundTo(t.cost, 2), F.money],
    [roundTo(t.lateMin, 1), F.minutes],
    [t.unassigned, F.integer],
    [t.mustServeUnassigned, F.integer],
    [formatCooling(run.settings.cooling, run.settings.rule, run.settings), F.text],
    [run.settings.seed, null],
    [run.createdSerial, F.dateTime],
    // Re-plans only: stops of the earlier plan now on another vehicle (blank for a plan from scratch).
    [t.vehicleChanges ?? null, t.vehicleChanges === undefined ? null : F.integer],
  ];
  return { values: [cells.map((c) => c[0])], numberFormats: [cells.map((c) => c[1])] };
}
