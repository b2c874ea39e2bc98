import { placeKm } from "../geo/placeKm.js";
import { ROW_DEMAND, ROW_EARLIEST, ROW_LATEST, ROW_SERVICE } from "../schedule/compileProblem.js";
import {
  CUM_DIST,
  CUM_SVC,
  CUM_TRAV,
  CUM_WIN,
  LEG_MIN,
  PRE_D,
  PRE_E,
  PRE_L,
  PRE_TW,
  SUF_D,
  SUF_E,
  SUF_L,
  SUF_TW,
} from "../schedule/RouteArrays.js";
import { penalisedCost } from "./penalisedCost.js";
import { applyRouteRules } from "./routeRules.js";
import { R_COUNT, R_DIST, R_DUTY, R_ENDTW, R_EXCESS, R_MOVED, R_SIZE, R_STOPTW } from "./routeResults.js";
import type { SearchState } from "./SearchState.js";

/**
 * Penalised cost of vehicle `v` driving the concatenation of `m` pieces in `pieces`
 * (4 ints each: route, from, to, reversed; route -1: the one stop `from`); the route results
 * go to `state.out` at `slot`. Segment summaries are concatenated (Vidal et al. 2013,
 * `concatWindows`) without copying stops: forward prefixes and suffixes of the same vehicle
 * cost O(1); other pieces O(1) too when they hold no binding window (prefix sums), else
 * O(piece length). Allocation-free: this is the hot path. `concatWindows`' formulas are
 * written out here (the same operations), and the leg into a piece is computed in one place
 * for every kind of piece (a pool stop is a piece of one stop): a number passed to or returned
 * from a call the engine does not inline is boxed, which on a large day allocated some
 * 50 MB per second.
 *
 * @param state - the search state (routes, weights, scratch)
 * @param v - the vehicle that would drive the route
 * @param pieces - the pieces, 4 ints each
 * @param m - number of pieces
 * @param slot - 0 or 1: where in `state.out` the results go; the penalised cost (vehicle weight
 *   excluded) at `R_COST` (not returned: a number returned from a call the engine does not
 *   inline is boxed, an allocation per evaluation)
 */
export function evaluatePieces(state: SearchState, v: number, pieces: Int32Array, m: number, slot: number): void {
  const cp = state.cp;
  const L = cp.locationCount;
  const T = cp.travelMin;
  const Dm = cp.distanceKm;
  // On a large great-circle matrix the km are computed, not read (bitwise the same; `placeKm`).
  const P = cp.places;
  // Minutes from km when the matrix allows it (bitwise the stored minutes; one read per arc).
  const derived = cp.travelFromKm;
  const dv = cp.travelDivisor;
  const mu = cp.travelMultiplier;
  const f = cp.travelFactor[v]!;
  const dims = cp.dims;
  const load = state.scratchLoad;
  const routes = state.routes;
  const rows = cp.stopRows;
  const SR = cp.stopStride;
  let aD = 0;
  let aTW = 0;
  let aE = cp.shiftStartMin[v]!;
  let aL = cp.shiftEndMin[v]!;
  let dist = 0;
  let last = cp.startLoc[v]!;
  // The loads of the first three dimensions in locals (a day's dimensions plus the stop count
  // fit: most problems have one or two), further ones in `load`: a typed array element is read
  // and written through memory, with its bounds checked, at every piece.
  let q0 = 0;
  let q1 = 0;
  let q2 = 0;
  let k = 0;
  // The route's own prefix, from its window summaries (a route without windows keeps none: its
  // pieces are all summed from prefix sums below).
  const own = routes[v]!;
  if (m > 0 && pieces[0] === v && pieces[1] === 1 && pieces[3] === 0 && own.windowed) {
    const a = own.data;
    const j = pieces[2]!;
    const o = j * own.stride;
    aD = a[o + PRE_D]!;
    aTW = a[o + PRE_TW]!;
    aE = a[o + PRE_E]!;
    aL = a[o + PRE_L]!;
    dist = a[o + CUM_DIST]!;
    last = own.locs[j]!;
    const ol = o + own.oLoad;
    q0 = a[ol]!;
    if (dims > 1) {
      q1 = a[ol + 1]!;
      if (dims > 2) {
        q2 = a[ol + 2]!;
        for (let d = 3; d < dims; d++) load[d] = a[ol + d]!;
      }
    }
    k = 1;
  } else {
    for (let d = 3; d < dims; d++) load[d] = 0;
  }
  for (; k < m; k++) {
    const src = pieces[4 * k]!;
    const i = pieces[4 * k + 1]!;
    const j = pieces[4 * k + 2]!;
    const rev = pieces[4 * k + 3]! !== 0;
    // The leg into the piece (one place that computes or reads it, so that the engine inlines it).
    const r = src < 0 ? own : routes[src]!;
    const firstLoc = src < 0 ? cp.stopLoc[i]! : rev ? r.locs[j]! : r.locs[i]!;
    const kmIn = P ? placeKm(P, last, firstLoc) : Dm[last * L + firstLoc]!;
    const tIn = (derived ? (kmIn / dv) * mu : T[last * L + firstLoc]!) * f;
    // The piece's summary (d2, tw2, e2, l2) and where it ends.
    let d2: number;
    let tw2 = 0;
    let e2 = -Infinity;
    let l2 = Infinity;
    if (src < 0) {
      // One pool stop.
      const o = i * SR;
      d2 = rows[o + ROW_SERVICE]!;
      e2 = rows[o + ROW_EARLIEST]!;
      l2 = rows[o + ROW_LATEST]!;
      dist += kmIn;
      const od = o + ROW_DEMAND;
      q0 = q0 + rows[od]!;
      if (dims > 1) {
        q1 = q1 + rows[od + 1]!;
        if (dims > 2) {
          q2 = q2 + rows[od + 2]!;
          for (let d = 3; d < dims; d++) load[d] = load[d]! + rows[od + d]!;
        }
      }
      last = firstLoc;
    } else {
      const a = r.data;
      const S = r.stride;
      const oi = i * S;
      const oj = j * S;
      const sameSpeed = cp.travelFactor[src] === f;
      if (sameSpeed && !rev && j === r.len && r.windowed) {
        d2 = a[oi + SUF_D]!;
        tw2 = a[oi + SUF_TW]!;
        e2 = a[oi + SUF_E]!;
        l2 = a[oi + SUF_L]!;
      } else if (sameSpeed && a[oj + CUM_WIN]! - a[oi - S + CUM_WIN]! === 0) {
        d2 =
          a[oj + CUM_SVC]! - a[oi - S + CUM_SVC]! + (rev ? a[oj + r.oTravR]! - a[oi + r.oTravR]! : a[oj + CUM_TRAV]! - a[oi + CUM_TRAV]!);
      } else {
        // Walk the piece: binding windows or another speed. Its legs come from the route's own
        // copies of the matrix entries (forward into p, or reversed out of p + 1).
        const first = r.nodes[rev ? j : i]! * SR;
        d2 = rows[first + ROW_SERVICE]!;
        e2 = rows[first + ROW_EARLIEST]!;
        l2 = rows[first + ROW_LATEST]!;
        for (let q = 1; q <= j - i; q++) {
          const p = rev ? j - q : i + q;
          const s = r.nodes[p]! * SR;
          const t = (rev ? a[(p + 1) * S + r.oLegMinR]! : a[p * S + LEG_MIN]!) * f;
          const sd = rows[s + ROW_SERVICE]!;
          const se = rows[s + ROW_EARLIEST]!;
          const sl = rows[s + ROW_LATEST]!;
          // concatWindows(d2, tw2, e2, l2; t; sd, 0, se, sl), written out: the same operations.
          const delta = d2 - tw2 + t;
          const wait = Math.max(se - delta - l2, 0);
          const warp = Math.max(e2 + delta - sl, 0);
          d2 = d2 + (sd + t + wait);
          tw2 = tw2 + (0 + warp);
          e2 = Math.max(se - delta, e2) - wait;
          l2 = Math.min(sl - delta, l2) + warp;
        }
      }
      dist += kmIn + (rev ? a[oj + r.oDistR]! - a[oi + r.oDistR]! : a[oj + CUM_DIST]! - a[oi + CUM_DIST]!);
      const lj = oj + r.oLoad;
      const li = oi - S + r.oLoad;
      q0 = q0 + a[lj]! - a[li]!;
      if (dims > 1) {
        q1 = q1 + a[lj + 1]! - a[li + 1]!;
        if (dims > 2) {
          q2 = q2 + a[lj + 2]! - a[li + 2]!;
          for (let d = 3; d < dims; d++) load[d] = load[d]! + a[lj + d]! - a[li + d]!;
        }
      }
      last = rev ? r.locs[i]! : r.locs[j]!;
    }
    // concatWindows(aD, aTW, aE, aL; tIn; d2, tw2, e2, l2), written out: the same operations.
    const delta = aD - aTW + tIn;
    const wait = Math.max(e2 - delta - aL, 0);
    const warp = Math.max(aE + delta - l2, 0);
    aD = aD + (d2 + tIn + wait);
    aTW = aTW + (tw2 + warp);
    aE = Math.max(e2 - delta, aE) - wait;
    aL = Math.min(l2 - delta, aL) + warp;
  }
  // End depot: its lateness is overtime, kept apart from lateness at stops.
  const endLoc = cp.endLoc[v]!;
  const e = cp.endDepot[v]!;
  let kmEnd: number;
  let tEnd: number;
  if (e >= 0) {
    // The end depot's own table: one short row instead of a matrix column.
    const o = (e * L + last) * 2;
    kmEnd = cp.toEnd[o]!;
    tEnd = cp.toEnd[o + 1]! * f;
  } else {
    kmEnd = Dm[last * L + endLoc]!;
    tEnd = T[last * L + endLoc]! * f;
  }
  // The end depot is a segment of no duration whose window is the shift: concatWindows(aD, aTW,
  // aE, aL; tEnd; 0, 0, shift start, shift end) written out, of which the duration and the
  // warp added at the depot are used.
  const endDelta = aD - aTW + tEnd;
  const endWait = Math.max(cp.shiftStartMin[v]! - endDelta - aL, 0);
  const endTW = Math.max(aE + endDelta - cp.shiftEndMin[v]!, 0);
  const duration = aD + (0 + tEnd + endWait);
  dist += kmEnd;
  // Excess load summed over the dimensions in order, as the loop over `load` did.
  const cap = cp.capacity;
  const scale = cp.loadScale;
  const cv = v * dims;
  let excess = 0;
  let over = q0 - cap[cv]!;
  if (over > 0) excess += over / scale[0]!;
  if (dims > 1) {
    over = q1 - cap[cv + 1]!;
    if (over > 0) excess += over / scale[1]!;
    if (dims > 2) {
      over = q2 - cap[cv + 2]!;
      if (over > 0) excess += over / scale[2]!;
      for (let d = 3; d < dims; d++) {
        over = load[d]! - cap[cv + d]!;
        if (over > 0) excess += over / scale[d]!;
      }
    }
  }
  // The last dimension counts the stops.
  const count = dims === 1 ? q0 : dims === 2 ? q1 : dims === 3 ? q2 : load[dims - 1]!;
  const o = slot * R_SIZE;
  const out = state.out;
  out[o + R_COUNT] = m === 0 ? 0 : count;
  out[o + R_STOPTW] = aTW;
  out[o + R_ENDTW] = endTW;
  out[o + R_EXCESS] = excess;
  out[o + R_DIST] = dist;
  out[o + R_DUTY] = duration - aTW - endTW;
  out[o + R_MOVED] = 0;
  if (state.rulesOn[v]) applyRouteRules(state, v, pieces, m, slot);
  penalisedCost(state, v, out, o);
}
