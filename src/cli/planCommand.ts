import { writeFile } from "node:fs/promises";
import { Option, type Command } from "commander";
import type { Plan, Problem } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { formatCooling } from "../sheets/formatCooling.js";
import { sourceOf, writeScenarioResult } from "../workbook/scenario.js";
import { type ChainOptions, MAX_WORKERS, parseWorkers, runChains } from "./chains.js";
import type { CliIO } from "./CliIO.js";
import { formatIssue } from "./formatIssue.js";
import { type NavigationFileOptions, checkNavigationTargets, writeNavigationFiles } from "./navigationFiles.js";
import { outputPath } from "./outputPath.js";
import { prepareRun } from "./prepareRun.js";
import { progressBar } from "./progressBar.js";
import { addRunOptions, givenSettings, type InputSheetOptions } from "./runOptions.js";
import { TERMS } from "../sheets/terms.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { rangeText } from "../sheets/settingFieldTypes.js";
import { addGeocodeOptions, geocoderSetup, type GeocodeOptionValues } from "./geocodeOptions.js";
import { reviewLines } from "./geocodeCommand.js";

/** The options of `kiln plan` besides the plan settings. */
export type PlanOptions = InputSheetOptions &
  NavigationFileOptions &
  GeocodeOptionValues & { scenario: string; out?: string; softWindows?: boolean; workers?: string; sheetPerVehicle?: boolean };

/** Declare `kiln plan` (alias `solve`, its name before 0.2) on the program. */
export function declarePlan(program: Command, io: CliIO, exit: (code: number) => void): Command {
  const cmd = program
    .command("plan")
    .alias("solve")
    .summary("plan routes from a workbook's Stops and Fleet into a new workbook")
    .description(
      "Plan routes and write a new workbook: every original sheet, a new plan sheet and the Compare sheet.\n" +
        "OUT defaults to WORKBOOK.plan.xlsx beside the input (then .plan-2, ...); the input is never overwritten.\n" +
        "--gpx, --geojson and --csv also write navigation files (none of them when the input has errors).\n" +
        "Exit 0 ok, 2 input errors, 1 anything else.",
    )
    .argument("<WORKBOOK.xlsx>", "the workbook with the Stops and Fleet sheets")
    .option("--scenario <NAME>", "name of the plan sheet to write", "Plan")
    .option("--out <OUT.xlsx>", "where to write the new workbook (never the input itself)")
    .option(
      `--${SETTING_FIELDS.workers.flag} <N>`,
      `${SETTING_FIELDS.workers.label}: ${SETTING_FIELDS.workers.help}; ${rangeText(SETTING_FIELDS.workers)} ` +
        `(default 1, or the Settings sheet's Workers row; up to ${MAX_WORKERS})`,
    )
    .option(
      "--gpx <FILE.gpx>",
      "also write the routes as GPX 1.1 for navigation devices and apps: one route per vehicle, depot first and last",
    )
    .option("--geojson <FILE.geojson>", "also write the routes and stops as GeoJSON (RFC 7946) for map tools")
    .option(
      "--csv <DIR>",
      "also write one CSV file (RFC 4180) per vehicle into DIR (created when missing), for a driver app or a mail merge",
    )
    .option("--sheet-per-vehicle", "write one route sheet per vehicle instead of one route sheet per scenario with a block per vehicle")
    .option(
      "--from-plan <SHEET>",
      "re-plan a published day: start from the routes of this plan sheet (written by Kiln); stops added to Stops since are inserted, " +
        "stops no longer in Stops are taken out, and the rest keep their vehicle and order unless moving one saves more than --stability-cost",
    )
    .addOption(
      new Option(
        "--lock <VEHICLE>",
        "with --from-plan: keep this vehicle's route exactly as in that plan sheet; repeatable, or ids separated by commas",
      ).argParser((value: string, previous: string[] | undefined) => [...(previous ?? []), value]),
    );
  addRunOptions(cmd);
  addGeocodeOptions(cmd);
  cmd.action(async (workbook: string, opts: PlanOptions) => {
    exit(await runPlan(workbook, opts, givenSettings(cmd), io));
  });
  return cmd;
}

/**
 * `kiln plan`: read the stops and fleet of a workbook (and a road-distance matrix when
 * `--matrix` names one), plan, and write the input sheets unchanged plus a plan sheet, the
 * driver route sheets (paper from the locale: LC_ALL, LC_PAPER, LANG) and the Compare row into
 * a new file.
 *
 * @param workbook - the WORKBOOK.xlsx argument
 * @param opts - sheet options, `--scenario`, `--out`, `--soft-windows`, `--workers`, `--sheet-per-vehicle`,
 *   `--gpx`, `--geojson`, `--csv` (written after the workbook; none of them on an input error)
 * @param settings - the setting options given, by flag
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one line each on stderr)
 * @example await runPlan("demo/kiln-demo.xlsx", { scenario: "Plan" }, { moves: "20000" }, io) // => 0
 */
export async function runPlan(workbook: string, opts: PlanOptions, settings: Readonly<Record<string, string>>, io: CliIO): Promise<number> {
  const workers = parseWorkers(opts.workers);
  const geo = geocoderSetup(opts, io);
  if (geo.errors.length > 0) return reportErrors(io, geo.errors);
  const prepared = await prepareRun(workbook, opts, settings, opts.softWindows, geo.setup);
  if ("errors" in prepared || "error" in workers) {
    return reportErrors(io, [...("error" in workers ? [workers.error] : []), ...("errors" in prepared ? prepared.errors : [])]);
  }
  const { book, inputPath } = prepared;
  // --workers wins over the Settings sheet's Workers row; the plan sheet records the number used.
  const chains = opts.workers !== undefined ? workers.workers : (prepared.read.settings.workers ?? 1);
  const read = { ...prepared.read, settings: { ...prepared.read.settings, workers: chains } };
  const out = await outputPath(inputPath, opts.out);
  if ("error" in out) return reportErrors(io, [out.error]);
  const targetErrors = await checkNavigationTargets(opts, inputPath, out.path);
  if (targetErrors.length > 0) return reportErrors(io, targetErrors);
  if (prepared.located) for (const line of reviewLines(prepared.located, false)) io.stderr(line + "\n");
  for (const w of read.warnings) io.stderr(`warning: ${formatIssue(w)}\n`);
  if (prepared.notKept.length > 0) {
    io.stderr(
      `warning: ${workbook} has ${prepared.notKept.join(", ")}; the new workbook keeps every sheet's cells but not these (the file library cannot write them). The input file itself is not changed.\n`,
    );
  }

  const s = read.settings;
  const bar = progressBar(io);
  const started = io.now();
  const options: ChainOptions = {
    seed: s.seed,
    budget: s.moves !== undefined ? { moves: s.moves } : { seconds: s.seconds },
    rule: s.rule,
    cooling: s.cooling,
    p0: s.p0,
    pEnd: s.pEnd,
  };
  // Ctrl-C stops every chain and the best plan found so far is written; a second Ctrl-C quits at once.
  const stop = new AbortController();
  const onInterrupt = (): void => {
    if (stop.signal.aborted) process.exit(130);
    stop.abort();
    bar.done();
    io.stderr("Stopping: the best plan found so far will be written (Ctrl-C again quits without writing).\n");
  };
  process.on("SIGINT", onInterrupt);
  let result: Awaited<ReturnType<typeof runChains>>;
  try {
    result = await runChains(read.problem, options, chains, {
      now: io.now,
      onProgress: (p) => bar.update(p),
      signal: stop.signal,
    });
  } finally {
    process.off("SIGINT", onInterrupt);
  }
  bar.done();
  const runSeconds = (io.now() - started) / 1000;

  const source = async (sheet: string): Promise<string> => sourceOf((await book.readSheet(sheet))!);
  const matrixSource = prepared.sheets.matrix !== undefined ? await source(prepared.sheets.matrix) : undefined;
  const locale = process.env["LC_ALL"] || process.env["LC_PAPER"] || process.env["LANG"] || undefined;
  const { sheetName, routeSheets } = await writeScenarioResult(book, {
    read,
    result,
    runSeconds,
    scenario: opts.scenario,
    createdAt: new Date(),
    stopsSource: await source(prepared.sheets.stops),
    fleetSource: await source(prepared.sheets.fleet),
    ...(opts.fromPlan !== undefined ? { fromPlan: opts.fromPlan } : {}),
    ...(matrixSource !== undefined ? { matrixSource } : {}),
    sheetPerVehicle: opts.sheetPerVehicle === true,
    ...(locale !== undefined ? { locale } : {}),
  });
  // An explicit --out may replace an existing file; the default path never does ("wx").
  await writeFile(out.path, await book.toBuffer(), { flag: out.explicit ? "w" : "wx" });

  const plan = result.plan;
  const files = await writeNavigationFiles(
    opts,
    { problem: read.problem, plan, stopRows: read.stopRows, extraHeaders: read.extraHeaders, scenario: sheetName },
    inputPath,
  );
  const t = plan.totals;
  const lines = [
    prepared.usedText,
    `Wrote sheet "${sheetName}" and a Compare row to ${out.path}`,
    ...files,
    ...(routeSheets.length > 0 ? [`Route sheets for drivers: ${routeSheets.map((n) => `"${n}"`).join(", ")}`] : []),
    `Vehicles used: ${t.vehiclesUsed} of ${read.problem.vehicles.length}`,
    `Distance: ${t.distanceKm.toFixed(1)} km${matrixSource !== undefined ? ` (road distances from ${matrixSource})` : ""}`,
    `Cost: ${t.cost.toFixed(2)}`,
    ...(t.vehicleChanges !== undefined ? [`Re-planned from "${opts.fromPlan}": ${t.vehicleChanges} stop(s) changed vehicle`] : []),
    `${TERMS.unassigned}: ${t.unassigned}${plan.unassigned.length ? ` (${listIds(plan.unassigned.map((u) => String(read.problem.stops[u.stop]?.id ?? u.stop)))})` : ""}`,
    ...mustServeLines(read.problem, plan),
    `Feasible: ${plan.feasible ? "yes" : plan.violations.length === 0 ? `no: ${t.mustServeUnassigned} must-serve stop(s) left out, every route keeps the rules` : "no"}`,
    ...plan.violations.map((v) => `  ${v}`),
    `Run: ${result.stats.moves} moves in ${runSeconds.toFixed(1)} s, seed ${s.seed}, ${formatCooling(s.cooling, s.rule)}${stop.signal.aborted ? ", stopped by Ctrl-C" : ""}`,
  ];
  if (chains > 1) {
    const total = result.chains.reduce((sum, c) => sum + c.stats.moves, 0);
    lines.push(
      `Chains: ${chains} on worker threads, ${total} moves in all, the best plan shared ${result.shares} times; the plan is chain ${result.chain + 1}'s`,
    );
  }
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

/** At most 20 ids, then how many more (the plan sheet lists every one). */
function listIds(ids: readonly string[]): string {
  const shown = ids.slice(0, 20).join(", ");
  return ids.length > 20 ? `${shown}, … and ${ids.length - 20} more: see the plan sheet` : shown;
}

/**
 * Print each user error on its own line of stderr.
 *
 * @param io - output streams
 * @param errors - the lines
 * @returns 2, the exit code of input errors
 * @example reportErrors(io, ["--seed: ..."]) // => 2
 */
export function reportErrors(io: CliIO, errors: readonly string[]): number {
  for (const e of errors) io.stderr(e + "\n");
  return 2;
}
