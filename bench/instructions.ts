/**
 * Machine instructions per move evaluation in a run, counted by valgrind (`cachegrind`, no cache
 * simulation): a count that moves by about 5% between runs of the same code (V8's compilation
 * and collection still depend on timing), against a fifth for seconds on this loaded machine, so
 * two versions compare by the median of a few runs (`--repeat N`, default 3). Each size runs
 * `bench/instructionRun.ts` at two move budgets; the difference in instructions over the
 * difference in evaluations is the cost of one evaluation in a run (accepted moves' rebuilds
 * and best-plan copies included, start-up and compilation excluded). V8 runs with
 * `--no-concurrent-recompilation`, else its compiler thread is starved under valgrind and the
 * loop runs unoptimised. An instruction is not a second: cache misses (the 5 000-stop day's
 * cost) are not counted, so quote `bench/moveEvaluations.ts` beside it.
 *
 * `--sizes 100,1000` (default 100), `--moves 300000,900000` (the two budgets), `--repeat 3`, `--label NAME`
 * writes `bench/results/instructions-NAME-<date>.json`. Skips with a reason when valgrind is
 * missing (it is not needed by the rest of the project).
 *
 * Run: npx tsx bench/instructions.ts --label after-change
 */
import { spawnSync } from "node:child_process";
import { benchEnvironment, writeResults } from "./results.js";

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(name);
  return at > 0 ? (process.argv[at + 1] ?? fallback) : fallback;
}

const sizes = arg("--sizes", "100").split(",").map(Number);
const budgets = arg("--moves", "300000,900000").split(",").map(Number);
const label = process.argv.includes("--label") ? arg("--label", "") : undefined;
const repeat = Math.max(1, Number(arg("--repeat", "3")) || 3);

if (spawnSync("valgrind", ["--version"]).status !== 0) {
  console.log("valgrind not found: instructions not counted (install valgrind to run this bench)");
  process.exit(0);
}

/** Instructions and evaluations of one run under valgrind. */
function count(n: number, moves: number): { instructions: number; evaluations: number } {
  const run = spawnSync(
    "valgrind",
    [
      "--tool=cachegrind",
      "--cache-sim=no",
      "--cachegrind-out-file=/dev/null",
      process.execPath,
      "--no-concurrent-recompilation",
      "--no-concurrent-osr",
      "--import",
      "tsx",
      new URL("./instructionRun.ts", import.meta.url).pathname,
      String(n),
      String(moves),
    ],
    { encoding: "utf8", maxBuffer: 1 << 26 },
  );
  const refs = /I\s+refs:\s+([\d,]+)/.exec(run.stderr);
  const evaluations = /evaluations=(\d+)/.exec(run.stdout);
  if (!refs || !evaluations) throw new Error(`valgrind run failed (${n} stops, ${moves} moves):\n${run.stderr.slice(-2000)}`);
  return { instructions: Number(refs[1]!.replaceAll(",", "")), evaluations: Number(evaluations[1]) };
}

function median(xs: readonly number[]): number {
  const v = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(v.length / 2);
  return v.length % 2 === 1 ? v[mid]! : (v[mid - 1]! + v[mid]!) / 2;
}

const rows = sizes.map((n) => {
  const runs = Array.from({ length: repeat }, () => {
    const [a, b] = budgets.map((m) => count(n, m));
    return {
      instructions: [a!.instructions, b!.instructions],
      evaluations: [a!.evaluations, b!.evaluations],
      instructionsPerEvaluation: Math.round((b!.instructions - a!.instructions) / (b!.evaluations - a!.evaluations)),
    };
  });
  return {
    stops: n,
    budgets,
    evaluations: runs[0]!.evaluations,
    instructionsPerEvaluation: median(runs.map((r) => r.instructionsPerEvaluation)),
    runs,
  };
});
console.log(
  `Instructions per move evaluation in a run (valgrind, budgets ${budgets.join(" and ")} moves, seed 1, median of ${repeat} runs):`,
);
console.log("| stops | evaluations | instructions per evaluation | runs |");
console.log("|---:|---:|---:|:---|");
for (const r of rows)
  console.log(
    `| ${r.stops} | ${r.evaluations.join(" / ")} | ${r.instructionsPerEvaluation.toLocaleString("en")} | ${r.runs.map((x) => x.instructionsPerEvaluation).join(", ")} |`,
  );
if (label)
  console.log(`Written ${writeResults(`instructions-${label}`, { bench: "instructions", environment: benchEnvironment(), rows })}`);
