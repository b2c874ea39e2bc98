import type { GeocodeCandidate, MatchPrecision } from "./GeocodeTypes.js";

/** Properties that carry a match's label, first present wins (common practice among geocoders). */
const LABEL_KEYS = ["label", "display_name", "displayName", "name", "formatted", "formatted_address", "place_name", "title"];
/** Properties that carry a confidence from 0 to 1. */
const CONFIDENCE_KEYS = ["confidence", "score", "relevance"];
/** Properties that say what kind of place matched. */
const TYPE_KEYS = ["precision", "match_type", "accuracy", "type", "layer", "addresstype", "place_type", "result_type", "osm_value"];

/** Kind words by precision (normalised: lower case letters only); common practice among geocoders. */
const PRECISION_WORDS: Readonly<Record<MatchPrecision, readonly string[]>> = {
  house: ["house", "housenumber", "address", "building", "rooftop", "point", "premise", "parcel", "venue", "poi", "exact", "interpolated"],
  street: ["street", "road", "route", "streetname", "highway", "intersection", "block"],
  town: [
    "locality",
    "city",
    "town",
    "village",
    "hamlet",
    "municipality",
    "postcode",
    "postalcode",
    "zip",
    "district",
    "borough",
    "suburb",
    "neighbourhood",
    "neighborhood",
    "county",
    "region",
    "state",
    "province",
    "country",
    "localadmin",
    "place",
    "approximate",
  ],
};

/**
 * Read a geocoder's answer as a GeoJSON FeatureCollection (RFC 7946 §3.3) of Point features,
 * best match first. A Point's `coordinates` are [longitude, latitude] (RFC 7946 §3.1.1 and §4:
 * "longitude, latitude"); they become `{ lat, lon }` here. Features with another geometry, or
 * coordinates out of range, are skipped. The label comes from `label`, `display_name`, `name`,
 * ... of the feature's properties, the confidence from `confidence`, `score` or `relevance` when
 * within 0..1, the precision from `precision`, `type`, `layer`, ... when it names a kind of place.
 *
 * @param body - the parsed JSON body
 * @returns the candidates (empty: not found), or what the answer is instead of GeoJSON
 * @example readGeocodeResponse({ type: "FeatureCollection", features: [{ type: "Feature", geometry: { type: "Point", coordinates: [100, 0] }, properties: {} }] })
 * // => { ok: true, candidates: [{ lat: 0, lon: 100, label: "0, 100" }] }
 */
export function readGeocodeResponse(body: unknown): { ok: true; candidates: GeocodeCandidate[] } | { ok: false; message: string } {
  if (!isObject(body))
    return {
      ok: false,
      message: `a JSON ${body === null ? "null" : Array.isArray(body) ? "array" : typeof body}, not a GeoJSON FeatureCollection`,
    };
  if (body["type"] !== "FeatureCollection" || !Array.isArray(body["features"])) {
    const type = typeof body["type"] === "string" ? `"type": "${body["type"]}"` : 'no "type"';
    return { ok: false, message: `a JSON object with ${type}, not a GeoJSON FeatureCollection with "features"` };
  }
  const candidates: GeocodeCandidate[] = [];
  for (const f of body["features"] as unknown[]) {
    if (!isObject(f) || !isObject(f["geometry"])) continue;
    const g = f["geometry"];
    const c = g["coordinates"];
    if (g["type"] !== "Point" || !Array.isArray(c) || c.length < 2) continue;
    const [lon, lat] = c as unknown[];
    if (typeof lon !== "number" || typeof lat !== "number" || !Number.isFinite(lon) || !Number.isFinite(lat)) continue;
    if (Math.abs(lat) > 90 || Math.abs(lon) > 180) continue;
    const props = isObject(f["properties"]) ? f["properties"] : {};
    const confidence = firstConfidence(props);
    const precision = firstPrecision(props);
    candidates.push({
      lat,
      lon,
      label: firstLabel(props) ?? `${lat}, ${lon}`,
      ...(confidence !== undefined ? { confidence } : {}),
      ...(precision !== undefined ? { precision } : {}),
    });
  }
  return { ok: true, candidates };
}

function isObject(x: unknown): x is Record<string, unknown> {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}

function firstLabel(props: Record<string, unknown>): string | undefined {
  for (const k of LABEL_KEYS) {
    const v = props[k];
    if (typeof v === "string" && v.trim() !== "") return v.trim();
  }
  return undefined;
}

function firstConfidence(props: Record<string, unknown>): number | undefined {
  for (const k of CONFIDENCE_KEYS) {
    const v = props[k];
    if (typeof v === "number" && v >= 0 && v <= 1) return v;
  }
  return undefined;
}

function firstPrecision(props: Record<string, unknown>): MatchPrecision | undefined {
  for (const k of TYPE_KEYS) {
    const v = props[k];
    if (typeof v !== "string") continue;
    const word = v.toLowerCase().replace(/[^a-z]/g, "");
    for (const p of ["house", "street", "town"] as const) if (PRECISION_WORDS[p].includes(word)) return p;
  }
  return undefined;
}
