import { readFile } from "node:fs/promises";
import { resolve } from "node:path";
import type { ReadResult } from "../sheets/ReadResult.js";
import { ExcelJsWorkbook } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { describeUnreadableWorkbook } from "../workbook/exceljs/unreadableWorkbook.js";
import { partsNotKept } from "../workbook/exceljs/zipEntryNames.js";
import { describeMissingTable, findInputSheets } from "../workbook/findInputSheets.js";
import { readScenarioInput, sourceOf } from "../workbook/scenario.js";
import { findHeaderRow } from "../sheets/findHeaderRow.js";
import { COLUMN_MAP_KEY, mergeColumnMaps, parseColumnMap, storedColumnMap, type ColumnMapEntry } from "../sheets/columnMap.js";
import { parseSettingsSheet } from "../sheets/parseSettingsSheet.js";
import { locateWorkbook, saveGeocodeCache, type GeocoderSetup, type WorkbookLocation } from "../workbook/geocodeWorkbook.js";
import { formatIssue } from "./formatIssue.js";
import type { InputSheetOptions } from "./runOptions.js";
import { applySchedule, settingFlags } from "./settingFlags.js";

/** A workbook opened and read, ready to plan or profile. */
export interface PreparedRun {
  readonly book: ExcelJsWorkbook;
  readonly inputPath: string;
  readonly sheets: { readonly stops: string; readonly fleet: string; readonly settings?: string; readonly matrix?: string };
  readonly read: ReadResult & { readonly ok: true };
  /** Which sheets and ranges were read, one line: "Read stops from Stops!A1:H21 (header on row 3), fleet from ...". */
  readonly usedText: string;
  /** What the input holds that a copy saved through exceljs loses ("charts", ...). */
  readonly notKept: readonly string[];
  /** What geocoding did, when a geocoder was given (its cache is already in `book`). */
  readonly located?: WorkbookLocation;
}

/**
 * Shared first steps of `plan` and `profile`: check the setting options with the settings schema,
 * open the workbook, find the input sheets (and the matrix sheet, when named), read the problem
 * and apply the schedule options. Never throws on user mistakes.
 *
 * @param workbook - the WORKBOOK.xlsx argument as typed
 * @param sheets - the sheet options given
 * @param settings - the setting options given, by flag (`givenSettings`)
 * @param softWindows - `--soft-windows` was given
 * @param geocoder - the geocoding service (`--geocoder`): addresses without coordinates are looked up first
 * @returns the prepared run, or every user error as one line each
 * @example await prepareRun("demo/kiln-demo.xlsx", {}, { seed: "3" }) // => { book, read, ... }
 */
export async function prepareRun(
  workbook: string,
  sheets: InputSheetOptions,
  settings: Readonly<Record<string, string>>,
  softWindows = false,
  geocoder?: GeocoderSetup,
): Promise<PreparedRun | { errors: string[] }> {
  const flags = settingFlags(settings, softWindows);
  if (flags.errors.length > 0) return { errors: flags.errors };
  const inputPath = resolve(workbook);
  let bytes: Uint8Array;
  try {
    bytes = await readFile(inputPath);
  } catch {
    return { errors: [`${workbook}: cannot read the file; check the path`] };
  }
  let book: ExcelJsWorkbook;
  try {
    book = await ExcelJsWorkbook.fromBuffer(bytes);
  } catch {
    return { errors: [describeUnreadableWorkbook(bytes, workbook)] };
  }
  const errors: string[] = [];
  const typedMap: ColumnMapEntry[] = [];
  for (const text of sheets.map ?? []) {
    const parsed = parseColumnMap(text, `--map "${text}"`);
    if ("entry" in parsed) typedMap.push(parsed.entry);
    else errors.push(parsed.message);
  }
  const lock = (sheets.lock ?? [])
    .flatMap((text) => text.split(","))
    .map((id) => id.trim())
    .filter((id) => id !== "");
  if (lock.length > 0 && sheets.fromPlan === undefined)
    errors.push("--lock: keeps a route of an earlier plan; give that plan sheet with --from-plan SHEET");
  if (errors.length > 0) return { errors };
  // The pane's remembered mapping applies here too, so the file plans the same in both; --map wins.
  const columnMap = mergeColumnMaps(storedColumnMap((await book.readSettings())[COLUMN_MAP_KEY]), typedMap);
  const found = await findInputSheets(book);
  const stops = sheets.stops ?? found.stops;
  const fleet = sheets.fleet ?? found.fleet;
  const settingsSheet = sheets.settings ?? found.settings;
  const matrix = sheets.matrix;
  if (!stops) errors.push(`${workbook}: ${describeMissingTable(found, "stops", "name the stops sheet with --stops SHEET")}`);
  if (!fleet) errors.push(`${workbook}: ${describeMissingTable(found, "fleet", "name the fleet sheet with --fleet SHEET")}`);
  if (!stops || !fleet) return { errors };
  let located: WorkbookLocation | undefined;
  if (geocoder) {
    const settingsRead = settingsSheet ? await book.readSheet(settingsSheet) : undefined;
    const country = flags.overrides.country ?? (settingsRead ? parseSettingsSheet(settingsRead).settings.country : undefined);
    located = await locateWorkbook(book, { stops, fleet }, geocoder, country);
    if (located?.error !== undefined) return { errors: [`--geocoder: ${located.error} Nothing was written.`] };
    if (located && located.located.issues.length > 0) return { errors: located.located.issues.map(formatIssue) };
    // The answers travel in the output workbook, so planning it again asks nothing.
    if (located) await saveGeocodeCache(book, located.cache);
  }
  const read = await readScenarioInput(book, {
    ...(located ? { located: located.located } : {}),
    stopsSheet: stops,
    fleetSheet: fleet,
    ...(settingsSheet ? { settingsSheet } : {}),
    ...(matrix ? { matrixSheet: matrix } : {}),
    overrides: columnMap.length > 0 ? { ...flags.overrides, columnMap } : flags.overrides,
    ...(sheets.fromPlan !== undefined ? { fromPlan: { sheet: sheets.fromPlan, lock, lockSource: "--lock" } } : {}),
  });
  if (!read.ok) return { errors: read.issues.map(formatIssue) };
  const cooling = applySchedule(read.settings.cooling, flags.schedule);
  if ("errors" in cooling) return { errors: cooling.errors };
  return {
    book,
    inputPath,
    usedText: await usedText(book, { stops, fleet, settings: settingsSheet, matrix }),
    notKept: partsNotKept(bytes),
    sheets: { stops, fleet, ...(settingsSheet ? { settings: settingsSheet } : {}), ...(matrix ? { matrix } : {}) },
    read: { ...read, settings: { ...read.settings, cooling: cooling.spec } },
    ...(located ? { located } : {}),
  };
}

/** "Read stops from Stops!A1:H21 (header on row 3), fleet from Fleet!A1:F4, settings from Settings." */
async function usedText(
  book: ExcelJsWorkbook,
  sheets: { stops: string; fleet: string; settings: string | undefined; matrix: string | undefined },
): Promise<string> {
  const part = async (what: "stops" | "fleet" | "settings" | "distance matrix", name: string | undefined): Promise<string[]> => {
    const read = name === undefined ? undefined : await book.readSheet(name);
    if (!read) return [];
    let text = `${what} from ${sourceOf(read)}`;
    if (what === "stops" || what === "fleet") {
      const h = findHeaderRow(read.values, what, read);
      if (h !== undefined && h > 0) text += ` (header on row ${read.row + h + 1})`;
    }
    return [text];
  };
  const parts = [
    ...(await part("stops", sheets.stops)),
    ...(await part("fleet", sheets.fleet)),
    ...(await part("settings", sheets.settings)),
    ...(await part("distance matrix", sheets.matrix)),
  ];
  return `Read ${parts.join(", ")}.`;
}
