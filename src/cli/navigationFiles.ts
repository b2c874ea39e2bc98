import type { RouteFilesInput } from "../exports/RouteFilesInput.js";
import { mkdir, stat, writeFile } from "node:fs/promises";
import { dirname, join, resolve } from "node:path";
import { routeCsvFiles } from "../exports/routeCsvFiles.js";
import { writeGeoJson } from "../exports/writeGeoJson.js";
import { writeGpx } from "../exports/writeGpx.js";
import { canonical } from "./outputPath.js";

/** The navigation-file options of `kiln plan`, as given. */
export interface NavigationFileOptions {
  readonly gpx?: string;
  readonly geojson?: string;
  readonly csv?: string;
}

/**
 * Check the `--gpx`, `--geojson` and `--csv` targets before anything is planned or written: no
 * file may be the input workbook or the output workbook, the two files may not be one, a file's
 * folder must exist and not be a file, and the CSV folder must not be a file (it is created when
 * missing).
 *
 * @param opts - the options given
 * @param inputPath - absolute path of the input workbook
 * @param outPath - absolute path of the workbook to be written
 * @returns one line per problem (empty when all is well)
 * @example await checkNavigationTargets({ gpx: "week.xlsx" }, "/d/week.xlsx", "/d/week.plan.xlsx") // => ["--gpx week.xlsx: that is the input workbook; ..."]
 */
export async function checkNavigationTargets(opts: NavigationFileOptions, inputPath: string, outPath: string): Promise<string[]> {
  const errors: string[] = [];
  const input = await canonical(inputPath);
  const out = await canonical(outPath);
  const seen = new Map<string, string>();
  for (const [flag, value] of [
    ["--gpx", opts.gpx],
    ["--geojson", opts.geojson],
  ] as const) {
    if (value === undefined) continue;
    const path = await canonical(resolve(value));
    if (path === input) errors.push(`${flag} ${value}: that is the input workbook; kiln never writes over its input, choose another file`);
    else if (path === out) errors.push(`${flag} ${value}: that is the workbook this run writes; choose another file`);
    else if (seen.has(path)) errors.push(`${flag} ${value}: ${seen.get(path)} writes the same file; give each its own file name`);
    else if ((await kindOf(path)) === "folder")
      errors.push(`${flag} ${value}: that is a folder; give a file name such as routes${flag === "--gpx" ? ".gpx" : ".geojson"}`);
    else if ((await kindOf(dirname(path))) !== "folder")
      errors.push(`${flag} ${value}: the folder ${dirname(path)} does not exist; create it or choose another place`);
    seen.set(path, flag);
  }
  if (opts.csv !== undefined) {
    const dir = resolve(opts.csv);
    const kind = await kindOf(dir);
    if (kind === "file")
      errors.push(`--csv ${opts.csv}: that is a file; give a folder for the per-vehicle CSV files (it is created when missing)`);
  }
  return errors;
}

/**
 * Write the files the options ask for. Nothing here reads or writes the input workbook.
 *
 * @param opts - the options given (already checked by `checkNavigationTargets`)
 * @param input - problem, plan, stop rows, carried headers, scenario name
 * @param inputPath - absolute path of the input workbook (a CSV file of that name is never written)
 * @returns one line per file or folder written, for the run's report
 * @throws Error when the file system refuses a write (reported by the CLI as exit 1)
 * @example await writeNavigationFiles({ gpx: "day.gpx" }, input, "/d/week.xlsx") // => ["Wrote GPX routes for 3 vehicles to /d/day.gpx"]
 */
export async function writeNavigationFiles(opts: NavigationFileOptions, input: RouteFilesInput, inputPath: string): Promise<string[]> {
  const lines: string[] = [];
  const used = input.plan.routes.filter((r) => r.visits.length > 0).length;
  const vehicles = `${used} vehicle${used === 1 ? "" : "s"}`;
  if (opts.gpx !== undefined) {
    const path = resolve(opts.gpx);
    await writeFile(path, writeGpx(input), "utf8");
    lines.push(`Wrote GPX routes for ${vehicles} to ${path}`);
  }
  if (opts.geojson !== undefined) {
    const path = resolve(opts.geojson);
    await writeFile(path, JSON.stringify(writeGeoJson(input), null, 1) + "\n", "utf8");
    lines.push(`Wrote GeoJSON routes and stops for ${vehicles} to ${path}`);
  }
  if (opts.csv !== undefined) {
    const dir = resolve(opts.csv);
    await mkdir(dir, { recursive: true });
    const input0 = await canonical(inputPath);
    const files = routeCsvFiles(input);
    for (const f of files) {
      const path = join(dir, f.fileName);
      if ((await canonical(path)) === input0) throw new Error(`${path}: that is the input workbook; kiln never writes over its input`);
      await writeFile(path, f.text, "utf8");
    }
    lines.push(`Wrote ${files.length} CSV file${files.length === 1 ? "" : "s"} to ${dir}: ${files.map((f) => f.fileName).join(", ")}`);
  }
  return lines;
}

async function kindOf(path: string): Promise<"file" | "folder" | "none"> {
  try {
    return (await stat(path)).isDirectory() ? "folder" : "file";
  } catch {
    return "none";
  }
}
