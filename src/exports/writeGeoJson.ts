import type { RouteFilesInput } from "./RouteFilesInput.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { type DriverStop, driverRoutes, windowText } from "../sheets/driverRoutes.js";
import { formatClock } from "../sheets/formatClock.js";
import type { CellValue } from "../sheets/grid.js";
import { roundTo } from "../sheets/numberFormats.js";
import { COLLECT_PREFIX, DROP_PREFIX, LOAD_PREFIX, loadHeaders } from "../sheets/routeTableRows.js";

/** A GeoJSON position, longitude first (RFC 7946 §3.1.1). */
export type Position = readonly [lon: number, lat: number];

/** Property values Kiln writes: the user's cell values and its own numbers and texts. */
export type PropertyValue = CellValue | readonly string[];

/** A GeoJSON Feature as Kiln writes it (RFC 7946 §3.2). */
export interface Feature {
  readonly type: "Feature";
  readonly geometry:
    { readonly type: "Point"; readonly coordinates: Position } | { readonly type: "LineString"; readonly coordinates: readonly Position[] };
  readonly properties: Readonly<Record<string, PropertyValue>>;
}

/** A GeoJSON FeatureCollection (RFC 7946 §3.3). */
export interface FeatureCollection {
  readonly type: "FeatureCollection";
  readonly features: readonly Feature[];
}

/**
 * A plan as a GeoJSON FeatureCollection (RFC 7946), positions as [longitude, latitude] in WGS 84:
 * - per used vehicle one LineString from its start depot through its stops to its end depot,
 *   with `kind` "route", `vehicle`, `stops`, `km`, `drivingMin`, `dutyMin`, `departure`,
 *   `return`, `driver` when the fleet names one, and the load leaving the depot per dimension
 *   (`Load kg`, ...; headers as the plan sheet's, `loadHeaders`);
 * - per served stop one Point with `kind` "stop", `seq`, `vehicle`, `stop` (its id), `name`,
 *   `address`, `arrival`, `window`, `serviceMin`, the quantity to drop per dimension (`Drop kg`,
 *   ...), to collect when any stop collects (`Collect kg`, ...), then the stop's own columns
 *   under their headers (a header equal to one of Kiln's keys gets " (stop column)" added);
 * - per depot used one Point with `kind` "depot", `name` and the `vehicles` leaving from it;
 * - per stop left out of the plan one Point with `kind` "unplanned", `stop`, `name`,
 *   `address`, `reason` and its own columns, so a map never shows a plan as more complete than it is.
 * Times are clock texts ("09:12", "+1d" past midnight); km rounded to 0.1, minutes to 1.
 * The collection has a foreign member `caution` with the caution text (RFC 7946 §6.1).
 *
 * @param input - problem, plan, stop rows and carried headers
 * @returns the collection (serialise with `JSON.stringify`)
 * @throws RangeError when the plan refers to a vehicle, stop or location the problem does not have
 * @example writeGeoJson({ problem, plan }).features[0].geometry.type // => "LineString"
 */
export function writeGeoJson(input: RouteFilesInput): FeatureCollection & { readonly caution: string } {
  const { problem, plan } = input;
  const stopRows = input.stopRows ?? [];
  const extraHeaders = input.extraHeaders ?? [];
  const dims = problem.loadDimensions;
  const collects = problem.stops.some((s) => (s.pickup ?? []).some((q) => q > 0));
  const routes = driverRoutes(problem, plan, stopRows);
  const features: Feature[] = [];
  for (const r of routes) {
    features.push({
      type: "Feature",
      geometry: {
        type: "LineString",
        coordinates: [[r.start.lon, r.start.lat], ...r.stops.map((s): Position => [s.lon, s.lat]), [r.end.lon, r.end.lat]],
      },
      properties: {
        kind: "route",
        vehicle: r.vehicleId,
        stops: r.stops.length,
        km: roundTo(r.distanceKm, 1),
        drivingMin: Math.round(r.drivingMin),
        dutyMin: Math.round(r.dutyMin),
        departure: formatClock(r.start.timeMin),
        return: formatClock(r.end.timeMin),
        ...(r.driver !== undefined ? { driver: r.driver } : {}),
        ...perDimension(LOAD_PREFIX, dims, r.load),
      },
    });
  }
  for (const r of routes) {
    for (const s of r.stops) features.push(stopFeature(s, r.vehicleId, dims, collects, extraHeaders));
  }
  const depots = new Map<string, { name: string; lat: number; lon: number; vehicles: string[] }>();
  for (const r of routes) {
    for (const d of [r.start, r.end]) {
      const key = `${d.lat},${d.lon},${d.name}`;
      const entry = depots.get(key) ?? { name: d.name, lat: d.lat, lon: d.lon, vehicles: [] };
      if (!entry.vehicles.includes(r.vehicleId)) entry.vehicles.push(r.vehicleId);
      depots.set(key, entry);
    }
  }
  for (const d of depots.values()) {
    features.push({
      type: "Feature",
      geometry: { type: "Point", coordinates: [d.lon, d.lat] },
      properties: { kind: "depot", name: d.name, vehicles: d.vehicles },
    });
  }
  const rowOf = new Map(stopRows.map((row) => [row.stop, row]));
  for (const u of plan.unassigned) {
    const stop = problem.stops[u.stop];
    const at = stop && problem.locations[stop.location];
    if (!stop || !at) throw new RangeError(`writeGeoJson: unassigned stop ${u.stop} is not in the problem`);
    const row = rowOf.get(u.stop);
    const own = { kind: "unplanned", stop: stop.id, name: stop.name, address: row?.address ?? "", reason: u.reason };
    features.push({
      type: "Feature",
      geometry: { type: "Point", coordinates: [at.lon, at.lat] },
      properties: withColumns(own, row?.extra ?? {}, extraHeaders),
    });
  }
  return { type: "FeatureCollection", caution: CAUTION_TEXT, features };
}

function stopFeature(s: DriverStop, vehicle: string, dims: readonly string[], collects: boolean, extraHeaders: readonly string[]): Feature {
  const own: Record<string, PropertyValue> = {
    kind: "stop",
    seq: s.seq,
    vehicle,
    stop: s.id,
    name: s.name,
    address: s.address,
    arrival: formatClock(s.arrivalMin),
    window: windowText(s.window),
    serviceMin: roundTo(s.serviceMin, 1),
    ...perDimension(DROP_PREFIX, dims, s.drop),
    ...(collects ? perDimension(COLLECT_PREFIX, dims, s.collect) : {}),
  };
  return { type: "Feature", geometry: { type: "Point", coordinates: [s.lon, s.lat] }, properties: withColumns(own, s.extra, extraHeaders) };
}

/** One number per load dimension under the plan sheet's headers ("Drop kg"), rounded to 0.01. */
function perDimension(prefix: string, dims: readonly string[], values: readonly number[]): Record<string, number> {
  const out: Record<string, number> = {};
  loadHeaders(prefix, dims).forEach((h, i) => (out[h] = roundTo(values[i] ?? 0, 2)));
  return out;
}

/** Kiln's properties, then the stop's own columns under their headers (renamed on a clash). */
function withColumns(
  own: Record<string, PropertyValue>,
  extra: Readonly<Record<string, CellValue>>,
  headers: readonly string[],
): Record<string, PropertyValue> {
  const out = { ...own };
  for (const h of headers) {
    let key = h;
    while (Object.hasOwn(out, key)) key = `${key} (stop column)`;
    // defineProperty: a header such as "__proto__" stays an ordinary property.
    Object.defineProperty(out, key, {
      value: Object.hasOwn(extra, h) ? extra[h] : null,
      enumerable: true,
      writable: true,
      configurable: true,
    });
  }
  return out;
}
