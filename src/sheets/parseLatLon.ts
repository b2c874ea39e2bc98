import { plainCell } from "./cellValue.js";
import { readDegrees } from "./parseCoordinate.js";

/**
 * Latitude and longitude from one cell holding both, latitude first: "45.76, 4.83",
 * "45.76; 4.83", "45.76 4.83", or DMS pairs such as `45°45'36"N, 4°50'E`.
 * Values are not range-checked here (the caller names the one out of range).
 *
 * @param value - a raw cell value
 * @returns the pair in decimal degrees, or `undefined` when empty or unreadable
 * @example parseLatLon("45.76, 4.83") // => { lat: 45.76, lon: 4.83 }
 */
export function parseLatLon(value: unknown): { lat: number; lon: number } | undefined {
  const v = plainCell(value);
  if (typeof v !== "string") return undefined;
  const t = v.trim().replace(/^\(|\)$/g, "");
  let parts = t.split(/[,;]/);
  if (parts.length !== 2) parts = t.split(/\s+/);
  if (parts.length !== 2) return undefined;
  const lat = readDegrees(parts[0], "lat");
  const lon = readDegrees(parts[1], "lon");
  return lat === undefined || lon === undefined ? undefined : { lat, lon };
}
