import { greatCircleKm, type LatLon } from "../core/index.js";

/** A point is far from the rest when it is this many times the typical distance from the median, ... */
const FAR_FACTOR = 5;
/** ... and at least this far (km), so a compact town round does not flag its outskirts. */
const FAR_MIN_KM = 50;
/** "Far from the rest" needs a rest: at least this many points. */
export const FAR_MIN_POINTS = 8;

/** The far-from-others rule measured on a set of points. */
export interface FarFromOthers {
  /** Component-wise median of the points (robust to a few wrong ones). */
  readonly centre: LatLon;
  /** Median great-circle distance of the points from `centre` (km). */
  readonly typicalKm: number;
  /** Distance of a point from `centre` (km). */
  km(p: LatLon): number;
  /** True when `p` lies far from the rest (see `farFromOthers`). */
  isFar(p: LatLon): boolean;
}

/**
 * The one plausibility rule for a point among others (stops and depots, typed or geocoded): a
 * point is far when it lies more than 5 times the typical distance of the points from their
 * median, and over 50 km, with 8 points or more (limits: common practice, chosen for delivery
 * rounds of one region).
 *
 * @param points - every point of the round
 * @returns the measured rule; `isFar` is always false with fewer than 8 points
 * @example farFromOthers(points).isFar({ lat: 0, lon: 100 }) // => true for a round in one town
 */
export function farFromOthers(points: readonly LatLon[]): FarFromOthers {
  const centre = { lat: median(points.map((p) => p.lat)), lon: median(points.map((p) => p.lon)) };
  const typicalKm = median(points.map((p) => greatCircleKm(centre, p)));
  const limitKm = Math.max(FAR_FACTOR * typicalKm, FAR_MIN_KM);
  const km = (p: LatLon): number => greatCircleKm(centre, p);
  return { centre, typicalKm, km, isFar: (p) => points.length >= FAR_MIN_POINTS && km(p) > limitKm };
}

/**
 * The median of numbers (0 for none).
 *
 * @param xs - the numbers
 * @returns the middle value, or the mean of the two middle values
 * @example median([3, 1, 2]) // => 2
 */
export function median(xs: readonly number[]): number {
  if (xs.length === 0) return 0;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
