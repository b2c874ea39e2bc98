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
 *   npm run bench -- --suite solomon --seconds 8 --equal-time 1,2
 *
 * `--equal-time A,B` runs every instance once with A and once with B workers at the same
 * wall-clock seconds (the chains share one clock start, so B workers get no extra time) and
 * prints one row per instance with both results side by side, written to
 * `bench/results/<name>-<date>.json` (default name "workers-A-vs-B").
 *
 *   npm run bench -- --suite solomon --seconds 8 --sharing 2
 *
 * `--sharing N` runs every instance once with N independent chains and once with N chains that
 * share their best plan at the marks of the budget (the product's behaviour), at the same
 * wall-clock seconds, side by side (default name "sharing-N").
 *
 * Small GEO instances (burma14, ulysses16, ulysses22) always get 1 s; the others `--seconds`
 * (default 30). EUC_2D instances run only when named with `--only`. The benchmark folder is
 * `KILN_BENCHMARKS_DIR` when set, otherwise `../shared/benchmarks` beside the checkout;
 * `--fixtures` runs the six committed reference instances of test/fixtures/reference instead.
 */
import { existsSync, readFileSync, readdirSync, statSync } from "node:fs";
import { loadavg } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { SolomonBenchRecord, TsplibBenchRecord } from "../src/cli/benchCommand.js";
import { Command } from "commander";
import { settingFlags } from "../src/cli/settingFlags.js";
import { parseWorkers } from "../src/cli/chains.js";
import { BENCHMARKS_DIR } from "./benchmarksDir.js";
import { benchEnvironment, cpuClock, rssSampler, writeResults } from "./results.js";

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
    .option("--equal-time <A,B>", "run every instance with A and with B workers at the same seconds and compare them side by side")
    .option("--sharing <N>", "run every instance with N independent and with N sharing chains at the same seconds, side by side")
    .option("--moves <K>", "with --sharing: a budget of K moves per chain instead of seconds (the same work, whatever the load)")
    .option("--fixtures", "run the committed reference instances (test/fixtures/reference) instead of the benchmark folder")
    .option("--name <NAME>", "results file name: bench/results/<NAME>-<date>.json (default suites, or workers-A-vs-B)")
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
    equalTime?: string;
    sharing?: string;
    moves?: string;
    name?: string;
  }>();
  const errors: string[] = [];
  const parsedWorkers = parseWorkers(opts.workers);
  if ("error" in parsedWorkers) errors.push(parsedWorkers.error);
  const workers = "workers" in parsedWorkers ? parsedWorkers.workers : 1;
  const pair =
    opts.equalTime !== undefined ? parsePair(opts.equalTime) : opts.sharing !== undefined ? parseSharing(opts.sharing) : undefined;
  const pairFlag = opts.equalTime !== undefined ? "--equal-time" : "--sharing";
  if (pair && "error" in pair) errors.push(pair.error);
  if (opts.equalTime !== undefined && opts.sharing !== undefined) errors.push("give --equal-time or --sharing, not both");
  if (pair && opts.workers !== undefined) errors.push(`give --workers or ${pairFlag}, not both`);
  if (pair && opts.cpuClock) errors.push(`${pairFlag} compares at equal wall-clock time: leave out --cpu-clock`);
  if (pair && opts.seeds !== "1") errors.push(`${pairFlag} runs the one seed of --seed: leave out --seeds`);
  const name = opts.name ?? (pair && "configs" in pair ? pair.name + (opts.moves !== undefined ? "-moves" : "") : "suites");
  const movesBudget = opts.moves !== undefined ? Number(opts.moves) : undefined;
  if (movesBudget !== undefined && opts.sharing === undefined) errors.push("--moves goes with --sharing (the other modes count seconds)");
  if (movesBudget !== undefined && !(Number.isInteger(movesBudget) && movesBudget >= 1000))
    errors.push(`--moves: "${opts.moves}" is not a whole number of at least 1000`);
  if (!/^[\w.-]+$/.test(name)) errors.push(`--name: "${name}" may hold only letters, digits, ".", "_" and "-"`);
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

  const { benchInstance, loadBenchFile, compiled } = await benchCode();
  process.stderr.write(
    compiled
      ? "using the compiled CLI in dist/cli (worker threads start as in the product)\n"
      : "using the sources through tsx: dist/cli is missing or older than src/ (npm run build:cli); each worker thread compiles TypeScript as it starts, which costs it time\n",
  );
  if (pair && "configs" in pair) {
    const compared: [Row, Row][] = [];
    // The machine's load (1-minute average of runnable processes) before and after: a shared machine is noisy.
    const loadBefore = loadavg()[0]!;
    for (const job of jobs) {
      const loaded = await loadBenchFile(job.file);
      if ("errors" in loaded) {
        for (const e of loaded.errors) process.stderr.write(e + "\n");
        return 2;
      }
      const both: Row[] = [];
      for (const config of pair.configs) {
        const count = config.workers;
        const budget = movesBudget !== undefined ? { moves: movesBudget } : { seconds: job.seconds };
        process.stderr.write(`${job.name}: ${"moves" in budget ? `${budget.moves} moves` : `${budget.seconds} s`}, ${config.label} ...\n`);
        const rss = rssSampler();
        const started = performance.now();
        const { record, evaluations, moves } = await benchInstance(loaded, {
          seed,
          budget,
          now: () => performance.now(),
          workers: count,
          share: config.share,
        });
        const wallS = (performance.now() - started) / 1000;
        both.push(toRow(job.name, seed, count, wallS, rss.stop(), record, evaluations, moves));
      }
      compared.push([both[0]!, both[1]!]);
    }
    const environment = benchEnvironment();
    process.stdout.write(pairTable(compared, pair.configs) + "\n");
    process.stdout.write(
      `\nNode ${environment.node}, ${environment.cpuModel} (${environment.cpuCount} cores), seed ${seed}, ` +
        `${movesBudget !== undefined ? `${movesBudget} moves per chain` : `${seconds} s per instance`} for both, ` +
        `load average ${loadBefore.toFixed(1)} before and ${loadavg()[0]!.toFixed(1)} after\n`,
    );
    const written = writeResults(name, {
      bench: opts.sharing !== undefined ? "sharing" : "equal-time",
      environment,
      seed,
      ...(movesBudget !== undefined ? { movesPerChain: movesBudget } : { seconds }),
      loadAverage: { before: loadBefore, after: loadavg()[0]! },
      workers: pair.configs.map((c) => c.workers),
      sharing: pair.configs.map((c) => c.share),
      rows: compared.map(([a, b]) => ({
        instance: a.instance,
        reference: a.reference,
        referenceVehicles: a.referenceVehicles,
        runs: [a, b],
      })),
    });
    process.stderr.write(`wrote ${written}\n`);
    return 0;
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
      rows.push(toRow(job.name, runSeed, workers, wallS, rss.stop(), record, evaluations, moves));
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
  const written = writeResults(name, { bench: "suites", environment, seed, seeds: seedCount, clock, seconds, workers, rows, medians });
  process.stderr.write(`wrote ${written}\n`);
  return 0;

  /** One run's row against its reference. */
  function toRow(
    instance: string,
    runSeed: number,
    count: number,
    wallS: number,
    peakRssMb: number,
    record: SolomonBenchRecord | TsplibBenchRecord,
    evaluations: number,
    moves: number,
  ): Row {
    const common = {
      instance,
      seed: runSeed,
      seconds: Math.round(wallS * 100) / 100,
      moves,
      evaluations,
      evaluationsPerSecond: wallS > 0 ? Math.round(evaluations / wallS) : 0,
      peakRssMb,
      workers: count,
    };
    if (record.format === "tsplib") {
      const reference = Number(optimal.find(([n]) => n === instance)?.[1]);
      return { ...common, reference, ours: record.length, gapPct: gap(record.length, reference), feasible: true, record };
    }
    const ref = bestKnown.find(([n]) => n === instance);
    const reference = Number(ref?.[2]);
    return {
      ...common,
      reference,
      ours: Math.round(record.distance * 100) / 100,
      referenceVehicles: Number(ref?.[1]),
      vehicles: record.vehicles,
      gapPct: gap(record.distance, reference),
      feasible: record.feasible,
      record,
    };
  }
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

/**
 * The bench path of `kiln bench`: the compiled one in dist/cli when it is newer than every source
 * file (a worker thread then starts from plain JavaScript, as in the installed CLI), otherwise the
 * sources (a worker thread then first registers tsx and compiles, seconds on a loaded machine,
 * which an equal-time comparison would count against the chains).
 */
async function benchCode(): Promise<typeof import("../src/cli/benchCommand.js") & { compiled: boolean }> {
  const dist = fileURLToPath(new URL("../dist/cli/cli/benchCommand.js", import.meta.url));
  if (existsSync(dist) && statSync(dist).mtimeMs >= newestMtime(fileURLToPath(new URL("../src/", import.meta.url)))) {
    return { ...((await import(dist)) as typeof import("../src/cli/benchCommand.js")), compiled: true };
  }
  return { ...(await import("../src/cli/benchCommand.js")), compiled: false };
}

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(path) : statSync(path).mtimeMs);
  }
  return newest;
}

/**
 * Read `--equal-time A,B`: two worker counts, each checked like `--workers`.
 *
 * @param text - the option text
 * @returns the two counts, or the error line
 * @example parsePair("1,2") // => { counts: [1, 2] }
 */
function parsePair(text: string): { configs: [PairConfig, PairConfig]; name: string } | { error: string } {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.length !== 2) return { error: `--equal-time: "${text}" is not two worker counts; give them as A,B, e.g. --equal-time 1,2` };
  const counts: number[] = [];
  for (const p of parts) {
    const w = parseWorkers(p);
    if ("error" in w) return { error: w.error.replace(/^--workers/, "--equal-time") };
    counts.push(w.workers);
  }
  const config = (n: number): PairConfig => ({ label: `${n} worker${n === 1 ? "" : "s"}`, tag: String(n), workers: n, share: true });
  return { configs: [config(counts[0]!), config(counts[1]!)], name: `workers-${counts[0]}-vs-${counts[1]}` };
}

/** One side of a side-by-side comparison: its column label, its tag in the "better" column, its chains. */
interface PairConfig {
  readonly label: string;
  readonly tag: string;
  readonly workers: number;
  readonly share: boolean;
}

/**
 * Read `--sharing N`: N independent chains against N chains that share, N checked like `--workers`.
 *
 * @param text - the option text
 * @returns the two sides, or the error line
 * @example parseSharing("2").configs[1] // => { label: "2 sharing", tag: "shared", workers: 2, share: true }
 */
function parseSharing(text: string): { configs: [PairConfig, PairConfig]; name: string } | { error: string } {
  const w = parseWorkers(text);
  if ("error" in w) return { error: w.error.replace(/^--workers/, "--sharing") };
  if (w.workers < 2) return { error: `--sharing: ${text} chain cannot share with another; give 2 or more` };
  return {
    configs: [
      { label: `${w.workers} independent`, tag: "independent", workers: w.workers, share: false },
      { label: `${w.workers} sharing`, tag: "shared", workers: w.workers, share: true },
    ],
    name: `sharing-${w.workers}`,
  };
}

/**
 * One row per instance, the two worker counts side by side at the same seconds: distance and
 * vehicles of each, the distance gap of each to the best-known, and which one is better by the
 * hierarchical order (vehicles first, then distance; an infeasible plan loses to a feasible one).
 */
function pairTable(pairs: readonly [Row, Row][], configs: readonly [PairConfig, PairConfig]): string {
  const [a, b] = configs.map((c) => c.tag) as [string, string];
  const [la, lb] = configs.map((c) => c.label) as [string, string];
  const lines = [
    `| instance | best-known (vehicles / distance) | ${la}: vehicles / distance | ${lb}: vehicles / distance | gap % (${a}) | gap % (${b}) | better | moves (${a}) | moves (${b}) | peak RSS MB (${a} / ${b}) |`,
    "|---|---:|---:|---:|---:|---:|:---:|---:|---:|---:|",
  ];
  const cell = (r: Row): string => {
    const rec = r.record;
    if (rec.format === "tsplib") return String(rec.length);
    return `${rec.vehicles} / ${rec.distance.toFixed(2)}${rec.feasible ? "" : " (infeasible)"}`;
  };
  const wins = [0, 0, 0];
  for (const [ra, rb] of pairs) {
    const order = compareRows(ra, rb);
    wins[order < 0 ? 0 : order > 0 ? 1 : 2]!++;
    const ref = ra.referenceVehicles !== undefined ? `${ra.referenceVehicles} / ${ra.reference.toFixed(2)}` : String(ra.reference);
    lines.push(
      `| ${ra.instance} | ${ref} | ${cell(ra)} | ${cell(rb)} | ${pct(ra.gapPct)} | ${pct(rb.gapPct)} | ${order < 0 ? a : order > 0 ? b : "="} | ` +
        `${ra.moves.toLocaleString("en-US")} | ${rb.moves.toLocaleString("en-US")} | ${ra.peakRssMb.toFixed(0)} / ${rb.peakRssMb.toFixed(0)} |`,
    );
  }
  const vehicles = (rows: readonly Row[]): number => rows.reduce((s, r) => s + (r.vehicles ?? 0), 0);
  const as = pairs.map(([x]) => x);
  const bs = pairs.map(([, y]) => y);
  const best = as.reduce((s, r) => s + (r.referenceVehicles ?? 0), 0);
  // The mean gap over the instances where both runs reach the best-known vehicle count, so the two means are comparable.
  const matched = pairs.filter(([x, y]) => x.vehicles === x.referenceVehicles && y.vehicles === y.referenceVehicles);
  lines.push(`| **total vehicles** | ${best} | ${vehicles(as)} | ${vehicles(bs)} | | | | | | |`);
  lines.push(`| **mean gap %, all** | | | | ${pct(mean(as.map((r) => r.gapPct)))} | ${pct(mean(bs.map((r) => r.gapPct)))} | | | | |`);
  lines.push(
    `| **mean gap %, ${matched.length} instances where both reach the best-known vehicles** | | | | ${pct(mean(matched.map(([x]) => x.gapPct)))} | ${pct(mean(matched.map(([, y]) => y.gapPct)))} | | | | |`,
  );
  lines.push(`| **better on** | | | | | | ${a}: ${wins[0]}, ${b}: ${wins[1]}, equal: ${wins[2]} | | | |`);
  const infeasible = [as, bs].map((rows) => rows.filter((r) => !r.feasible).length);
  if (infeasible[0]! + infeasible[1]! > 0) lines.push(`| **infeasible plans** | | ${infeasible[0]} | ${infeasible[1]} | | | | | | |`);
  return lines.join("\n");
}

/** Hierarchical order of two bench rows: feasible first, then fewer vehicles, then shorter (0.005 tolerance). */
function compareRows(x: Row, y: Row): number {
  if (x.feasible !== y.feasible) return x.feasible ? -1 : 1;
  if ((x.vehicles ?? 0) !== (y.vehicles ?? 0)) return (x.vehicles ?? 0) - (y.vehicles ?? 0);
  return Math.abs(x.ours - y.ours) < 0.005 ? 0 : x.ours - y.ours;
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
