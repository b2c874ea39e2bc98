/**
 * Move evaluations per second of the annealer's hot path on invented instances of 100, 1 000
 * and 5 000 stops (demo data: stops scattered around two depots, windows, two load
 * dimensions, vehicles of two speeds). Two figures per size: "raw" draws and evaluates moves
 * on the first plan without applying them; "in run" is a `createSolver` run of as many moves as
 * the raw rate makes in 2 s (a move budget: with a seconds budget the setup of a 5 000-stop run
 * would use up most of the time), whose evaluations are divided by the time spent in `step`
 * only (medians of `--repeat N` runs, default 5) (setup excluded; accepted moves, their route
 * rebuilds and best-plan copies included).
 *
 * `--rules pickups|limits|breaks|all` adds the dispatcher's rules to every instance (pickups at
 * every third stop; driving 8 h, duty 10 h, 300 km; a break of 45 min after 4.5 h of driving
 * and 30 min inside 12:00-13:30, invented values for the measurement only) to measure what they
 * cost; `--sizes 100,1000` picks the sizes.
 *
 * `--replan` measures re-planning a published day against planning from scratch on the same
 * instance: the earlier plan is the best plan of a 20 000-move run with every 20th stop left out
 * (stops added since), a stability cost of 20 and the first vehicle's route locked (invented
 * values for the measurement only); each size then gets a "plain" and a "re-plan" row, and the
 * figures also go to `bench/results/moveEvaluations-replan-<date>.json` with the machine's load.
 *
 * Sizes are interleaved (every size once per round), and the in-run rate of the largest size
 * over the smallest is printed with the table, taken within each round (median over rounds).
 * Every rate is given per wall second and per CPU second of this process (`process.cpuUsage`):
 * on a shared machine the wall figures follow the load, the CPU figures much less.
 * `--label NAME` also writes the figures to `bench/results/moveEvaluations-NAME-<date>.json`.
 *
 * Run: npx tsx bench/moveEvaluations.ts   (writes bench/out/moveEvaluations.json)
 */
import { mkdirSync, writeFileSync } from "node:fs";
import { createRandom } from "../src/core/anneal/createRandom.js";
import { initialWeights } from "../src/core/anneal/initialWeights.js";
import { constructPlan } from "../src/core/construct/constructPlan.js";
import type { Problem } from "../src/core/model.js";
import { Move, proposeMove } from "../src/core/moves/proposeMove.js";
import { SearchState } from "../src/core/moves/SearchState.js";
import { buildNeighbours } from "../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../src/core/schedule/compileProblem.js";
import { createSolver, solve } from "../src/core/solve.js";
import { loadavg } from "node:os";
import { benchEnvironment, writeResults } from "./results.js";
import { moveEvaluationsDay } from "./moveEvaluationsDay.js";

/** `--rules` of the command line: which of the dispatcher's rules to add. */
const rulesAt = process.argv.indexOf("--rules");
const RULES = rulesAt > 0 ? (process.argv[rulesAt + 1] ?? "none") : "none";
const sizesAt = process.argv.indexOf("--sizes");
const SIZES =
  sizesAt > 0
    ? (process.argv[sizesAt + 1] ?? "")
        .split(",")
        .map(Number)
        .filter((x) => x > 0)
    : [100, 1000, 5000];

function withRules(p: Problem, rules: string): Problem {
  const on = (r: string): boolean => rules === r || rules === "all";
  return {
    ...p,
    stops: p.stops.map((s, i) => (on("pickups") && i % 3 === 0 ? { ...s, pickup: [1 + (i % 7), i % 2] } : s)),
    vehicles: p.vehicles.map((v) => ({
      ...v,
      ...(on("limits") ? { maxDrivingMin: 480, maxDutyMin: 600, maxKm: 300 } : {}),
      ...(on("breaks")
        ? { drivingBreak: { driveMin: 270, breakMin: 45 }, windowBreak: { earliestMin: 720, latestMin: 810, breakMin: 30 } }
        : {}),
    })),
  };
}

/** `--replan`: the same instance re-planned from an earlier plan (see the header). */
const REPLAN = process.argv.includes("--replan");

function withEarlier(p: Problem): Problem {
  const published = solve(p, { seed: 1, budget: { moves: 20_000 } }).plan;
  const routes = p.vehicles.map((_, k) => (published.routes[k]?.visits ?? []).map((v) => v.stop).filter((i) => i % 20 !== 19));
  return { ...p, earlier: { routes, stabilityCost: 20, locked: [0] } };
}

/** CPU milliseconds of this process so far (user + system). */
function cpuMs(): number {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
}

function raw(problem: Problem, seconds: number): { wall: number; cpu: number } {
  const cp = compileProblem(problem);
  const w = initialWeights(cp);
  const state = new SearchState(cp, w.wTime, w.wLoad);
  const nb = buildNeighbours(cp, 20);
  constructPlan(state, nb);
  const rng = createRandom(1);
  const mv = new Move();
  const active = Int32Array.from({ length: cp.n }, (_, i) => i);
  let evaluations = 0;
  const start = performance.now();
  const cpuStart = cpuMs();
  let sink = 0;
  while (performance.now() - start < seconds * 1000) {
    for (let k = 0; k < 10_000; k++) {
      if (proposeMove(state, nb, rng, mv, active)) {
        evaluations++;
        sink += mv.delta;
      }
    }
  }
  if (Number.isNaN(sink)) console.warn("NaN delta seen");
  const wallMs = performance.now() - start;
  return { wall: evaluations / (wallMs / 1000), cpu: evaluations / ((cpuMs() - cpuStart) / 1000) };
}

/** Repetitions per size (`--repeat N`, default 5): the table gives medians, the JSON every run. */
const repeatAt = process.argv.indexOf("--repeat");
const REPEAT = repeatAt > 0 ? Math.max(1, Number(process.argv[repeatAt + 1]) || 5) : 5;

function inRun(problem: Problem, moves: number): { perSecond: number; perCpuSecond: number; cost: number; feasible: boolean } {
  const solver = createSolver(problem, { seed: 1, budget: { moves } });
  let stepMs = 0;
  let stepCpuMs = 0;
  for (;;) {
    const t = performance.now();
    const c = cpuMs();
    const done = solver.step(20_000);
    stepMs += performance.now() - t;
    stepCpuMs += cpuMs() - c;
    if (done) break;
  }
  const result = solver.result();
  const e = result.stats.evaluations;
  return {
    perSecond: e / (stepMs / 1000),
    perCpuSecond: e / (stepCpuMs / 1000),
    cost: result.plan.totals.cost,
    feasible: result.plan.feasible,
  };
}

function median(values: readonly number[]): number {
  const v = [...values].sort((a, b) => a - b);
  const mid = Math.floor(v.length / 2);
  return v.length % 2 === 1 ? v[mid]! : (v[mid - 1]! + v[mid]!) / 2;
}

const loadBefore = loadavg()[0]!;
const rows: {
  mode: "plain" | "re-plan";
  stops: number;
  vehicles: number;
  rawPerSecond: number;
  inRunPerSecond: number;
  rawPerCpuSecond: number;
  inRunPerCpuSecond: number;
  runCost: number;
  feasible: boolean;
  rawRuns: number[];
  inRunRuns: number[];
  rawCpuRuns: number[];
  inRunCpuRuns: number[];
}[] = [];
// Every size in each round (sizes interleaved), so that a change in the machine's load between
// rounds touches every size alike and the ratio of two sizes can be taken within one round.
const cases = SIZES.flatMap((n) => {
  const plain = withRules(moveEvaluationsDay(n), RULES);
  return (REPLAN ? (["plain", "re-plan"] as const) : (["plain"] as const)).map((mode) => ({
    n,
    mode,
    problem: mode === "plain" ? plain : withEarlier(plain),
    rawRuns: [] as number[],
    inRunRuns: [] as number[],
    rawCpuRuns: [] as number[],
    inRunCpuRuns: [] as number[],
    last: { perSecond: 0, perCpuSecond: 0, cost: 0, feasible: false },
  }));
});
for (let r = 0; r < REPEAT; r++) {
  for (const c of cases) {
    const r = raw(c.problem, 1);
    c.rawRuns.push(Math.round(r.wall));
    c.rawCpuRuns.push(Math.round(r.cpu));
    c.last = inRun(c.problem, Math.max(10_000, 2 * c.rawRuns[c.rawRuns.length - 1]!));
    c.inRunRuns.push(Math.round(c.last.perSecond));
    c.inRunCpuRuns.push(Math.round(c.last.perCpuSecond));
  }
}
for (const c of cases)
  rows.push({
    mode: c.mode,
    stops: c.n,
    vehicles: c.problem.vehicles.length,
    rawPerSecond: Math.round(median(c.rawRuns)),
    inRunPerSecond: Math.round(median(c.inRunRuns)),
    rawPerCpuSecond: Math.round(median(c.rawCpuRuns)),
    inRunPerCpuSecond: Math.round(median(c.inRunCpuRuns)),
    runCost: Math.round(c.last.cost),
    feasible: c.last.feasible,
    rawRuns: c.rawRuns,
    inRunRuns: c.inRunRuns,
    rawCpuRuns: c.rawCpuRuns,
    inRunCpuRuns: c.inRunCpuRuns,
  });
// In-run rate of the largest size over the smallest, within each round (plain mode), median.
const plainCases = cases.filter((c) => c.mode === "plain");
const smallest = plainCases[0];
const largest = plainCases[plainCases.length - 1];
const ratios = smallest && largest && largest !== smallest ? largest.inRunRuns.map((x, r) => x / smallest.inRunRuns[r]!) : [];
const cpuRatios = smallest && largest && largest !== smallest ? largest.inRunCpuRuns.map((x, r) => x / smallest.inRunCpuRuns[r]!) : [];
console.log(
  `Medians of ${REPEAT} runs per size (raw: 1 s each; in run: a createSolver run of about 2 s of moves each); rules: ${RULES}${REPLAN ? "; plain and re-plan" : ""}.`,
);
console.log(
  "| mode | stops | vehicles | raw evaluations/s | in-run evaluations/s | raw per CPU second | in-run per CPU second | in-run plan cost | feasible |",
);
console.log("|:---|---:|---:|---:|---:|---:|---:|---:|:---|");
const fmt = (x: number): string => x.toLocaleString("en");
for (const r of rows)
  console.log(
    `| ${r.mode} | ${r.stops} | ${r.vehicles} | ${fmt(r.rawPerSecond)} | ${fmt(r.inRunPerSecond)} | ${fmt(r.rawPerCpuSecond)} | ${fmt(r.inRunPerCpuSecond)} | ${r.runCost} | ${r.feasible} |`,
  );
const percent = (xs: number[]): string => xs.map((x) => `${(100 * x).toFixed(0)}%`).join(", ");
if (ratios.length > 0)
  console.log(
    `In-run rate at ${largest!.n} stops over ${smallest!.n} stops: ${(100 * median(ratios)).toFixed(0)}% per wall second, ${(100 * median(cpuRatios)).toFixed(0)}% per CPU second (ratio within each round, median of ${ratios.length}: ${percent(ratios)}; per CPU second ${percent(cpuRatios)})`,
  );
mkdirSync(new URL("./out/", import.meta.url), { recursive: true });
writeFileSync(
  new URL("./out/moveEvaluations.json", import.meta.url),
  JSON.stringify(
    {
      node: process.version,
      rules: RULES,
      replan: REPLAN,
      rows,
      inRunRatioLargestToSmallest: ratios,
      inRunCpuRatioLargestToSmallest: cpuRatios,
    },
    null,
    2,
  ),
);
/** `--label NAME` (or `--replan`): the figures also go to `bench/results/moveEvaluations-<label>-<date>.json`. */
const labelAt = process.argv.indexOf("--label");
const LABEL = labelAt > 0 ? process.argv[labelAt + 1] : REPLAN ? "replan" : undefined;
if (LABEL) {
  const path = writeResults(`moveEvaluations-${LABEL}`, {
    bench: `moveEvaluations${REPLAN ? " --replan" : ""}`,
    environment: benchEnvironment(),
    // The machine may be shared: its 1-minute load average before and after, for reading the figures.
    loadAverage1m: { before: Math.round(loadBefore * 10) / 10, after: Math.round(loadavg()[0]! * 10) / 10 },
    repeat: REPEAT,
    rules: RULES,
    rows,
    inRunRatioLargestToSmallest: { rounds: ratios, median: ratios.length > 0 ? median(ratios) : null },
    inRunCpuRatioLargestToSmallest: { rounds: cpuRatios, median: cpuRatios.length > 0 ? median(cpuRatios) : null },
  });
  console.log(`Written ${path}`);
}
