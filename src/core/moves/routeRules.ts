import type { CompiledProblem } from "../schedule/compileProblem.js";
import { CUM_TRAV } from "../schedule/RouteArrays.js";
import { scheduleRoute } from "../schedule/timeRoute.js";
import { R_DIST, R_DUTY, R_ENDTW, R_EXCESS, R_MOVED, R_SIZE, R_STOPTW } from "./routeResults.js";
import type { SearchState } from "./SearchState.js";

/**
 * The dispatcher's rules on a candidate route, after `evaluatePieces` has concatenated its
 * time and distance summaries; rewrites the results at `slot` of `state.out`.
 *
 * - Pickups: the load on board changes along the route, so capacity must hold at every
 *   point. A segment is summarised by its deliveries D, pickups P and highest load M
 *   ("deliveries still to make in it + pickups made in it"); A then B gives
 *   D = D1 + D2, P = P1 + P2, M = max(M1 + D2, P1 + M2) (the load-feasibility concatenation
 *   for simultaneous pickup and delivery). Same-vehicle prefixes and suffixes are O(1)
 *   from `RouteArrays`, other pieces are walked.
 * - Limits on driving minutes (legs summed per piece in O(1)), duty minutes and km: the
 *   excess counts as time warp.
 * - Breaks: the route's stops are laid out and timed exactly by `scheduleRoute` (O(route
 *   length)), which then gives the duty, lateness, overtime and any broken break rule.
 * - Re-planning (O(route length)): the stops whose earlier vehicle was another one are counted
 *   (each costs the stability cost), and the stops that were on this vehicle before must keep
 *   their earlier order: each one that comes after a stop it used to precede counts as
 *   `ORDER_PENALTY_MIN` minutes of time warp, so the best feasible plan keeps the order.
 *
 * @param state - the search state
 * @param v - the vehicle
 * @param pieces - the pieces, 4 ints each (route, from, to, reversed; route -1: one pool stop)
 * @param m - number of pieces
 * @param slot - where the results are in `state.out`
 */
export function applyRouteRules(state: SearchState, v: number, pieces: Int32Array, m: number, slot: number): void {
  const cp = state.cp;
  const out = state.out;
  const o = slot * R_SIZE;
  if (m === 0) return;
  if (cp.anyPickup) out[o + R_EXCESS] = pickupExcess(state, v, pieces, m);
  let over = 0;
  const count = cp.hasBreaks[v] || cp.replanning ? layOut(state, pieces, m) : 0;
  if (cp.replanning) over += keepEarlier(state, v, count, o);
  if (cp.hasBreaks[v]) {
    const t = scheduleRoute(cp.problem, v, state.rulesStops, count, false);
    out[o + R_STOPTW] = t.lateMin;
    out[o + R_DUTY] = t.returnMin - t.departureMin;
    over += t.overtimeMin + t.breakViolationMin;
    if (cp.maxDrivingMin[v]! < Infinity) over += Math.max(0, t.drivingMin - cp.maxDrivingMin[v]!);
  } else {
    over += out[o + R_ENDTW]!;
    if (cp.maxDrivingMin[v]! < Infinity) over += Math.max(0, drivingMin(state, v, pieces, m) - cp.maxDrivingMin[v]!);
  }
  over += Math.max(0, out[o + R_DUTY]! - cp.maxDutyMin[v]!) + Math.max(0, out[o + R_DIST]! - cp.maxKm[v]!);
  out[o + R_ENDTW] = over;
}

/** True when some rule of this module applies to vehicle `v`. */
export function hasRouteRules(cp: CompiledProblem, v: number): boolean {
  return (
    cp.replanning ||
    cp.anyPickup ||
    cp.hasBreaks[v] === 1 ||
    cp.maxDrivingMin[v]! < Infinity ||
    cp.maxDutyMin[v]! < Infinity ||
    cp.maxKm[v]! < Infinity
  );
}

/** Minutes of time warp that one stop out of its earlier order counts as (large enough to steer the search back). */
export const ORDER_PENALTY_MIN = 60;

/**
 * Count the laid-out route's stops that changed vehicle into `out[o + R_MOVED]`; return the
 * order penalty of the stops that stayed (home stops appearing below an earlier rank).
 */
function keepEarlier(state: SearchState, v: number, count: number, o: number): number {
  const cp = state.cp;
  const stops = state.rulesStops;
  let moved = 0;
  let outOfOrder = 0;
  let lastRank = -1;
  for (let k = 0; k < count; k++) {
    const s = stops[k]!;
    const h = cp.homeVehicle[s]!;
    if (h < 0) continue;
    if (h !== v) moved++;
    else {
      const rank = cp.homeRank[s]!;
      if (rank < lastRank) outOfOrder++;
      else lastRank = rank;
    }
  }
  state.out[o + R_MOVED] = moved;
  return outOfOrder * ORDER_PENALTY_MIN;
}

/** Copy the candidate route's stops into `state.rulesStops`; returns how many. */
function layOut(state: SearchState, pieces: Int32Array, m: number): number {
  return state.materialise(pieces, m, state.rulesStops);
}

/** Minutes of driving of the candidate route: legs between pieces, prefix sums inside them. */
function drivingMin(state: SearchState, v: number, pieces: Int32Array, m: number): number {
  const cp = state.cp;
  const L = cp.locationCount;
  const T = cp.travelMin;
  const f = cp.travelFactor[v]!;
  let last = cp.startLoc[v]!;
  let total = 0;
  for (let k = 0; k < m; k++) {
    const src = pieces[4 * k]!;
    const i = pieces[4 * k + 1]!;
    if (src < 0) {
      const loc = cp.stopLoc[i]!;
      total += T[last * L + loc]! * f;
      last = loc;
      continue;
    }
    const j = pieces[4 * k + 2]!;
    const rev = pieces[4 * k + 3]! !== 0;
    const r = state.routes[src]!;
    const firstLoc = rev ? r.locs[j]! : r.locs[i]!;
    total += T[last * L + firstLoc]! * f;
    const a = r.data;
    const S = r.stride;
    const inside = rev ? a[j * S + r.oTravR]! - a[i * S + r.oTravR]! : a[j * S + CUM_TRAV]! - a[i * S + CUM_TRAV]!;
    total += (inside * f) / cp.travelFactor[src]!;
    last = rev ? r.locs[i]! : r.locs[j]!;
  }
  return total + T[last * L + cp.endLoc[v]!]! * f;
}

/** Highest load over capacity at any point, in `loadScale` units, plus stops over `maxStops`. */
function pickupExcess(state: SearchState, v: number, pieces: Int32Array, m: number): number {
  const cp = state.cp;
  const dims = cp.dims;
  const D = state.rulesLoad;
  const P = state.rulesPick;
  const M = state.rulesMax;
  for (let d = 0; d < dims; d++) D[d] = P[d] = M[d] = 0;
  for (let k = 0; k < m; k++) {
    const src = pieces[4 * k]!;
    const i = pieces[4 * k + 1]!;
    if (src < 0) {
      for (let d = 0; d < dims; d++) join(D, P, M, d, cp.demand[i * dims + d]!, cp.pickup[i * dims + d]!, -1);
      continue;
    }
    const j = pieces[4 * k + 2]!;
    const rev = pieces[4 * k + 3]! !== 0;
    const r = state.routes[src]!;
    const whole = (i: number, j: number, d: number): number =>
      r.data[j * r.stride + r.oLoad + d]! - r.data[(i - 1) * r.stride + r.oLoad + d]!;
    const picked = (i: number, j: number, d: number): number => r.prePick[j * dims + d]! - r.prePick[(i - 1) * dims + d]!;
    if (!rev && i === 1) {
      for (let d = 0; d < dims; d++) join(D, P, M, d, whole(1, j, d), picked(1, j, d), r.preMax[j * dims + d]!);
    } else if (!rev && j === r.len) {
      for (let d = 0; d < dims; d++) join(D, P, M, d, whole(i, j, d), picked(i, j, d), r.sufMax[i * dims + d]!);
    } else {
      for (let q = 0; q <= j - i; q++) {
        const s = r.nodes[rev ? j - q : i + q]!;
        for (let d = 0; d < dims; d++) join(D, P, M, d, cp.demand[s * dims + d]!, cp.pickup[s * dims + d]!, -1);
      }
    }
  }
  let excess = 0;
  for (let d = 0; d < dims - 1; d++) {
    const o = M[d]! - cp.capacity[v * dims + d]!;
    if (o > 0) excess += o / cp.loadScale[d]!;
  }
  const stops = D[dims - 1]! - cp.capacity[v * dims + dims - 1]!;
  return excess + (stops > 0 ? stops / cp.loadScale[dims - 1]! : 0);
}

/** Append a segment (deliveries q, pickups p, highest load mx; -1: one stop) to the running summary. */
function join(D: Float64Array, P: Float64Array, M: Float64Array, d: number, q: number, p: number, mx: number): void {
  const m2 = mx < 0 ? Math.max(q, p) : mx;
  M[d] = Math.max(M[d]! + q, P[d]! + m2);
  D[d] = D[d]! + q;
  P[d] = P[d]! + p;
}
