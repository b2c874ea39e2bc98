import { Option, type Command } from "commander";
import { summariseRuns, type RunsSummary, type SeededRun } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { formatCooling } from "../sheets/formatCooling.js";
import type { PlanSettings } from "../sheets/PlanSettings.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { SCHEDULE_PARAMETERS } from "../sheets/scheduleNames.js";
import { type SettingKey } from "../sheets/settingFieldTypes.js";
import { parseTemperaturePlan, TEMPERATURE_PLAN_EXAMPLE, withTemperaturePlan, type TemperaturePlan } from "../sheets/temperaturePlan.js";
import { runChains, type ChainOptions } from "./chains.js";
import type { CliIO } from "./CliIO.js";
import { formatIssue } from "./formatIssue.js";
import { reportErrors } from "./planCommand.js";
import { prepareRun } from "./prepareRun.js";
import { progressLine } from "./progressBar.js";
import { addRunOptions, givenSettings, type InputSheetOptions } from "./runOptions.js";
import { RUN_SETTING_KEYS } from "./settingFlags.js";

/** The most seeds `--seeds` accepts. */
export const MAX_SEEDS = 1000;

/** The run settings `compare-schedules` takes as options: all but the schedule's own (those come with each --try). */
export const COMPARE_SETTING_KEYS: readonly SettingKey[] = RUN_SETTING_KEYS.filter(
  (k) => k !== "schedule" && !(SCHEDULE_PARAMETERS as readonly string[]).includes(k),
);

/** The options of `kiln compare-schedules` besides the plan settings. */
export type CompareOptions = InputSheetOptions & { try?: string[]; seeds?: string; json?: boolean; softWindows?: boolean };

/** One temperature plan's result, as `--json` prints it. */
export interface ScheduleComparison extends RunsSummary {
  /** The plan as given to --try. */
  readonly schedule: string;
  /** The plan in words ("geometric ×0.95 every 2000 moves, acceptance from 0.50, Metropolis"). */
  readonly description: string;
  /** Moves each run made, in seed order. */
  readonly moves: readonly number[];
}

/** Declare `kiln compare-schedules` on the program. */
export function declareCompareSchedules(program: Command, io: CliIO, exit: (code: number) => void): Command {
  const cmd = program
    .command("compare-schedules")
    .summary("run several temperature plans with several seeds each on one workbook and compare their costs")
    .description(
      "Run each temperature plan (--try, repeatable) with seeds S, S+1, ... (S = --seed, default 1; N = --seeds) on the\n" +
        "same workbook and budget, and print per plan the median, best and worst cost, the vehicles used and how many runs\n" +
        "were feasible. Each run is exactly the run `kiln plan` makes with that schedule, seed and budget: with --moves the\n" +
        "costs are the ones `kiln plan --moves K --seed S` prints. Nothing is written.\n" +
        "PLAN is a schedule name as --schedule takes it (geometric, linear, lundy-mees, time-based), alone for its defaults\n" +
        "or followed by a colon and NAME=VALUE settings separated by commas, named like the options of kiln plan:\n" +
        "alpha, level (moves per level), steps, beta, t0, tend, p0, pend, rule. Examples:\n" +
        `  --try time-based --try ${TEMPERATURE_PLAN_EXAMPLE} --try lundy-mees:beta=0.0002 --try linear:steps=50,p0=0.3\n` +
        "Runs are ranked as the solver ranks plans: a plan that keeps every rule and serves every must-serve stop ranks\n" +
        "before any that does not, then by cost; best, median and worst follow that order.\n" +
        "Exit 0 ok, 2 input errors (a bad PLAN among them), 1 anything else.",
    )
    .argument("<WORKBOOK.xlsx>", "the workbook with the Stops and Fleet sheets")
    .addOption(
      new Option("--try <PLAN>", `a temperature plan to run, e.g. ${TEMPERATURE_PLAN_EXAMPLE}; repeat for each plan`).argParser(
        (value: string, previous: string[] | undefined) => [...(previous ?? []), value],
      ),
    )
    .option("--seeds <N>", `how many seeds to run each plan with, 1 to ${MAX_SEEDS} (default 3)`)
    .option("--json", "print an array with one object per plan (schedule, seeds, costs, median, best, worst, vehicles, feasible, ...)");
  addRunOptions(cmd, COMPARE_SETTING_KEYS);
  cmd.action(async (workbook: string, opts: CompareOptions) => {
    exit(await runCompareSchedules(workbook, opts, givenSettings(cmd, COMPARE_SETTING_KEYS), io));
  });
  return cmd;
}

/**
 * `kiln compare-schedules`: read the workbook once, run every temperature plan with every seed
 * (one chain, the plan pipeline's `runChains`, so each run equals `kiln plan`'s), and print the
 * figures of each plan as a table or as JSON.
 *
 * @param workbook - the WORKBOOK.xlsx argument
 * @param opts - sheet options, `--try`, `--seeds`, `--json`, `--soft-windows`
 * @param settings - the setting options given, by flag
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one line each on stderr)
 * @example await runCompareSchedules("demo/kiln-demo.xlsx", { try: ["geometric", "lundy-mees"], seeds: "3" }, { moves: "20000" }, io) // => 0
 */
export async function runCompareSchedules(
  workbook: string,
  opts: CompareOptions,
  settings: Readonly<Record<string, string>>,
  io: CliIO,
): Promise<number> {
  const errors: string[] = [];
  const plans: TemperaturePlan[] = [];
  for (const text of opts.try ?? []) {
    const parsed = parseTemperaturePlan(text);
    if ("plan" in parsed) plans.push(parsed.plan);
    else errors.push(`--try "${text}": ${parsed.error}`);
  }
  if ((opts.try ?? []).length === 0) {
    errors.push(
      `--try: no temperature plan given; give one --try PLAN for each plan to compare, e.g. --try time-based --try ${TEMPERATURE_PLAN_EXAMPLE}`,
    );
  }
  const seeds = parseSeeds(opts.seeds);
  if ("error" in seeds) errors.push(seeds.error);
  if (settings["moves"] === undefined && settings["seconds"] === undefined) {
    errors.push("give the budget of each run: --moves K (reproducible: the same costs every time) or --seconds S");
  }
  if (errors.length > 0) return reportErrors(io, errors);
  const prepared = await prepareRun(workbook, opts, settings, opts.softWindows);
  if ("errors" in prepared) return reportErrors(io, prepared.errors);
  const { read } = prepared;
  const s = read.settings;
  const n = (seeds as { seeds: number }).seeds;
  const seedMax = (SETTING_FIELDS.seed as { max: number }).max;
  if (s.seed + n - 1 > seedMax) {
    return reportErrors(io, [
      `--seeds: seeds ${s.seed} to ${s.seed + n - 1} go past the largest seed ${seedMax}; give a smaller --seed or --seeds`,
    ]);
  }
  const runSettings: PlanSettings[] = [];
  for (const plan of plans) {
    const applied = withTemperaturePlan(s, plan);
    if ("error" in applied) errors.push(`--try "${plan.text}": ${applied.error}`);
    else runSettings.push(applied.settings);
  }
  if (errors.length > 0) return reportErrors(io, errors);
  for (const w of read.warnings) io.stderr(`warning: ${formatIssue(w)}\n`);

  const total = plans.length * n;
  const results: ScheduleComparison[] = [];
  for (const [i, plan] of plans.entries()) {
    const ps = runSettings[i]!;
    const runs: SeededRun[] = [];
    const moves: number[] = [];
    for (let k = 0; k < n; k++) {
      const seed = s.seed + k;
      const options: ChainOptions = {
        seed,
        budget: ps.moves !== undefined ? { moves: ps.moves } : { seconds: ps.seconds },
        rule: ps.rule,
        cooling: ps.cooling,
        p0: ps.p0,
        pEnd: ps.pEnd,
      };
      const label = `Run ${i * n + k + 1} of ${total}: plan ${i + 1}, seed ${seed} `;
      const result = await runChains(read.problem, options, 1, {
        now: io.now,
        ...(io.isTTY ? { onProgress: (p) => io.stderr(`\r\x1b[2K${label}${progressLine(p, 16)}`) } : {}),
      });
      runs.push({ seed, plan: result.plan });
      moves.push(result.stats.moves);
    }
    results.push({
      schedule: plan.text,
      description: formatCooling(ps.cooling, ps.rule, ps),
      ...summariseRuns(read.problem, runs),
      moves,
    });
  }
  if (io.isTTY) io.stderr("\r\x1b[2K");

  if (opts.json) {
    io.stdout(JSON.stringify(results, null, 2) + "\n");
    io.stderr(CAUTION_TEXT + "\n");
    return 0;
  }
  const budget = s.moves !== undefined ? `${s.moves} moves` : `${s.seconds} s`;
  const seedText = n === 1 ? `seed ${s.seed}` : `seeds ${s.seed} to ${s.seed + n - 1}`;
  io.stdout(
    [
      prepared.usedText,
      `${plans.length} temperature plan(s), each run with ${seedText}, ${budget} a run:`,
      "",
      ...comparisonTable(results, read.problem.vehicles.length),
      "",
      CAUTION_TEXT,
    ].join("\n") + "\n",
  );
  return 0;
}

/**
 * The printed comparison: a table of median, best and worst cost, vehicles and feasible runs,
 * one row per plan, then each plan's text and description, then every run's cost by seed.
 *
 * @param results - one comparison per plan
 * @param fleetSize - vehicles in the fleet
 * @returns the lines
 * @example comparisonTable(results, 5)[0] // => "plan   median cost    best cost   worst cost  vehicles  feasible"
 */
export function comparisonTable(results: readonly ScheduleComparison[], fleetSize: number): string[] {
  const money = (x: number): string => x.toFixed(2);
  const row = (c: readonly string[]): string =>
    [c[0]!.padEnd(4), c[1]!.padStart(12), c[2]!.padStart(12), c[3]!.padStart(12), c[4]!.padStart(9), c[5]!.padStart(9)].join(" ");
  const lines = [row(["plan", "median cost", "best cost", "worst cost", "vehicles", "feasible"])];
  for (const [i, r] of results.entries()) {
    const lo = Math.min(...r.vehicles);
    const hi = Math.max(...r.vehicles);
    lines.push(
      row([
        String(i + 1),
        money(r.median),
        money(r.best),
        money(r.worst),
        lo === hi ? String(lo) : `${lo}–${hi}`,
        `${r.feasible} of ${r.seeds.length}`,
      ]),
    );
  }
  lines.push("", "Plans:");
  for (const [i, r] of results.entries()) lines.push(`${String(i + 1).padEnd(4)} ${r.schedule}: ${r.description}`);
  lines.push("", `Cost of each run (vehicles of ${fleetSize}; * not feasible):`);
  for (const [i, r] of results.entries()) {
    const runs = r.seeds.map((seed, k) => `seed ${seed} ${money(r.costs[k]!)} (${r.vehicles[k]})${r.feasibleBySeed[k] ? "" : "*"}`);
    lines.push(`${String(i + 1).padEnd(4)} ${runs.join(", ")}`);
  }
  return lines;
}

/** Check a `--seeds` value (default 3). */
function parseSeeds(text: string | undefined): { seeds: number } | { error: string } {
  if (text === undefined) return { seeds: 3 };
  const n = Number(text.trim());
  if (!Number.isInteger(n) || n < 1 || n > MAX_SEEDS) {
    return {
      error: `--seeds: "${text}" is not a whole number from 1 to ${MAX_SEEDS}; give how many seeds to run each plan with, e.g. --seeds 5`,
    };
  }
  return { seeds: n };
}
