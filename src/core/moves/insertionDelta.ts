import type { SearchState } from "./SearchState.js";

/**
 * Cost change of inserting stop `s` into route `v` after position `cut` (0 = right after the
 * start depot), evaluated by concatenating the route's prefix, the stop and the suffix
 * (O(1) with the route's segment summaries; Vidal et al. 2013). The route is not changed;
 * the evaluation's other results stay in `state.out`.
 *
 * @param state - the search state
 * @param pieces - scratch buffer of at least 12 entries (three pieces of four)
 * @param v - route (vehicle) index
 * @param cut - insert after this many stops, 0..len
 * @param s - stop index
 * @returns penalised cost change of route v
 * @example insertionDelta(state, new Int32Array(12), 0, 0, 5) // cost of putting stop 5 first on route 0
 */
export function insertionDelta(state: SearchState, pieces: Int32Array, v: number, cut: number, s: number): number {
  const len = state.routes[v]!.len;
  let m = 0;
  if (cut >= 1) m = putPiece(pieces, m, v, 1, cut);
  m = putPiece(pieces, m, -1, s, s);
  if (cut < len) m = putPiece(pieces, m, v, cut + 1, len);
  return state.evaluate(v, pieces, m, 0) - state.routeCost(v);
}

/** Write piece m (route v, positions i..j, not reversed; route -1: stop i alone) and return m + 1. */
function putPiece(buf: Int32Array, m: number, v: number, i: number, j: number): number {
  buf[4 * m] = v;
  buf[4 * m + 1] = i;
  buf[4 * m + 2] = j;
  buf[4 * m + 3] = 0;
  return m + 1;
}
