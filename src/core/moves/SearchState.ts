import type { CompiledProblem } from "../schedule/compileProblem.js";
import { RouteArrays } from "../schedule/RouteArrays.js";

/** Maximum pieces of one new route: a move is described as a concatenation of route parts. */
export const MAX_PIECES = 6;

/** Route-level results of one evaluation, by slot (0: route A, 1: route B). */
const R_COST = 0;
const R_REAL = 1;
const R_VIOL = 2;
const R_COUNT = 3;
const R_STOPTW = 4;
const R_ENDTW = 5;
const R_EXCESS = 6;
const R_DIST = 7;
const R_DUTY = 8;
const R_SIZE = 9;

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
  /** 1 for routes written since the last `clearDirty` (lets a snapshot copy only those). */
  readonly dirty: Uint8Array;
  /** Running sums over routes of unpenalised cost and violation; stops that must be served but sit in the pool. */
  realSum = 0;
  violSum = 0;
  mustInPool = 0;
  private readonly load: Float64Array;
  private readonly tmp: Int32Array[];

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
    this.load = new Float64Array(cp.dims);
    this.tmp = [new Int32Array(cp.n + 1), new Int32Array(cp.n + 1)];
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
      this.rStats[o + R_COST] = this.penalised(v, this.rStats, o);
      this.realSum += this.rStats[o + R_REAL]!;
      this.violSum += this.rStats[o + R_VIOL]!;
    }
  }

  /**
   * Penalised cost of vehicle `v` driving the concatenation of `m` pieces in `pieces`
   * (4 ints each: route, from, to, reversed); results also go to `out` at `slot`.
   * Allocation-free: this is the hot path.
   */
  evaluate(v: number, pieces: Int32Array, m: number, slot: number): number {
    const cp = this.cp;
    const L = cp.locationCount;
    const T = cp.travelMin;
    const Dm = cp.distanceKm;
    const f = cp.travelFactor[v]!;
    const dims = cp.dims;
    const load = this.load;
    let aD = 0;
    let aTW = 0;
    let aE = cp.shiftStartMin[v]!;
    let aL = cp.shiftEndMin[v]!;
    let dist = 0;
    let last = cp.startLoc[v]!;
    let k = 0;
    for (let d = 0; d < dims; d++) load[d] = 0;
    if (m > 0 && pieces[0] === v && pieces[1] === 1 && pieces[3] === 0) {
      const r = this.routes[v]!;
      const j = pieces[2]!;
      aD = r.preD[j]!;
      aTW = r.preTW[j]!;
      aE = r.preE[j]!;
      aL = r.preL[j]!;
      dist = r.cumDist[j]!;
      last = r.locs[j]!;
      for (let d = 0; d < dims; d++) load[d] = r.preLoad[j * dims + d]!;
      k = 1;
    }
    for (; k < m; k++) {
      const src = pieces[4 * k]!;
      const i = pieces[4 * k + 1]!;
      if (src < 0) {
        // One pool stop.
        const loc = cp.stopLoc[i]!;
        const t = T[last * L + loc]! * f;
        const e2 = cp.earliestMin[i]!;
        const l2 = cp.latestMin[i]!;
        const delta = aD - aTW + t;
        const wt = Math.max(e2 - delta - aL, 0);
        const tw = Math.max(aE + delta - l2, 0);
        aE = Math.max(e2 - delta, aE) - wt;
        aL = Math.min(l2 - delta, aL) + tw;
        aD += cp.serviceMin[i]! + t + wt;
        aTW += tw;
        dist += Dm[last * L + loc]!;
        for (let d = 0; d < dims; d++) load[d] = load[d]! + cp.demand[i * dims + d]!;
        last = loc;
        continue;
      }
      const j = pieces[4 * k + 2]!;
      const rev = pieces[4 * k + 3]! !== 0;
      const r = this.routes[src]!;
      const sameSpeed = cp.travelFactor[src] === f;
      const firstLoc = rev ? r.locs[j]! : r.locs[i]!;
      const lastLoc = rev ? r.locs[i]! : r.locs[j]!;
      const tIn = T[last * L + firstLoc]! * f;
      let d2: number;
      let tw2 = 0;
      let e2 = -Infinity;
      let l2 = Infinity;
      if (sameSpeed && !rev && j === r.len) {
        d2 = r.sufD[i]!;
        tw2 = r.sufTW[i]!;
        e2 = r.sufE[i]!;
        l2 = r.sufL[i]!;
      } else if (sameSpeed && r.cumWin[j]! - r.cumWin[i - 1]! === 0) {
        d2 = r.cumSvc[j]! - r.cumSvc[i - 1]! + (rev ? r.cumTravR[j]! - r.cumTravR[i]! : r.cumTrav[j]! - r.cumTrav[i]!);
      } else {
        // Walk the piece: binding windows or another speed.
        d2 = 0;
        let pl = -1;
        for (let q = 0; q <= j - i; q++) {
          const p = rev ? j - q : i + q;
          const s = r.nodes[p]!;
          const loc = r.locs[p]!;
          if (pl < 0) {
            d2 = cp.serviceMin[s]!;
            e2 = cp.earliestMin[s]!;
            l2 = cp.latestMin[s]!;
          } else {
            const t = T[pl * L + loc]! * f;
            const ee = cp.earliestMin[s]!;
            const ll = cp.latestMin[s]!;
            const delta = d2 - tw2 + t;
            const wt = Math.max(ee - delta - l2, 0);
            const tw = Math.max(e2 + delta - ll, 0);
            e2 = Math.max(ee - delta, e2) - wt;
            l2 = Math.min(ll - delta, l2) + tw;
            d2 += cp.serviceMin[s]! + t + wt;
            tw2 += tw;
          }
          pl = loc;
        }
      }
      const delta = aD - aTW + tIn;
      const wt = Math.max(e2 - delta - aL, 0);
      const tw = Math.max(aE + delta - l2, 0);
      aE = Math.max(e2 - delta, aE) - wt;
      aL = Math.min(l2 - delta, aL) + tw;
      aD += d2 + tIn + wt;
      aTW += tw2 + tw;
      dist += Dm[last * L + firstLoc]! + (rev ? r.cumDistR[j]! - r.cumDistR[i]! : r.cumDist[j]! - r.cumDist[i]!);
      for (let d = 0; d < dims; d++) load[d] = load[d]! + r.preLoad[j * dims + d]! - r.preLoad[(i - 1) * dims + d]!;
      last = lastLoc;
    }
    // End depot: its lateness is overtime, kept apart from lateness at stops.
    const endLoc = cp.endLoc[v]!;
    const tEnd = T[last * L + endLoc]! * f;
    const delta = aD - aTW + tEnd;
    const wt = Math.max(cp.shiftStartMin[v]! - delta - aL, 0);
    const endTW = Math.max(aE + delta - cp.shiftEndMin[v]!, 0);
    const duration = aD + tEnd + wt;
    dist += Dm[last * L + endLoc]!;
    let excess = 0;
    for (let d = 0; d < dims; d++) {
      const over = load[d]! - cp.capacity[v * dims + d]!;
      if (over > 0) excess += over / cp.loadScale[d]!;
    }
    const o = slot * R_SIZE;
    const out = this.out;
    out[o + R_COUNT] = m === 0 ? 0 : load[dims - 1]!;
    out[o + R_STOPTW] = aTW;
    out[o + R_ENDTW] = endTW;
    out[o + R_EXCESS] = excess;
    out[o + R_DIST] = dist;
    out[o + R_DUTY] = duration - aTW - endTW;
    const cost = this.penalised(v, out, o);
    out[o + R_COST] = cost;
    return cost;
  }

  /**
   * Replace route `v` by the concatenation of `m` pieces; `pieces2` for a second route `v2`
   * (-1 when none). Both are materialised before either is written, so pieces may cross.
   * The stats computed by the last `evaluate` calls (slots 0 and 1) are stored as is.
   */
  apply(v: number, pieces: Int32Array, m: number, v2: number, pieces2: Int32Array, m2: number): void {
    const c1 = this.materialise(pieces, m, this.tmp[0]!);
    const c2 = v2 >= 0 ? this.materialise(pieces2, m2, this.tmp[1]!) : 0;
    this.write(v, this.tmp[0]!, c1, 0);
    if (v2 >= 0) this.write(v2, this.tmp[1]!, c2, 1);
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

  private materialise(pieces: Int32Array, m: number, into: Int32Array): number {
    let c = 0;
    for (let k = 0; k < m; k++) {
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

  private write(v: number, stops: Int32Array, count: number, slot: number): void {
    const route = this.routes[v]!;
    const wasUsed = route.len > 0;
    this.dirty[v] = 1;
    let lo = 1;
    let hi = count;
    if (count === route.len && count > 0) {
      // Same length (moves inside one route): rebuild from the first to the last changed position.
      const nodes = route.nodes;
      while (lo <= count && nodes[lo] === stops[lo - 1]) lo++;
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
    this.rStats.set(this.out.subarray(slot * R_SIZE, slot * R_SIZE + R_SIZE), o);
    this.realSum += this.rStats[o + R_REAL]!;
    this.violSum += this.rStats[o + R_VIOL]!;
    this.used += (count > 0 ? 1 : 0) - (wasUsed ? 1 : 0);
  }

  private penalised(v: number, a: Float64Array, o: number): number {
    const cp = this.cp;
    if (a[o + R_COUNT] === 0) {
      a[o + R_REAL] = 0;
      a[o + R_VIOL] = 0;
      return 0;
    }
    const stopTW = a[o + R_STOPTW]!;
    const endTW = a[o + R_ENDTW]!;
    const excess = a[o + R_EXCESS]!;
    const real =
      cp.fixedCost[v]! +
      cp.costPerKm[v]! * a[o + R_DIST]! +
      (cp.costPerHour[v]! * a[o + R_DUTY]!) / 60 +
      (cp.hardWindows ? 0 : cp.lateCostPerMin * stopTW);
    a[o + R_REAL] = real;
    a[o + R_VIOL] = (cp.hardWindows ? stopTW : 0) + endTW + excess;
    return real + (cp.hardWindows ? this.wTime * stopTW : 0) + this.wTime * endTW + this.wLoad * excess;
  }
}

/** Index of the stop count in the route results (for callers that read `out`). */
export const RESULT_COUNT = R_COUNT;
/** Index of the violation measure in the route results. */
export const RESULT_VIOL = R_VIOL;
/** Index of the unpenalised cost in the route results. */
export const RESULT_REAL = R_REAL;
/** Stride of one slot in `SearchState.out`. */
export const RESULT_SIZE = R_SIZE;
