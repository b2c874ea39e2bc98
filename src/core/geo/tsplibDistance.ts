/**
 * Distance functions of TSPLIB95 (G. Reinelt, "TSPLIB 95", Universität Heidelberg, 1995,
 * section 2 "The distance functions"). Each returns the integer the library's published
 * optimal tour lengths are measured in, so a tour length computed here can be compared
 * with `optimal.csv` exactly.
 */

/** Edge weight types computed from node coordinates. */
export type TsplibCoordType = "EUC_2D" | "CEIL_2D" | "ATT" | "GEO";

/** A node of a TSPLIB file: `x` and `y` as written (GEO: x = latitude, y = longitude, DDD.MM). */
export interface TsplibPoint {
  readonly x: number;
  readonly y: number;
}

/** TSPLIB95's value of pi for GEO; the published GEO optima depend on this truncation. */
const TSPLIB_PI = 3.141592;
/** TSPLIB95's Earth radius for GEO, km. */
const TSPLIB_RRR_KM = 6378.388;

/**
 * The distance between two nodes by a TSPLIB95 edge weight type.
 *
 * - EUC_2D: nint(sqrt(dx² + dy²)), nint = round half up as `(int)(x + 0.5)`.
 * - CEIL_2D: ceil(sqrt(dx² + dy²)).
 * - ATT (pseudo-Euclidean): r = sqrt((dx² + dy²) / 10), t = nint(r), t + 1 when t < r.
 * - GEO: coordinates DDD.MM to radians with PI = 3.141592, then the sphere of radius
 *   6378.388 km, `int(RRR * acos(0.5 * ((1 + q1) q2 - (1 - q1) q3)) + 1)`.
 *
 * @param type - the file's EDGE_WEIGHT_TYPE
 * @param a - first node as written in the file
 * @param b - second node as written in the file
 * @returns the integer distance (GEO: km on TSPLIB's sphere). Two distinct GEO nodes at the
 *   same coordinates are `int(RRR * acos(1) + 1) = 1` apart, as TSPLIB95 defines it: the 0 of
 *   a node to itself (the diagonal) is `tsplibEdge`'s business, which knows node identity.
 * @throws TypeError when `type` is not one of the supported types
 * @example tsplibDistance("EUC_2D", { x: 0, y: 0 }, { x: 3, y: 4 }) // => 5
 */
export function tsplibDistance(type: TsplibCoordType, a: TsplibPoint, b: TsplibPoint): number {
  switch (type) {
    case "EUC_2D":
      return nint(Math.hypot(a.x - b.x, a.y - b.y));
    case "CEIL_2D":
      return Math.ceil(Math.hypot(a.x - b.x, a.y - b.y));
    case "ATT": {
      const dx = a.x - b.x;
      const dy = a.y - b.y;
      const r = Math.sqrt((dx * dx + dy * dy) / 10);
      const t = nint(r);
      return t < r ? t + 1 : t;
    }
    case "GEO": {
      const latA = tsplibGeoRadians(a.x);
      const lonA = tsplibGeoRadians(a.y);
      const latB = tsplibGeoRadians(b.x);
      const lonB = tsplibGeoRadians(b.y);
      const q1 = Math.cos(lonA - lonB);
      const q2 = Math.cos(latA - latB);
      const q3 = Math.cos(latA + latB);
      return Math.trunc(TSPLIB_RRR_KM * Math.acos(0.5 * ((1 + q1) * q2 - (1 - q1) * q3)) + 1);
    }
    default:
      throw new TypeError(`type must be EUC_2D, CEIL_2D, ATT or GEO, got ${String(type)}`);
  }
}

/**
 * A TSPLIB GEO coordinate DDD.MM (degrees, then minutes as the two decimals) in decimal
 * degrees: `deg + 5 * min / 3` with deg truncated and `min = x - deg` (TSPLIB95).
 *
 * @param x - the coordinate as written, e.g. 16.47 (16° 47')
 * @returns decimal degrees, e.g. 16.7833
 * @example tsplibGeoDegrees(16.30) // => 16.5
 */
export function tsplibGeoDegrees(x: number): number {
  const deg = Math.trunc(x);
  return deg + (5 * (x - deg)) / 3;
}

/**
 * A TSPLIB GEO coordinate in radians with TSPLIB95's PI = 3.141592.
 *
 * @param x - the coordinate as written (DDD.MM)
 * @returns radians
 * @example tsplibGeoRadians(90) // => 1.570796
 */
export function tsplibGeoRadians(x: number): number {
  return (TSPLIB_PI * tsplibGeoDegrees(x)) / 180;
}

/** TSPLIB95's nint: `(int)(x + 0.5)` for the non-negative values distances produce. */
function nint(x: number): number {
  return Math.trunc(x + 0.5);
}
