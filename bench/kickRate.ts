/**
 * Kicks per CPU second of the kick phase (`KickSearch`) on a TSPLIB instance, from the plan of a
 * short annealing run (kick phase off), and the gap it reaches: for comparing two versions of
 * the phase from the same start. Prints one line per seed and writes nothing.
 *
 *   npx tsx bench/kickRate.ts FILE.tsp OPTIMUM [--seconds 5] [--seeds 1,2,3] [--start-moves 2000000]
 */
import { readFileSync } from "node:fs";
import { cpuUsage } from "node:process";
import { createRandom } from "../src/core/anneal/createRandom.js";
import { parseTsplib, tsplibToProblem } from "../src/core/formats/index.js";
import { SearchState } from "../src/core/moves/SearchState.js";
import { buildNeighbours } from "../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../src/core/schedule/compileProblem.js";
import { BestPlan } from "../src/core/search/BestPlan.js";
import { KickSearch } from "../src/core/search/kickSearch.js";
import { solve } from "../src/core/solve.js";

const args = process.argv.slice(2);
const flag = (name: string, fallback: string): string => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1]! : fallback;
};
const [file, optimumText] = args;
if (!file || !optimumText) throw new Error("usage: kickRate.ts FILE.tsp OPTIMUM [--seconds S] [--seeds 1,2] [--start-moves M]");
const optimum = Number(optimumText);
const seconds = Number(flag("seconds", "5"));
const startMoves = Number(flag("start-moves", "2000000"));
const problem = tsplibToProblem(parseTsplib(readFileSync(file, "utf8")));
const cpuSeconds = (): number => {
  const u = cpuUsage();
  return (u.user + u.system) / 1e6;
};
for (const seed of flag("seeds", "1").split(",").map(Number)) {
  const start = solve(problem, { seed, budget: { moves: startMoves }, kickPhase: false }).plan;
  const cp = compileProblem(problem);
  const state = new SearchState(cp, 1, 1);
  for (const r of start.routes)
    if (r.visits.length > 0)
      state.setRoute(
        r.vehicle,
        r.visits.map((v) => v.stop),
      );
  const best = new BestPlan(problem, cp);
  best.consider(state);
  const active = Int32Array.from({ length: cp.n }, (_, s) => s);
  const search = new KickSearch(state, buildNeighbours(cp, 20), active, createRandom(seed), false, () => best.consider(state));
  const t0 = cpuSeconds();
  let used = 0;
  while (cpuSeconds() - t0 < seconds) {
    const got = search.run(Number.MAX_SAFE_INTEGER, 20_000);
    used += got;
    if (got === 0) break;
  }
  const s = cpuSeconds() - t0;
  const gap = (100 * (best.key2 - optimum)) / optimum;
  console.log(
    `seed ${seed}: start ${start.totals.distanceKm.toFixed(0)} -> ${best.key2.toFixed(0)} (gap ${gap.toFixed(2)}%), ${search.kicks} kicks in ${s.toFixed(1)} CPU s = ${(search.kicks / s).toFixed(0)}/s, ${(used / search.kicks).toFixed(0)} evaluations per kick, kept ${search.kept}`,
  );
}
