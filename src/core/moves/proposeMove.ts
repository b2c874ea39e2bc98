import type { Random } from "../anneal/createRandom.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import type { CompiledProblem } from "../schedule/compileProblem.js";
import { MAX_PIECES, RESULT_COUNT, RESULT_SIZE, type SearchState } from "./SearchState.js";

/** The kinds of move between two placed stops, drawn uniformly (pool and open-route moves are drawn before). */
export const MoveKind = {
  relocateAfter: 0,
  relocateBefore: 1,
  swap: 2,
  twoOpt: 3,
  orOpt: 4,
} as const;

/** A proposed move: the new content of one or two routes as pieces, and pool changes. */
export class Move {
  vA = -1;
  mA = 0;
  readonly piecesA = new Int32Array(4 * MAX_PIECES);
  vB = -1;
  mB = 0;
  readonly piecesB = new Int32Array(4 * MAX_PIECES);
  /** Stop that leaves the pool (-1 none) and stop that enters it (-1 none). */
  poolIn = -1;
  poolOut = -1;
  /** The stop drawn and its partner (read by tests and the ablation checks). */
  u = -1;
  v = -1;
  /** Change of the penalised total cost. */
  delta = 0;
  /** Change of the number of used vehicles. */
  usedDelta = 0;
}

/**
 * Draw one random move from the granular neighbourhood: a stop u at random, one of its
 * k nearest partners v, then a move that relates u and v (relocate, swap, 2-opt, 2-opt*,
 * or-opt of 2-3 stops; pool moves; opening an empty route), and compute its cost change
 * without touching the routes. Within a route, 2-opt and or-opt always make u and v
 * neighbours, on either side, so the legs from and to the depot can change too.
 *
 * @param state - current solution
 * @param nb - neighbour lists
 * @param rng - the run's generator
 * @param mv - filled in
 * @param active - the stops that may move (default: all; stops no vehicle can serve are skipped anyway)
 * @returns false when the drawn combination is not a valid move (nothing to evaluate)
 * @example if (proposeMove(state, nb, rng, mv) && mv.delta < 0) applyMove(state, mv)
 */
export function proposeMove(state: SearchState, nb: Neighbours, rng: Random, mv: Move, active?: Int32Array): boolean {
  // Evaluated in one place after the pieces are drawn: so the engine inlines the evaluation here
  // once, and the small `piece` calls into `betweenRoutes` and `withinRoute` (evaluating at every
  // return of those used up their inlining budget, and each piece was a call).
  return drawMove(state, nb, rng, mv, active) && finish(state, mv);
}

/** The draw of `proposeMove`: the move's pieces and pool changes, not yet evaluated; false when invalid. */
function drawMove(state: SearchState, nb: Neighbours, rng: Random, mv: Move, active?: Int32Array): boolean {
  const cp = state.cp;
  const u = active ? active[rng.int(active.length)]! : rng.int(cp.n);
  if (state.routeOf[u]! < -1) return false;
  const v = nb.all ? nb.all[rng.int(nb.all.length)]! : nb.list[u * nb.k + rng.int(nb.k)]!;
  mv.u = u;
  mv.v = v;
  if (v < 0 || v === u) return false;
  mv.poolIn = -1;
  mv.poolOut = -1;
  mv.vB = -1;
  mv.mB = 0;
  const ru = state.routeOf[u]!;
  const rv = state.routeOf[v]!;
  const A = mv.piecesA;
  const B = mv.piecesB;
  const V = cp.vehicleCount;
  if (ru < 0) {
    if (rv < 0) return false;
    // Insert u from the pool next to v.
    if (!mayServe(cp, u, rv)) return false;
    const q = state.posOf[v]!;
    const len = state.routes[rv]!.len;
    const after = rng.next() < 0.5;
    const cut = after ? q : q - 1;
    let m = 0;
    m = piece(A, m, rv, 1, cut, 0);
    m = single(A, m, u);
    m = piece(A, m, rv, cut + 1, len, 0);
    mv.vA = rv;
    mv.mA = m;
    mv.poolIn = u;
    return true;
  }
  const p = state.posOf[u]!;
  const ra = state.routes[ru]!;
  const a = ra.len;
  const roll = rng.next();
  if (cp.optional[u] && roll < 0.05) {
    let m = piece(A, 0, ru, 1, p - 1, 0);
    if (rv === -1) {
      // Serve v instead of u.
      if (!mayServe(cp, v, ru)) return false;
      m = single(A, m, v);
      mv.poolIn = v;
    }
    // Otherwise u only leaves for the pool.
    mv.vA = ru;
    mv.mA = piece(A, m, ru, p + 1, a, 0);
    mv.poolOut = u;
    return true;
  }
  if (roll < 0.07 && state.used < V) {
    // Open an empty route with u.
    const w = rng.int(V);
    if (state.routes[w]!.len !== 0 || !mayServe(cp, u, w)) return false;
    let m = piece(A, 0, ru, 1, p - 1, 0);
    m = piece(A, m, ru, p + 1, a, 0);
    mv.vA = ru;
    mv.mA = m;
    mv.vB = w;
    mv.mB = piece(B, 0, ru, p, p, 0);
    return true;
  }
  if (rv < 0) return false;
  const q = state.posOf[v]!;
  const rb = state.routes[rv]!;
  const b = rb.len;
  const kind = rng.int(5);
  return ru !== rv ? betweenRoutes(state, rng, mv, kind, u, v, ru, rv, p, q, a, b) : withinRoute(state, rng, mv, kind, ru, p, q, a);
}

/** A move of `proposeMove` between u's route `ru` (u at `p`, `a` stops) and v's route `rv` (v at `q`, `b` stops). */
function betweenRoutes(
  state: SearchState,
  rng: Random,
  mv: Move,
  kind: number,
  u: number,
  v: number,
  ru: number,
  rv: number,
  p: number,
  q: number,
  a: number,
  b: number,
): boolean {
  const cp = state.cp;
  const A = mv.piecesA;
  const B = mv.piecesB;
  mv.vA = ru;
  mv.vB = rv;
  switch (kind) {
    case MoveKind.relocateAfter:
    case MoveKind.relocateBefore: {
      if (!mayServe(cp, u, rv)) return false;
      const cut = kind === MoveKind.relocateAfter ? q : q - 1;
      mv.mA = piece(A, piece(A, 0, ru, 1, p - 1, 0), ru, p + 1, a, 0);
      let m = piece(B, 0, rv, 1, cut, 0);
      m = piece(B, m, ru, p, p, 0);
      mv.mB = piece(B, m, rv, cut + 1, b, 0);
      break;
    }
    case MoveKind.swap: {
      if (!mayServe(cp, u, rv) || !mayServe(cp, v, ru)) return false;
      let m = piece(A, 0, ru, 1, p - 1, 0);
      m = piece(A, m, rv, q, q, 0);
      mv.mA = piece(A, m, ru, p + 1, a, 0);
      m = piece(B, 0, rv, 1, q - 1, 0);
      m = piece(B, m, ru, p, p, 0);
      mv.mB = piece(B, m, rv, q + 1, b, 0);
      break;
    }
    case MoveKind.twoOpt: {
      // 2-opt*: exchange tails so that u is followed by v (or v by u).
      if (rng.next() < 0.5) {
        if (!fits(state, rv, q, b, ru) || !fits(state, ru, p + 1, a, rv)) return false;
        mv.mA = piece(A, piece(A, 0, ru, 1, p, 0), rv, q, b, 0);
        mv.mB = piece(B, piece(B, 0, rv, 1, q - 1, 0), ru, p + 1, a, 0);
      } else {
        if (!fits(state, ru, p, a, rv) || !fits(state, rv, q + 1, b, ru)) return false;
        mv.mA = piece(A, piece(A, 0, ru, 1, p - 1, 0), rv, q + 1, b, 0);
        mv.mB = piece(B, piece(B, 0, rv, 1, q, 0), ru, p, a, 0);
      }
      break;
    }
    default: {
      const c = 2 + rng.int(2);
      if (p + c - 1 > a || !fits(state, ru, p, p + c - 1, rv)) return false;
      const rev = rng.next() < 0.5 ? 1 : 0;
      mv.mA = piece(A, piece(A, 0, ru, 1, p - 1, 0), ru, p + c, a, 0);
      let m = piece(B, 0, rv, 1, q, 0);
      m = piece(B, m, ru, p, p + c - 1, rev);
      mv.mB = piece(B, m, rv, q + 1, b, 0);
    }
  }
  return true;
}

/** A move of `proposeMove` inside route `ru` (`a` stops) between u at `p` and v at `q`. */
function withinRoute(state: SearchState, rng: Random, mv: Move, kind: number, ru: number, p: number, q: number, a: number): boolean {
  const A = mv.piecesA;
  mv.vA = ru;
  let m = 0;
  switch (kind) {
    case MoveKind.relocateAfter:
    case MoveKind.relocateBefore: {
      const cut = kind === MoveKind.relocateAfter ? q : q - 1;
      if (cut === p || cut === p - 1) return false;
      if (p < cut) {
        m = piece(A, m, ru, 1, p - 1, 0);
        m = piece(A, m, ru, p + 1, cut, 0);
        m = piece(A, m, ru, p, p, 0);
        m = piece(A, m, ru, cut + 1, a, 0);
      } else {
        m = piece(A, m, ru, 1, cut, 0);
        m = piece(A, m, ru, p, p, 0);
        m = piece(A, m, ru, cut + 1, p - 1, 0);
        m = piece(A, m, ru, p + 1, a, 0);
      }
      break;
    }
    case MoveKind.swap: {
      const lo = Math.min(p, q);
      const hi = Math.max(p, q);
      m = piece(A, m, ru, 1, lo - 1, 0);
      m = piece(A, m, ru, hi, hi, 0);
      m = piece(A, m, ru, lo + 1, hi - 1, 0);
      m = piece(A, m, ru, lo, lo, 0);
      m = piece(A, m, ru, hi + 1, a, 0);
      break;
    }
    case MoveKind.twoOpt: {
      // 2-opt (Croes 1958): reverse a stretch so that u and v become neighbours on the route.
      // With lo < hi their positions: reversing lo+1..hi makes the edges (lo, hi) and
      // (lo+1, hi+1); reversing lo..hi-1 makes (lo-1, hi-1) and (lo, hi). Both add the
      // edge u-v, drawn with equal chance.
      const lo = Math.min(p, q);
      const hi = Math.max(p, q);
      const successors = rng.next() < 0.5;
      const from = successors ? lo + 1 : lo;
      const to = successors ? hi : hi - 1;
      if (to <= from) return false;
      m = piece(A, m, ru, 1, from - 1, 0);
      m = piece(A, m, ru, from, to, 1);
      m = piece(A, m, ru, to + 1, a, 0);
      break;
    }
    default: {
      // Or-opt (Or 1976): a chain of 2 or 3 stops that starts or ends at u moves next to v,
      // after or before it, turned so that u and v become neighbours on the route.
      const c = 2 + rng.int(2);
      const after = rng.next() < 0.5;
      const startsAtU = rng.next() < 0.5;
      const first = startsAtU ? p : p - c + 1;
      const last = first + c - 1;
      if (first < 1 || last > a || (q >= first && q <= last)) return false;
      // After v, u leads the chain; before v, u ends it.
      const rev = after === startsAtU ? 0 : 1;
      const cut = after ? q : q - 1;
      if ((cut === first - 1 || cut === last) && !rev) return false;
      if (cut < first) {
        m = piece(A, m, ru, 1, cut, 0);
        m = piece(A, m, ru, first, last, rev);
        m = piece(A, m, ru, cut + 1, first - 1, 0);
        m = piece(A, m, ru, last + 1, a, 0);
      } else {
        m = piece(A, m, ru, 1, first - 1, 0);
        m = piece(A, m, ru, last + 1, cut, 0);
        m = piece(A, m, ru, first, last, rev);
        m = piece(A, m, ru, cut + 1, a, 0);
      }
    }
  }
  mv.mA = m;
  return true;
}

/**
 * Apply a move that `proposeMove` evaluated last (its route results are still in `state.out`).
 *
 * @param state - current solution, changed in place
 * @param mv - the move
 */
export function applyMove(state: SearchState, mv: Move): void {
  if (mv.poolIn >= 0) state.removeFromPool(mv.poolIn);
  state.apply(mv.vA, mv.piecesA, mv.mA, mv.vB, mv.piecesB, mv.mB);
  if (mv.poolOut >= 0) state.addToPool(mv.poolOut);
}

function finish(state: SearchState, mv: Move): boolean {
  const cA = state.evaluate(mv.vA, mv.piecesA, mv.mA, 0);
  let delta = cA - state.routeCost(mv.vA);
  let used = (state.out[RESULT_COUNT]! > 0 ? 1 : 0) - (state.routeCount(mv.vA) > 0 ? 1 : 0);
  if (mv.vB >= 0) {
    const cB = state.evaluate(mv.vB, mv.piecesB, mv.mB, 1);
    delta += cB - state.routeCost(mv.vB);
    used += (state.out[RESULT_SIZE + RESULT_COUNT]! > 0 ? 1 : 0) - (state.routeCount(mv.vB) > 0 ? 1 : 0);
  }
  const cp = state.cp;
  if (mv.poolIn >= 0) delta -= cp.unservedCost[mv.poolIn]!;
  if (mv.poolOut >= 0) delta += cp.unservedCost[mv.poolOut]!;
  mv.usedDelta = used;
  mv.delta = delta + state.vehicleWeight * used;
  return true;
}

/**
 * Append the piece (route, i..j, reversed when `rev` is 1) to `buf` when it holds a stop.
 *
 * @returns the new number of pieces
 * @example m = piece(mv.piecesA, m, r, 1, p - 1, 0)
 */
export function piece(buf: Int32Array, m: number, route: number, i: number, j: number, rev: number): number {
  if (i > j) return m;
  const o = 4 * m;
  buf[o] = route;
  buf[o + 1] = i;
  buf[o + 2] = j;
  buf[o + 3] = rev;
  return m + 1;
}

function single(buf: Int32Array, m: number, stop: number): number {
  const o = 4 * m;
  buf[o] = -1;
  buf[o + 1] = stop;
  buf[o + 2] = stop;
  buf[o + 3] = 0;
  return m + 1;
}

/** May every stop at positions i..j of route r go on vehicle w? */
function fits(state: SearchState, r: number, i: number, j: number, w: number): boolean {
  const cp = state.cp;
  if (!cp.anyIncompatible) return true;
  const nodes = state.routes[r]!.nodes;
  for (let p = i; p <= j; p++) if (!mayServe(cp, nodes[p]!, w)) return false;
  return true;
}

/** May vehicle `w` serve stop `s`? The table is read only for a stop some vehicle may not serve. */
function mayServe(cp: CompiledProblem, s: number, w: number): boolean {
  return cp.everyVehicle[s] === 1 || cp.compatible[s * cp.vehicleCount + w] === 1;
}
