/**
 * Independent annealing chains, the part every adapter shares (the CLI's worker threads and the
 * pane's Web Workers): the seed of each chain, which chain's plan is kept, and one progress for
 * all of them. Chain k solves with `chainSeed(seed, k)` and the full budget; the plan kept is the
 * best by the solver's own order (`comparePlans`), ties to the lowest chain index, so the same
 * seed, move budget and number of chains give the same plan wherever they run, and chain 0 is
 * the run one chain would make.
 */
import { comparePlans } from "./comparePlans.js";
import type { Plan, Problem } from "./model.js";
import type { Progress } from "./options.js";

/**
 * The seed of chain k: the run's seed itself for chain 0, a seed derived from it otherwise.
 *
 * @param seed - the run's seed
 * @param chain - chain index from 0
 * @returns the chain's seed
 * @example chainSeed(7, 0) // => 7; chainSeed(7, 2) // => "7/chain 2"
 */
export function chainSeed(seed: number | string, chain: number): number | string {
  return chain === 0 ? seed : `${seed}/chain ${chain}`;
}

/**
 * The chain whose plan a run keeps: the best by `comparePlans`, the lowest index among equals.
 *
 * @param problem - the problem every chain solved
 * @param plans - each chain's final plan, by chain index (at least one)
 * @returns the index of the kept plan
 * @throws RangeError when `plans` is empty
 * @example keptChain(problem, [planOfChain0, planOfChain1]) // => 1 when chain 1's plan is better
 */
export function keptChain(problem: Problem, plans: readonly Plan[]): number {
  if (plans.length === 0) throw new RangeError("keptChain needs the plan of at least one chain");
  let best = 0;
  for (let k = 1; k < plans.length; k++) if (comparePlans(problem, plans[k]!, plans[best]!) < 0) best = k;
  return best;
}

/**
 * One progress of several chains: the moves of all, the best cost any chain has found, the
 * budget fraction and elapsed time of the slowest chain, chain 0's temperature and phase (every
 * chain follows the same schedule) and the mean acceptance shares.
 *
 * @param latest - each chain's latest progress (undefined before its first report)
 * @returns the combined progress (fraction 0 until every chain has reported)
 * @example combineProgress([p0, p1]).bestCost // => Math.min(p0.bestCost, p1.bestCost)
 */
export function combineProgress(latest: readonly (Progress | undefined)[]): Progress {
  const ps = latest.filter((p): p is Progress => p !== undefined);
  const worse = ps.map((p) => p.worseAccepted).filter((w): w is number => w !== undefined);
  return {
    moves: ps.reduce((s, p) => s + p.moves, 0),
    fraction: ps.length < latest.length ? 0 : Math.min(...ps.map((p) => p.fraction)),
    temperature: (latest[0] ?? ps[0])?.temperature ?? 0,
    currentCost: Math.min(...ps.map((p) => p.currentCost)),
    bestCost: Math.min(...ps.map((p) => p.bestCost)),
    acceptanceRate: mean(ps.map((p) => p.acceptanceRate)),
    ...(worse.length > 0 ? { worseAccepted: mean(worse) } : {}),
    elapsedMs: Math.max(0, ...ps.map((p) => p.elapsedMs)),
    ...((latest[0] ?? ps[0])?.phase !== undefined ? { phase: (latest[0] ?? ps[0])!.phase } : {}),
  };
}

function mean(xs: readonly number[]): number {
  return xs.length > 0 ? xs.reduce((s, x) => s + x, 0) / xs.length : 0;
}
