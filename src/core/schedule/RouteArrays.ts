import { placeKm } from "../geo/placeKm.js";
import { ROW_DEMAND, ROW_EARLIEST, ROW_LATEST, ROW_SERVICE, ROW_WINDOWED, type CompiledProblem } from "./compileProblem.js";

/**
 * Offsets of a position's numbers in `RouteArrays.data`: position `i` of a route starts at
 * `i * stride`. One array per route with the numbers of a position side by side, so that an
 * evaluation reads one or two cache lines per position it looks at instead of one per
 * separate array (and one array header instead of some twenty).
 */
export const PRE_D = 0;
export const PRE_TW = 1;
export const PRE_E = 2;
export const PRE_L = 3;
export const CUM_DIST = 4;
export const CUM_TRAV = 5;
export const CUM_SVC = 6;
export const CUM_WIN = 7;
export const SUF_D = 8;
export const SUF_TW = 9;
export const SUF_E = 10;
export const SUF_L = 11;
export const LEG_KM = 12;
export const LEG_MIN = 13;
/** Where the reversed legs and their prefix sums go when the matrix is not symmetric. */
const OWN_REVERSED = 14;

/** The names of a position's numbers, for readers outside the hot loops (tests, tools). */
export type RouteField =
  | "preD"
  | "preTW"
  | "preE"
  | "preL"
  | "sufD"
  | "sufTW"
  | "sufE"
  | "sufL"
  | "cumDist"
  | "cumDistR"
  | "cumTrav"
  | "cumTravR"
  | "cumSvc"
  | "cumWin"
  | "legKm"
  | "legMin"
  | "legKmR"
  | "legMinR";

/**
 * One vehicle's route during the search, with prefix and suffix segment summaries
 * (duration, time warp, earliest and latest start; Vidal, Crainic, Gendreau & Prins 2013,
 * "A hybrid genetic algorithm with adaptive diversity management for a large class of
 * vehicle routing problems with time-windows", Computers & Operations Research 40(1)).
 *
 * Position 0 is the start depot, 1..len the stops, len+1 the end depot.
 * `pre*` at i summarises positions 0..i (start depot included); `suf*` at i summarises
 * stops i..len (end depot excluded, so lateness at the end depot stays separable).
 * Additive quantities (distance, travel, service, load, windowed-stop count) are prefix sums.
 * Every number of position i is in `data` at `i * stride + offset` (`PRE_D`, ..., `LEG_MIN`;
 * the reversed legs and their prefix sums at `oLegKmR`, `oLegMinR`, `oDistR`, `oTravR`; the
 * `dims` prefix loads from `oLoad`).
 *
 * The window summaries (`pre*` and `suf*`) are kept only while the route holds a
 * stop with a window that can bind (`windowed`): a stretch of stops without one is summarised
 * exactly by its prefix sums (duration = service + travel, no warp, open window), so a route
 * without windows (a TSPLIB tour, a day without windows) skips the two O(len) passes over
 * them after every move, and its readers take the prefix sums instead.
 */
export class RouteArrays {
  capacity = 0;
  len = 0;
  /** True while some stop on the route has a window that can bind: only then are `pre*`/`suf*` current. */
  windowed = false;
  nodes: Int32Array = new Int32Array(0);
  locs: Int32Array = new Int32Array(0);
  /** `(capacity + 2) * stride` numbers: every position's summaries side by side (offsets above). */
  data: Float64Array = new Float64Array(0);
  /** Numbers per position. */
  readonly stride: number;
  /**
   * Offsets of the reversed legs (i -> i-1) and their prefix sums. On a symmetric matrix
   * (`cp.symmetric`) they are the forward offsets: the reversed legs are the forward ones, kept once.
   */
  readonly oDistR: number;
  readonly oTravR: number;
  readonly oLegKmR: number;
  readonly oLegMinR: number;
  /** Offset of the `dims` prefix loads. */
  readonly oLoad: number;
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
    const own = !cp.symmetric;
    this.oDistR = own ? OWN_REVERSED : CUM_DIST;
    this.oTravR = own ? OWN_REVERSED + 1 : CUM_TRAV;
    this.oLegKmR = own ? OWN_REVERSED + 2 : LEG_KM;
    this.oLegMinR = own ? OWN_REVERSED + 3 : LEG_MIN;
    this.oLoad = own ? OWN_REVERSED + 4 : OWN_REVERSED;
    this.stride = this.oLoad + cp.dims;
    this.ensure(8);
  }

  /**
   * The route's stops in visiting order, as a new array (a copy: the route's own buffer changes
   * with every move).
   *
   * @example const before = route.stops()
   */
  stops(): number[] {
    return Array.from(this.nodes.subarray(1, this.len + 1));
  }

  /**
   * One number of position `i` by name (for tests and tools; the hot loops read `data`).
   *
   * @param field - which number
   * @param i - the position (0 start depot, 1..len stops)
   * @returns the number as stored
   * @example route.value("cumDist", route.len) // => km from the start depot to the last stop
   */
  value(field: RouteField, i: number): number {
    return this.data[i * this.stride + this.offset(field)]!;
  }

  /** Offset of a named number in a position's block. */
  private offset(field: RouteField): number {
    switch (field) {
      case "preD":
        return PRE_D;
      case "preTW":
        return PRE_TW;
      case "preE":
        return PRE_E;
      case "preL":
        return PRE_L;
      case "sufD":
        return SUF_D;
      case "sufTW":
        return SUF_TW;
      case "sufE":
        return SUF_E;
      case "sufL":
        return SUF_L;
      case "cumDist":
        return CUM_DIST;
      case "cumDistR":
        return this.oDistR;
      case "cumTrav":
        return CUM_TRAV;
      case "cumTravR":
        return this.oTravR;
      case "cumSvc":
        return CUM_SVC;
      case "cumWin":
        return CUM_WIN;
      case "legKm":
        return LEG_KM;
      case "legMin":
        return LEG_MIN;
      case "legKmR":
        return this.oLegKmR;
      case "legMinR":
        return this.oLegMinR;
    }
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
      // The legs into positions from..old move to to..: forwards when they move down, else backwards.
      const from = old - tail + 2;
      const to = count - tail + 2;
      const a = this.data;
      const S = this.stride;
      const own = !this.cp.symmetric;
      const n = old + 1 - from;
      for (let k = 0; k < n; k++) {
        const q = to < from ? k : n - 1 - k;
        const src = (from + q) * S;
        const dst = (to + q) * S;
        a[dst + LEG_KM] = a[src + LEG_KM]!;
        a[dst + LEG_MIN] = a[src + LEG_MIN]!;
        if (own) {
          a[dst + this.oLegKmR] = a[src + this.oLegKmR]!;
          a[dst + this.oLegMinR] = a[src + this.oLegMinR]!;
        }
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
    const nodes = this.nodes;
    locs[0] = cp.startLoc[v]!;
    nodes[0] = -1;
    nodes[len + 1] = -1;
    locs[len + 1] = cp.endLoc[v]!;
    const a = this.data;
    const S = this.stride;
    const { oDistR, oTravR, oLegKmR, oLegMinR, oLoad } = this;
    const L = cp.locationCount;
    const T = cp.travelMin;
    const Dm = cp.distanceKm;
    const P = cp.places;
    const derived = cp.travelFromKm;
    const dv = cp.travelDivisor;
    const mu = cp.travelMultiplier;
    const symmetric = cp.symmetric;
    for (let i = lo, end = Math.min(legHi, len); i <= end; i++) {
      const x = locs[i - 1]!;
      const y = locs[i]!;
      const o = i * S;
      // Computed on a large great-circle matrix (symmetric: one computation), else read.
      const km = P ? placeKm(P, x, y) : Dm[x * L + y]!;
      a[o + LEG_KM] = km;
      a[o + LEG_MIN] = derived ? (km / dv) * mu : T[x * L + y]!;
      if (symmetric) continue; // the reversed legs are these numbers
      const kmR = P ? km : Dm[y * L + x]!;
      a[o + oLegKmR] = kmR;
      a[o + oLegMinR] = derived ? (kmR / dv) * mu : T[y * L + x]!;
    }
    a[CUM_DIST] = a[oDistR] = a[CUM_TRAV] = a[oTravR] = a[CUM_SVC] = 0;
    a[CUM_WIN] = 0;
    for (let d = 0; d < dims; d++) a[oLoad + d] = 0;
    // The stops' numbers side by side (`cp.stopRows`): one or two cache lines per stop.
    const rows = cp.stopRows;
    const SR = cp.stopStride;
    for (let i = lo; i <= len; i++) {
      const s = nodes[i]! * SR;
      const o = i * S;
      const b = o - S;
      a[o + CUM_TRAV] = a[b + CUM_TRAV]! + a[o + LEG_MIN]! * f;
      a[o + CUM_DIST] = a[b + CUM_DIST]! + a[o + LEG_KM]!;
      if (!symmetric) {
        a[o + oTravR] = a[b + oTravR]! + a[o + oLegMinR]! * f;
        a[o + oDistR] = a[b + oDistR]! + a[o + oLegKmR]!;
      }
      a[o + CUM_SVC] = a[b + CUM_SVC]! + rows[s + ROW_SERVICE]!;
      a[o + CUM_WIN] = a[b + CUM_WIN]! + rows[s + ROW_WINDOWED]!;
      // The loads: the first three dimensions written out (most problems have at most three,
      // the stop count included), as `evaluatePieces` reads them.
      const ol = o + oLoad;
      const bl = b + oLoad;
      const sd = s + ROW_DEMAND;
      a[ol] = a[bl]! + rows[sd]!;
      if (dims > 1) {
        a[ol + 1] = a[bl + 1]! + rows[sd + 1]!;
        if (dims > 2) {
          a[ol + 2] = a[bl + 2]! + rows[sd + 2]!;
          for (let d = 3; d < dims; d++) a[ol + d] = a[bl + d]! + rows[sd + d]!;
        }
      }
    }
    if (cp.anyPickup) this.rebuildPickups(lo, hi);
    const windowed = a[len * S + CUM_WIN]! > 0;
    if (windowed && !this.windowed) {
      // The summaries were not kept while the route had no window: all of them now.
      lo = 1;
      hi = len;
    }
    this.windowed = windowed;
    if (!windowed) return;
    a[PRE_D] = 0;
    a[PRE_TW] = 0;
    a[PRE_E] = cp.shiftStartMin[v]!;
    a[PRE_L] = cp.shiftEndMin[v]!;
    // concatWindows (Vidal et al. 2013) written out below, the same operations: a call the
    // engine does not inline would box every number passed to it.
    for (let i = lo; i <= len; i++) {
      const s = nodes[i]! * SR;
      const o = i * S;
      const b = o - S;
      // Prefix(i-1), the leg, then stop i.
      const pD = a[b + PRE_D]!;
      const pTW = a[b + PRE_TW]!;
      const pE = a[b + PRE_E]!;
      const pL = a[b + PRE_L]!;
      const t = a[o + LEG_MIN]! * f;
      const e = rows[s + ROW_EARLIEST]!;
      const l = rows[s + ROW_LATEST]!;
      const delta = pD - pTW + t;
      const wait = Math.max(e - delta - pL, 0);
      const warp = Math.max(pE + delta - l, 0);
      a[o + PRE_D] = pD + (rows[s + ROW_SERVICE]! + t + wait);
      a[o + PRE_TW] = pTW + (0 + warp);
      a[o + PRE_E] = Math.max(e - delta, pE) - wait;
      a[o + PRE_L] = Math.min(l - delta, pL) + warp;
    }
    if (len > 0 && hi >= len) {
      const s = nodes[len]! * SR;
      const o = len * S;
      a[o + SUF_D] = rows[s + ROW_SERVICE]!;
      a[o + SUF_TW] = 0;
      a[o + SUF_E] = rows[s + ROW_EARLIEST]!;
      a[o + SUF_L] = rows[s + ROW_LATEST]!;
    }
    for (let i = Math.min(hi, len - 1); i >= 1; i--) {
      const s = nodes[i]! * SR;
      const o = i * S;
      const n = o + S;
      const t = a[n + CUM_TRAV]! - a[o + CUM_TRAV]!;
      // Stop i, the leg, then suffix(i+1).
      const svc = rows[s + ROW_SERVICE]!;
      const e = rows[s + ROW_EARLIEST]!;
      const l = rows[s + ROW_LATEST]!;
      const nE = a[n + SUF_E]!;
      const nL = a[n + SUF_L]!;
      const delta = svc - 0 + t;
      const wait = Math.max(nE - delta - l, 0);
      const warp = Math.max(e + delta - nL, 0);
      a[o + SUF_D] = svc + (a[n + SUF_D]! + t + wait);
      a[o + SUF_TW] = 0 + (a[n + SUF_TW]! + warp);
      a[o + SUF_E] = Math.max(nE - delta, e) - wait;
      a[o + SUF_L] = Math.min(nL - delta, l) + warp;
    }
  }

  /** Pickup summaries (segment concatenation of loads in both directions). */
  private rebuildPickups(lo: number, hi: number): void {
    const cp = this.cp;
    const dims = cp.dims;
    const len = this.len;
    const { prePick, preMax, sufMax, data, stride, oLoad } = this;
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
        const restQ = data[len * stride + oLoad + d]! - data[i * stride + oLoad + d]!;
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
    const data = F(size * this.stride);
    data.set(this.data);
    this.data = data;
    if (this.cp.anyPickup) {
      this.prePick = F(size * this.cp.dims);
      this.preMax = F(size * this.cp.dims);
      this.sufMax = F(size * this.cp.dims);
    }
    this.capacity = cap;
    return true;
  }
}
