import type { LatLon } from "../../core/index.js";

/** What one cell of `Range.valuesAsJson` (ExcelApi 1.16) says about a place. */
export type GeographyCell =
  /** A linked entity (e.g. a Geography data type) that exposes both coordinates. */
  | { readonly kind: "place"; readonly label: string; readonly at: LatLon }
  /** A linked entity without usable latitude/longitude properties. */
  | { readonly kind: "entityWithoutCoordinates"; readonly label: string }
  /** Plain text, a number, an error or an empty cell. */
  | { readonly kind: "notEntity" };

/**
 * Reads latitude and longitude from one `valuesAsJson` cell. Linked entities have
 * `type: "LinkedEntity"`, a display `text` and optional `properties`; whether Geography
 * entities expose "Latitude"/"Longitude" there is unverified (OFFICE-NOTES.md), so the
 * property names are matched case-insensitively ("Latitude", "latitude", "Lat"; "Longitude",
 * "Lon", "Lng") and their values may be plain numbers, numeric text, or cell values with a
 * numeric `basicValue`. Anything else yields `entityWithoutCoordinates` rather than a guess.
 *
 * @param cell - one element of `range.valuesAsJson` (any shape; nothing is assumed)
 * @returns the place with its coordinates in degrees, or why there is none
 * @example geographyFromCell({ type: "LinkedEntity", text: "Oslo",
 *   properties: { Latitude: { type: "Double", basicValue: 59.91 }, Longitude: 10.75 } })
 *   // { kind: "place", label: "Oslo", at: { lat: 59.91, lon: 10.75 } }
 */
export function geographyFromCell(cell: unknown): GeographyCell {
  if (!isRecord(cell) || cell["type"] !== "LinkedEntity") return { kind: "notEntity" };
  const label = typeof cell["text"] === "string" ? cell["text"] : "";
  const props = isRecord(cell["properties"]) ? cell["properties"] : {};
  const lat = numberProperty(props, ["latitude", "lat"]);
  const lon = numberProperty(props, ["longitude", "lon", "lng", "long"]);
  if (lat === undefined || lon === undefined || Math.abs(lat) > 90 || Math.abs(lon) > 180) {
    return { kind: "entityWithoutCoordinates", label };
  }
  return { kind: "place", label, at: { lat, lon } };
}

function numberProperty(props: Record<string, unknown>, names: readonly string[]): number | undefined {
  for (const [key, value] of Object.entries(props)) {
    if (names.includes(key.trim().toLowerCase())) return asNumber(value);
  }
  return undefined;
}

function asNumber(value: unknown): number | undefined {
  if (typeof value === "number") return Number.isFinite(value) ? value : undefined;
  if (typeof value === "string" && value.trim() !== "") {
    const n = Number(value.trim());
    return Number.isFinite(n) ? n : undefined;
  }
  if (isRecord(value)) return asNumber(value["basicValue"]);
  return undefined;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}
