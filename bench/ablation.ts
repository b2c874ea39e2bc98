/**
 * `npm run bench:ablation`: what each part of the engine buys. The six reference instances
 * (TSPLIB95 burma14, ulysses16, ulysses22; Solomon 1987 C101, R101, RC201) from
 * ../shared/benchmarks when present (or KILN_BENCHMARKS_DIR), else the committed copies in
 * test/fixtures/reference, each solved at equal time by
 *   - the engine as shipped (one chain),
 *   - the engine with each part switched off in turn by its `SolveOptions` switch (granular
 *     neighbourhood, O(1) move evaluation, route minimisation, adaptive penalties, kick phase), and
 *   - a plain textbook annealer (bench/textbookAnnealer.ts).
 * Prints a markdown table and writes bench/results/ablation-<date>.json.
 *
 *   npm run bench:ablation -- [--seconds S] [--seed N] [--cpu-clock]
 *
 * `--cpu-clock` counts the seconds in CPU time of this process, so every variant gets the same
 * work on a loaded machine.
 */
import { existsSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Command } from "commander";
import { benchRecord, loadBenchFile, type BenchInstance } from "../src/cli/benchCommand.js";
import { settingFlags } from "../src/cli/settingFlags.js";
import { type ChainOptions, runChains } from "../src/cli/chains.js";
import { solomonToProblem, tsplibToProblem, type Plan } from "../src/core/index.js";
import { BENCHMARKS_DIR } from "./benchmarksDir.js";
import { benchEnvironment, cpuClock, rssSampler, writeResults } from "./results.js";
import { textbookAnneal } from "./textbookAnnealer.js";

const INSTANCES = [
  ["tsplib", "burma14", "tsp"],
  ["tsplib", "ulysses16", "tsp"],
  ["tsplib", "ulysses22", "tsp"],
  ["solomon", "C101", "txt"],
  ["solomon", "R101", "txt"],
  ["solomon", "RC201", "txt"],
] as const;

const FIXTURES = fileURLToPath(new URL("../test/fixtures/reference/", import.meta.url));

/** Engine variants: each switchable part off in turn (the ablation switches of `SolveOptions`). */
const VARIANTS: readonly { name: string; options: ChainOptions }[] = [
  { name: "engine", options: {} },
  { name: "no granular neighbours", options: { granularNeighbours: false } },
  { name: "no O(1) evaluation", options: { incrementalEvaluation: false } },
  { name: "no route minimisation", options: { routeMinimisation: false } },
  { name: "no adaptive penalties", options: { adaptivePenalties: false } },
  { name: "no kick phase", options: { kickPhase: false } },
];

interface AblationRow {
  instance: string;
  variant: string;
  reference: number;
  ours: number;
  gapPct: number;
  vehicles?: number;
  referenceVehicles?: number;
  feasible: boolean;
  seconds: number;
  moves: number;
  evaluationsPerSecond: number;
  peakRssMb: number;
  workers: number;
}

function references(dir: { tsplib: string; solomon: string }): Map<string, { value: number; vehicles?: number }> {
  const out = new Map<string, { value: number; vehicles?: number }>();
  const rows = (file: string): string[][] =>
    existsSync(file)
      ? readFileSync(file, "utf8")
          .split(/\r?\n/)
          .slice(1)
          .filter((l) => l.trim() !== "")
          .map((l) => l.split(",").map((c) => c.trim()))
      : [];
  for (const [name = "", value = ""] of rows(dir.tsplib + "optimal.csv")) out.set(name, { value: Number(value) });
  for (const [name = "", vehicles = "", value = ""] of rows(dir.solomon + "best-known.csv"))
    out.set(name, { value: Number(value), vehicles: Number(vehicles) });
  return out;
}

async function main(argv: string[]): Promise<number> {
  const program = new Command("bench/ablation")
    .option("--seconds <S>", "seconds per run (every variant gets the same)", "10")
    .option("--seed <N>", "seed of every run", "1")
    .option("--cpu-clock", "count seconds of this process's CPU time instead of wall time")
    .exitOverride();
  try {
    program.parse(argv, { from: "user" });
  } catch {
    return 2;
  }
  const opts = program.opts<{ seconds: string; seed: string; cpuClock?: boolean }>();
  const flags = settingFlags({ seconds: opts.seconds, seed: opts.seed });
  if (flags.errors.length > 0) {
    for (const e of flags.errors) process.stderr.write(e + "\n");
    return 2;
  }
  const seconds = flags.overrides.seconds ?? 10;
  const seed = flags.overrides.seed ?? 1;
  const shared = existsSync(BENCHMARKS_DIR + "solomon/C101.txt");
  const dir = shared
    ? { tsplib: BENCHMARKS_DIR + "tsplib/", solomon: BENCHMARKS_DIR + "solomon/" }
    : { tsplib: FIXTURES, solomon: FIXTURES };
  process.stderr.write(`instances from ${shared ? BENCHMARKS_DIR : FIXTURES}\n`);
  const refs = references(dir);
  const now = opts.cpuClock ? cpuClock() : (): number => performance.now();

  const rows: AblationRow[] = [];
  for (const [suite, name, ext] of INSTANCES) {
    const loaded = await loadBenchFile(`${dir[suite]}${name}.${ext}`);
    if ("errors" in loaded) {
      for (const e of loaded.errors) process.stderr.write(e + "\n");
      return 2;
    }
    const problem = loaded.format === "tsplib" ? tsplibToProblem(loaded.inst) : solomonToProblem(loaded.inst);
    const ref = refs.get(name) ?? { value: NaN };
    const add = (variant: string, plan: Plan, moves: number, evaluations: number, elapsedMs: number, peakRssMb: number): void => {
      const record = benchRecord(loaded as BenchInstance, problem, plan, { seed, elapsedMs, moves });
      const ours = record.format === "tsplib" ? record.length : Math.round(record.distance * 100) / 100;
      rows.push({
        instance: name,
        variant,
        reference: ref.value,
        ours,
        gapPct: ((ours - ref.value) / ref.value) * 100,
        ...(record.format === "solomon" ? { vehicles: record.vehicles, referenceVehicles: ref.vehicles ?? NaN } : {}),
        feasible: record.format === "tsplib" ? plan.feasible : record.feasible,
        seconds: Math.round(elapsedMs / 10) / 100,
        moves,
        evaluationsPerSecond: elapsedMs > 0 ? Math.round(evaluations / (elapsedMs / 1000)) : 0,
        peakRssMb,
        workers: 1,
      });
    };
    for (const v of VARIANTS) {
      process.stderr.write(`${name}: ${v.name}, ${seconds} s ...\n`);
      const rss = rssSampler();
      const { plan, stats } = await runChains(problem, { seed, budget: { seconds }, ...v.options }, 1, { now });
      add(v.name, plan, stats.moves, stats.evaluations, stats.elapsedMs, rss.stop());
    }
    process.stderr.write(`${name}: textbook annealer, ${seconds} s ...\n`);
    // The textbook annealer never yields, so its peak is sampled at its start and end only.
    const rss = rssSampler();
    const tb = textbookAnneal(problem, { seed, seconds, now });
    add("textbook annealer", tb.plan, tb.moves, tb.moves, tb.elapsedMs, rss.stop());
  }

  const lines = [
    `Ablation at equal time: ${seconds} ${opts.cpuClock ? "CPU" : "wall"} seconds per run, seed ${seed}, one core.`,
    "",
    "| instance | variant | reference | ours | gap % | vehicles (ours / best-known) | feasible | moves | evaluations/s | peak RSS MB |",
    "|---|---|---:|---:|---:|---:|---|---:|---:|---:|",
    ...rows.map(
      (r) =>
        `| ${r.instance} | ${r.variant} | ${r.reference} | ${r.ours} | ${r.gapPct.toFixed(2)} | ${r.vehicles !== undefined ? `${r.vehicles} / ${r.referenceVehicles}` : ""} | ` +
        `${r.feasible ? "yes" : "**no**"} | ${r.moves.toLocaleString("en-US")} | ${r.evaluationsPerSecond.toLocaleString("en-US")} | ${r.peakRssMb.toFixed(0)} |`,
    ),
  ];
  // The peak RSS is the process's: the samples of one run include what earlier runs left allocated.
  const environment = benchEnvironment();
  lines.push(`Node ${environment.node}, ${environment.cpuModel} (${environment.cpuCount} cores).`);
  process.stdout.write(lines.join("\n") + "\n");
  const written = writeResults("ablation", { bench: "ablation", environment, seed, seconds, clock: opts.cpuClock ? "cpu" : "wall", rows });
  process.stderr.write(`wrote ${written}\n`);
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`bench/ablation: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
