/** The matrix scan, the end-depot arc table and the computable places that `compileProblem` builds for the search. */
import { placeKm, places, type Places } from "../geo/placeKm.js";
import type { Problem } from "../model.js";

/**
 * From this many locations on, the search computes the km of a great-circle matrix instead of
 * reading them: the table is then 8 MB or more (16 MB at 1 448), beyond the processor's faster
 * caches, where a read at random costs more than the haversine (`bench/results/scale-*`).
 */
export const COMPUTE_KM_FROM_LOCATIONS = 1024;

/**
 * The places of a matrix built by `buildMatrix` (`Matrix.greatCircle`) when the search should
 * compute its km (`COMPUTE_KM_FROM_LOCATIONS` or more locations) and a sample of entries (two
 * per row) is bitwise what `placeKm` gives; otherwise undefined and the table is read.
 *
 * @param problem - the problem
 * @param fromLocations - the size from which to compute (default `COMPUTE_KM_FROM_LOCATIONS`)
 * @returns the places, or undefined
 */
export function computablePlaces(problem: Problem, fromLocations = COMPUTE_KM_FROM_LOCATIONS): Places | undefined {
  const m = problem.matrix;
  const L = m.size;
  if (!m.greatCircle || m.userSupplied || L < fromLocations || problem.locations.length !== L) return undefined;
  const p = places(problem.locations, m.greatCircle.detourFactor);
  for (let i = 0; i < L; i++) {
    for (const j of [(i * 7919 + 1) % L, (i * 104729 + 7) % L]) if (placeKm(p, i, j) !== m.distanceKm[i * L + j]) return undefined;
  }
  return p;
}

/** Up to this many locations `symmetricArcs` compares the tables entry by entry (a larger scan would cost the setup). */
const SYMMETRY_SCAN_MAX_LOCATIONS = 2048;

/**
 * True when every arc costs bitwise the same both ways, in km and in minutes: then a route's
 * reversed legs and their prefix sums are its forward ones (`RouteArrays` keeps one copy). A
 * matrix whose km are computed from the places (`computablePlaces`: `placeKm` measures from the
 * lower index, so both ways alike) with minutes derived from km is symmetric without a scan;
 * other tables are compared up to `SYMMETRY_SCAN_MAX_LOCATIONS` locations, and larger ones are
 * taken as asymmetric (both copies kept, the same numbers).
 */
export function symmetricArcs(
  km: Float64Array,
  min: Float64Array,
  L: number,
  computedFromPlaces: boolean,
  minutesFromKm: boolean,
): boolean {
  if (computedFromPlaces && minutesFromKm) return true;
  if (L > SYMMETRY_SCAN_MAX_LOCATIONS) return false;
  for (let i = 0; i < L; i++) {
    for (let j = i + 1; j < L; j++) {
      // A NaN entry never compares equal, so such a matrix keeps both copies.
      if (km[i * L + j] !== km[j * L + i] || min[i * L + j] !== min[j * L + i]) return false;
    }
  }
  return true;
}

/** Largest number of entries (2 per arc) of the end-depot table; beyond it the matrix is read. */
const TO_END_MAX_ENTRIES = 1 << 23;

/**
 * One pass over the matrix: the largest finite km and minutes, and whether minutes follow from
 * km bitwise as `(km / divisor) * multiplier` with (1, 1) or (reference speed, 60).
 */
export function scanMatrix(
  km: Float64Array,
  min: Float64Array,
  speedKmh: number,
): { maxKm: number; maxMin: number; divisor: number; multiplier: number } {
  let maxKm = 0;
  let maxMin = 0;
  let same = true;
  let atSpeed = speedKmh > 0;
  for (let i = 0; i < km.length; i++) {
    const d = km[i]!;
    const t = min[i]!;
    if (d > maxKm && Number.isFinite(d)) maxKm = d;
    if (t > maxMin && Number.isFinite(t)) maxMin = t;
    // A NaN entry never compares equal, so such a matrix keeps both tables.
    if (same && t !== d) same = false;
    if (atSpeed && t !== (d / speedKmh) * 60) atSpeed = false;
  }
  if (same) return { maxKm, maxMin, divisor: 1, multiplier: 1 };
  if (atSpeed) return { maxKm, maxMin, divisor: speedKmh, multiplier: 60 };
  return { maxKm, maxMin, divisor: 0, multiplier: 1 };
}

/** The end-depot arc table of `CompiledProblem.toEnd` (one block per distinct end location). */
export function endDepotArcs(
  km: Float64Array,
  min: Float64Array,
  L: number,
  endLoc: Int32Array,
): { toEnd: Float64Array; endDepot: Int32Array } {
  const depots: number[] = [];
  const endDepot = Int32Array.from(endLoc, (loc) => {
    const k = depots.indexOf(loc);
    if (k >= 0) return k;
    depots.push(loc);
    return depots.length - 1;
  });
  if (depots.length * L * 2 > TO_END_MAX_ENTRIES) return { toEnd: new Float64Array(0), endDepot: endDepot.fill(-1) };
  const toEnd = new Float64Array(depots.length * L * 2);
  depots.forEach((e, k) => {
    for (let loc = 0; loc < L; loc++) {
      toEnd[(k * L + loc) * 2] = km[loc * L + e]!;
      toEnd[(k * L + loc) * 2 + 1] = min[loc * L + e]!;
    }
  });
  return { toEnd, endDepot };
}
