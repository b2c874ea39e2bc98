import type { Problem } from "../model.js";
import { compileEarlier } from "./compileEarlier.js";
import type { Places } from "../geo/placeKm.js";
import { computablePlaces, COMPUTE_KM_FROM_LOCATIONS, endDepotArcs, scanMatrix, symmetricArcs } from "./compiledArcs.js";
import { reachable, reasonFor } from "./unservableReasons.js";

/**
 * Offsets in `CompiledProblem.stopRows`: a stop's service minutes, window hull, window flag and
 * `dims` demands side by side, the numbers the move loop reads about a stop.
 */
export const ROW_SERVICE = 0;
export const ROW_EARLIEST = 1;
export const ROW_LATEST = 2;
export const ROW_WINDOWED = 3;
export const ROW_DEMAND = 4;

/**
 * A problem flattened into typed arrays for the search: one index space for stops
 * (0..n-1) and vehicles (0..V-1), window hulls, demands with an extra "stop count"
 * dimension that carries `maxStops`, per-vehicle travel factors and a compatibility table.
 */
export interface CompiledProblem {
  readonly problem: Problem;
  /** Number of stops, vehicles, locations. */
  readonly n: number;
  readonly vehicleCount: number;
  readonly locationCount: number;
  /** Load dimensions of the problem plus one (stop count, capacity `maxStops`). */
  readonly dims: number;
  readonly travelMin: Float64Array;
  readonly distanceKm: Float64Array;
  /**
   * When every entry of `travelMin` is `(distanceKm / travelDivisor) * travelMultiplier`
   * bitwise (a matrix built from km at one speed, or minutes equal to km), true: the search then
   * reads only `distanceKm` and derives minutes with that very expression, one memory read per
   * arc instead of two, with identical values. False: both tables are read.
   */
  readonly travelFromKm: boolean;
  /**
   * When set, `distanceKm[a * L + b]` is bitwise `placeKm(places, a, b)` and the hot loops
   * compute it instead of reading a table too large for the caches (`computablePlaces`).
   */
  readonly places: Places | undefined;
  readonly travelDivisor: number;
  readonly travelMultiplier: number;
  /** Every arc costs bitwise the same both ways, km and minutes (`symmetricArcs`). */
  readonly symmetric: boolean;
  /**
   * Arcs into the vehicles' end depots, laid out by depot: `toEnd[(endDepot[v] * L + loc) * 2]`
   * is `distanceKm[loc * L + endLoc[v]]` and the next entry the `travelMin` of that arc (copies,
   * so a column of the row-major matrix is read from one short row). Empty when there would be
   * more than `TO_END_MAX_ENTRIES` entries (then `endDepot` is all -1 and the matrix is read).
   */
  readonly toEnd: Float64Array;
  readonly endDepot: Int32Array;
  readonly stopLoc: Int32Array;
  readonly serviceMin: Float64Array;
  /** Window hull [first earliest, last latest]; -Infinity/+Infinity for a stop that is never binding. */
  readonly earliestMin: Float64Array;
  readonly latestMin: Float64Array;
  /** 1 when the stop's window can bind (finite hull or several windows). */
  readonly windowed: Uint8Array;
  /** `n * dims` demands; the last dimension is 1 (one stop). */
  readonly demand: Float64Array;
  /**
   * `serviceMin`, `earliestMin`, `latestMin`, `windowed` and `demand` again, stop by stop
   * (`stopRows[s * stopStride + ROW_SERVICE]`, ..., `ROW_DEMAND + d`): the same numbers laid out
   * for the move loop, which reads them together for stops scattered over a large day (one or
   * two cache lines per stop instead of five).
   */
  readonly stopRows: Float64Array;
  readonly stopStride: number;
  /** `n * dims` pickups (collected at the stop); the last dimension is 0. */
  readonly pickup: Float64Array;
  /** True when some stop collects something (load then varies along the route). */
  readonly anyPickup: boolean;
  /** Typical demand per dimension: load excess is measured in these units. */
  readonly loadScale: Float64Array;
  /** Cost of leaving the stop unserved; `mustServeCost` for a stop that must be served. */
  readonly unservedCost: Float64Array;
  readonly optional: Uint8Array;
  readonly mustServeCost: number;
  readonly startLoc: Int32Array;
  readonly endLoc: Int32Array;
  readonly shiftStartMin: Float64Array;
  readonly shiftEndMin: Float64Array;
  readonly fixedCost: Float64Array;
  readonly costPerKm: Float64Array;
  readonly costPerHour: Float64Array;
  /** Multiplier of `travelMin` for each vehicle (reference speed / own speed). */
  readonly travelFactor: Float64Array;
  /** Per vehicle: limits on driving minutes, duty minutes and km (Infinity when none). */
  readonly maxDrivingMin: Float64Array;
  readonly maxDutyMin: Float64Array;
  readonly maxKm: Float64Array;
  /** 1 when the vehicle has a break rule (its routes are then timed by `scheduleRoute`). */
  readonly hasBreaks: Uint8Array;
  /** `V * dims` capacities; the last dimension is `maxStops` (or Infinity). */
  readonly capacity: Float64Array;
  /** `n * V`: 1 when vehicle v may serve stop s (features, pins, capacity, reachable in its shift). */
  readonly compatible: Uint8Array;
  /** True when some stop/vehicle pair is incompatible (moves must then check). */
  readonly anyIncompatible: boolean;
  /**
   * Per stop: 1 when every vehicle may serve it (its row of `compatible` is all 1), so the move
   * loop need not read `compatible`, an `n * V` table (2 MB at 5 000 stops and 417 vehicles)
   * read at random otherwise.
   */
  readonly everyVehicle: Uint8Array;
  readonly hardWindows: boolean;
  readonly lateCostPerMin: number;
  readonly hierarchical: boolean;
  /** Why a stop can never be served ("" when it can). */
  readonly unservableReason: readonly string[];
  /** True when re-planning from `Problem.earlier`: every route is then checked by `applyRouteRules`. */
  readonly replanning: boolean;
  /** Per stop: its vehicle in the earlier plan (-1: none) and its position there (0-based). */
  readonly homeVehicle: Int32Array;
  readonly homeRank: Int32Array;
  /** Cost per stop served by another vehicle than its home vehicle (0 when not re-planning). */
  readonly stabilityCost: number;
  /** Per vehicle: 1 when its earlier route is locked (kept exactly). */
  readonly locked: Uint8Array;
}

/**
 * Flatten a (validated) problem for the search.
 *
 * @param problem - a problem without `validateProblem` issues
 * @param computeKmFrom - from this many locations on, a great-circle matrix's km are computed
 *   in the hot loops (`computablePlaces`; default `COMPUTE_KM_FROM_LOCATIONS`; the same numbers)
 * @returns the compiled arrays; stops no vehicle can serve carry a reason in words
 * @throws RangeError when the problem has no vehicle
 * @example compileProblem(problem).compatible[s * V + v] // => 1 when v may serve s
 */
export function compileProblem(problem: Problem, computeKmFrom: number = COMPUTE_KM_FROM_LOCATIONS): CompiledProblem {
  const n = problem.stops.length;
  const V = problem.vehicles.length;
  if (V < 1) throw new RangeError("problem.vehicles must not be empty");
  const L = problem.matrix.size;
  const baseDims = problem.loadDimensions.length;
  const dims = baseDims + 1;
  const m = problem.matrix;
  const minShiftStart = Math.min(...problem.vehicles.map((v) => v.shiftStartMin));
  const stopLoc = new Int32Array(n);
  const serviceMin = new Float64Array(n);
  const earliestMin = new Float64Array(n);
  const latestMin = new Float64Array(n);
  const windowed = new Uint8Array(n);
  const demand = new Float64Array(n * dims);
  const pickup = new Float64Array(n * dims);
  let anyPickup = false;
  const loadScale = new Float64Array(dims).fill(1);
  const unservedCost = new Float64Array(n);
  const optional = new Uint8Array(n);
  problem.stops.forEach((s, i) => {
    stopLoc[i] = s.location;
    serviceMin[i] = s.serviceMin;
    const first = s.windows[0];
    const last = s.windows[s.windows.length - 1];
    const e = first ? first.earliestMin : 0;
    const l = last ? last.latestMin : Infinity;
    // A single window that opens before any shift and never closes cannot bind:
    // -Infinity/+Infinity lets reversed segments be summarised from prefix sums.
    const open = s.windows.length <= 1 && e <= minShiftStart && l === Infinity;
    earliestMin[i] = open ? -Infinity : e;
    latestMin[i] = open ? Infinity : l;
    windowed[i] = open ? 0 : 1;
    for (let d = 0; d < baseDims; d++) demand[i * dims + d] = s.demand[d] ?? 0;
    demand[i * dims + baseDims] = 1;
    for (let d = 0; d < baseDims; d++) {
      const p = s.pickup?.[d] ?? 0;
      pickup[i * dims + d] = p;
      if (p > 0) anyPickup = true;
    }
    if (s.unservedCost !== undefined) {
      optional[i] = 1;
      unservedCost[i] = s.unservedCost;
    }
  });
  for (let d = 0; d < baseDims; d++) {
    let sum = 0;
    let count = 0;
    for (let i = 0; i < n; i++) {
      const q = demand[i * dims + d]!;
      if (q > 0) {
        sum += q;
        count++;
      }
    }
    loadScale[d] = count > 0 ? sum / count : 1;
  }
  const vs = problem.vehicles;
  const startLoc = Int32Array.from(vs, (v) => v.startLocation);
  const endLoc = Int32Array.from(vs, (v) => v.endLocation);
  const shiftStartMin = Float64Array.from(vs, (v) => v.shiftStartMin);
  const shiftEndMin = Float64Array.from(vs, (v) => v.shiftEndMin);
  const fixedCost = Float64Array.from(vs, (v) => v.fixedCost);
  const costPerKm = Float64Array.from(vs, (v) => v.costPerKm);
  const costPerHour = Float64Array.from(vs, (v) => v.costPerHour);
  const travelFactor = Float64Array.from(vs, (v) => (m.userSupplied ? 1 : problem.referenceSpeedKmh / v.speedKmh));
  const maxDrivingMin = Float64Array.from(vs, (v) => v.maxDrivingMin ?? Infinity);
  const maxDutyMin = Float64Array.from(vs, (v) => v.maxDutyMin ?? Infinity);
  const maxKm = Float64Array.from(vs, (v) => v.maxKm ?? Infinity);
  const hasBreaks = Uint8Array.from(vs, (v) => (v.drivingBreak !== undefined || v.windowBreak !== undefined ? 1 : 0));
  const capacity = new Float64Array(V * dims);
  vs.forEach((v, k) => {
    for (let d = 0; d < baseDims; d++) capacity[k * dims + d] = v.capacity[d] ?? 0;
    capacity[k * dims + baseDims] = v.maxStops ?? Infinity;
  });
  const arcs = scanMatrix(m.distanceKm, m.travelMin, problem.referenceSpeedKmh);
  const maxRow = arcs.maxKm;
  const maxTravel = arcs.maxMin;
  const maxFactor = Math.max(...travelFactor);
  let routeBound = 0;
  for (let k = 0; k < V; k++) routeBound += fixedCost[k]!;
  const maxPerKm = Math.max(...costPerKm);
  const maxHour = Math.max(...costPerHour);
  let serviceSum = 0;
  for (let i = 0; i < n; i++) serviceSum += serviceMin[i]!;
  routeBound += (n + V) * (maxPerKm * maxRow + (maxHour * maxTravel * maxFactor) / 60) + (maxHour * serviceSum) / 60;
  // Far above any plan's route cost, so a stop without unserved cost is always worth serving.
  const mustServeCost = 1000 * (routeBound + 1);
  for (let i = 0; i < n; i++) if (!optional[i]) unservedCost[i] = mustServeCost;

  const compatible = new Uint8Array(n * V);
  const unservableReason: string[] = [];
  let anyIncompatible = false;
  for (let i = 0; i < n; i++) {
    const s = problem.stops[i]!;
    let pinOk = 0;
    let featureOk = 0;
    let capOk = 0;
    let ok = 0;
    for (let k = 0; k < V; k++) {
      const v = vs[k]!;
      if (s.allowedVehicles !== undefined && !s.allowedVehicles.includes(v.id)) continue;
      if (s.excludedVehicles?.includes(v.id)) continue;
      pinOk++;
      const feats = s.requiredFeatures ?? [];
      if (!feats.every((f) => (v.features ?? []).includes(f))) continue;
      featureOk++;
      let fits = capacity[k * dims + baseDims]! >= 1;
      for (let d = 0; d < baseDims; d++) {
        if (demand[i * dims + d]! > capacity[k * dims + d]! || pickup[i * dims + d]! > capacity[k * dims + d]!) fits = false;
      }
      if (!fits) continue;
      capOk++;
      if (problem.hardWindows && !reachable(problem, i, k, travelFactor[k]!)) continue;
      compatible[i * V + k] = 1;
      ok++;
    }
    if (ok < V) anyIncompatible = true;
    unservableReason.push(
      s.unplannedReason !== undefined
        ? s.unplannedReason
        : ok > 0
          ? ""
          : pinOk === 0
            ? "no vehicle is left once its pin and excluded vehicles are applied"
            : reasonFor(problem, i, featureOk, capOk),
    );
  }
  const replan = compileEarlier(problem, compatible, unservableReason, unservedCost, optional);
  if (replan.locked.some((x) => x === 1)) anyIncompatible = true;
  const stopStride = ROW_DEMAND + dims;
  const stopRows = new Float64Array(n * stopStride);
  for (let i = 0; i < n; i++) {
    const o = i * stopStride;
    stopRows[o + ROW_SERVICE] = serviceMin[i]!;
    stopRows[o + ROW_EARLIEST] = earliestMin[i]!;
    stopRows[o + ROW_LATEST] = latestMin[i]!;
    stopRows[o + ROW_WINDOWED] = windowed[i]!;
    for (let d = 0; d < dims; d++) stopRows[o + ROW_DEMAND + d] = demand[i * dims + d]!;
  }
  const everyVehicle = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    let all = 1;
    for (let k = 0; k < V && all; k++) if (!compatible[i * V + k]) all = 0;
    everyVehicle[i] = all;
  }
  const ends = endDepotArcs(m.distanceKm, m.travelMin, L, endLoc);
  const places = computablePlaces(problem, computeKmFrom);
  // Every field written out, no spread: built with spreads, each compiled problem got a hidden
  // class of its own in V8, so the hot loops' reads of it turned megamorphic after a few runs in
  // one process (the bench, the pane's worker) and ran at half speed.
  return {
    replanning: replan.replanning,
    homeVehicle: replan.homeVehicle,
    homeRank: replan.homeRank,
    stabilityCost: replan.stabilityCost,
    locked: replan.locked,
    problem,
    n,
    vehicleCount: V,
    locationCount: L,
    dims,
    travelMin: m.travelMin,
    distanceKm: m.distanceKm,
    travelFromKm: arcs.divisor > 0,
    places,
    travelDivisor: arcs.divisor > 0 ? arcs.divisor : 1,
    travelMultiplier: arcs.multiplier,
    symmetric: symmetricArcs(m.distanceKm, m.travelMin, L, places !== undefined, arcs.divisor > 0),
    toEnd: ends.toEnd,
    endDepot: ends.endDepot,
    stopLoc,
    serviceMin,
    earliestMin,
    latestMin,
    windowed,
    demand,
    stopRows,
    stopStride,
    pickup,
    anyPickup,
    loadScale,
    unservedCost,
    optional,
    mustServeCost,
    startLoc,
    endLoc,
    shiftStartMin,
    shiftEndMin,
    fixedCost,
    costPerKm,
    costPerHour,
    travelFactor,
    maxDrivingMin,
    maxDutyMin,
    maxKm,
    hasBreaks,
    capacity,
    compatible,
    anyIncompatible,
    everyVehicle,
    hardWindows: problem.hardWindows,
    lateCostPerMin: problem.lateCostPerMin,
    hierarchical: problem.objective === "hierarchical",
    unservableReason,
  };
}
