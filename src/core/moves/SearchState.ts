import type { CompiledProblem } from "../schedule/compileProblem.js";
import { RouteArrays } from "../schedule/RouteArrays.js";
import { evaluatePieces } from "./evaluatePieces.js";
import { hasRouteRules } from "./routeRules.js";
import { penalisedCost } from "./penalisedCost.js";
import { R_COST, R_COUNT, R_ENDTW, R_EXCESS, R_REAL, R_SIZE, R_STOPTW, R_VIOL } from "./routeResults.js";

/** Maximum pieces of one new route: a move is described as a concatenation of route parts. */
export const MAX_PIECES = 6;

/**
 * The search's current solution: one `RouteArrays` per vehicle, an unassigned pool, and the
 * penalised cost of each route. A candidate route is described as up to `MAX_PIECES` pieces
 * `(route, from, to, reversed)` of existing routes (route -1: one pool stop `from`), and its
 * cost is found by concatenating segment summaries (Vidal et al. 2013) without copying stops.
 * Forward prefixes and suffixes of the same vehicle cost O(1); other pieces O(1) too when they
 * hold no binding window (prefix sums), else O(piece length).
 */
export class SearchState {
  readonly routes: RouteArrays[];
  /** Route of each stop; -1 in the pool; -2 never served (no vehicle can). */
  readonly routeOf: Int32Array;
  readonly posOf: Int32Array;
  readonly pool: Int32Array;
  readonly poolIndex: Int32Array;
  poolSize = 0;
  poolCost = 0;
  /** Penalty weights: per minute of time warp and per unit (of `loadScale`) of excess load. */
  wTime = 1;
  wLoad = 1;
  /** Added per used vehicle under the hierarchical objective. */
  vehicleWeight = 0;
  readonly rStats: Float64Array;
  /** Results of the last `evaluate` per slot. */
  readonly out = new Float64Array(2 * R_SIZE);
  used = 0;
  /**
   * 1 for routes written since the best plan last copied them (lets a snapshot copy only those);
   * the first `dirtyCount` entries of `dirtyList` name them, so the copy does not scan the fleet.
   */
  readonly dirty: Uint8Array;
  readonly dirtyList: Int32Array;
  dirtyCount = 0;
  /** Running sums over routes of unpenalised cost and violation; stops that must be served but sit in the pool. */
  realSum = 0;
  violSum = 0;
  mustInPool = 0;
  /** Scratch load per dimension of the evaluation under way. */
  readonly scratchLoad: Float64Array;
  /** 1 for vehicles with a rule of `routeRules` (pickups, breaks, working-time limits); their scratch. */
  readonly rulesOn: Uint8Array;
  readonly rulesStops: Int32Array;
  readonly rulesLoad: Float64Array;
  readonly rulesPick: Float64Array;
  readonly rulesMax: Float64Array;
  /**
   * When true, `evaluate` walks every candidate route stop by stop from its depot instead of
   * concatenating segment summaries (`SolveOptions.incrementalEvaluation` off), and counts the
   * routes so evaluated in `fullEvaluations`.
   */
  fullEvaluation = false;
  fullEvaluations = 0;
  private readonly tmp: Int32Array[];
  private fullChain: Int32Array | undefined;

  /**
   * @param cp - the compiled problem
   * @param wTime - initial time-warp weight (cost per minute)
   * @param wLoad - initial load-excess weight (cost per typical demand)
   */
  constructor(
    readonly cp: CompiledProblem,
    wTime: number,
    wLoad: number,
  ) {
    const V = cp.vehicleCount;
    this.routes = Array.from({ length: V }, (_, v) => new RouteArrays(cp, v));
    this.routeOf = new Int32Array(cp.n).fill(-1);
    this.posOf = new Int32Array(cp.n);
    this.pool = new Int32Array(cp.n);
    this.poolIndex = new Int32Array(cp.n).fill(-1);
    this.rStats = new Float64Array(V * R_SIZE);
    this.dirty = new Uint8Array(V).fill(1);
    this.dirtyList = Int32Array.from({ length: V }, (_, v) => v);
    this.dirtyCount = V;
    this.scratchLoad = new Float64Array(cp.dims);
    this.rulesStops = new Int32Array(cp.n + 1);
    this.rulesLoad = new Float64Array(cp.dims);
    this.rulesPick = new Float64Array(cp.dims);
    this.rulesMax = new Float64Array(cp.dims);
    this.rulesOn = Uint8Array.from({ length: V }, (_, v) => (hasRouteRules(cp, v) ? 1 : 0));
    this.tmp = [new Int32Array(cp.n + 1), new Int32Array(cp.n + 1), new Int32Array(cp.n + 1)];
    this.wTime = wTime;
    this.wLoad = wLoad;
    for (let s = 0; s < cp.n; s++) {
      if (cp.unservableReason[s]) this.routeOf[s] = -2;
      else this.addToPool(s);
    }
  }

  /** Penalised cost of route `v` as stored (vehicle weight excluded). */
  routeCost(v: number): number {
    return this.rStats[v * R_SIZE + R_COST]!;
  }

  /** Stops on route `v`. */
  routeCount(v: number): number {
    return this.rStats[v * R_SIZE + R_COUNT]!;
  }

  /** Current penalised total (routes + vehicle weights + pool). */
  total(): number {
    let sum = this.poolCost + this.vehicleWeight * this.used;
    for (let v = 0; v < this.routes.length; v++) sum += this.rStats[v * R_SIZE + R_COST]!;
    return sum;
  }

  /** Cost without penalties (routes + pool), the plan's reported cost. */
  realCost(): number {
    return this.realSum + this.poolCost;
  }

  /** True when no route breaks a rule and no must-serve stop waits in the pool. */
  isFeasible(): boolean {
    return this.violSum < 1e-7 && this.mustInPool === 0;
  }

  /** Sum of violations (late minutes under hard windows, overtime, excess load, must-serve stops in the pool). */
  violation(): number {
    return this.violSum + this.mustInPool;
  }

  /** Time-warp minutes (hard windows + overtime) and load excess of the current routes. */
  violationParts(): { time: number; load: number } {
    let time = 0;
    let load = 0;
    for (let v = 0; v < this.routes.length; v++) {
      const o = v * R_SIZE;
      time += (this.cp.hardWindows ? this.rStats[o + R_STOPTW]! : 0) + this.rStats[o + R_ENDTW]!;
      load += this.rStats[o + R_EXCESS]!;
    }
    return { time, load };
  }

  /** Change the penalty weights and recompute every stored route cost. */
  setWeights(wTime: number, wLoad: number): void {
    this.wTime = wTime;
    this.wLoad = wLoad;
    this.realSum = 0;
    this.violSum = 0;
    for (let v = 0; v < this.routes.length; v++) {
      const o = v * R_SIZE;
      penalisedCost(this, v, this.rStats, o);
      this.realSum += this.rStats[o + R_REAL]!;
      this.violSum += this.rStats[o + R_VIOL]!;
    }
  }

  /**
   * Penalised cost of vehicle `v` driving the concatenation of `m` pieces in `pieces`
   * (4 ints each: route, from, to, reversed); results also go to `out` at `slot`.
   * Allocation-free: this is the hot path (see `evaluatePieces`).
   */
  evaluate(v: number, pieces: Int32Array, m: number, slot: number): number {
    if (this.fullEvaluation) this.evaluateFully(v, pieces, m, slot);
    else evaluatePieces(this, v, pieces, m, slot);
    return this.out[slot * R_SIZE + R_COST]!;
  }

  /**
   * The same result as `evaluate` without segment summaries: the candidate route is written
   * out and evaluated as a chain of single stops, every arc read from the matrix (O(route)).
   */
  evaluateFully(v: number, pieces: Int32Array, m: number, slot: number): void {
    const stops = this.tmp[2]!;
    const count = this.materialise(pieces, m, stops);
    const chain = (this.fullChain ??= new Int32Array(4 * (this.cp.n + 1)));
    for (let i = 0; i < count; i++) {
      const s = stops[i]!;
      chain[4 * i] = -1;
      chain[4 * i + 1] = s;
      chain[4 * i + 2] = s;
      chain[4 * i + 3] = 0;
    }
    this.fullEvaluations++;
    evaluatePieces(this, v, chain, count, slot);
  }

  /**
   * Replace route `v` by the concatenation of `m` pieces; `pieces2` for a second route `v2`
   * (-1 when none). Both are materialised before either is written, so pieces may cross.
   * The stats computed by the last `evaluate` calls (slots 0 and 1) are stored as is.
   */
  apply(v: number, pieces: Int32Array, m: number, v2: number, pieces2: Int32Array, m2: number): void {
    if (v2 < 0 && this.applyInside(v, pieces, m)) return;
    const c1 = this.materialise(pieces, m, this.tmp[0]!);
    const c2 = v2 >= 0 ? this.materialise(pieces2, m2, this.tmp[1]!) : 0;
    this.write(v, this.tmp[0]!, c1, 0);
    if (v2 >= 0) this.write(v2, this.tmp[1]!, c2, 1);
  }

  /**
   * A move inside route `v` that keeps its length, its first stops (a forward piece from
   * position 1) and its last (a forward piece to the end): only the stretch between is written
   * out and compared, not the whole route (two O(len) passes fewer per accepted move on a long
   * route). The same result as the general path.
   *
   * @returns false when the move is not of that form (nothing done)
   */
  private applyInside(v: number, pieces: Int32Array, m: number): boolean {
    const route = this.routes[v]!;
    const len = route.len;
    const last = 4 * (m - 1);
    if (m < 3 || pieces[0] !== v || pieces[1] !== 1 || pieces[3] !== 0) return false;
    if (pieces[last] !== v || pieces[last + 2] !== len || pieces[last + 3] !== 0) return false;
    let count = 0;
    for (let k = 0; k < m; k++) count += pieces[4 * k + 2]! - pieces[4 * k + 1]! + 1;
    if (count !== len) return false;
    // Stops of the middle pieces, at the indices the whole route would give them (position - 1).
    const head = pieces[2]!;
    const tail = pieces[last + 1]!;
    const stops = this.tmp[0]!;
    this.materialise(pieces, m - 1, stops, 1, head);
    this.write(v, stops, len, 0, head + 1, tail - 1);
    return true;
  }

  /** Forget which routes were written (after a snapshot copied them). */
  clearDirty(): void {
    for (let k = 0; k < this.dirtyCount; k++) this.dirty[this.dirtyList[k]!] = 0;
    this.dirtyCount = 0;
  }

  /**
   * Empty route `v` into the pool and return its stops in visiting order.
   *
   * @example for (const s of state.emptyRoute(v)) reinsert(s)
   */
  emptyRoute(v: number): number[] {
    const stops = this.routes[v]!.stops();
    this.setRoute(v, []);
    for (const s of stops) this.addToPool(s);
    return stops;
  }

  /** Put stop `s` (not on a route) into the pool. */
  addToPool(s: number): void {
    if (this.poolIndex[s]! >= 0) return;
    this.poolIndex[s] = this.poolSize;
    this.pool[this.poolSize++] = s;
    this.routeOf[s] = -1;
    this.poolCost += this.cp.unservedCost[s]!;
    if (!this.cp.optional[s]) this.mustInPool++;
  }

  /** Take stop `s` out of the pool (the caller puts it on a route). */
  removeFromPool(s: number): void {
    const k = this.poolIndex[s]!;
    if (k < 0) return;
    const lastStop = this.pool[--this.poolSize]!;
    this.pool[k] = lastStop;
    this.poolIndex[lastStop] = k;
    this.poolIndex[s] = -1;
    this.poolCost -= this.cp.unservedCost[s]!;
    if (!this.cp.optional[s]) this.mustInPool--;
    if (this.poolSize === 0) this.poolCost = 0;
  }

  /** Set route `v` to `stops` (full evaluation), e.g. from construction or a snapshot. */
  setRoute(v: number, stops: readonly number[] | Int32Array, count: number = stops.length): void {
    const buf = this.tmp[0]!;
    for (let i = 0; i < count; i++) buf[i] = stops[i]!;
    // Evaluate as a chain of single stops: independent of the route's old content.
    const chain = new Int32Array(4 * Math.max(count, 1));
    for (let i = 0; i < count; i++) chain.set([-1, buf[i]!, buf[i]!, 0], 4 * i);
    this.evaluate(v, chain, count, 0);
    for (let i = 0; i < count; i++) if (this.routeOf[buf[i]!] === -1) this.removeFromPool(buf[i]!);
    this.write(v, buf, count, 0);
  }

  /**
   * Write the stops of a candidate route, given as pieces (source route, from, to, reversed; or
   * -1 and a single stop), into `into`: pieces `first`..`m - 1`, from index `at` on.
   *
   * @returns the index after the last stop written (how many were written, from the defaults)
   */
  materialise(pieces: Int32Array, m: number, into: Int32Array, first = 0, at = 0): number {
    let c = at;
    for (let k = first; k < m; k++) {
      const src = pieces[4 * k]!;
      const i = pieces[4 * k + 1]!;
      if (src < 0) {
        into[c++] = i;
        continue;
      }
      const j = pieces[4 * k + 2]!;
      const nodes = this.routes[src]!.nodes;
      if (pieces[4 * k + 3]) for (let p = j; p >= i; p--) into[c++] = nodes[p]!;
      else for (let p = i; p <= j; p++) into[c++] = nodes[p]!;
    }
    return c;
  }

  /** Write route `v`; with `from`..`to`, only those positions can differ (only they are read from `stops`). */
  private write(v: number, stops: Int32Array, count: number, slot: number, from = 1, to = count): void {
    const route = this.routes[v]!;
    const wasUsed = route.len > 0;
    if (!this.dirty[v]) {
      this.dirty[v] = 1;
      this.dirtyList[this.dirtyCount++] = v;
    }
    let lo = from;
    let hi = to;
    if (count === route.len && count > 0) {
      // Same length (moves inside one route): rebuild from the first to the last changed position.
      const nodes = route.nodes;
      while (lo <= hi && nodes[lo] === stops[lo - 1]) lo++;
      while (hi >= lo && nodes[hi] === stops[hi - 1]) hi--;
      if (lo <= hi) route.replaceRange(stops, lo, hi);
    } else {
      route.assign(stops, count);
    }
    for (let p = lo; p <= hi; p++) {
      const s = route.nodes[p]!;
      this.routeOf[s] = v;
      this.posOf[s] = p;
    }
    const o = v * R_SIZE;
    this.realSum -= this.rStats[o + R_REAL]!;
    this.violSum -= this.rStats[o + R_VIOL]!;
    // Copied one by one: a subarray would allocate a view per accepted move.
    for (let k = 0; k < R_SIZE; k++) this.rStats[o + k] = this.out[slot * R_SIZE + k]!;
    this.realSum += this.rStats[o + R_REAL]!;
    this.violSum += this.rStats[o + R_VIOL]!;
    this.used += (count > 0 ? 1 : 0) - (wasUsed ? 1 : 0);
  }
}

export { RESULT_COUNT, RESULT_REAL, RESULT_SIZE, RESULT_VIOL } from "./routeResults.js";
