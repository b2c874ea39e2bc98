import type { Random } from "../../src/core/anneal/createRandom.js";
import type { SearchState } from "../../src/core/moves/SearchState.js";

/**
 * A random first plan for move tests: every stop, in stop order, on a vehicle drawn from `rng`;
 * a stop for which `leaveOut` is true stays in the pool (it is asked before the draw, so the
 * draws are the same as a loop that tests it first).
 *
 * @param state - the search state whose routes are set
 * @param rng - the test's random generator
 * @param leaveOut - which stops to leave unplanned (default: none)
 */
export function randomStart(state: SearchState, rng: Random, leaveOut: (stop: number) => boolean = () => false): void {
  const cp = state.cp;
  const init: number[][] = Array.from({ length: cp.vehicleCount }, () => []);
  for (let s = 0; s < cp.n; s++) if (!leaveOut(s)) init[rng.int(cp.vehicleCount)]!.push(s);
  init.forEach((r, v) => state.setRoute(v, r));
}

/**
 * The stops `0..n-1` in a random order (a Fisher-Yates shuffle from the end), for a random
 * tour in tests.
 *
 * @param n - number of stops
 * @param rng - the test's random generator
 * @returns the shuffled stop numbers
 * @example state.setRoute(0, randomOrder(cp.n, createRandom(1)))
 */
export function randomOrder(n: number, rng: Random): number[] {
  const order = Array.from({ length: n }, (_, s) => s);
  for (let i = order.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}
