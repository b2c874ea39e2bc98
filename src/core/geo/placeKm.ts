import { EARTH_MEAN_RADIUS_KM } from "../constants.js";
import type { LatLon } from "../model.js";
import { RAD } from "./greatCircleKm.js";

/**
 * The places of a matrix built by `buildMatrix`, so that an entry can be computed again instead
 * of read: coordinates and each point's cosine of latitude, and the detour factor.
 */
export interface Places {
  readonly lat: Float64Array;
  readonly lon: Float64Array;
  readonly cosLat: Float64Array;
  readonly detourFactor: number;
}

/**
 * The places of `locations` for `placeKm`.
 *
 * @param locations - points in decimal degrees
 * @param detourFactor - road distance over great-circle distance
 * @returns coordinates and cosines as typed arrays
 * @example placeKm(places([{lat: 0, lon: 0}, {lat: 0, lon: 1}], 1.3), 0, 1) // => 144.55 (about)
 */
export function places(locations: readonly LatLon[], detourFactor: number): Places {
  return {
    lat: Float64Array.from(locations, (p) => p.lat),
    lon: Float64Array.from(locations, (p) => p.lon),
    cosLat: Float64Array.from(locations, (p) => Math.cos(p.lat * RAD)),
    detourFactor,
  };
}

/**
 * Km from place `i` to place `j` as `buildMatrix` stores it: great-circle km (haversine, the
 * same terms in the same order as `greatCircleKm`) times the detour factor, computed from the
 * lower index to the higher, 0 from a place to itself. `buildMatrix` fills its table with this
 * function, so an entry computed here is bitwise the stored one.
 *
 * @param p - the places
 * @param i - from
 * @param j - to
 * @returns kilometres
 * @example placeKm(p, 3, 7) === buildMatrix(locations).distanceKm[3 * n + 7] // => true
 */
export function placeKm(p: Places, i: number, j: number): number {
  if (i === j) return 0;
  const a = i < j ? i : j;
  const b = i < j ? j : i;
  const dLat = (p.lat[b]! - p.lat[a]!) * RAD;
  const dLon = (p.lon[b]! - p.lon[a]!) * RAD;
  const h = Math.sin(dLat / 2) ** 2 + p.cosLat[a]! * p.cosLat[b]! * Math.sin(dLon / 2) ** 2;
  return 2 * Math.asin(Math.min(1, Math.sqrt(h))) * EARTH_MEAN_RADIUS_KM * p.detourFactor;
}
