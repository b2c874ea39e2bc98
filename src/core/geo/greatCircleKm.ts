import { EARTH_MEAN_RADIUS_KM } from "../constants.js";
import type { LatLon } from "../model.js";

/** Radians per degree. */
export const RAD = Math.PI / 180;

/**
 * Central angle between two points, by the haversine formula (Sinnott, "Virtues of the
 * Haversine", Sky & Telescope 68(2), 1984), which stays accurate for short distances.
 *
 * @param a - first point, decimal degrees
 * @param b - second point, decimal degrees
 * @returns the angle in radians, 0..PI
 * @example centralAngleRad({lat: 0, lon: 0}, {lat: 0, lon: 90}) // => PI / 2
 */
export function centralAngleRad(a: LatLon, b: LatLon): number {
  const dLat = (b.lat - a.lat) * RAD;
  const dLon = (b.lon - a.lon) * RAD;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * RAD) * Math.cos(b.lat * RAD) * Math.sin(dLon / 2) ** 2;
  return 2 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/**
 * Great-circle distance on the mean Earth sphere.
 *
 * @param a - first point, decimal degrees
 * @param b - second point, decimal degrees
 * @returns kilometres
 * @example greatCircleKm({lat: 0, lon: 0}, {lat: 0, lon: 1}) // => 111.195 (about)
 */
export function greatCircleKm(a: LatLon, b: LatLon): number {
  return centralAngleRad(a, b) * EARTH_MEAN_RADIUS_KM;
}
