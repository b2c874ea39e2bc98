import type { Random } from "../anneal/createRandom.js";
import { R_VIOL } from "../moves/routeResults.js";
import type { SearchState } from "../moves/SearchState.js";
import { SUF_L, SUF_TW } from "../schedule/RouteArrays.js";

/** Most stops one insertion may eject (Nagata & Bräysy 2009 use k_max = 5; from memory). */
export const EJECT_MAX = 5;
/**
 * Search nodes one insertion position may visit, and one whole search (the search is
 * exponential in k_max without a cap).
 */
const NODES_PER_POSITION = 2_000;
const NODE_LIMIT = 100_000;
/** Tolerance of the time and load checks (minutes, load units). */
const EPS = 1e-7;

/**
 * The ejection step of the route-minimisation phase (Nagata & Bräysy 2009, "A powerful route
 * minimization heuristic for the vehicle routing problem with time windows", Operations
 * Research Letters 37(5); written from the published description): insert stop `s` at some
 * position of some route and eject at most `EJECT_MAX` other stops of that route so that the
 * route keeps every hard rule, choosing the insertion and ejections whose failure counters
 * `p` sum least.
 *
 * For each insertion position the stops of the route are decided in order, keep or eject
 * (a lexicographic search): a kept stop that the vehicle reaches after its window closes ends
 * the branch (hard windows), a branch whose counters already reach the best sum ends too,
 * and once the stops still to decide lie after the inserted one, their route's suffix summary
 * tells in O(1) whether keeping them all fits (Vidal et al. 2013 segment summaries), which
 * ends the branch since further ejections only add to the sum. Every candidate is checked
 * exactly by `SearchState.evaluate` (capacity, windows, shift end, maximum stops, and every
 * rule of `routeRules`) before it is kept.
 */
export class EjectionSearch {
  /** The best candidate: vehicle, insertion cut, ejected route positions (1..len), their count and sum. */
  bestVehicle = -1;
  bestCut = 0;
  bestCount = 0;
  bestSum = Infinity;
  readonly bestEjected = new Int32Array(EJECT_MAX);
  /** Nodes visited plus candidates evaluated by the last `search` (counted as moves by the run). */
  work = 0;
  private readonly ejected = new Int32Array(EJECT_MAX);
  private readonly removed: Float64Array;
  private readonly total: Float64Array;
  private readonly pieces = new Int32Array(4 * (2 * EJECT_MAX + 4));
  private v = 0;
  private cut = 0;
  private len = 0;
  private s = 0;
  private f = 1;
  private p: Int32Array = new Int32Array(0);
  private nodes = 0;
  private positionLimit = 0;

  constructor(private readonly state: SearchState) {
    this.removed = new Float64Array(state.cp.dims);
    this.total = new Float64Array(state.cp.dims);
  }

  /**
   * Find the least-counter insertion of `s` with ejections over the used, unlocked routes that
   * may serve it; the result is in the `best…` fields (`bestVehicle` -1 when none was found).
   *
   * @param s - the stop to insert (in the pool)
   * @param p - failure counter of every stop (ejection cost)
   * @param rng - draws the route to start from (ties go to the first found)
   * @returns true when a candidate was found
   */
  search(s: number, p: Int32Array, rng: Random): boolean {
    const state = this.state;
    const cp = state.cp;
    const V = cp.vehicleCount;
    this.s = s;
    this.p = p;
    this.bestVehicle = -1;
    this.bestSum = Infinity;
    this.bestCount = 0;
    this.nodes = 0;
    this.work = 0;
    const start = rng.int(V);
    for (let k = 0; k < V && this.nodes < NODE_LIMIT; k++) {
      const v = (start + k) % V;
      const r = state.routes[v]!;
      if (r.len === 0 || cp.locked[v] || !cp.compatible[s * V + v]) continue;
      this.v = v;
      this.len = r.len;
      this.f = cp.travelFactor[v]!;
      const dims = cp.dims;
      for (let d = 0; d < dims; d++) {
        this.total[d] = r.data[r.len * r.stride + r.oLoad + d]! + cp.demand[s * dims + d]!;
        this.removed[d] = 0;
      }
      for (let cut = 0; cut <= r.len && this.nodes < NODE_LIMIT; cut++) {
        this.cut = cut;
        this.positionLimit = Math.min(NODE_LIMIT, this.nodes + NODES_PER_POSITION);
        this.visit(0, cp.shiftStartMin[v]!, cp.startLoc[v]!, 0, 0);
      }
    }
    this.work += this.nodes;
    return this.bestVehicle >= 0;
  }

  /**
   * Apply the best candidate: route `bestVehicle` gets `s` at `bestCut` without the ejected
   * stops, which go to the pool.
   *
   * @returns the ejected stops
   */
  apply(): number[] {
    const state = this.state;
    const r = state.routes[this.bestVehicle]!;
    const out: number[] = [];
    const stops: number[] = [];
    let e = 0;
    for (let pos = 1; pos <= r.len; pos++) {
      if (e < this.bestCount && this.bestEjected[e] === pos) {
        out.push(r.nodes[pos]!);
        e++;
      } else stops.push(r.nodes[pos]!);
      if (pos === this.bestCut) stops.push(this.s);
    }
    if (this.bestCut === 0) stops.unshift(this.s);
    state.setRoute(this.bestVehicle, stops);
    for (const x of out) state.addToPool(x);
    return out;
  }

  /**
   * Decide position `i` of the sequence (route positions 1..cut, then `s`, then cut+1..len;
   * sequence index i > cut is route position i) after the earlier ones: departure `t` from
   * location `last`, `count` ejected so far with counter sum `sum`.
   */
  private visit(i: number, t: number, last: number, count: number, sum: number): void {
    if (sum >= this.bestSum || this.nodes >= this.positionLimit) return;
    this.nodes++;
    const state = this.state;
    const cp = state.cp;
    const r = state.routes[this.v]!;
    const cut = this.cut;
    const len = this.len;
    if (i > len) {
      if (this.loadFits()) this.offer(count, sum);
      return;
    }
    if (i > cut && this.loadFits()) {
      // Keep every stop from route position i on: O(1) on the route's suffix summary.
      const a = t + this.travel(last, r.locs[i]!);
      // A route without windows keeps no window summaries: its suffixes have no warp and never close.
      const warp = r.windowed ? r.data[i * r.stride + SUF_TW]! : 0;
      const latest = r.windowed ? r.data[i * r.stride + SUF_L]! : Infinity;
      if (warp <= EPS && (!cp.hardWindows || a <= latest + EPS) && this.offer(count, sum)) return;
    }
    const x = i === cut ? this.s : i < cut ? r.nodes[i + 1]! : r.nodes[i]!;
    const loc = cp.stopLoc[x]!;
    const arrive = t + this.travel(last, loc);
    const begin = Math.max(arrive, cp.earliestMin[x]!);
    if (!cp.hardWindows || begin <= cp.latestMin[x]! + EPS) this.visit(i + 1, begin + cp.serviceMin[x]!, loc, count, sum);
    if (i === cut || count >= EJECT_MAX || sum + this.p[x]! >= this.bestSum) return;
    const dims = cp.dims;
    for (let d = 0; d < dims; d++) this.removed[d] = this.removed[d]! + cp.demand[x * dims + d]!;
    this.ejected[count] = i < cut ? i + 1 : i;
    this.visit(i + 1, t, last, count + 1, sum + this.p[x]!);
    for (let d = 0; d < dims; d++) this.removed[d] = this.removed[d]! - cp.demand[x * dims + d]!;
  }

  /** Does the route's load without the ejected stops fit the vehicle (every dimension)? */
  private loadFits(): boolean {
    const cp = this.state.cp;
    const dims = cp.dims;
    for (let d = 0; d < dims; d++) {
      if (this.total[d]! - this.removed[d]! > cp.capacity[this.v * dims + d]! + EPS) return false;
    }
    return true;
  }

  /** Evaluate the candidate exactly; keep it when it breaks no rule. True when kept. */
  private offer(count: number, sum: number): boolean {
    const state = this.state;
    const pieces = this.pieces;
    let m = 0;
    let from = 1;
    const put = (a: number, b: number): void => {
      if (a > b) return;
      pieces[4 * m] = this.v;
      pieces[4 * m + 1] = a;
      pieces[4 * m + 2] = b;
      pieces[4 * m + 3] = 0;
      m++;
    };
    let e = 0;
    const until = (limit: number): void => {
      // Route positions from..limit without the ejected ones.
      while (e < count && this.ejected[e]! <= limit) {
        put(from, this.ejected[e]! - 1);
        from = this.ejected[e]! + 1;
        e++;
      }
      put(from, limit);
      from = limit + 1;
    };
    until(this.cut);
    pieces[4 * m] = -1;
    pieces[4 * m + 1] = this.s;
    pieces[4 * m + 2] = this.s;
    pieces[4 * m + 3] = 0;
    m++;
    until(this.len);
    this.work++;
    state.evaluate(this.v, pieces, m, 0);
    if (state.out[R_VIOL]! > EPS) return false;
    this.bestSum = sum;
    this.bestCount = count;
    this.bestVehicle = this.v;
    this.bestCut = this.cut;
    this.bestEjected.set(this.ejected.subarray(0, count));
    return true;
  }

  private travel(a: number, b: number): number {
    const cp = this.state.cp;
    const L = cp.locationCount;
    const min = cp.travelFromKm ? (cp.distanceKm[a * L + b]! / cp.travelDivisor) * cp.travelMultiplier : cp.travelMin[a * L + b]!;
    return min * this.f;
  }
}
