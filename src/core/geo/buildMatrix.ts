import { DEFAULT_DETOUR_FACTOR, DEFAULT_SPEED_KMH } from "../constants.js";
import type { LatLon, Matrix } from "../model.js";
import { placeKm, places } from "./placeKm.js";

/** Side of the square tiles the matrix is filled in (64 x 64 entries: 32 KB per array). */
const TILE = 64;

/** Options of `buildMatrix`. */
export interface BuildMatrixOptions {
  /** Road distance over great-circle distance (default 1.3, common practice). */
  readonly detourFactor: number;
  /** Speed for `travelMin` (default 40 km/h). */
  readonly speedKmh: number;
}

/**
 * The travel matrix of a set of locations: great-circle km times the detour factor, and
 * minutes at the given speed. Built once per problem, row-major in typed arrays.
 *
 * @param locations - points in decimal degrees
 * @param options - detour factor and reference speed
 * @returns a `Matrix` with `size = locations.length`
 * @throws RangeError when the detour factor is below 1 or the speed is not positive
 * @example buildMatrix([{lat: 0, lon: 0}, {lat: 0, lon: 1}]).distanceKm[1] // => 144.55 (about)
 */
export function buildMatrix(locations: readonly LatLon[], options: Partial<BuildMatrixOptions> = {}): Matrix {
  const detour = options.detourFactor ?? DEFAULT_DETOUR_FACTOR;
  const speed = options.speedKmh ?? DEFAULT_SPEED_KMH;
  if (!(detour >= 1)) throw new RangeError(`detourFactor must be >= 1, got ${detour}`);
  if (!(speed > 0)) throw new RangeError(`speedKmh must be > 0, got ${speed}`);
  const n = locations.length;
  const distanceKm = new Float64Array(n * n);
  const travelMin = new Float64Array(n * n);
  // Every entry is `placeKm` (bitwise `greatCircleKm(a, b) * detour`, each point's cosine taken
  // once), from the lower index to the higher and mirrored; the matrix filled in square tiles
  // so the mirrored writes stay in cache.
  const p = places(locations, detour);
  for (let i0 = 0; i0 < n; i0 += TILE) {
    const i1 = Math.min(n, i0 + TILE);
    for (let j0 = i0; j0 < n; j0 += TILE) {
      const j1 = Math.min(n, j0 + TILE);
      for (let i = i0; i < i1; i++) {
        for (let j = Math.max(j0, i + 1); j < j1; j++) {
          const km = placeKm(p, i, j);
          const min = (km / speed) * 60;
          distanceKm[i * n + j] = km;
          distanceKm[j * n + i] = km;
          travelMin[i * n + j] = min;
          travelMin[j * n + i] = min;
        }
      }
    }
  }
  return { size: n, distanceKm, travelMin, userSupplied: false, greatCircle: { detourFactor: detour } };
}

/**
 * A matrix from numbers the user supplied (for example exported from a road-routing
 * engine), used as is. When no time matrix is given, minutes follow from km at `speedKmh`.
 *
 * @param distanceKm - square table of kilometres, row = from, column = to
 * @param travelMin - optional square table of minutes of the same size
 * @param speedKmh - speed for minutes when `travelMin` is absent (default 40)
 * @throws RangeError when a table is not square or sizes differ (validate user data first)
 * @example userMatrix([[0, 5], [6, 0]]).distanceKm[2] // => 6
 */
export function userMatrix(
  distanceKm: readonly (readonly number[])[],
  travelMin?: readonly (readonly number[])[],
  speedKmh: number = DEFAULT_SPEED_KMH,
): Matrix {
  const n = distanceKm.length;
  const check = (t: readonly (readonly number[])[], what: string): void => {
    if (t.length !== n || t.some((row) => row.length !== n)) {
      throw new RangeError(`${what} must be ${n} x ${n}`);
    }
  };
  check(distanceKm, "distanceKm");
  if (travelMin) check(travelMin, "travelMin");
  const d = new Float64Array(n * n);
  const t = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      d[i * n + j] = distanceKm[i]![j]!;
      t[i * n + j] = travelMin ? travelMin[i]![j]! : (distanceKm[i]![j]! / speedKmh) * 60;
    }
  }
  return { size: n, distanceKm: d, travelMin: t, userSupplied: true };
}
