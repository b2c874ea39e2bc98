import { access, readFile, realpath, writeFile } from "node:fs/promises";
import { basename, dirname, extname, join, resolve } from "node:path";
import type { Issue } from "../core/model.js";
import type { CoolingSpec, SolveOptions } from "../core/options.js";
import { solve } from "../core/solve.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { formatCooling } from "../sheets/formatCooling.js";
import { GEOMETRIC_DEFAULTS, LINEAR_DEFAULT_STEPS } from "../sheets/parseSettingsSheet.js";
import type { PlanSettings } from "../sheets/PlanSettings.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { ExcelJsWorkbook } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { partsNotKept } from "../workbook/exceljs/zipEntryNames.js";
import { findInputSheets } from "../workbook/findInputSheets.js";
import { readScenarioInput, sourceOf, writeScenarioResult } from "../workbook/scenario.js";
import type { CliIO } from "./CliIO.js";
import { numberOption, parseArgs, type ParsedArgs } from "./parseArgs.js";
import { progressBar } from "./progressBar.js";

/** Options shared by `solve` and `profile` (names without dashes). */
export const RUN_VALUE_OPTIONS = [
  "stops",
  "fleet",
  "settings",
  "rule",
  "schedule",
  "alpha",
  "level",
  "steps",
  "beta",
  "t0",
  "tend",
  "seed",
  "seconds",
  "moves",
  "detour",
  "speed",
] as const;

/**
 * Defaults of schedule parameters the user leaves out: the same as for a Settings sheet that
 * names only the schedule (geometric factor 0.94 is common practice). Lundy-Mees has no
 * default beta: its scale depends on the cost units, so `--beta` is required.
 */
export const SCHEDULE_PARAMETER_DEFAULTS = {
  alpha: GEOMETRIC_DEFAULTS.alpha,
  steps: LINEAR_DEFAULT_STEPS,
} as const;

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
    `Feasible: ${plan.feasible ? "yes" : "no"}`,
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
  const overrides = settingOverrides(parsed);
  const scheduleFlags = scheduleFlagsOf(parsed);
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
    return { errors: [`${parsed.positional[0]}: not an .xlsx workbook; save it as "Excel Workbook (*.xlsx)" and try again`] };
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
  const cooling = applyScheduleFlags(read.settings.cooling, scheduleFlags);
  if ("error" in cooling) return { errors: [cooling.error] };
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

/** The schedule flags as given (undefined = not given). */
interface ScheduleFlags {
  kind?: CoolingSpec["kind"];
  alpha?: number;
  level?: number;
  steps?: number;
  beta?: number;
  t0?: number;
  tEnd?: number;
}

const SCHEDULE_KINDS: Record<string, CoolingSpec["kind"]> = {
  geometric: "geometric",
  linear: "linear",
  "lundy-mees": "lundyMees",
  time: "timeFraction",
};

function scheduleFlagsOf(parsed: ParsedArgs): ScheduleFlags {
  const flags: ScheduleFlags = {};
  const name = parsed.values.get("schedule");
  if (name !== undefined) {
    const kind = SCHEDULE_KINDS[name];
    if (kind) flags.kind = kind;
    else parsed.errors.push(`--schedule must be geometric, linear, lundy-mees or time, got "${name}"`);
  }
  const positive = (opt: string): number | undefined => {
    const v = numberOption(parsed, opt, { min: 0 });
    if (v === 0) parsed.errors.push(`--${opt} must be > 0, got 0`);
    return v === 0 ? undefined : v;
  };
  const alpha = positive("alpha");
  if (alpha !== undefined && !(alpha < 1)) parsed.errors.push(`--alpha must be between 0 and 1 (exclusive), got ${alpha}`);
  else if (alpha !== undefined) flags.alpha = alpha;
  const level = numberOption(parsed, "level", { min: 1, integer: true });
  if (level !== undefined) flags.level = level;
  const steps = numberOption(parsed, "steps", { min: 1, integer: true });
  if (steps !== undefined) flags.steps = steps;
  const beta = positive("beta");
  if (beta !== undefined) flags.beta = beta;
  const t0 = positive("t0");
  if (t0 !== undefined) flags.t0 = t0;
  const tEnd = positive("tend");
  if (tEnd !== undefined) flags.tEnd = tEnd;
  return flags;
}

/** Combine the flags with the schedule the settings chose (flags win; a flag must fit the kind). */
function applyScheduleFlags(base: CoolingSpec, f: ScheduleFlags): { spec: CoolingSpec } | { error: string } {
  const kind = f.kind ?? base.kind;
  const same = <K extends CoolingSpec["kind"]>(k: K): Extract<CoolingSpec, { kind: K }> | undefined =>
    base.kind === k ? (base as Extract<CoolingSpec, { kind: K }>) : undefined;
  const misfit = (flag: string, value: number | undefined, fits: boolean): string | undefined =>
    value !== undefined && !fits
      ? `--${flag} does not apply to the ${kindName(kind)} schedule; choose --schedule ${flagHome(flag)}`
      : undefined;
  const error =
    misfit("alpha", f.alpha, kind === "geometric") ??
    misfit("level", f.level, kind === "geometric") ??
    misfit("steps", f.steps, kind === "linear") ??
    misfit("beta", f.beta, kind === "lundyMees") ??
    misfit("tend", f.tEnd, kind === "linear" || kind === "timeFraction");
  if (error) return { error };
  const D = SCHEDULE_PARAMETER_DEFAULTS;
  const t0 = f.t0 ?? same(kind)?.t0;
  const withT0 = t0 !== undefined ? { t0 } : {};
  switch (kind) {
    case "geometric": {
      const b = same("geometric");
      const movesPerLevel = f.level ?? b?.movesPerLevel;
      return {
        spec: { kind, alpha: f.alpha ?? b?.alpha ?? D.alpha, ...(movesPerLevel !== undefined ? { movesPerLevel } : {}), ...withT0 },
      };
    }
    case "linear": {
      const b = same("linear");
      const tEnd = f.tEnd ?? b?.tEnd;
      return { spec: { kind, steps: f.steps ?? b?.steps ?? D.steps, ...withT0, ...(tEnd !== undefined ? { tEnd } : {}) } };
    }
    case "lundyMees": {
      const beta = f.beta ?? same("lundyMees")?.beta;
      if (beta === undefined) return { error: "--schedule lundy-mees needs --beta B (T <- T / (1 + B T) per move; e.g. 1e-4)" };
      return { spec: { kind, beta, ...withT0 } };
    }
    case "timeFraction": {
      const tEnd = f.tEnd ?? same("timeFraction")?.tEnd;
      return { spec: { kind, ...withT0, ...(tEnd !== undefined ? { tEnd } : {}) } };
    }
  }
}

function kindName(kind: CoolingSpec["kind"]): string {
  return Object.entries(SCHEDULE_KINDS).find(([, k]) => k === kind)?.[0] ?? kind;
}

function flagHome(flag: string): string {
  return flag === "alpha" || flag === "level"
    ? "geometric"
    : flag === "steps"
      ? "linear"
      : flag === "beta"
        ? "lundy-mees"
        : "linear or time";
}

/** Settings the flags override (the settings sheet and defaults fill the rest). */
function settingOverrides(parsed: ParsedArgs): Partial<PlanSettings> {
  const o: { -readonly [K in keyof PlanSettings]?: PlanSettings[K] } = {};
  const rule = parsed.values.get("rule");
  if (rule === "metropolis" || rule === "logistic") o.rule = rule;
  else if (rule !== undefined) parsed.errors.push(`--rule must be metropolis or logistic, got "${rule}"`);
  const seed = numberOption(parsed, "seed", { min: 0, integer: true });
  if (seed !== undefined) o.seed = seed;
  const seconds = numberOption(parsed, "seconds", { min: 0 });
  const moves = numberOption(parsed, "moves", { min: 1, integer: true });
  if (seconds !== undefined && moves !== undefined) parsed.errors.push("use --seconds or --moves, not both");
  else if (moves !== undefined) o.moves = moves;
  else if (seconds !== undefined) {
    if (seconds === 0) parsed.errors.push("--seconds must be > 0, got 0");
    o.seconds = seconds;
    o.moves = undefined; // a seconds flag beats a move budget from the Settings sheet
  }
  const detour = numberOption(parsed, "detour", { min: 1 });
  if (detour !== undefined) o.detourFactor = detour;
  const speed = numberOption(parsed, "speed", { min: 0 });
  if (speed === 0) parsed.errors.push("--speed must be > 0 km/h, got 0");
  else if (speed !== undefined) o.speedKmh = speed;
  if (parsed.flags.has("soft-windows")) o.hardWindows = false;
  return o;
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
