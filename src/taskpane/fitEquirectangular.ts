/**
 * An equirectangular projection fitted to a box: x = lon * cos(meanLat), y = lat, scaled
 * uniformly so every point fits inside `width x height` pixels with `paddingPx` to spare.
 * Over a delivery area (tens of km) the distortion is negligible (common practice for local maps).
 */
import type { LatLon } from "../core/index.js";

/** A fitted projection. */
export interface FittedProjection {
  /** Pixel position of a point (y grows downwards, as on a canvas). */
  project(p: LatLon): { x: number; y: number };
  /** Pixels per km along the mean latitude, for a scale bar. */
  readonly pxPerKm: number;
}

/** Degrees of latitude per km on the mean Earth sphere (R = 6371.0088 km). */
const DEG_PER_KM = 180 / (Math.PI * 6371.0088);

/**
 * Fit an equirectangular projection around the mean latitude of `points`.
 *
 * @param points - the points to show (at least one), decimal degrees
 * @param width - box width in px (> 0)
 * @param height - box height in px (> 0)
 * @param paddingPx - margin kept free on every side (default 16)
 * @returns the projection
 * @throws RangeError when there are no points or the box is empty
 * @example fitEquirectangular([{lat: 0, lon: 0}, {lat: 0, lon: 1}], 100, 100, 0).project({lat: 0, lon: 1}) // => { x: 100, y: 50 }
 */
export function fitEquirectangular(points: readonly LatLon[], width: number, height: number, paddingPx = 16): FittedProjection {
  if (points.length === 0) throw new RangeError("points must not be empty");
  if (!(width > 0 && height > 0)) throw new RangeError(`width and height must be > 0, got ${width} x ${height}`);
  const meanLat = points.reduce((s, p) => s + p.lat, 0) / points.length;
  const k = Math.cos((meanLat * Math.PI) / 180);
  let minX = Infinity,
    maxX = -Infinity,
    minY = Infinity,
    maxY = -Infinity;
  for (const p of points) {
    const x = p.lon * k;
    minX = Math.min(minX, x);
    maxX = Math.max(maxX, x);
    minY = Math.min(minY, p.lat);
    maxY = Math.max(maxY, p.lat);
  }
  const innerW = Math.max(1, width - 2 * paddingPx);
  const innerH = Math.max(1, height - 2 * paddingPx);
  // A single point (or a line) still gets a finite scale: about 1 km across.
  const spanX = Math.max(maxX - minX, 1e-9);
  const spanY = Math.max(maxY - minY, 1e-9);
  const scale = Math.min(innerW / spanX, innerH / spanY, innerW / DEG_PER_KM);
  const offX = (width - (maxX - minX) * scale) / 2;
  const offY = (height - (maxY - minY) * scale) / 2;
  return {
    project: (p) => ({ x: offX + (p.lon * k - minX) * scale, y: offY + (maxY - p.lat) * scale }),
    pxPerKm: scale * DEG_PER_KM,
  };
}
