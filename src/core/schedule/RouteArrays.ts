import { placeKm } from "../geo/placeKm.js";
import type { CompiledProblem } from "./compileProblem.js";
import { concatWindows, WindowSummary } from "./concatWindows.js";

/** The summary `concatWindows` writes (one at a time: nothing here calls back). */
const W = new WindowSummary();

/**
 * One vehicle's route during the search, with prefix and suffix segment summaries
 * (duration, time warp, earliest and latest start; Vidal, Crainic, Gendreau & Prins 2013,
 * "A hybrid genetic algorithm with adaptive diversity management for a large class of
 * vehicle routing problems with time-windows", Computers & Operations Research 40(1)).
 *
 * Position 0 is the start depot, 1..len the stops, len+1 the end depot.
 * `pre*[i]` summarises positions 0..i (start depot included); `suf*[i]` summarises
 * stops i..len (end depot excluded, so lateness at the end depot stays separable).
 * Additive quantities (distance, travel, service, load, windowed-stop count) are prefix sums.
 *
 * The window summaries (`pre*` and `suf*` but `preLoad`) are kept only while the route holds a
 * stop with a window that can bind (`windowed`): a stretch of stops without one is summarised
 * exactly by its prefix sums (duration = service + travel, no warp, open window), so a route
 * without windows (a TSPLIB tour, a day without windows) skips the two O(len) passes over
 * them after every move, and its readers take the prefix sums instead.
 */
export class RouteArrays {
  capacity = 0;
  len = 0;
  /** True while some stop on the route has a window that can bind: only then are `pre*`/`suf*` (but `preLoad`) current. */
  windowed = false;
  nodes: Int32Array = new Int32Array(0);
  locs: Int32Array = new Int32Array(0);
  preD: Float64Array = new Float64Array(0);
  preTW: Float64Array = new Float64Array(0);
  preE: Float64Array = new Float64Array(0);
  preL: Float64Array = new Float64Array(0);
  sufD: Float64Array = new Float64Array(0);
  sufTW: Float64Array = new Float64Array(0);
  sufE: Float64Array = new Float64Array(0);
  sufL: Float64Array = new Float64Array(0);
  /** Sum over k=1..i of the leg (k-1 -> k): forward, and reversed (k -> k-1). */
  cumDist: Float64Array = new Float64Array(0);
  cumDistR: Float64Array = new Float64Array(0);
  cumTrav: Float64Array = new Float64Array(0);
  cumTravR: Float64Array = new Float64Array(0);
  cumSvc: Float64Array = new Float64Array(0);
  cumWin: Int32Array = new Int32Array(0);
  /**
   * The matrix entries of the leg into position i (from i-1), as stored (minutes at the
   * reference speed, before the vehicle's factor), and of the reversed leg (i -> i-1). Kept so
   * that rebuilding after a move reads the matrix only for the legs the move created, and a
   * walk over a piece reads its legs from here. On a symmetric matrix (`cp.symmetric`) the
   * reversed legs and their prefix sums (`legKmR`, `legMinR`, `cumDistR`, `cumTravR`) are the
   * forward arrays themselves, kept once.
   */
  legKm: Float64Array = new Float64Array(0);
  legMin: Float64Array = new Float64Array(0);
  legKmR: Float64Array = new Float64Array(0);
  legMinR: Float64Array = new Float64Array(0);
  /** `(len + 2) * dims` prefix loads. */
  preLoad: Float64Array = new Float64Array(0);
  /**
   * Only when some stop collects (`cp.anyPickup`), `(len + 2) * dims` each: prefix pickups, and
   * the highest load over stops 1..i (`preMax`) and over stops i..len (`sufMax`) counted as
   * "deliveries still to make in the segment + pickups made in it" (see `routeRules`).
   */
  prePick: Float64Array = new Float64Array(0);
  preMax: Float64Array = new Float64Array(0);
  sufMax: Float64Array = new Float64Array(0);

  /**
   * @param cp - the compiled problem
   * @param vehicle - index of the vehicle that drives this route
   */
  constructor(
    readonly cp: CompiledProblem,
    readonly vehicle: number,
  ) {
    this.ensure(8);
  }

  /**
   * Replace the stops of the route and rebuild every summary in O(len); the matrix is read only
   * for legs that are new (stops the old and new route share at their ends keep theirs).
   *
   * @param stops - stop indices in visiting order
   * @param count - how many of `stops` to take (default all)
   * @example route.assign(Int32Array.of(3, 1), 2)
   */
  assign(stops: Int32Array | readonly number[], count: number = stops.length): void {
    // Stops shared with the old route at the start keep their summaries (unless the arrays
    // grew, which keeps only stops, locations and legs); at the end, their legs.
    const grew = this.ensure(count);
    const old = this.len;
    const nodes = this.nodes;
    let head = 0;
    const both = Math.min(old, count);
    while (!grew && head < both && nodes[head + 1] === stops[head]) head++;
    let tail = 0;
    while (tail < both - head && nodes[old - tail] === stops[count - 1 - tail]) tail++;
    if (tail > 0 && count !== old) {
      const from = old - tail + 2;
      const to = count - tail + 2;
      this.legKm.copyWithin(to, from, old + 1);
      this.legMin.copyWithin(to, from, old + 1);
      if (!this.cp.symmetric) {
        this.legKmR.copyWithin(to, from, old + 1);
        this.legMinR.copyWithin(to, from, old + 1);
      }
    }
    this.len = count;
    for (let i = head; i < count; i++) nodes[i + 1] = stops[i]!;
    for (let i = head + 1; i <= count; i++) this.locs[i] = this.cp.stopLoc[nodes[i]!]!;
    this.rebuild(head + 1, count, count - tail + 1);
  }

  /**
   * Replace stops at positions lo..hi (same length) and rebuild only what they affect:
   * prefixes from lo on, suffixes from hi down.
   *
   * @param stops - the whole new sequence (0-based), `len` long
   * @param lo - first changed position (1-based)
   * @param hi - last changed position
   */
  replaceRange(stops: Int32Array, lo: number, hi: number): void {
    for (let p = lo; p <= hi; p++) this.nodes[p] = stops[p - 1]!;
    for (let p = lo; p <= hi; p++) this.locs[p] = this.cp.stopLoc[this.nodes[p]!]!;
    this.rebuild(lo, hi, hi + 1);
  }

  /**
   * Recompute the summaries from `nodes[1..len]`: prefixes from `lo` on, suffixes from `hi`
   * down. `locs[1..len]` must be current, and so must the legs into positions after `legHi`
   * (those up to it are read from the matrix again).
   */
  rebuild(lo: number = 1, hi: number = this.len, legHi: number = this.len): void {
    const cp = this.cp;
    const v = this.vehicle;
    const len = this.len;
    const f = cp.travelFactor[v]!;
    const dims = cp.dims;
    const locs = this.locs;
    locs[0] = cp.startLoc[v]!;
    this.nodes[0] = -1;
    this.nodes[len + 1] = -1;
    locs[len + 1] = cp.endLoc[v]!;
    const { legKm, legMin, legKmR, legMinR } = this;
    const L = cp.locationCount;
    const T = cp.travelMin;
    const Dm = cp.distanceKm;
    const P = cp.places;
    const derived = cp.travelFromKm;
    const dv = cp.travelDivisor;
    const mu = cp.travelMultiplier;
    const symmetric = cp.symmetric;
    for (let i = lo, end = Math.min(legHi, len); i <= end; i++) {
      const a = locs[i - 1]!;
      const b = locs[i]!;
      // Computed on a large great-circle matrix (symmetric: one computation), else read.
      const km = P ? placeKm(P, a, b) : Dm[a * L + b]!;
      legKm[i] = km;
      legMin[i] = derived ? (km / dv) * mu : T[a * L + b]!;
      if (symmetric) continue; // the reversed legs are these arrays
      const kmR = P ? km : Dm[b * L + a]!;
      legKmR[i] = kmR;
      legMinR[i] = derived ? (kmR / dv) * mu : T[b * L + a]!;
    }
    const { preD, preTW, preE, preL, preLoad, cumDist, cumDistR, cumTrav, cumTravR, cumSvc, cumWin } = this;
    cumDist[0] = cumDistR[0] = cumTrav[0] = cumTravR[0] = cumSvc[0] = 0;
    cumWin[0] = 0;
    for (let d = 0; d < dims; d++) preLoad[d] = 0;
    for (let i = lo; i <= len; i++) {
      const s = this.nodes[i]!;
      cumTrav[i] = cumTrav[i - 1]! + legMin[i]! * f;
      cumDist[i] = cumDist[i - 1]! + legKm[i]!;
      if (!symmetric) {
        cumTravR[i] = cumTravR[i - 1]! + legMinR[i]! * f;
        cumDistR[i] = cumDistR[i - 1]! + legKmR[i]!;
      }
      cumSvc[i] = cumSvc[i - 1]! + cp.serviceMin[s]!;
      cumWin[i] = cumWin[i - 1]! + cp.windowed[s]!;
      for (let d = 0; d < dims; d++) preLoad[i * dims + d] = preLoad[(i - 1) * dims + d]! + cp.demand[s * dims + d]!;
    }
    if (cp.anyPickup) this.rebuildPickups(lo, hi);
    const windowed = cumWin[len]! > 0;
    if (windowed && !this.windowed) {
      // The summaries were not kept while the route had no window: all of them now.
      lo = 1;
      hi = len;
    }
    this.windowed = windowed;
    if (!windowed) return;
    preD[0] = 0;
    preTW[0] = 0;
    preE[0] = cp.shiftStartMin[v]!;
    preL[0] = cp.shiftEndMin[v]!;
    for (let i = lo; i <= len; i++) {
      const s = this.nodes[i]!;
      // Prefix(i-1) then stop i.
      concatWindows(
        W,
        preD[i - 1]!,
        preTW[i - 1]!,
        preE[i - 1]!,
        preL[i - 1]!,
        legMin[i]! * f,
        cp.serviceMin[s]!,
        0,
        cp.earliestMin[s]!,
        cp.latestMin[s]!,
      );
      preD[i] = W.duration;
      preTW[i] = W.timeWarp;
      preE[i] = W.earliest;
      preL[i] = W.latest;
    }
    const { sufD, sufTW, sufE, sufL } = this;
    if (len > 0 && hi >= len) {
      const s = this.nodes[len]!;
      sufD[len] = cp.serviceMin[s]!;
      sufTW[len] = 0;
      sufE[len] = cp.earliestMin[s]!;
      sufL[len] = cp.latestMin[s]!;
    }
    for (let i = Math.min(hi, len - 1); i >= 1; i--) {
      const s = this.nodes[i]!;
      const t = cumTrav[i + 1]! - cumTrav[i]!;
      // Stop i then suffix(i+1).
      concatWindows(
        W,
        cp.serviceMin[s]!,
        0,
        cp.earliestMin[s]!,
        cp.latestMin[s]!,
        t,
        sufD[i + 1]!,
        sufTW[i + 1]!,
        sufE[i + 1]!,
        sufL[i + 1]!,
      );
      sufD[i] = W.duration;
      sufTW[i] = W.timeWarp;
      sufE[i] = W.earliest;
      sufL[i] = W.latest;
    }
  }

  /** Pickup summaries (segment concatenation of loads in both directions). */
  private rebuildPickups(lo: number, hi: number): void {
    const cp = this.cp;
    const dims = cp.dims;
    const len = this.len;
    const { prePick, preMax, sufMax, preLoad } = this;
    for (let d = 0; d < dims; d++) prePick[d] = preMax[d] = 0;
    for (let i = lo; i <= len; i++) {
      const s = this.nodes[i]!;
      for (let d = 0; d < dims; d++) {
        const q = cp.demand[s * dims + d]!;
        const p = cp.pickup[s * dims + d]!;
        prePick[i * dims + d] = prePick[(i - 1) * dims + d]! + p;
        // Stops 1..i-1 then stop i: max(M1 + q, P1 + max(q, p)).
        preMax[i * dims + d] = Math.max(preMax[(i - 1) * dims + d]! + q, prePick[(i - 1) * dims + d]! + Math.max(q, p));
      }
    }
    for (let d = 0; d < dims; d++) sufMax[(len + 1) * dims + d] = 0;
    for (let i = Math.min(hi, len); i >= 1; i--) {
      const s = this.nodes[i]!;
      for (let d = 0; d < dims; d++) {
        const q = cp.demand[s * dims + d]!;
        const p = cp.pickup[s * dims + d]!;
        const restQ = preLoad[len * dims + d]! - preLoad[i * dims + d]!;
        // Stop i then stops i+1..len: max(max(q, p) + D2, p + M2).
        sufMax[i * dims + d] = Math.max(Math.max(q, p) + restQ, p + sufMax[(i + 1) * dims + d]!);
      }
    }
  }

  /**
   * Grow the arrays so that `count` stops fit (allocates only when growing).
   *
   * @returns true when the arrays grew (then only stops, locations and legs were kept)
   */
  ensure(count: number): boolean {
    if (count <= this.capacity) return false;
    const cap = Math.max(count, this.capacity * 2, 8);
    const size = cap + 2;
    const F = (k: number): Float64Array => new Float64Array(k);
    const I = (k: number): Int32Array => new Int32Array(k);
    const nodes = I(size);
    nodes.set(this.nodes);
    this.nodes = nodes;
    const locs = I(size);
    locs.set(this.locs);
    this.locs = locs;
    this.preD = F(size);
    this.preTW = F(size);
    this.preE = F(size);
    this.preL = F(size);
    this.sufD = F(size);
    this.sufTW = F(size);
    this.sufE = F(size);
    this.sufL = F(size);
    this.cumDist = F(size);
    this.cumTrav = F(size);
    this.cumDistR = this.cp.symmetric ? this.cumDist : F(size);
    this.cumTravR = this.cp.symmetric ? this.cumTrav : F(size);
    this.cumSvc = F(size);
    this.cumWin = I(size);
    const keep = (old: Float64Array): Float64Array => {
      const a = F(size);
      a.set(old);
      return a;
    };
    this.legKm = keep(this.legKm);
    this.legMin = keep(this.legMin);
    this.legKmR = this.cp.symmetric ? this.legKm : keep(this.legKmR);
    this.legMinR = this.cp.symmetric ? this.legMin : keep(this.legMinR);
    this.preLoad = F(size * this.cp.dims);
    if (this.cp.anyPickup) {
      this.prePick = F(size * this.cp.dims);
      this.preMax = F(size * this.cp.dims);
      this.sufMax = F(size * this.cp.dims);
    }
    this.capacity = cap;
    return true;
  }
}
