import { readFile, writeFile } from "node:fs/promises";
import { resolve } from "node:path";
import type { Command } from "commander";
import { REVIEW_ORDER, matchText } from "../geocode/index.js";
import { parseSettingsSheet } from "../sheets/parseSettingsSheet.js";
import { parseSettingValue } from "../sheets/settingsSchema.js";
import { ExcelJsWorkbook } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { describeUnreadableWorkbook } from "../workbook/exceljs/unreadableWorkbook.js";
import { findInputSheets } from "../workbook/findInputSheets.js";
import { addCoordinatesToSheets, locateWorkbook, saveGeocodeCache, type WorkbookLocation } from "../workbook/geocodeWorkbook.js";
import type { CliIO } from "./CliIO.js";
import { formatIssue } from "./formatIssue.js";
import { addGeocodeOptions, geocoderSetup, type GeocodeOptionValues } from "./geocodeOptions.js";
import { outputPath } from "./outputPath.js";
import { reportErrors } from "./planCommand.js";

/** The options of `kiln geocode`. */
type GeocodeCommandOptions = GeocodeOptionValues & { out?: string; stops?: string; fleet?: string; country?: string };

/** Declare `kiln geocode` on the program. */
export function declareGeocode(program: Command, io: CliIO, exit: (code: number) => void): Command {
  const cmd = program
    .command("geocode")
    .summary("add coordinates to a workbook's addresses through a geocoding service you choose")
    .description(
      "Look up the addresses of the stops (and of the fleet's depots) that have no coordinates, and write a copy of the\n" +
        "workbook with Latitude, Longitude and a Geocode match column added to the right of each table (only into\n" +
        "empty cells, never over a value), plus the answers kept for next time. The addresses are sent to the service\n" +
        "given with --geocoder and nowhere else. OUT defaults to WORKBOOK.geocoded.xlsx beside the input.\n" +
        "Exit 0 ok, 2 input errors or a service that fails (nothing written), 1 anything else.",
    )
    .argument("<WORKBOOK.xlsx>", "the workbook with the Stops (and Fleet) sheets")
    .option("--out <OUT.xlsx>", "where to write the copy (never the input itself)")
    .option("--stops <SHEET>", 'sheet with the stops (default: the sheet named "Stops")')
    .option("--fleet <SHEET>", 'sheet with the vehicles (default: the sheet named "Fleet")')
    .option("--country <NAME>", "country added to addresses whose row gives none (default: the Settings sheet's Default country)");
  addGeocodeOptions(cmd, true);
  cmd.action(async (workbook: string, opts: GeocodeCommandOptions) => {
    exit(await runGeocode(workbook, opts, io));
  });
  return cmd;
}

/**
 * `kiln geocode`: geocode the addresses without coordinates and write a copy with the
 * coordinates, match labels and the answers cache.
 *
 * @param workbook - the WORKBOOK.xlsx argument
 * @param opts - the options
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors or a failing service (nothing written)
 * @example await runGeocode("week.xlsx", { geocoder: "http://127.0.0.1:8080/search?q={address}" }, io) // => 0
 */
export async function runGeocode(workbook: string, opts: GeocodeCommandOptions, io: CliIO): Promise<number> {
  const geo = geocoderSetup(opts, io);
  const errors = [...geo.errors];
  let country: string | undefined;
  if (opts.country !== undefined) {
    const c = parseSettingValue("country", opts.country);
    if (c.ok) country = String(c.value);
    else errors.push(`--country: ${c.message}`);
  }
  if (errors.length > 0 || !geo.setup) return reportErrors(io, errors);
  const inputPath = resolve(workbook);
  let bytes: Uint8Array;
  try {
    bytes = await readFile(inputPath);
  } catch {
    return reportErrors(io, [`${workbook}: cannot read the file; check the path`]);
  }
  let book: ExcelJsWorkbook;
  try {
    book = await ExcelJsWorkbook.fromBuffer(bytes);
  } catch {
    return reportErrors(io, [describeUnreadableWorkbook(bytes, workbook)]);
  }
  const found = await findInputSheets(book);
  const stops = opts.stops ?? found.stops;
  const fleet = opts.fleet ?? found.fleet;
  if (!stops) return reportErrors(io, [`${workbook}: no sheet named "Stops"; name the stops sheet with --stops SHEET`]);
  if (country === undefined && found.settings) {
    const s = await book.readSheet(found.settings);
    country = s ? parseSettingsSheet(s).settings.country : undefined;
  }
  const out = await outputPath(inputPath, opts.out, "geocoded");
  if ("error" in out) return reportErrors(io, [out.error]);
  const where = await locateWorkbook(book, { stops, ...(fleet ? { fleet } : {}) }, geo.setup, country);
  if (!where) return reportErrors(io, [`${workbook}: no sheet named "${stops}"; name the stops sheet with --stops SHEET`]);
  if (where.error !== undefined) return reportErrors(io, [`--geocoder: ${where.error} Nothing was written.`]);
  const written = await addCoordinatesToSheets(book, where);
  await saveGeocodeCache(book, where.cache);
  await writeFile(out.path, await book.toBuffer(), { flag: out.explicit ? "w" : "wx" });
  for (const line of reviewLines(where, true)) io.stderr(line + "\n");
  const n = where.located.review.length;
  io.stdout(
    `Wrote ${out.path}: ${n} address${n === 1 ? "" : "es"} geocoded (${where.requests} request${where.requests === 1 ? "" : "s"} to the service, the rest from the answers kept in the workbook), ${written} cells added.\n`,
  );
  return 0;
}

/**
 * The geocoding review for the terminal: a count by quality, then one line per doubtful match
 * (not found, far away, ambiguous, approximate), most doubtful first, each naming its cell.
 *
 * @param where - from `locateWorkbook`
 * @param withNotFound - list not-found stops too (the plan lists them itself as warnings)
 * @returns the lines
 * @example reviewLines(where, true) // => ["Geocoded 12 addresses: 10 found, 1 approximate, 1 not found", "Stops!B5: not found: ..."]
 */
export function reviewLines(where: WorkbookLocation, withNotFound: boolean): string[] {
  const review = where.located.review;
  if (review.length === 0) return [];
  const counts = REVIEW_ORDER.map((q) => [q, review.filter((r) => r.quality === q).length] as const).filter(([, k]) => k > 0);
  const words = counts.map(([q, k]) => `${k} ${q === "not-found" ? "not found" : q === "far" ? "far away" : q}`);
  const lines = [
    `Geocoded ${review.length} address${review.length === 1 ? "" : "es"} (${where.requests} requests): ${words.reverse().join(", ")}`,
  ];
  for (const r of review) {
    if (r.quality === "found" || (r.quality === "not-found" && !withNotFound && r.table === "stops")) continue;
    const fix = r.quality === "not-found" ? "correct the address or type its coordinates" : "check it, or type the coordinates";
    lines.push(`${r.quality === "not-found" ? "warning" : "check"}: ${r.cell}: "${r.address}" ${matchText(r)}; ${fix}.`);
  }
  for (const i of where.located.issues) lines.push(`warning: ${formatIssue(i)}`);
  return lines;
}
