import type { CompiledProblem } from "../schedule/compileProblem.js";

/** Each stop's k closest partners, row-major `n * k` (`-1` pads when fewer exist). */
export interface Neighbours {
  readonly k: number;
  readonly list: Int32Array;
  /**
   * When present, moves draw a stop's partner uniformly from these stops instead of from its
   * list (the granular neighbourhood switched off, `SolveOptions.granularNeighbours`).
   */
  readonly all?: Int32Array;
}

/** Weights of waiting and time warp in the proximity measure (Vidal et al. 2013 use 0.2 and 1). */
const WAIT_WEIGHT = 0.2;
const WARP_WEIGHT = 1;

/**
 * Granular neighbourhoods: for each stop, the k stops that are closest by travel time plus
 * the waiting and lateness that following one another would cause (window compatibility,
 * after Vidal, Crainic, Gendreau & Prins 2013, "A hybrid genetic algorithm with adaptive
 * diversity management ...", Computers & Operations Research 40(1)).
 *
 * @param cp - the compiled problem
 * @param k - neighbours per stop (default 20); capped at n - 1
 * @returns the neighbour lists, closest first
 * @throws RangeError when k is not a positive integer
 * @example buildNeighbours(cp, 20).list.subarray(0, 20) // => the 20 partners of stop 0
 */
export function buildNeighbours(cp: CompiledProblem, k: number = 20): Neighbours {
  if (!(Number.isInteger(k) && k >= 1)) throw new RangeError(`k must be a positive integer, got ${k}`);
  const n = cp.n;
  const kk = Math.max(1, Math.min(k, n - 1));
  const list = new Int32Array(n * kk).fill(-1);
  const bestScore = new Float64Array(kk);
  const L = cp.locationCount;
  for (let u = 0; u < n; u++) {
    let found = 0;
    const lu = cp.stopLoc[u]!;
    const eu = cp.earliestMin[u]!;
    const xu = cp.latestMin[u]!;
    const su = cp.serviceMin[u]!;
    for (let v = 0; v < n; v++) {
      if (v === u || cp.unservableReason[v]) continue;
      const lv = cp.stopLoc[v]!;
      const ev = cp.earliestMin[v]!;
      const xv = cp.latestMin[v]!;
      const tuv = cp.travelMin[lu * L + lv]!;
      const tvu = cp.travelMin[lv * L + lu]!;
      const forward = tuv + proximityPenalty(eu + su + tuv, ev, xu + su + tuv, xv);
      const backward = tvu + proximityPenalty(ev + cp.serviceMin[v]! + tvu, eu, xv + cp.serviceMin[v]! + tvu, xu);
      const score = Math.min(forward, backward);
      if (found === kk && score >= bestScore[kk - 1]!) continue;
      let p = found < kk ? found++ : kk - 1;
      while (p > 0 && bestScore[p - 1]! > score) {
        bestScore[p] = bestScore[p - 1]!;
        list[u * kk + p] = list[u * kk + p - 1]!;
        p--;
      }
      bestScore[p] = score;
      list[u * kk + p] = v;
    }
  }
  return { k: kk, list };
}

/**
 * The same lists with the granular neighbourhood switched off for moves: a move's partner is
 * any stop some vehicle can serve (`list` and `k` stay for construction and route elimination).
 *
 * @param cp - the compiled problem
 * @param nb - the granular lists
 * @returns neighbours whose moves pair any two servable stops
 * @example proposeMove(state, everyPartner(cp, nb), rng, mv)
 */
export function everyPartner(cp: CompiledProblem, nb: Neighbours): Neighbours {
  const all: number[] = [];
  for (let s = 0; s < cp.n; s++) if (!cp.unservableReason[s]) all.push(s);
  return { k: nb.k, list: nb.list, all: Int32Array.from(all) };
}

/**
 * Waiting and warp when service at the second stop follows the first: earliest arrival
 * `arriveEarly`, latest `arriveLate`, and the second window [e, l]. Infinite hulls add nothing.
 */
function proximityPenalty(arriveEarly: number, e: number, arriveLate: number, l: number): number {
  const wait = Number.isFinite(e) && Number.isFinite(arriveLate) ? Math.max(0, e - arriveLate) : 0;
  const warp = Number.isFinite(arriveEarly) && Number.isFinite(l) ? Math.max(0, arriveEarly - l) : 0;
  return WAIT_WEIGHT * wait + WARP_WEIGHT * warp;
}
