import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";

/**
 * The vehicle of a plan whose cost is a sum of symmetric arc costs over its one route, whatever
 * the order of its stops: then a tour can be improved on the arc costs alone (`TourDescent`).
 * Every condition is checked on the compiled problem and the current plan, and any doubt gives
 * -1 (the generic evaluation is then used):
 *
 * - exactly one route in use, no stop in the pool, and every stop of the route may move (the
 *   stops `active` are the route's stops, the vehicle is not locked);
 * - the route starts and ends at the same place, and every arc between its places costs bitwise
 *   the same both ways, km and minutes (`CompiledProblem.symmetric`, or on a matrix too large for
 *   that scan the route's own arcs compared): a tour then costs the same in either direction;
 * - no rule that depends on the order (`SearchState.rulesOn`: pickups, breaks, limits on driving,
 *   duty or km, re-planning), and no stop with a window that can bind, so nobody waits or is late;
 *   loads are delivered only, so an excess of load is the same in any order;
 * - the shift is long enough for any order: the service minutes plus, for each place, its
 *   longest arc out (at the vehicle's speed) fit between the shift's start and end, so no order
 *   runs into overtime.
 *
 * The route's cost is then the vehicle's fixed cost, its cost per hour of the service minutes
 * (both the same in any order), and per arc `costPerKm * km + costPerHour * minutes / 60`.
 *
 * @param state - the search state
 * @param active - the stops that may move
 * @param nb - the neighbour lists (the granular lists; none when every stop is a partner)
 * @returns the vehicle, or -1 when the plan is not such a tour
 * @example tourVehicle(state, active, nb) // => 0 on a TSPLIB instance's tour
 */
export function tourVehicle(state: SearchState, active: Int32Array, nb: Neighbours): number {
  const cp = state.cp;
  if (nb.all || state.used !== 1 || state.poolSize !== 0) return -1;
  let v = -1;
  for (let r = 0; r < state.routes.length; r++) if (state.routes[r]!.len > 0) v = r;
  if (v < 0) return -1;
  const route = state.routes[v]!;
  const len = route.len;
  if (active.length !== len || cp.locked[v] || state.rulesOn[v] || cp.startLoc[v] !== cp.endLoc[v]) return -1;
  for (let i = 0; i < active.length; i++) if (state.routeOf[active[i]!] !== v) return -1;
  const costPerKm = cp.costPerKm[v]!;
  const perMin = cp.costPerHour[v]! / 60;
  if (!(Number.isFinite(costPerKm) && Number.isFinite(perMin))) return -1;
  const L = cp.locationCount;
  const f = cp.travelFactor[v]!;
  let longest = 0;
  for (let p = 0; p <= len; p++) {
    const a = p === 0 ? cp.startLoc[v]! : route.locs[p]!;
    if (p > 0 && cp.windowed[route.nodes[p]!]) return -1;
    if (p > 0) longest += cp.serviceMin[route.nodes[p]!]!;
    if (cp.shiftEndMin[v] === Infinity) continue;
    let out = 0;
    for (let q = 0; q <= len; q++) {
      const b = q === 0 ? cp.startLoc[v]! : route.locs[q]!;
      out = Math.max(out, cp.travelMin[a * L + b]! * f);
    }
    longest += out;
  }
  if (!(cp.shiftEndMin[v]! - cp.shiftStartMin[v]! >= longest)) return -1;
  return cp.symmetric || symmetricRoute(state, v) ? v : -1;
}

/**
 * Whether every arc between the places of route `v` (its stops and its depot) costs bitwise
 * the same both ways, km and minutes: the check `CompiledProblem.symmetric` leaves out on a
 * matrix of more than 2 048 places, here over the route's places only (once per kick phase).
 */
function symmetricRoute(state: SearchState, v: number): boolean {
  const cp = state.cp;
  const route = state.routes[v]!;
  const L = cp.locationCount;
  const km = cp.distanceKm;
  const min = cp.travelMin;
  for (let p = 0; p <= route.len; p++) {
    const a = p === 0 ? cp.startLoc[v]! : route.locs[p]!;
    for (let q = p + 1; q <= route.len; q++) {
      const b = route.locs[q]!;
      if (km[a * L + b] !== km[b * L + a] || min[a * L + b] !== min[b * L + a]) return false;
    }
  }
  return true;
}

/** Most stops of a segment moved by or-opt. */
const OR_OPT_MOST = 3;

/**
 * Most evaluations `TourDescent.improve` uses at one stop with `neighbours` neighbours: per
 * direction and neighbour, the look, a 2-opt and two places for each chain length.
 *
 * @param neighbours - neighbours looked at
 * @returns the bound
 * @example mostEvaluations(8) // => 128
 */
export function mostEvaluations(neighbours: number): number {
  return 2 * neighbours * (2 + 2 * OR_OPT_MOST);
}

/**
 * A tour of one vehicle kept as a cycle in an array with each node's position (the depot is
 * node `n`), improved by 2-opt and or-opt moves whose gains come from the arc costs alone
 * (Bentley 1992, "Fast algorithms for geometric traveling salesman problems"; from memory): for
 * a stop, both of its tour neighbours, its nearest neighbours in the neighbour lists, a 2-opt
 * that joins it to a neighbour and every or-opt that moves a chain of 1 to `OR_OPT_MOST` stops
 * starting at it next to a neighbour, either way round. A 2-opt reverses the shorter side of the
 * cycle, and an or-opt shifts the shorter stretch between the chain's two places: on a cycle
 * with symmetric costs both sides give the same tour. Only for a plan `tourVehicle` accepts: the
 * gains are then exactly the route's cost differences, up to rounding (the caller re-costs the
 * result with the exact evaluation before it is used).
 */
export class TourDescent {
  /** Nodes in tour order (a cycle; the depot is node `n`), and each node's index there. */
  readonly order: Int32Array;
  readonly pos: Int32Array;
  /** Number of nodes: the stops and the depot. */
  readonly size: number;
  private readonly loc: Int32Array;
  private readonly km: Float64Array;
  private readonly minutes: Float64Array;
  private readonly L: number;
  private readonly perKm: number;
  private readonly perMin: number;
  private readonly chain = new Int32Array(OR_OPT_MOST);
  /** Nodes whose tour neighbours the last applied move changed (`changedCount` of them). */
  readonly changed = new Int32Array(6);
  changedCount = 0;
  /** Whether the last `improve` applied a move, and the cost it saved by the arc costs. */
  applied = false;
  gain = 0;

  /**
   * @param state - the search state (read only: the tour starts as vehicle `v`'s route)
   * @param v - the vehicle, from `tourVehicle`
   */
  constructor(
    state: SearchState,
    readonly v: number,
  ) {
    const cp = state.cp;
    const route = state.routes[v]!;
    const n = cp.n;
    this.size = route.len + 1;
    this.order = new Int32Array(this.size);
    this.pos = new Int32Array(n + 1).fill(-1);
    this.loc = new Int32Array(n + 1);
    for (let s = 0; s < n; s++) this.loc[s] = cp.stopLoc[s]!;
    this.loc[n] = cp.startLoc[v]!;
    this.order[0] = n;
    this.pos[n] = 0;
    for (let p = 1; p <= route.len; p++) {
      const s = route.nodes[p]!;
      this.order[p] = s;
      this.pos[s] = p;
    }
    this.km = cp.distanceKm;
    this.minutes = cp.travelMin;
    this.L = cp.locationCount;
    this.perKm = cp.costPerKm[v]!;
    this.perMin = (cp.costPerHour[v]! / 60) * cp.travelFactor[v]!;
  }

  /** Cost of the arc between nodes `a` and `b` (either way). */
  cost(a: number, b: number): number {
    const i = this.loc[a]! * this.L + this.loc[b]!;
    return this.perMin === 0 ? this.perKm * this.km[i]! : this.perKm * this.km[i]! + this.perMin * this.minutes[i]!;
  }

  /** The node after `a` in the array's direction. */
  next(a: number): number {
    const p = this.pos[a]! + 1;
    return this.order[p === this.size ? 0 : p]!;
  }

  /** The node before `a` in the array's direction. */
  prev(a: number): number {
    const p = this.pos[a]!;
    return this.order[p === 0 ? this.size - 1 : p - 1]!;
  }

  /** The depot's node. */
  get depot(): number {
    return this.pos.length - 1;
  }

  /**
   * Write the route's stops from the depot into `out`, in the direction that starts with `first`
   * or else ends with `last` (the plan's first and last stop, so that a tour changed in its
   * middle reads as the plan does there), else in the array's direction; returns how many.
   */
  stops(out: Int32Array, first = -1, last = -1): number {
    const N = this.size;
    const depot = this.depot;
    const d = this.pos[depot]!;
    const after = this.next(depot);
    const before = this.prev(depot);
    const backward = after !== first && (before === first || (before !== last && after === last));
    for (let k = 1; k < N; k++) {
      const p = backward ? d - k : d + k;
      out[k - 1] = this.order[p >= N ? p - N : p < 0 ? p + N : p]!;
    }
    return N - 1;
  }

  /** Take the cycle of another descent of the same tour (to undo). */
  copyFrom(other: TourDescent): void {
    this.order.set(other.order);
    this.pos.set(other.pos);
  }

  /**
   * Find the best 2-opt or or-opt move at stop `t1` with its first `neighbours` neighbours and
   * apply it when it lowers the cost by more than `epsilon`; `changed` then names the nodes whose
   * tour neighbours changed.
   *
   * @param nb - neighbour lists
   * @param t1 - the stop
   * @param neighbours - how many of its nearest neighbours to look at
   * @param epsilon - the least gain that counts (against rounding)
   * @returns the evaluations used: each neighbour looked at and each move whose gain was
   *   computed (at most `mostEvaluations(neighbours)`); `applied` says whether a move was made
   */
  improve(nb: Neighbours, t1: number, neighbours: number, epsilon: number): number {
    const K = Math.min(neighbours, nb.k);
    const depot = this.depot;
    const chain = this.chain;
    let evaluations = 0;
    let best = epsilon;
    // The best move: kind (1: 2-opt, 2: or-opt), its nodes.
    let kind = 0;
    let b1 = 0;
    let b2 = 0;
    let b3 = 0;
    let b4 = 0;
    let b5 = 0;
    let b6 = 0;
    for (let dir = 0; dir < 2; dir++) {
      const fwd = dir === 0;
      const t2 = fwd ? this.next(t1) : this.prev(t1);
      const c12 = this.cost(t1, t2);
      // The chain starting at t1 in this direction (stops only), its outer neighbour before t1.
      const before = fwd ? this.prev(t1) : this.next(t1);
      const cBefore = this.cost(before, t1);
      for (let k = 0; k < K; k++) {
        const t3 = nb.list[t1 * nb.k + k]!;
        if (t3 < 0 || this.pos[t3]! < 0) continue;
        evaluations++;
        const c13 = this.cost(t1, t3);
        // 2-opt: drop (t1, t2) and (t3, t4), join t1-t3 and t2-t4.
        const t4 = fwd ? this.next(t3) : this.prev(t3);
        if (c13 < c12 && t3 !== t2 && t4 !== t1) {
          evaluations++;
          const g = c12 + this.cost(t3, t4) - c13 - this.cost(t2, t4);
          if (g > best) {
            best = g;
            kind = 1;
            b1 = t1;
            b2 = t2;
            b3 = t3;
            b4 = t4;
            b5 = dir;
          }
        }
        // Or-opt: the chain t1 .. tail (away from `before`) moves next to t3, t1 beside t3.
        if (!(c13 < cBefore)) continue;
        let tail = t1;
        let after = t2;
        chain[0] = t1;
        for (let len = 1; len <= OR_OPT_MOST; len++) {
          if (len > 1) {
            if (after === depot || after === before) break;
            tail = after;
            chain[len - 1] = tail;
            after = fwd ? this.next(tail) : this.prev(tail);
          }
          if (t3 === tail || after === before || (len > 1 && inChain(chain, len, t3))) break;
          const removed = cBefore + this.cost(tail, after) - this.cost(before, after);
          for (let side = 0; side < 2; side++) {
            const x = side === 0 ? this.next(t3) : this.prev(t3);
            if (inChain(chain, len, x)) continue;
            // Dropping (t3, x) where it is the chain's own outer arc is no move.
            if ((t3 === before && x === after) || (t3 === after && x === before)) continue;
            evaluations++;
            const g = removed + this.cost(t3, x) - c13 - this.cost(tail, x);
            if (g > best) {
              best = g;
              kind = 2;
              b1 = t1;
              b2 = tail;
              b3 = before;
              b4 = after;
              b5 = t3;
              b6 = x;
            }
          }
        }
      }
    }
    this.applied = kind !== 0;
    this.gain = kind !== 0 ? best : 0;
    if (kind === 1) this.twoOpt(b1, b2, b3, b4, b5 === 0);
    else if (kind === 2) this.orOpt(b1, b2, b3, b4, b5, b6);
    return evaluations;
  }

  /**
   * 2-opt: drop (t1, t2) and (t3, t4), where t2 and t4 follow t1 and t3 in the same direction
   * (`fwd`: the array's), and join t1-t3 and t2-t4.
   */
  private twoOpt(t1: number, t2: number, t3: number, t4: number, fwd: boolean): void {
    // Forward: t1 t2 .. t3 t4 -> reverse t2..t3. Backward: t2 t1 .. t4 t3 -> reverse t1..t4.
    if (fwd) this.reversePath(t2, t3);
    else this.reversePath(t1, t4);
    this.note(t1, t2, t3, t4, -1, -1);
  }

  /**
   * Or-opt: the chain from `head` to `tail` (between `before`, next to `head`, and `after`,
   * next to `tail`) moves between `t3` and its tour neighbour `x`, `head` beside `t3`.
   */
  private orOpt(head: number, tail: number, before: number, after: number, t3: number, x: number): void {
    const N = this.size;
    const order = this.order;
    const pos = this.pos;
    // The chain in the array's direction: from `first` (after `p`) to `last` (before `nx`).
    const headFirst = this.next(before) === head;
    const first = headFirst ? head : tail;
    const last = headFirst ? tail : head;
    const p = headFirst ? before : after;
    const nx = headFirst ? after : before;
    // The arc (a, b) it goes into, b after a in the array; which end of the chain meets a.
    const xAfter = this.next(t3) === x;
    const a = xAfter ? t3 : x;
    const b = xAfter ? x : t3;
    const headAtA = a === t3;
    const len = ((pos[last]! - pos[first]! + N) % N) + 1;
    const chain = this.chain;
    // The chain as it will read in the array's direction after a.
    for (let k = 0; k < len; k++) chain[k] = order[(pos[first]! + k) % N]!;
    const firstAtA = headAtA === (first === head);
    const gapForward = ((pos[a]! - pos[nx]! + N) % N) + 1; // nx .. a
    const gapBack = ((pos[p]! - pos[b]! + N) % N) + 1; // b .. p
    if (gapForward <= gapBack) {
      // p [chain] nx .. a b -> p nx .. a [chain] b: shift nx .. a back by len.
      let at = pos[first]!;
      for (let k = 0; k < gapForward; k++) {
        const from = (at + len) % N;
        const node = order[from]!;
        order[at] = node;
        pos[node] = at;
        at = at + 1 === N ? 0 : at + 1;
      }
      for (let k = 0; k < len; k++) {
        const node = chain[firstAtA ? k : len - 1 - k]!;
        const q = (at + k) % N;
        order[q] = node;
        pos[node] = q;
      }
    } else {
      // a b .. p [chain] nx -> a [chain] b .. p nx: shift b .. p on by len.
      let at = pos[last]!;
      for (let k = 0; k < gapBack; k++) {
        const from = (at - len + N) % N;
        const node = order[from]!;
        order[at] = node;
        pos[node] = at;
        at = at === 0 ? N - 1 : at - 1;
      }
      for (let k = 0; k < len; k++) {
        const node = chain[firstAtA ? len - 1 - k : k]!;
        const q = (at - k + N) % N;
        order[q] = node;
        pos[node] = q;
      }
    }
    this.note(before, head, tail, after, t3, x);
  }

  /** Reverse the path from `from` to `to` in the array's direction, or the rest of the cycle when that is shorter. */
  private reversePath(from: number, to: number): void {
    const N = this.size;
    let i = this.pos[from]!;
    let j = this.pos[to]!;
    let count = ((j - i + N) % N) + 1;
    if (2 * count > N) {
      const i2 = j + 1 === N ? 0 : j + 1;
      j = i === 0 ? N - 1 : i - 1;
      i = i2;
      count = N - count;
    }
    const order = this.order;
    const pos = this.pos;
    for (let k = 0; k < count >> 1; k++) {
      const a = order[i]!;
      const b = order[j]!;
      order[i] = b;
      pos[b] = i;
      order[j] = a;
      pos[a] = j;
      i = i + 1 === N ? 0 : i + 1;
      j = j === 0 ? N - 1 : j - 1;
    }
  }

  private note(a: number, b: number, c: number, d: number, e: number, f: number): void {
    const depot = this.depot;
    let m = 0;
    for (const s of [a, b, c, d, e, f]) if (s >= 0 && s !== depot) this.changed[m++] = s;
    this.changedCount = m;
  }
}

function inChain(chain: Int32Array, len: number, s: number): boolean {
  for (let k = 0; k < len; k++) if (chain[k] === s) return true;
  return false;
}
