import type { Issue, SolveResult } from "../core/index.js";
import { cellAddress, sheetRef } from "../sheets/cellAddress.js";
import { excelSerialFromDate } from "../sheets/excelSerial.js";
import { COMPARE_SHEET, layoutCompareHeader, layoutCompareRow } from "../sheets/layoutCompare.js";
import { layoutPlan } from "../sheets/layoutPlan.js";
import { layoutRouteSheets } from "../sheets/layoutRouteSheets.js";
import { STABILITY_COST_DEFAULT, type PlanSettings, type RunRecord } from "../sheets/PlanSettings.js";
import { buildEarlierPlan } from "../sheets/buildEarlierPlan.js";
import { readPlanRoutes } from "../sheets/readPlanRoutes.js";
import { readProblem } from "../sheets/readProblem.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { paperSizeForLocale } from "../sheets/printSetup.js";
import { scenarioSettingsKey } from "../sheets/scenarioSettingsKey.js";
import { uniqueSheetName } from "../sheets/uniqueSheetName.js";
import type { SheetRead, WorkbookPort } from "./WorkbookPort.js";

/** Which sheets hold the input of a run. */
export interface ScenarioRequest {
  readonly stopsSheet: string;
  readonly fleetSheet: string;
  readonly settingsSheet?: string;
  /** Optional sheet with a user distance/time matrix (an optional addition to the shared API). */
  readonly matrixSheet?: string;
  readonly overrides?: Partial<PlanSettings>;
  /**
   * Re-plan a published day: the plan sheet to start from, and the vehicles whose routes are
   * kept exactly (`lockSource` names where the list came from, for messages).
   */
  readonly fromPlan?: { readonly sheet: string; readonly lock: readonly string[]; readonly lockSource: string };
  /**
   * The stops and fleet tables with geocoded coordinates filled in (in memory, see
   * `locateWorkbook`), read instead of the sheets, and the stops whose address was not found.
   */
  readonly located?: {
    readonly stops: SheetRead;
    readonly fleet?: SheetRead;
    readonly unlocated: ReadonlyMap<number, string>;
  };
}

/** What `writeScenarioResult` needs besides the port. */
export interface ScenarioOutput {
  readonly read: ReadResult & { readonly ok: true };
  readonly result: SolveResult;
  /** The name the user gave the scenario (the sheet name is made unique from it). */
  readonly scenario: string;
  readonly createdAt: Date;
  readonly runSeconds: number;
  /** Where the input came from, e.g. "Stops!A1:N85". */
  readonly stopsSource: string;
  readonly fleetSource: string;
  /** Where the road-distance matrix came from ("Km!A1:J11"), when one replaced great-circle distances. */
  readonly matrixSource?: string;
  /** Write one route sheet per vehicle instead of one per scenario (CLI `--sheet-per-vehicle`, the pane's checkbox). */
  readonly sheetPerVehicle?: boolean;
  /** Locale whose paper the route sheets print on (BCP 47, "en-US"); the runtime's locale when absent. */
  readonly locale?: string;
  /** The plan sheet a re-plan started from (the problem then carries `earlier`). */
  readonly fromPlan?: string;
}

/**
 * First half of a scenario run, shared by the CLI and the pane: read the input sheets through
 * any `WorkbookPort` and turn them into a problem (or a list of issues). A missing sheet is a
 * user issue, not an exception; nothing in the workbook is changed.
 *
 * @param port - the workbook
 * @param request - sheet names and setting overrides (CLI flags or pane fields)
 * @returns the reader's result: `ok: true` with the problem, or every issue at once
 * @example const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet" });
 */
export async function readScenarioInput(port: WorkbookPort, request: ScenarioRequest): Promise<ReadResult> {
  if (!port || !request) throw new TypeError("readScenarioInput: port and request are required");
  const names = await port.listSheets();
  const issues: Issue[] = [];
  const need = async (name: string | undefined, what: string): Promise<SheetRead | undefined> => {
    if (name === undefined) return undefined;
    const read = await port.readSheet(name);
    if (!read) {
      issues.push({
        sheet: name,
        cell: "",
        message: `${name}: no sheet of that name holds the ${what}; sheets in this workbook: ${names.join(", ") || "(none)"}; choose the ${what} sheet by name`,
      });
    }
    return read;
  };
  const stops = request.located?.stops ?? (await need(request.stopsSheet, "stops"));
  const fleet = request.located?.fleet ?? (await need(request.fleetSheet, "fleet"));
  const settings = await need(request.settingsSheet, "settings");
  const matrix = await need(request.matrixSheet, "distance matrix");
  const earlierSheet = request.fromPlan ? await need(request.fromPlan.sheet, "earlier plan") : undefined;
  if (!stops || !fleet || issues.length > 0) return { ok: false, issues, stopColumns: [], fleetColumns: [] };
  const unlocated = request.located?.unlocated;
  const read = readProblem(
    { stops, fleet, ...(settings ? { settings } : {}), ...(matrix ? { matrix } : {}), ...(unlocated ? { unlocated } : {}) },
    request.overrides,
  );
  if (!read.ok) return read;
  return withEarlierPlan(read, request.fromPlan && earlierSheet ? { ...request.fromPlan, read: earlierSheet } : undefined);
}

/** Where the pane's ticked routes come from, in messages about them. */
export const LOCKED_ROUTES_SOURCE = "Locked routes";

/**
 * A read problem with the earlier plan of a plan sheet to start from (re-planning a published
 * day), shared by the CLI and the pane: the sheet's route table (`readPlanRoutes`) becomes the
 * problem's `earlier`, with the routes of the Fleet's Lock column and of `from.lock` kept exactly.
 * A sheet that is not a Kiln plan, or names a vehicle the Fleet no longer has, comes back as
 * issues at its cell. Without a plan sheet the problem is unchanged, and each ticked Lock cell is
 * a warning there (nothing to lock), never an error.
 *
 * @param read - the tables as read (`readProblem`)
 * @param from - the plan sheet as read, the extra vehicles to lock and where they were named
 *   (`--lock`, `LOCKED_ROUTES_SOURCE`); undefined for a plan from scratch
 * @returns the read result with `problem.earlier` set, or the issues
 * @example withEarlierPlan(read, { read: planSheet, lock: ["Van 2"], lockSource: "--lock" }).problem.earlier.locked
 */
export function withEarlierPlan(
  read: ReadResult & { ok: true },
  from: { readonly read: SheetRead; readonly lock: readonly string[]; readonly lockSource: string } | undefined,
): ReadResult {
  if (!from) return read.lockedVehicles.length === 0 ? read : { ...read, warnings: [...read.warnings, ...nothingToLock(read)] };
  const fail = (issues: Issue[]): ReadResult => ({ ok: false, issues, stopColumns: read.stopColumns, fleetColumns: read.fleetColumns });
  const table = readPlanRoutes(from.read);
  if ("issues" in table) return fail(table.issues);
  const stabilityCost = read.settings.stabilityCost ?? STABILITY_COST_DEFAULT;
  const lock = [...new Set([...read.lockedVehicles.map((l) => l.vehicle), ...from.lock])];
  const built = buildEarlierPlan(read.problem, from.read.sheet, table.routes, { stabilityCost, lock, lockSource: from.lockSource });
  if (!built.earlier) return fail(built.issues);
  return { ...read, problem: { ...read.problem, earlier: built.earlier }, warnings: [...read.warnings, ...built.warnings] };
}

/** One warning per ticked Lock cell (a Count row locks all its vehicles) when no plan sheet is chosen. */
function nothingToLock(read: ReadResult & { ok: true }): Issue[] {
  const byCell = new Map<string, { sheet: string; cell: string; vehicles: string[] }>();
  for (const l of read.lockedVehicles) {
    const key = `${l.sheet}!${l.cell}`;
    const entry = byCell.get(key) ?? { sheet: l.sheet, cell: l.cell, vehicles: [] };
    entry.vehicles.push(l.vehicle);
    byCell.set(key, entry);
  }
  return [...byCell.values()].map(({ sheet, cell, vehicles }) => ({
    sheet,
    cell,
    message: `${sheet}!${cell}: Lock says yes for ${vehicles.map((v) => `"${v}"`).join(", ")}, but there is nothing to lock: no earlier plan chosen. Choose the plan sheet to start from (Start from plan sheet in the pane, --from-plan SHEET on the command line), or clear the Lock cell.`,
  }));
}

/**
 * Second half of a scenario run: write the plan to a new, uniquely named scenario sheet (with
 * its route chart where the adapter can draw one) and the driver route sheets
 * (`layoutRouteSheets`: one per scenario, or one per vehicle; ready to print on the locale's
 * paper), store the run record as JSON under `scenarioSettingsKey(sheetName)` with the plan
 * sheet's rename-proof id, and append a row to the Compare sheet, all in one
 * `WorkbookPort.writeRun`. Input sheets are not touched.
 *
 * @param port - the workbook
 * @param input - the read result, the solver's result and the run's bookkeeping
 * @returns the names of the plan sheet and of the route sheets written
 * @throws TypeError when an argument is missing (a programming mistake)
 * @example const { sheetName, routeSheets } = await writeScenarioResult(book, { read, result, scenario: "Monday", ... });
 * // sheetName "Monday", routeSheets ["Monday routes"]
 */
export async function writeScenarioResult(
  port: WorkbookPort,
  input: ScenarioOutput,
): Promise<{ sheetName: string; routeSheets: string[] }> {
  if (!port || !input?.read?.ok || !input.result)
    throw new TypeError("writeScenarioResult: port, input.read (ok) and input.result are required");
  const existing = await port.listSheets();
  const sheetName = uniqueSheetName(input.scenario, existing);
  const run: RunRecord = {
    scenario: sheetName,
    createdSerial: excelSerialFromDate(input.createdAt),
    settings: input.read.settings,
    moves: input.result.stats.moves,
    runSeconds: input.runSeconds,
    stopsSource: input.stopsSource,
    fleetSource: input.fleetSource,
    ...(input.matrixSource !== undefined ? { matrixSource: input.matrixSource } : {}),
    ...replanRecord(input),
  };
  const { problem, stopRows, extraHeaders } = input.read;
  const layout = layoutPlan({ problem, plan: input.result.plan, run, stopRows, extraHeaders });
  const routeSheets = layoutRouteSheets({
    problem,
    plan: input.result.plan,
    run,
    stopRows,
    extraHeaders,
    sheetPerVehicle: input.sheetPerVehicle === true,
    paperSize: paperSizeForLocale(input.locale ?? Intl.DateTimeFormat().resolvedOptions().locale),
    existingSheets: [...existing, sheetName],
  });
  await keepRecordOfRenamedSheet(port, sheetName);
  await port.writeRun({
    sheets: [
      { name: sheetName, grid: layout.grid, ...(layout.chart ? { chart: layout.chart } : {}) },
      ...routeSheets.map((r) => ({ name: r.name, grid: r.grid })),
    ],
    record: (sheetId) => ({
      key: scenarioSettingsKey(sheetName),
      value: JSON.stringify(sheetId !== undefined ? { ...run, sheetId } : run),
    }),
    append: { name: COMPARE_SHEET, header: layoutCompareHeader(), rows: layoutCompareRow(run, input.result.plan) },
  });
  return { sheetName, routeSheets: routeSheets.map((r) => r.name) };
}

/** The re-plan fields of the run record: the sheet started from and the locked vehicles' ids. */
function replanRecord(input: ScenarioOutput): Pick<RunRecord, "fromPlan" | "locked"> {
  const earlier = input.read.problem.earlier;
  if (input.fromPlan === undefined || !earlier) return {};
  return { fromPlan: input.fromPlan, locked: earlier.locked.map((v) => input.read.problem.vehicles[v]!.id) };
}

/**
 * A record already stored under the new sheet's name belongs to a plan sheet that was renamed or
 * deleted since; move it to a key of its own so the renamed sheet keeps its Rerun settings
 * (records are found by sheet id first, whatever their key).
 */
async function keepRecordOfRenamedSheet(port: WorkbookPort, sheetName: string): Promise<void> {
  const key = scenarioSettingsKey(sheetName);
  const settings = await port.readSettings();
  const old = settings[key];
  if (old === undefined) return;
  let n = 2;
  while (settings[`${key} (${n})`] !== undefined) n++;
  await port.writeSetting(`${key} (${n})`, old);
}

/**
 * The A1-style range a sheet read covers, for the run record ("Stops!A1:N85").
 *
 * @param read - a sheet read
 * @returns sheet and range; just the sheet name when the read is empty
 * @example sourceOf({ sheet: "Stops", row: 0, col: 0, values: [["a", "b"]] }) // => "Stops!A1:B1"
 */
export function sourceOf(read: SheetRead): string {
  const rows = read.values.length;
  const cols = Math.max(0, ...read.values.map((r) => r.length));
  const sheet = sheetRef(read.sheet);
  if (rows === 0 || cols === 0) return sheet;
  return `${sheet}!${cellAddress(read.row, read.col)}:${cellAddress(read.row + rows - 1, read.col + cols - 1)}`;
}
