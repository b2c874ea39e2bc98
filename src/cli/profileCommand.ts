import {
  sampleMeanUphill,
  calibrateTemperatures,
  describeProfile,
  endOfRunText,
  profile,
  type ProfilePoint,
  ROUTE_MINIMISATION_SHARE,
  SOLVE_DEFAULTS,
} from "../core/index.js";
import { formatCooling } from "../sheets/formatCooling.js";
import type { CliIO } from "./CliIO.js";
import type { Command } from "commander";
import { reportErrors } from "./planCommand.js";
import { prepareRun } from "./prepareRun.js";
import { addRunOptions, givenSettings, type InputSheetOptions } from "./runOptions.js";

/** Rows of the printed table (fraction 0 to 1 inclusive, every 1/15 of the run). */
export const PROFILE_ROWS = 16;

/** Declare `kiln profile` on the program. */
export function declareProfile(program: Command, io: CliIO, exit: (code: number) => void): Command {
  const cmd = program
    .command("profile")
    .summary("show the temperature and P(accept) profile of a schedule, without solving")
    .description(
      "Sample random moves from the first plan, print the mean uphill cost change and the\n" +
        "temperature / P(accept) profile of the chosen schedule, without solving.",
    )
    .argument("<WORKBOOK.xlsx>", "the workbook with the Stops and Fleet sheets");
  addRunOptions(cmd);
  cmd.action(async (workbook: string, opts: InputSheetOptions & { softWindows?: boolean }) => {
    exit(await runProfileOf(workbook, opts, givenSettings(cmd), io));
  });
  return cmd;
}

/**
 * `kiln profile`: read the problem, sample the mean uphill change from the first plan
 * (`sampleMeanUphill`), and print the schedule's temperature and the probability of accepting
 * that change over the run as a table, plus a one-line reading (`describeProfile`).
 *
 * @param workbook - the WORKBOOK.xlsx argument
 * @param opts - sheet options and `--soft-windows`
 * @param settings - the setting options given, by flag
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one line each on stderr)
 * @example await runProfileOf("demo/kiln-demo.xlsx", {}, { schedule: "geometric", moves: "100000" }, io) // => 0
 */
export async function runProfileOf(
  workbook: string,
  opts: InputSheetOptions & { softWindows?: boolean },
  settings: Readonly<Record<string, string>>,
  io: CliIO,
): Promise<number> {
  const prepared = await prepareRun(workbook, opts, settings, opts.softWindows);
  if ("errors" in prepared) return reportErrors(io, prepared.errors);
  const { read } = prepared;
  const s = read.settings;
  const sample = sampleMeanUphill(read.problem, { seed: s.seed, samples: SOLVE_DEFAULTS.calibrationSamples, now: io.now });
  if (!(sample.meanUphill > 0)) {
    io.stdout(`No uphill move found among the sampled moves (seed ${s.seed}): there is no cost change to calibrate the temperature on.\n`);
    return 0;
  }
  // A seconds budget has no move count until the run: the table expects the moves per second
  // measured on this problem by a short timed burst.
  const rate = sample.movesPerSecond ?? 0;
  const budgetMoves = s.moves ?? Math.max(1, Math.round(rate * s.seconds));
  const expected = s.moves === undefined;
  const points = profile(s.cooling, s.rule, sample.meanUphill, budgetMoves, {
    p0: s.p0,
    pEnd: s.pEnd,
    points: PROFILE_ROWS,
    uphill: sample.uphill,
  });
  const { t0, tEnd } = calibrateTemperatures(sample.meanUphill, s.rule, s.p0, s.pEnd, sample.uphill);
  const lines = [
    `Mean uphill change: ${sample.meanUphill.toPrecision(4)} (cost units, from ${sample.samples} uphill moves sampled from the first plan, seed ${s.seed})`,
    `Schedule: ${formatCooling(s.cooling, s.rule, s)}; calibrated T0 ${t0.toPrecision(4)}, T end ${tEnd.toPrecision(4)} (p0 ${s.p0}, p end ${s.pEnd})`,
    expected
      ? `Moves: about ${budgetMoves} expected in ${s.seconds} s (${formatRate(rate)} measured on this problem; pass --moves K for an exact table)`
      : `Moves: ${budgetMoves}`,
    ...(read.problem.objective === "hierarchical"
      ? [
          `Vehicles first: a route-minimisation phase (ejection pool, squeeze, ejections) uses up to ${Math.round(100 * ROUTE_MINIMISATION_SHARE)}% of the budget before the annealing (less when it reaches the lower bound on vehicles or saves none for a while); the schedule below then runs over the rest.`,
        ]
      : []),
    endOfRunText(),
    "",
    ...profileTable(points),
    "",
    describeProfile(points, s.rule),
  ];
  io.stdout(lines.join("\n") + "\n");
  return 0;
}

/**
 * The profile as fixed-width text rows: a header, then fraction, moves, T and P per point.
 *
 * @param points - profile points
 * @returns the lines, header first
 * @example profileTable(points)[0] // => "fraction      moves            T   P(accept)"
 */
export function profileTable(points: readonly ProfilePoint[]): string[] {
  const row = (cells: readonly string[]): string =>
    [cells[0]!.padStart(8), cells[1]!.padStart(10), cells[2]!.padStart(12), cells[3]!.padStart(11)].join(" ");
  return [
    row(["fraction", "moves", "T", "P(accept)"]),
    ...points.map((p) => row([p.fraction.toFixed(3), String(p.moves), p.temperature.toPrecision(4), p.pAccept.toPrecision(4)])),
  ];
}

function formatRate(movesPerSecond: number): string {
  return `${(movesPerSecond / 1e6).toPrecision(3)} M moves/s`;
}
