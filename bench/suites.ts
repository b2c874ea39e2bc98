/**
 * `npm run bench`: runs the public benchmark suites of the benchmark folder (TSPLIB95 and
 * Solomon 1987) through the same path as `kiln bench`, prints a markdown table against the
 * published optima / best-known results, and writes the records to `bench/out/suites.json`.
 *
 *   npm run bench -- [--seconds S] [--only NAME,NAME] [--suite tsplib|solomon] [--seed N]
 *
 * Small GEO instances (burma14, ulysses16, ulysses22) always get 1 s; the others `--seconds`
 * (default 30). EUC_2D instances run only when named with `--only`. The benchmark folder is
 * `KILN_BENCHMARKS_DIR` when set, otherwise `../shared/benchmarks` beside the checkout.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { benchInstance, loadBenchFile, type SolomonBenchRecord, type TsplibBenchRecord } from "../src/cli/benchCommand.js";
import { Command } from "commander";
import { settingFlags } from "../src/cli/settingFlags.js";

const BENCHMARKS_DIR = process.env["KILN_BENCHMARKS_DIR"]
  ? resolve(process.env["KILN_BENCHMARKS_DIR"]) + "/"
  : fileURLToPath(new URL("../../shared/benchmarks/", import.meta.url));
const OUT_DIR = fileURLToPath(new URL("./out/", import.meta.url));
const SMALL_GEO = ["burma14", "ulysses16", "ulysses22"];
const LARGE_GEO = ["gr96", "gr202", "gr431"];

interface Row {
  record: SolomonBenchRecord | TsplibBenchRecord;
  reference: number;
  referenceVehicles?: number;
  gapPct: number;
  evaluationsPerSecond: number;
  evaluations: number;
}

async function runSuites(argv: string[]): Promise<number> {
  const program = new Command("bench/suites")
    .description(
      "Run the TSPLIB and Solomon suites of the benchmark folder (KILN_BENCHMARKS_DIR or ../shared/benchmarks) and print a table and JSON.",
    )
    .option("--seconds <S>", "seconds per large instance", "30")
    .option("--seed <N>", "seed of every run", "1")
    .option("--suite <NAME>", "tsplib or solomon (default both)")
    .option("--only <NAMES>", "comma-separated instance names")
    .exitOverride();
  try {
    program.parse(argv, { from: "user" });
  } catch {
    return 2;
  }
  const opts = program.opts<{ seconds: string; seed: string; suite?: string; only?: string }>();
  const errors: string[] = [];
  const flags = settingFlags({ seconds: opts.seconds, seed: opts.seed });
  errors.push(...flags.errors);
  const seconds = flags.overrides.seconds ?? 30;
  const seed = flags.overrides.seed ?? 1;
  const suite = opts.suite;
  if (suite !== undefined && suite !== "tsplib" && suite !== "solomon") errors.push(`--suite must be tsplib or solomon, got "${suite}"`);
  if (!existsSync(BENCHMARKS_DIR))
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
      jobs.push({ file: `tsplib/${name}.tsp`, seconds: SMALL_GEO.includes(name) ? 1 : seconds, name });
    }
  }
  if (suite !== "tsplib") {
    for (const [name] of bestKnown) {
      if (only && !only.includes(name.toLowerCase())) continue;
      jobs.push({ file: `solomon/${name}.txt`, seconds, name });
    }
  }
  if (jobs.length === 0) {
    process.stderr.write("no instance matches --only/--suite\n");
    return 2;
  }

  const rows: Row[] = [];
  for (const job of jobs) {
    const loaded = await loadBenchFile(BENCHMARKS_DIR + job.file);
    if ("errors" in loaded) {
      for (const e of loaded.errors) process.stderr.write(e + "\n");
      return 2;
    }
    process.stderr.write(`${job.name}: ${job.seconds} s ...\n`);
    const { record, stats } = benchInstance(loaded, { seed, budget: { seconds: job.seconds }, now: () => performance.now() });
    const elapsedS = stats.elapsedMs / 1000;
    const evaluationsPerSecond = elapsedS > 0 ? stats.evaluations / elapsedS : 0;
    if (record.format === "tsplib") {
      const reference = Number(optimal.find(([n]) => n === job.name)?.[1]);
      rows.push({ record, reference, gapPct: gap(record.length, reference), evaluationsPerSecond, evaluations: stats.evaluations });
    } else {
      const ref = bestKnown.find(([n]) => n === job.name);
      const reference = Number(ref?.[2]);
      rows.push({
        record,
        reference,
        referenceVehicles: Number(ref?.[1]),
        gapPct: gap(record.distance, reference),
        evaluationsPerSecond,
        evaluations: stats.evaluations,
      });
    }
  }

  process.stdout.write(table(rows) + "\n");
  mkdirSync(OUT_DIR, { recursive: true });
  writeFileSync(OUT_DIR + "suites.json", JSON.stringify({ seed, seconds, rows }, null, 2) + "\n");
  process.stderr.write("wrote bench/out/suites.json\n");
  return 0;
}

function table(rows: readonly Row[]): string {
  const lines = [
    "| instance | reference | ours | gap % | vehicles (ours / best-known) | seconds | evaluations/s |",
    "|---|---:|---:|---:|---:|---:|---:|",
  ];
  for (const r of rows) {
    const rec = r.record;
    const ours = rec.format === "tsplib" ? String(rec.length) : rec.distance.toFixed(2) + (rec.feasible ? "" : " (infeasible)");
    const vehicles = rec.format === "solomon" ? `${rec.vehicles} / ${r.referenceVehicles}` : "";
    const ref = rec.format === "tsplib" ? String(r.reference) : r.reference.toFixed(2);
    lines.push(
      `| ${rec.instance} | ${ref} | ${ours} | ${pct(r.gapPct)} | ${vehicles} | ${rec.seconds.toFixed(1)} | ${Math.round(r.evaluationsPerSecond).toLocaleString("en-US")} |`,
    );
  }
  const tsp = rows.filter((r) => r.record.format === "tsplib");
  const sol = rows.filter((r) => r.record.format === "solomon");
  if (tsp.length > 0) lines.push(`| **mean TSPLIB gap** | | | ${pct(mean(tsp.map((r) => r.gapPct)))} | | | |`);
  if (sol.length > 0) {
    const ours = sol.reduce((s, r) => s + (r.record as SolomonBenchRecord).vehicles, 0);
    const best = sol.reduce((s, r) => s + (r.referenceVehicles ?? 0), 0);
    const infeasible = sol.filter((r) => !(r.record as SolomonBenchRecord).feasible).length;
    lines.push(`| **mean Solomon gap** (distance) | | | ${pct(mean(sol.map((r) => r.gapPct)))} | | | |`);
    lines.push(`| **total vehicles** | | | | ${ours} / ${best} | | |`);
    if (infeasible > 0) lines.push(`| **infeasible plans** | | ${infeasible} of ${sol.length} | | | | |`);
  }
  return lines.join("\n");
}

/** Rows of a small CSV without quoting, header dropped, as [name, ...values]. */
function readCsv(relative: string): [string, ...string[]][] {
  return readFileSync(BENCHMARKS_DIR + relative, "utf8")
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
