import type { Neighbours } from "../neighbours/buildNeighbours.js";
import { insertionDelta } from "../moves/insertionDelta.js";
import { RESULT_SIZE, RESULT_VIOL, type SearchState } from "../moves/SearchState.js";

/** Routes up to this length are tried at every position; longer ones next to the stop's neighbours. */
const FULL_SCAN_LEN = 60;
/** Fleets up to this size are tried route by route for every stop; larger ones near its neighbours first. */
const ALL_ROUTES_UP_TO = 30;

/**
 * A first plan by sequential cheapest insertion (Solomon 1987, "Algorithms for the vehicle
 * routing and scheduling problems with time window constraints", Operations Research 35(2),
 * in its simplest form): stops far from the depots first; each goes where it adds the least
 * cost without breaking a rule, into a route already in use when the objective is
 * hierarchical, else into a new route; when nothing fits, where it costs least with penalties.
 * An optional stop stays unserved when serving it costs more than its unserved cost.
 *
 * @param state - a state whose servable stops are all in the pool; changed in place
 * @param nb - neighbour lists (candidate positions in long routes)
 * @example constructPlan(state, nb); state.poolSize // => optional stops not worth serving
 */
export function constructPlan(state: SearchState, nb: Neighbours): void {
  const cp = state.cp;
  const V = cp.vehicleCount;
  const L = cp.locationCount;
  const order: number[] = [];
  for (let s = 0; s < cp.n; s++) if (state.routeOf[s] === -1) order.push(s);
  const far = (s: number): number => {
    let best = Infinity;
    for (let v = 0; v < V; v++) best = Math.min(best, cp.travelMin[cp.startLoc[v]! * L + cp.stopLoc[s]!]!);
    return best;
  };
  const key = order.map((s) => -far(s));
  const idx = order.map((_, i) => i).sort((a, b) => key[a]! - key[b]! || order[a]! - order[b]!);
  const pieces = new Int32Array(12);
  const rStatsViol = (v: number): number => state.rStats[v * RESULT_SIZE + RESULT_VIOL]!;
  for (const i of idx) {
    const s = order[i]!;
    let bestFeasible = Infinity;
    let bestFeasibleAt = -1;
    let bestFeasibleRoute = -1;
    let bestAny = Infinity;
    let bestAnyAt = -1;
    let bestAnyRoute = -1;
    let openCost = Infinity;
    let openRoute = -1;
    const tryAt = (v: number, cut: number): void => {
      const r = state.routes[v]!;
      const delta = insertionDelta(state, pieces, v, cut, s);
      const addedViol = state.out[RESULT_VIOL]! - rStatsViol(v);
      if (r.len === 0) {
        if (addedViol < 1e-9 && delta < openCost) {
          openCost = delta;
          openRoute = v;
        }
      } else if (addedViol < 1e-9 && delta < bestFeasible) {
        bestFeasible = delta;
        bestFeasibleAt = cut;
        bestFeasibleRoute = v;
      }
      const withVehicle = delta + (r.len === 0 ? state.vehicleWeight : 0);
      if (withVehicle < bestAny) {
        bestAny = withVehicle;
        bestAnyAt = cut;
        bestAnyRoute = v;
      }
    };
    // Routes holding one of the stop's neighbours first; all routes only when none of them fits.
    const seenRoute = new Set<number>();
    let triedEmpty = false;
    const tryRoute = (v: number): void => {
      if (seenRoute.has(v) || !cp.compatible[s * V + v]) return;
      seenRoute.add(v);
      const r = state.routes[v]!;
      if (r.len === 0) {
        // Identical empty vehicles give the same result: the first compatible one stands for all.
        if (!triedEmpty || cp.anyIncompatible) tryAt(v, 0);
        triedEmpty = true;
      } else if (r.len <= FULL_SCAN_LEN) {
        for (let cut = 0; cut <= r.len; cut++) tryAt(v, cut);
      } else {
        tryAt(v, 0);
        for (let k = 0; k < nb.k; k++) {
          const w = nb.list[s * nb.k + k]!;
          if (w >= 0 && state.routeOf[w] === v) {
            tryAt(v, state.posOf[w]!);
            tryAt(v, state.posOf[w]! - 1);
          }
        }
      }
    };
    for (let k = 0; k < nb.k; k++) {
      const w = nb.list[s * nb.k + k]!;
      if (w >= 0 && state.routeOf[w]! >= 0) tryRoute(state.routeOf[w]!);
    }
    if (V <= ALL_ROUTES_UP_TO) for (let v = 0; v < V; v++) if (state.routes[v]!.len > 0) tryRoute(v);
    if (bestFeasibleRoute < 0 || !cp.hierarchical) {
      for (let v = 0; v < V && !(triedEmpty && !cp.anyIncompatible); v++) if (state.routes[v]!.len === 0) tryRoute(v);
    }
    if (bestFeasibleRoute < 0 && openRoute < 0) for (let v = 0; v < V; v++) if (state.routes[v]!.len > 0) tryRoute(v);
    let route = -1;
    let at = 0;
    let cost = Infinity;
    if (bestFeasibleRoute >= 0 && (cp.hierarchical || bestFeasible <= openCost)) {
      route = bestFeasibleRoute;
      at = bestFeasibleAt;
      cost = bestFeasible;
    } else if (openRoute >= 0) {
      route = openRoute;
      cost = openCost;
    } else if (bestAnyRoute >= 0) {
      route = bestAnyRoute;
      at = bestAnyAt;
      cost = bestAny;
    }
    if (route < 0 || (cp.optional[s] && cost > cp.unservedCost[s]!)) continue;
    const stops = state.routes[route]!.stops();
    stops.splice(at, 0, s);
    state.setRoute(route, stops);
  }
}
