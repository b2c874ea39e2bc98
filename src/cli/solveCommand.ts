import { access, readFile, realpath, writeFile } from "node:fs/promises";
import { basename, dirname, extname, join, resolve } from "node:path";
import { type Issue, type Plan, type Problem, type SolveOptions, solve } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { formatCooling } from "../sheets/formatCooling.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { ExcelJsWorkbook } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { describeUnreadableWorkbook } from "../workbook/exceljs/unreadableWorkbook.js";
import { partsNotKept } from "../workbook/exceljs/zipEntryNames.js";
import { findInputSheets } from "../workbook/findInputSheets.js";
import { readScenarioInput, sourceOf, writeScenarioResult } from "../workbook/scenario.js";
import type { CliIO } from "./CliIO.js";
import { parseArgs, type ParsedArgs } from "./parseArgs.js";
import { RUN_SETTING_KEYS, applySchedule, settingFlags } from "./settingFlags.js";
import { progressBar } from "./progressBar.js";

/** Options shared by `solve` and `profile` (names without dashes). */
export const RUN_VALUE_OPTIONS = ["stops", "fleet", "settings", ...RUN_SETTING_KEYS.map((k) => SETTING_FIELDS[k].flag)] as const;

/** Usage text of `kiln solve`. */
export const SOLVE_USAGE = `kiln solve WORKBOOK.xlsx [--stops SHEET] [--fleet SHEET] [--settings SHEET] [--scenario NAME]
  [--rule metropolis|logistic] [--schedule geometric|linear|lundy-mees|time] [--alpha A] [--level L]
  [--steps N] [--beta B] [--t0 T] [--tend T] [--seed N] [--seconds S | --moves K] [--detour F]
  [--speed KMH] [--soft-windows] [--out OUT.xlsx]
  Plan routes and write a new workbook: every original sheet, a new scenario sheet and the
  Compare sheet. OUT defaults to WORKBOOK.plan.xlsx beside the input (then .plan-2, ...);
  the input is never overwritten. Exit 0 ok, 2 input errors, 1 anything else.`;

/**
 * `kiln solve`: read the stops and fleet of a workbook, plan, and write the input sheets
 * unchanged plus a scenario sheet and the Compare row into a new file.
 *
 * @param args - the arguments after `solve`
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one line each on stderr), 1 anything else
 * @example await runSolve(["demo/kiln-demo.xlsx", "--moves", "20000"], io) // => 0, writes demo/kiln-demo.plan.xlsx
 */
export async function runSolve(args: string[], io: CliIO): Promise<number> {
  const parsed = parseArgs(args, { values: [...RUN_VALUE_OPTIONS, "scenario", "out"], flags: ["soft-windows", "help"] });
  if (parsed.flags.has("help")) {
    io.stdout(SOLVE_USAGE + "\n");
    return 0;
  }
  const prepared = await prepareRun(parsed);
  if ("errors" in prepared) return reportErrors(io, prepared.errors);
  const { book, read, inputPath } = prepared;
  const out = await outputPath(inputPath, parsed.values.get("out"));
  if ("error" in out) return reportErrors(io, [out.error]);
  for (const w of read.warnings) io.stderr(`warning: ${formatIssue(w)}\n`);
  if (prepared.notKept.length > 0) {
    io.stderr(
      `warning: ${parsed.positional[0]} has ${prepared.notKept.join(", ")}; the new workbook keeps every sheet's cells but not these (the file library cannot write them). The input file itself is not changed.\n`,
    );
  }

  const s = read.settings;
  const bar = progressBar(io);
  const started = io.now();
  const options: Partial<SolveOptions> = {
    seed: s.seed,
    budget: s.moves !== undefined ? { moves: s.moves } : { seconds: s.seconds },
    rule: s.rule,
    cooling: s.cooling,
    p0: s.p0,
    pEnd: s.pEnd,
    now: io.now,
    onProgress: (p) => bar.update(p),
  };
  const result = solve(read.problem, options);
  bar.done();
  const runSeconds = (io.now() - started) / 1000;

  const stopsRead = (await book.readSheet(prepared.sheets.stops))!;
  const fleetRead = (await book.readSheet(prepared.sheets.fleet))!;
  const { sheetName } = await writeScenarioResult(book, {
    read,
    result,
    runSeconds,
    scenario: parsed.values.get("scenario") ?? "Plan",
    createdAt: new Date(),
    stopsSource: sourceOf(stopsRead),
    fleetSource: sourceOf(fleetRead),
  });
  // An explicit --out may replace an existing file; the default path never does ("wx").
  await writeFile(out.path, await book.toBuffer(), { flag: out.explicit ? "w" : "wx" });

  const plan = result.plan;
  const t = plan.totals;
  const lines = [
    `Wrote sheet "${sheetName}" and a Compare row to ${out.path}`,
    `Vehicles used: ${t.vehiclesUsed} of ${read.problem.vehicles.length}`,
    `Distance: ${t.distanceKm.toFixed(1)} km`,
    `Cost: ${t.cost.toFixed(2)}`,
    `Unassigned: ${t.unassigned}${plan.unassigned.length ? ` (${plan.unassigned.map((u) => read.problem.stops[u.stop]?.id ?? u.stop).join(", ")})` : ""}`,
    ...mustServeLines(read.problem, plan),
    `Feasible: ${plan.feasible ? "yes" : plan.violations.length === 0 ? `no: ${t.mustServeUnassigned} must-serve stop(s) left out, every route keeps the rules` : "no"}`,
    ...plan.violations.map((v) => `  ${v}`),
    `Run: ${result.stats.moves} moves in ${runSeconds.toFixed(1)} s, seed ${s.seed}, ${formatCooling(s.cooling, s.rule)}`,
  ];
  if (book.skippedCharts.length > 0) {
    lines.push("Route chart: not drawn in the file (exceljs cannot write charts); the Excel add-in draws it.");
  }
  lines.push(CAUTION_TEXT);
  io.stdout(lines.join("\n") + "\n");
  return 0;
}

/**
 * The lines that tell a dispatcher that stops which must be served were left out, with each
 * distinct reason once ("total demand 1 640 kg is more than the fleet's 900 kg; ...").
 */
function mustServeLines(problem: Problem, plan: Plan): string[] {
  const n = plan.totals.mustServeUnassigned;
  if (n === 0) return [];
  const left = plan.unassigned.filter((u) => problem.stops[u.stop]?.unservedCost === undefined);
  const reasons = new Map<string, string[]>();
  for (const u of left) reasons.set(u.reason, [...(reasons.get(u.reason) ?? []), problem.stops[u.stop]?.id ?? String(u.stop)]);
  return [
    `MUST-SERVE STOPS LEFT OUT: ${n} (they have no Priority, so every one of them should be served):`,
    ...[...reasons].map(([reason, ids]) => `  ${ids.join(", ")}: ${reason}`),
  ];
}

/** A workbook opened and read, ready to solve or profile. */
export interface PreparedRun {
  readonly book: ExcelJsWorkbook;
  readonly inputPath: string;
  readonly sheets: { readonly stops: string; readonly fleet: string; readonly settings?: string };
  readonly read: ReadResult & { readonly ok: true };
  /** What the input holds that a copy saved through exceljs loses ("charts", ...). */
  readonly notKept: readonly string[];
}

/**
 * Shared first steps of `solve` and `profile`: check the options, open the workbook, find the
 * input sheets, read the problem and apply the schedule flags. Never throws on user mistakes.
 *
 * @param parsed - parsed arguments (RUN_VALUE_OPTIONS and --soft-windows)
 * @returns the prepared run, or every user error as one line each
 * @example await prepareRun(parseArgs(["demo/kiln-demo.xlsx"], spec)) // => { book, read, ... }
 */
export async function prepareRun(parsed: ParsedArgs): Promise<PreparedRun | { errors: string[] }> {
  const flags = settingFlags(Object.fromEntries(parsed.values), parsed.flags.has("soft-windows"));
  parsed.errors.push(...flags.errors);
  const overrides = flags.overrides;
  const errors = [...parsed.errors];
  if (parsed.positional.length !== 1) {
    errors.push(
      parsed.positional.length === 0 ? "no WORKBOOK.xlsx given" : `one WORKBOOK.xlsx expected, got ${parsed.positional.length} files`,
    );
  }
  if (errors.length > 0) return { errors };
  const inputPath = resolve(parsed.positional[0]!);
  let bytes: Uint8Array;
  try {
    bytes = await readFile(inputPath);
  } catch {
    return { errors: [`${parsed.positional[0]}: cannot read the file; check the path`] };
  }
  let book: ExcelJsWorkbook;
  try {
    book = await ExcelJsWorkbook.fromBuffer(bytes);
  } catch {
    return { errors: [describeUnreadableWorkbook(bytes, parsed.positional[0]!)] };
  }
  const found = await findInputSheets(book);
  const stops = parsed.values.get("stops") ?? found.stops;
  const fleet = parsed.values.get("fleet") ?? found.fleet;
  const settings = parsed.values.get("settings") ?? found.settings;
  if (!stops)
    errors.push(`${parsed.positional[0]}: no sheet named "Stops" and none with Latitude and Longitude headers; name it with --stops SHEET`);
  if (!fleet)
    errors.push(`${parsed.positional[0]}: no sheet named "Fleet" and none with Vehicle or Capacity headers; name it with --fleet SHEET`);
  if (!stops || !fleet) return { errors };
  const read = await readScenarioInput(book, {
    stopsSheet: stops,
    fleetSheet: fleet,
    ...(settings ? { settingsSheet: settings } : {}),
    overrides,
  });
  if (!read.ok) return { errors: read.issues.map(formatIssue) };
  const cooling = applySchedule(read.settings.cooling, flags.schedule);
  if ("errors" in cooling) return { errors: cooling.errors };
  return {
    book,
    inputPath,
    notKept: partsNotKept(bytes),
    sheets: { stops, fleet, ...(settings ? { settings } : {}) },
    read: { ...read, settings: { ...read.settings, cooling: cooling.spec } },
  };
}

/**
 * One line for an issue: "Sheet!E7: message" (the message already names the fix). A message
 * that already starts with its sheet is printed as is.
 *
 * @param issue - a user-data issue
 * @returns the line, without a newline
 * @example formatIssue({ sheet: "Stops", cell: "E7", message: "latitude 123.4 is outside -90..90" }) // => "Stops!E7: latitude 123.4 is outside -90..90"
 */
export function formatIssue(issue: Issue): string {
  if (issue.message.startsWith(`${issue.sheet}!`) || issue.message.startsWith(`${issue.sheet}:`)) return issue.message;
  if (issue.cell === "") return `${issue.sheet}: ${issue.message}`;
  if (/^\$?[A-Z]{1,3}\$?\d+(:\$?[A-Z]{1,3}\$?\d+)?$/.test(issue.cell)) return `${issue.sheet}!${issue.cell}: ${issue.message}`;
  return `${issue.sheet} (${issue.cell}): ${issue.message}`;
}

/**
 * Where `solve` writes: `--out` as given (but never the input itself), or the first free
 * `NAME.plan.xlsx`, `NAME.plan-2.xlsx`, ... beside the input.
 *
 * @param inputPath - absolute path of the input workbook
 * @param out - the `--out` value, if any
 * @returns the path and whether the user chose it, or a user error
 * @example await outputPath("/data/week.xlsx") // => { path: "/data/week.plan.xlsx", explicit: false }
 */
export async function outputPath(inputPath: string, out?: string): Promise<{ path: string; explicit: boolean } | { error: string }> {
  if (out !== undefined) {
    const path = resolve(out);
    if ((await canonical(path)) === (await canonical(inputPath))) {
      return { error: `--out ${out}: that is the input workbook; kiln never writes over its input, choose another file` };
    }
    return { path, explicit: true };
  }
  const dir = dirname(inputPath);
  const ext = extname(inputPath);
  const stem = basename(inputPath, ext);
  for (let n = 1; n < 10_000; n++) {
    const path = join(dir, `${stem}.plan${n === 1 ? "" : `-${n}`}.xlsx`);
    if (!(await exists(path))) return { path, explicit: false };
  }
  return { error: `${inputPath}: no free NAME.plan-N.xlsx name beside it; name the output with --out` };
}

function reportErrors(io: CliIO, errors: readonly string[]): number {
  for (const e of errors) io.stderr(e + "\n");
  return 2;
}

async function exists(path: string): Promise<boolean> {
  try {
    await access(path);
    return true;
  } catch {
    return false;
  }
}

async function canonical(path: string): Promise<string> {
  try {
    return await realpath(path);
  } catch {
    return resolve(path);
  }
}
