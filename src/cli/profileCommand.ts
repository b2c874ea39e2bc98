import { sampleMeanUphill, calibrateTemperatures, describeProfile, profile, type ProfilePoint, SOLVE_DEFAULTS } from "../core/index.js";
import { formatCooling } from "../sheets/formatCooling.js";
import type { CliIO } from "./CliIO.js";
import { parseArgs } from "./parseArgs.js";
import { RUN_VALUE_OPTIONS, prepareRun } from "./solveCommand.js";

/** Rows of the printed table (fraction 0 to 1 inclusive, every 1/15 of the run). */
export const PROFILE_ROWS = 16;

/** Usage text of `kiln profile`. */
export const PROFILE_USAGE = `kiln profile WORKBOOK.xlsx [--stops SHEET] [--fleet SHEET] [--settings SHEET]
  [--rule metropolis|logistic] [--schedule geometric|linear|lundy-mees|time] [--alpha A] [--level L]
  [--steps N] [--beta B] [--t0 T] [--tend T] [--seed N] [--seconds S | --moves K] [--detour F]
  [--speed KMH] [--soft-windows]
  Sample random moves from the first plan, print the mean uphill cost change and the
  temperature / P(accept) profile of the chosen schedule, without solving.`;

/**
 * `kiln profile`: read the problem, sample the mean uphill change from the first plan
 * (`sampleMeanUphill`), and print the schedule's temperature and the probability of accepting
 * that change over the run as a table, plus a one-line reading (`describeProfile`).
 *
 * @param args - the arguments after `profile`
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one line each on stderr), 1 anything else
 * @example await runProfile(["demo/kiln-demo.xlsx", "--schedule", "geometric", "--moves", "100000"], io) // => 0
 */
export async function runProfile(args: string[], io: CliIO): Promise<number> {
  const parsed = parseArgs(args, { values: [...RUN_VALUE_OPTIONS], flags: ["soft-windows", "help"] });
  if (parsed.flags.has("help")) {
    io.stdout(PROFILE_USAGE + "\n");
    return 0;
  }
  const prepared = await prepareRun(parsed);
  if ("errors" in prepared) {
    for (const e of prepared.errors) io.stderr(e + "\n");
    return 2;
  }
  const { read } = prepared;
  const s = read.settings;
  const sample = sampleMeanUphill(read.problem, { seed: s.seed, samples: SOLVE_DEFAULTS.calibrationSamples });
  if (!(sample.meanUphill > 0)) {
    io.stdout(`No uphill move found among the sampled moves (seed ${s.seed}): there is no cost change to calibrate the temperature on.\n`);
    return 0;
  }
  // A seconds budget has no move count until the run: the table then assumes the default budget.
  const defaultBudget = SOLVE_DEFAULTS.budget;
  const budgetMoves = s.moves ?? ("moves" in defaultBudget ? defaultBudget.moves : 2_000_000);
  const assumed = s.moves === undefined;
  const points = profile(s.cooling, s.rule, sample.meanUphill, budgetMoves, {
    p0: s.p0,
    pEnd: s.pEnd,
    points: PROFILE_ROWS,
    uphill: sample.uphill,
  });
  const { t0, tEnd } = calibrateTemperatures(sample.meanUphill, s.rule, s.p0, s.pEnd, sample.uphill);
  const lines = [
    `Mean uphill change: ${sample.meanUphill.toPrecision(4)} (cost units, from ${sample.samples} uphill moves sampled from the first plan, seed ${s.seed})`,
    `Schedule: ${formatCooling(s.cooling, s.rule)}; calibrated T0 ${t0.toPrecision(4)}, T end ${tEnd.toPrecision(4)} (p0 ${s.p0}, p end ${s.pEnd})`,
    assumed
      ? `Moves: ${budgetMoves} assumed (the run is bounded by ${s.seconds} s; pass --moves K for an exact table)`
      : `Moves: ${budgetMoves}`,
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
