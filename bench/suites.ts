/**
 * `npm run bench`: runs the public benchmark suites of the benchmark folder (TSPLIB95 and
 * Solomon 1987) through the same path as `kiln bench`, prints a markdown table against the
 * published optima / best-known results, and writes the rows (instance, reference, ours, gap,
 * vehicles, seconds, moves, evaluations/s, peak RSS, workers) with the Node version and CPU
 * model to `bench/results/<name>-<date>.json` (`--name`, default "suites").
 *
 *   npm run bench -- [--seconds S] [--only NAME,NAME] [--suite tsplib|solomon] [--seed N] [--seeds K] [--cpu-clock]
 *                    [--workers N] [--fixtures]
 *
 * `--seeds K` runs seeds N..N+K-1 on every instance and adds a table of medians by instance;
 * `--cpu-clock` counts the budget in CPU seconds of this process instead of wall seconds (one
 * worker only), so runs on a loaded machine get the same work.
 *
 * Small GEO instances (burma14, ulysses16, ulysses22) always get 1 s; the others `--seconds`
 * (default 30). EUC_2D instances run only when named with `--only`. The benchmark folder is
 * `KILN_BENCHMARKS_DIR` when set, otherwise `../shared/benchmarks` beside the checkout;
 * `--fixtures` runs the six committed reference instances of test/fixtures/reference instead.
 */
import { existsSync, readFileSync } from "node:fs";
import { resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { benchInstance, loadBenchFile, type SolomonBenchRecord, type TsplibBenchRecord } from "../src/cli/benchCommand.js";
import { Command } from "commander";
import { settingFlags } from "../src/cli/settingFlags.js";
import { parseWorkers } from "../src/cli/chains.js";
import { benchEnvironment, cpuClock, rssSampler, writeResults } from "./results.js";

const BENCHMARKS_DIR = process.env["KILN_BENCHMARKS_DIR"]
  ? resolve(process.env["KILN_BENCHMARKS_DIR"]) + "/"
  : fileURLToPath(new URL("../../shared/benchmarks/", import.meta.url));
/** The committed reference instances: one flat folder standing for both suite folders. */
const FIXTURES_DIR = fileURLToPath(new URL("../test/fixtures/reference/", import.meta.url));
let suiteDir = (suite: "tsplib" | "solomon"): string => BENCHMARKS_DIR + suite + "/";
const SMALL_GEO = ["burma14", "ulysses16", "ulysses22"];
const LARGE_GEO = ["gr96", "gr202", "gr431"];

interface Row {
  instance: string;
  seed: number;
  /** Optimal length (TSPLIB) or best-known distance (Solomon). */
  reference: number;
  /** Our length or distance. */
  ours: number;
  referenceVehicles?: number;
  vehicles?: number;
  gapPct: number;
  seconds: number;
  /** Moves of every chain together. */
  moves: number;
  evaluations: number;
  evaluationsPerSecond: number;
  peakRssMb: number;
  workers: number;
  feasible: boolean;
  record: SolomonBenchRecord | TsplibBenchRecord;
}

async function runSuites(argv: string[]): Promise<number> {
  const program = new Command("bench/suites")
    .description(
      "Run the TSPLIB and Solomon suites of the benchmark folder (KILN_BENCHMARKS_DIR or ../shared/benchmarks) and print a table and JSON.",
    )
    .option("--seconds <S>", "seconds per large instance", "30")
    .option("--seed <N>", "seed of every run", "1")
    .option("--seeds <K>", "run seeds N..N+K-1 and add medians by instance", "1")
    .option("--cpu-clock", "count seconds of this process's CPU time instead of wall time (one worker only)")
    .option("--suite <NAME>", "tsplib or solomon (default both)")
    .option("--only <NAMES>", "comma-separated instance names")
    .option("--workers <N>", "independent chains per instance on worker threads (default 1)")
    .option("--fixtures", "run the committed reference instances (test/fixtures/reference) instead of the benchmark folder")
    .option("--name <NAME>", "results file name: bench/results/<NAME>-<date>.json", "suites")
    .exitOverride();
  try {
    program.parse(argv, { from: "user" });
  } catch {
    return 2;
  }
  const opts = program.opts<{
    seconds: string;
    seed: string;
    seeds: string;
    cpuClock?: boolean;
    suite?: string;
    only?: string;
    workers?: string;
    fixtures?: boolean;
    name: string;
  }>();
  const errors: string[] = [];
  const parsedWorkers = parseWorkers(opts.workers);
  if ("error" in parsedWorkers) errors.push(parsedWorkers.error);
  const workers = "workers" in parsedWorkers ? parsedWorkers.workers : 1;
  if (!/^[\w.-]+$/.test(opts.name)) errors.push(`--name: "${opts.name}" may hold only letters, digits, ".", "_" and "-"`);
  if (opts.fixtures) suiteDir = () => FIXTURES_DIR;
  const flags = settingFlags({ seconds: opts.seconds, seed: opts.seed });
  errors.push(...flags.errors);
  const seconds = flags.overrides.seconds ?? 30;
  const seed = flags.overrides.seed ?? 1;
  const seedCount = Number(opts.seeds);
  if (!Number.isInteger(seedCount) || seedCount < 1 || seedCount > 20)
    errors.push(`--seeds: "${opts.seeds}" is not a whole number from 1 to 20`);
  if (opts.cpuClock && workers > 1) errors.push("--cpu-clock counts this thread's process time: use it with one worker");
  const now = opts.cpuClock ? cpuClock() : (): number => performance.now();
  const suite = opts.suite;
  if (suite !== undefined && suite !== "tsplib" && suite !== "solomon") errors.push(`--suite must be tsplib or solomon, got "${suite}"`);
  if (!opts.fixtures && !existsSync(BENCHMARKS_DIR))
    errors.push(
      `benchmark folder ${BENCHMARKS_DIR} not found: put the suites in ../shared/benchmarks beside the checkout or set KILN_BENCHMARKS_DIR`,
    );
  if (errors.length > 0) {
    for (const e of errors) process.stderr.write(e + "\n");
    return 2;
  }
  const optimal = readCsv("tsplib/optimal.csv");
  const bestKnown = readCsv("solomon/best-known.csv");
  const only = opts.only
    ?.split(",")
    .map((s) => s.trim().toLowerCase())
    .filter(Boolean);

  const jobs: { file: string; seconds: number; name: string }[] = [];
  if (suite !== "solomon") {
    for (const [name] of optimal) {
      const isGeo = SMALL_GEO.includes(name) || LARGE_GEO.includes(name);
      if (only ? !only.includes(name.toLowerCase()) : !isGeo) continue;
      jobs.push({ file: `${suiteDir("tsplib")}${name}.tsp`, seconds: SMALL_GEO.includes(name) ? 1 : seconds, name });
    }
  }
  if (suite !== "tsplib") {
    for (const [name] of bestKnown) {
      if (only && !only.includes(name.toLowerCase())) continue;
      jobs.push({ file: `${suiteDir("solomon")}${name}.txt`, seconds, name });
    }
  }
  if (jobs.length === 0) {
    process.stderr.write("no instance matches --only/--suite\n");
    return 2;
  }

  const rows: Row[] = [];
  for (const job of jobs) {
    const loaded = await loadBenchFile(job.file);
    if ("errors" in loaded) {
      for (const e of loaded.errors) process.stderr.write(e + "\n");
      return 2;
    }
    for (let runSeed = seed; runSeed < seed + seedCount; runSeed++) {
      process.stderr.write(`${job.name}: seed ${runSeed}, ${job.seconds} s${opts.cpuClock ? " CPU" : ""}, ${workers} worker(s) ...\n`);
      const rss = rssSampler();
      const started = now();
      const { record, evaluations, moves } = await benchInstance(loaded, {
        seed: runSeed,
        budget: { seconds: job.seconds },
        now,
        workers,
      });
      const wallS = (now() - started) / 1000;
      const peakRssMb = rss.stop();
      const common = {
        instance: job.name,
        seed: runSeed,
        seconds: Math.round(wallS * 100) / 100,
        moves,
        evaluations,
        evaluationsPerSecond: wallS > 0 ? Math.round(evaluations / wallS) : 0,
        peakRssMb,
        workers,
      };
      if (record.format === "tsplib") {
        const reference = Number(optimal.find(([n]) => n === job.name)?.[1]);
        rows.push({ ...common, reference, ours: record.length, gapPct: gap(record.length, reference), feasible: true, record });
      } else {
        const ref = bestKnown.find(([n]) => n === job.name);
        const reference = Number(ref?.[2]);
        const ours = Math.round(record.distance * 100) / 100;
        rows.push({
          ...common,
          reference,
          ours,
          referenceVehicles: Number(ref?.[1]),
          vehicles: record.vehicles,
          gapPct: gap(record.distance, reference),
          feasible: record.feasible,
          record,
        });
      }
    }
  }

  process.stdout.write(table(rows) + "\n");
  const medians = seedCount > 1 ? medianRows(rows) : [];
  if (medians.length > 0) process.stdout.write("\n" + medianTable(medians, seed, seedCount) + "\n");
  const environment = benchEnvironment();
  process.stdout.write(
    `\nNode ${environment.node}, ${environment.cpuModel} (${environment.cpuCount} cores), seed ${seed}` +
      `${seedCount > 1 ? ` to ${seed + seedCount - 1}` : ""}, ${workers} worker(s), ${opts.cpuClock ? "CPU" : "wall"} seconds\n`,
  );
  const clock = opts.cpuClock ? "cpu" : "wall";
  const written = writeResults(opts.name, { bench: "suites", environment, seed, seeds: seedCount, clock, seconds, workers, rows, medians });
  process.stderr.write(`wrote ${written}\n`);
  return 0;
}

function table(rows: readonly Row[]): string {
  const lines = [
    "| instance | reference | ours | gap % | vehicles (ours / best-known) | seconds | moves | evaluations/s | peak RSS MB | workers |",
    "|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|",
  ];
  for (const r of rows) {
    const rec = r.record;
    const ours = rec.format === "tsplib" ? String(rec.length) : rec.distance.toFixed(2) + (rec.feasible ? "" : " (infeasible)");
    const vehicles = rec.format === "solomon" ? `${rec.vehicles} / ${r.referenceVehicles}` : "";
    const ref = rec.format === "tsplib" ? String(r.reference) : r.reference.toFixed(2);
    lines.push(
      `| ${rec.instance} | ${ref} | ${ours} | ${pct(r.gapPct)} | ${vehicles} | ${r.seconds.toFixed(1)} | ${r.moves.toLocaleString("en-US")} | ` +
        `${Math.round(r.evaluationsPerSecond).toLocaleString("en-US")} | ${r.peakRssMb.toFixed(0)} | ${r.workers} |`,
    );
  }
  const tsp = rows.filter((r) => r.record.format === "tsplib");
  const sol = rows.filter((r) => r.record.format === "solomon");
  if (tsp.length > 0) lines.push(`| **mean TSPLIB gap** | | | ${pct(mean(tsp.map((r) => r.gapPct)))} | | | | | | |`);
  if (sol.length > 0) {
    const ours = sol.reduce((s, r) => s + (r.record as SolomonBenchRecord).vehicles, 0);
    const best = sol.reduce((s, r) => s + (r.referenceVehicles ?? 0), 0);
    const infeasible = sol.filter((r) => !(r.record as SolomonBenchRecord).feasible).length;
    lines.push(`| **mean Solomon gap** (distance) | | | ${pct(mean(sol.map((r) => r.gapPct)))} | | | | | | |`);
    lines.push(`| **total vehicles** | | | | ${ours} / ${best} | | | | | |`);
    if (infeasible > 0) lines.push(`| **infeasible plans** | | ${infeasible} of ${sol.length} | | | | | | | |`);
  }
  return lines.join("\n");
}

/** Median by instance over its seeds: gap, vehicles, moves; feasible when every seed was. */
interface MedianRow {
  instance: string;
  reference: number;
  referenceVehicles?: number;
  ours: number;
  gapPct: number;
  vehicles?: number;
  feasibleRuns: number;
  runs: number;
  moves: number;
}

function medianRows(rows: readonly Row[]): MedianRow[] {
  const names = [...new Set(rows.map((r) => r.instance))];
  return names.map((instance) => {
    const rs = rows.filter((r) => r.instance === instance);
    const vehicles = rs.map((r) => r.vehicles).filter((v): v is number => v !== undefined);
    return {
      instance,
      reference: rs[0]!.reference,
      ...(rs[0]!.referenceVehicles !== undefined ? { referenceVehicles: rs[0]!.referenceVehicles } : {}),
      ours: median(rs.map((r) => r.ours)),
      gapPct: median(rs.map((r) => r.gapPct)),
      ...(vehicles.length > 0 ? { vehicles: median(vehicles) } : {}),
      feasibleRuns: rs.filter((r) => r.feasible).length,
      runs: rs.length,
      moves: median(rs.map((r) => r.moves)),
    };
  });
}

function medianTable(rows: readonly MedianRow[], seed: number, count: number): string {
  const lines = [
    `Medians over seeds ${seed} to ${seed + count - 1}:`,
    "",
    "| instance | reference | ours (median) | gap % (median) | vehicles (median / best-known) | feasible runs | moves (median) |",
    "|---|---:|---:|---:|---:|---:|---:|",
  ];
  for (const r of rows) {
    const vehicles = r.vehicles !== undefined ? `${r.vehicles} / ${r.referenceVehicles}` : "";
    lines.push(
      `| ${r.instance} | ${r.reference} | ${r.ours} | ${pct(r.gapPct)} | ${vehicles} | ${r.feasibleRuns} / ${r.runs} | ${r.moves.toLocaleString("en-US")} |`,
    );
  }
  const withVehicles = rows.filter((r) => r.vehicles !== undefined);
  if (withVehicles.length > 0) {
    const ours = withVehicles.reduce((s, r) => s + r.vehicles!, 0);
    const best = withVehicles.reduce((s, r) => s + (r.referenceVehicles ?? 0), 0);
    lines.push(`| **sum of median vehicles** | | | | ${ours} / ${best} | | |`);
  }
  lines.push(`| **mean of median gaps** | | | ${pct(mean(rows.map((r) => r.gapPct)))} | | | |`);
  return lines.join("\n");
}

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Rows of a small CSV without quoting, header dropped, as [name, ...values]. */
function readCsv(relative: string): [string, ...string[]][] {
  const [suite, file] = relative.split("/") as ["tsplib" | "solomon", string];
  return readFileSync(suiteDir(suite) + file, "utf8")
    .split(/\r?\n/)
    .slice(1)
    .filter((l) => l.trim() !== "")
    .map((l) => {
      const [name = "", ...rest] = l.split(",").map((c) => c.trim());
      return [name, ...rest];
    });
}

function gap(ours: number, reference: number): number {
  return ((ours - reference) / reference) * 100;
}

/** Two decimals, without a "-0.00" for a result a hair below a reference rounded to cents. */
function pct(x: number): string {
  return (Math.abs(x) < 0.005 ? 0 : x).toFixed(2);
}

function mean(xs: readonly number[]): number {
  return xs.length === 0 ? 0 : xs.reduce((s, x) => s + x, 0) / xs.length;
}

runSuites(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`bench: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
