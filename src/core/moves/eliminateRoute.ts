import type { Random } from "../anneal/createRandom.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import { insertionDelta } from "./insertionDelta.js";
import type { SearchState } from "./SearchState.js";

/** Routes up to this length are tried at every position; longer ones next to the stop's neighbours. */
const FULL_SCAN_LEN = 60;

/**
 * Route elimination for the vehicles-first objective: empty a short used route (the shorter
 * of two drawn at random) and put each of its stops, in random order, where it raises the penalised cost least
 * in the other used routes (time warp and excess allowed, so the annealer can repair them
 * afterwards, in the spirit of the route-minimisation phase of Nagata & Bräysy 2009,
 * "A powerful route minimization heuristic for the vehicle routing problem with time windows",
 * Operations Research Letters 37(5)). Stops no other route may take stay in the pool.
 *
 * @param state - current solution, changed in place
 * @param nb - neighbour lists
 * @param rng - the run's generator
 * @returns the emptied route, or -1 when fewer than two routes are in use
 */
export function eliminateRoute(state: SearchState, nb: Neighbours, rng: Random): number {
  const cp = state.cp;
  const V = cp.vehicleCount;
  // Tournament of two random used routes, the shorter loses: mostly small routes, not always the same one.
  let victim = -1;
  if (state.used >= 2) {
    for (let t = 0; t < 2; t++) {
      let pick = rng.int(state.used);
      for (let v = 0; v < V; v++) {
        if (state.routes[v]!.len === 0) continue;
        if (pick-- === 0) {
          if (cp.locked[v]) break;
          if (victim < 0 || state.routes[v]!.len < state.routes[victim]!.len) victim = v;
          break;
        }
      }
    }
  }
  if (victim < 0 || state.used < 2) return -1;
  const stops = state.emptyRoute(victim);
  for (let i = stops.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [stops[i], stops[j]] = [stops[j]!, stops[i]!];
  }
  const pieces = new Int32Array(12);
  for (const s of stops) {
    let best = Infinity;
    let bestRoute = -1;
    let bestCut = 0;
    const tryAt = (v: number, cut: number): void => {
      const delta = insertionDelta(state, pieces, v, cut, s);
      if (delta < best) {
        best = delta;
        bestRoute = v;
        bestCut = cut;
      }
    };
    for (let v = 0; v < V; v++) {
      const route = state.routes[v]!;
      if (v === victim || route.len === 0 || !cp.compatible[s * V + v]) continue;
      if (route.len <= FULL_SCAN_LEN) {
        for (let cut = 0; cut <= route.len; cut++) tryAt(v, cut);
      } else {
        for (let k = 0; k < nb.k; k++) {
          const w = nb.list[s * nb.k + k]!;
          if (w >= 0 && state.routeOf[w] === v) {
            tryAt(v, state.posOf[w]!);
            tryAt(v, state.posOf[w]! - 1);
          }
        }
      }
    }
    if (bestRoute < 0) continue;
    const route = state.routes[bestRoute]!;
    const next = route.stops();
    next.splice(bestCut, 0, s);
    state.setRoute(bestRoute, next);
  }
  return victim;
}
