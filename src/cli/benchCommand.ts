import { readFile } from "node:fs/promises";
import { basename, extname } from "node:path";
import {
  detectFormat,
  parseSolomon,
  type SolomonInstance,
  parseTsplib,
  type TsplibInstance,
  solomonRoutesDistance,
  solomonToProblem,
  tsplibToProblem,
  tsplibTourLength,
  type Issue,
  type Plan,
  type Problem,
  type Budget,
  type RunStats,
} from "../core/index.js";
import { parseWorkers, runChains, MAX_WORKERS } from "./chains.js";
import type { CliIO } from "./CliIO.js";
import { Option, type Command } from "commander";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { rangeText } from "../sheets/settingFieldTypes.js";
import { settingFlags } from "./settingFlags.js";

/** Seconds per instance when neither `--seconds` nor `--moves` is given. */
const DEFAULT_SECONDS = 10;

/** A benchmark file read and recognised. */
export type BenchInstance =
  | { readonly format: "tsplib"; readonly name: string; readonly inst: TsplibInstance }
  | { readonly format: "solomon"; readonly name: string; readonly inst: SolomonInstance };

/** The JSON line of a Solomon instance (DESIGN.md §6). */
export interface SolomonBenchRecord {
  instance: string;
  format: "solomon";
  seed: number;
  seconds: number;
  moves: number;
  vehicles: number;
  distance: number;
  feasible: boolean;
  routes: number[][];
}

/** The JSON line of a TSPLIB instance (DESIGN.md §6). */
export interface TsplibBenchRecord {
  instance: string;
  format: "tsplib";
  seed: number;
  seconds: number;
  moves: number;
  length: number;
  tour: number[];
}

/** Declare `kiln bench` on the program. */
export function declareBench(program: Command, io: CliIO, exit: (code: number) => void): Command {
  const opt = (key: "seconds" | "moves" | "seed", extra: string): Option => {
    const f = SETTING_FIELDS[key];
    return new Option(`--${f.flag} <${f.valueName}>`, `${f.label}: ${f.help} per instance; ${rangeText(f)}${extra}`);
  };
  return program
    .command("bench")
    .summary("solve TSPLIB or Solomon benchmark files, one JSON line each")
    .description(
      "Solve TSPLIB (.tsp) or Solomon VRPTW files (format told by content) and print one JSON\n" +
        "object per line (every file is read and checked before any is solved).",
    )
    .argument("<FILE...>", "TSPLIB or Solomon files")
    .addOption(opt("seconds", ` (default ${DEFAULT_SECONDS})`))
    .addOption(opt("moves", ""))
    .addOption(opt("seed", " (default 1)"))
    .option("--workers <N>", `independent chains per instance on worker threads, 1 to ${MAX_WORKERS} (default 1); the best is kept`)
    .action(async (files: string[], opts: { seconds?: string; moves?: string; seed?: string; workers?: string }) => {
      exit(await runBenchOf(files, opts, io));
    });
}

/**
 * `kiln bench FILE... [--seconds S | --moves K] [--seed N] [--workers N]`: solves each file and prints
 * one JSON object per line on stdout (DESIGN.md §6). Every file is read and checked before
 * any is solved, so all input errors are reported at once. Option values follow the settings
 * schema (the same ranges and messages as `plan`).
 *
 * @param files - the FILE arguments
 * @param opts - the option texts given
 * @param io - output streams and clock
 * @returns exit code: 0 ok, 2 input errors (one per line on stderr)
 * @example await runBenchOf(["burma14.tsp"], { moves: "20000" }, io) // => 0, prints {"instance":"burma14",...}
 */
export async function runBenchOf(
  files: readonly string[],
  opts: { seconds?: string; moves?: string; seed?: string; workers?: string },
  io: CliIO,
): Promise<number> {
  const workers = parseWorkers(opts.workers);
  const flags = settingFlags(opts);
  const seconds = flags.overrides.seconds;
  const moves = flags.overrides.moves;
  const seed = flags.overrides.seed ?? 1;
  const parsed = { positional: files, errors: flags.errors };
  const errors = [...parsed.errors, ...("error" in workers ? [workers.error] : [])];
  const loaded: BenchInstance[] = [];
  for (const path of parsed.positional) {
    const result = await loadBenchFile(path);
    if ("errors" in result) errors.push(...result.errors);
    else loaded.push(result);
  }
  if (errors.length > 0) {
    for (const e of errors) io.stderr(e + "\n");
    return 2;
  }
  const budget: Budget = moves !== undefined ? { moves } : { seconds: seconds ?? DEFAULT_SECONDS };
  for (const instance of loaded) {
    const { record } = await benchInstance(instance, {
      seed,
      budget,
      now: io.now,
      progress: io.isTTY ? io.stderr : undefined,
      workers: "workers" in workers ? workers.workers : 1,
    });
    io.stdout(JSON.stringify(record) + "\n");
  }
  return 0;
}

/**
 * Reads a benchmark file and recognises its format; problems come back as messages
 * ("burma15.tsp: file not found"), never thrown.
 *
 * @param path - file path as the user typed it
 * @returns the instance (named after the file without extension) or the error lines
 * @example await loadBenchFile("missing.tsp") // => { errors: ["missing.tsp: file not found"] }
 */
export async function loadBenchFile(path: string): Promise<BenchInstance | { errors: string[] }> {
  let text: string;
  try {
    text = await readFile(path, "utf8");
  } catch (e) {
    return { errors: [`${path}: ${readError(e)}`] };
  }
  const name = basename(path, extname(path));
  const format = detectFormat(text);
  const where = (i: Issue): string => `${path}: ${i.cell ? i.cell + ": " : ""}${i.message}`;
  if (format === "tsplib") {
    const inst = parseTsplib(text);
    return inst.issues.length > 0 ? { errors: inst.issues.map(where) } : { format, name, inst };
  }
  if (format === "solomon") {
    const inst = parseSolomon(text);
    return inst.issues.length > 0 ? { errors: inst.issues.map(where) } : { format, name, inst };
  }
  return {
    errors: [
      `${path}: unknown format; expected a TSPLIB file (DIMENSION and NODE_COORD_SECTION) or a Solomon VRPTW file (VEHICLE and CUSTOMER blocks)`,
    ],
  };
}

/**
 * Solves one benchmark instance with the engine and builds its JSON record (`benchRecord`).
 * With several workers the chains run on worker threads, share their best plan at the marks of the
 * budget (unless `share` is false) and the best plan is kept (`runChains`).
 *
 * @param instance - a loaded instance
 * @param options - seed, budget, clock, an optional sink for progress lines, chains (default 1)
 * @returns the record, the kept chain's run statistics, the plan, and the evaluations of all chains
 * @throws RangeError when the solver leaves a TSP node out (a solver defect, not user data)
 * @example (await benchInstance(burma14, { seed: 1, budget: { moves: 20000 }, now: () => performance.now() })).record.length // => 3323
 */
export async function benchInstance(
  instance: BenchInstance,
  options: {
    seed: number;
    budget: Budget;
    now: () => number;
    progress?: ((s: string) => void) | undefined;
    workers?: number;
    /** False: independent chains (the bench's comparison); default true, as in the product. */
    share?: boolean;
  },
): Promise<{ record: SolomonBenchRecord | TsplibBenchRecord; stats: RunStats; plan: Plan; evaluations: number; moves: number }> {
  const problem: Problem = instance.format === "tsplib" ? tsplibToProblem(instance.inst) : solomonToProblem(instance.inst);
  const sink = options.progress;
  const result = await runChains(problem, { seed: options.seed, budget: options.budget }, options.workers ?? 1, {
    now: options.now,
    ...(options.share === false ? { share: false } : {}),
    ...(sink
      ? {
          onProgress: (p) =>
            sink(`\r${instance.name}: ${Math.round(p.fraction * 100)}% best ${fmt(p.bestCost)} T ${fmt(p.temperature)}   `),
        }
      : {}),
  });
  if (sink) sink("\n");
  const { plan, stats } = result;
  const evaluations = result.chains.reduce((s, c) => s + c.stats.evaluations, 0);
  const moves = result.chains.reduce((s, c) => s + c.stats.moves, 0);
  const record = benchRecord(instance, problem, plan, { seed: options.seed, elapsedMs: stats.elapsedMs, moves: stats.moves });
  return { record, stats, plan, evaluations, moves };
}

/**
 * The JSON record of a plan of a benchmark instance: routes and tours in the file's numbering,
 * lengths recomputed from the file (TSPLIB: by its EDGE_WEIGHT_TYPE; Solomon: Euclidean in
 * double precision), not taken from the solver.
 *
 * @param instance - the loaded instance
 * @param problem - the problem made of it (`tsplibToProblem` / `solomonToProblem`)
 * @param plan - a plan of that problem, by any solver
 * @param run - seed, milliseconds and moves of the run that made it
 * @returns the record
 * @throws RangeError when a TSP plan leaves a node out (a solver defect, not user data)
 * @example benchRecord(burma14, problem, plan, { seed: 1, elapsedMs: 1000, moves: 20000 }).length // => 3323
 */
export function benchRecord(
  instance: BenchInstance,
  problem: Problem,
  plan: Plan,
  run: { seed: number; elapsedMs: number; moves: number },
): SolomonBenchRecord | TsplibBenchRecord {
  const seconds = Math.round(run.elapsedMs) / 1000;
  const routes = plan.routes.filter((r) => r.visits.length > 0).map((r) => r.visits.map((v) => Number(problem.stops[v.stop]!.id)));
  if (instance.format === "tsplib") {
    const tour = [1, ...(routes[0] ?? [])];
    if (tour.length !== instance.inst.dimension) {
      throw new RangeError(`solver returned a tour of ${tour.length} of ${instance.inst.dimension} nodes for ${instance.name}`);
    }
    return {
      instance: instance.name,
      format: "tsplib",
      seed: run.seed,
      seconds,
      moves: run.moves,
      length: tsplibTourLength(instance.inst, tour),
      tour,
    };
  }
  return {
    instance: instance.name,
    format: "solomon",
    seed: run.seed,
    seconds,
    moves: run.moves,
    vehicles: routes.length,
    distance: solomonRoutesDistance(instance.inst, routes),
    feasible: plan.feasible && plan.unassigned.length === 0,
    routes,
  };
}

function readError(e: unknown): string {
  const code = (e as { code?: unknown } | null)?.code;
  if (code === "ENOENT") return "file not found";
  if (code === "EISDIR") return "is a folder, not a file";
  if (code === "EACCES" || code === "EPERM") return "permission denied";
  return `cannot be read (${typeof code === "string" ? code : String((e as Error)?.message ?? e)})`;
}

function fmt(x: number): string {
  return Number.isFinite(x) ? x.toFixed(1) : "-";
}
