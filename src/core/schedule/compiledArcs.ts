/** The matrix scan and the end-depot arc table that `compileProblem` builds for the search. */

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
