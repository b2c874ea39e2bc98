import type { CellValue, SheetRead } from "../sheets/grid.js";
import type { GeocodeCache } from "./geocodeAddresses.js";
import type { GeocodeCandidate } from "./GeocodeTypes.js";

/** The very hidden sheet that keeps every geocoder answer in the workbook. */
export const GEOCODE_CACHE_SHEET = "kiln-geocodes";
/** Candidates kept per answer (the best few are all a review needs). */
const KEEP = 5;

/**
 * The cache as kept in the workbook: a header row, then one row per answer with its key
 * (service and normalised address, see `geocodeCacheKey`) and its candidates as JSON.
 *
 * @param cache - the answers
 * @returns the rows to write with `writeVeryHiddenSheet`
 * @example cacheRows(new Map([["s|1 kiln lane", []]])) // => [["Key", "Candidates"], ["s|1 kiln lane", "[]"]]
 */
export function cacheRows(cache: GeocodeCache): CellValue[][] {
  const rows: CellValue[][] = [["Key", "Candidates"]];
  for (const [key, candidates] of [...cache].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
    rows.push([key, JSON.stringify(candidates.slice(0, KEEP))]);
  }
  return rows;
}

/**
 * Read the cache sheet back; rows that do not hold a key and a list of points are skipped.
 *
 * @param read - the sheet as read, or `undefined` when the workbook has none
 * @returns the answers by key
 * @example readCacheSheet(await book.readSheet(GEOCODE_CACHE_SHEET)).size // => 12
 */
export function readCacheSheet(read: SheetRead | undefined): GeocodeCache {
  const cache: GeocodeCache = new Map();
  for (const row of read?.values.slice(1) ?? []) {
    const [key, text] = row;
    if (typeof key !== "string" || key === "" || typeof text !== "string") continue;
    let data: unknown;
    try {
      data = JSON.parse(text);
    } catch {
      continue;
    }
    if (Array.isArray(data) && data.every(isCandidate)) cache.set(key, data);
  }
  return cache;
}

function isCandidate(x: unknown): x is GeocodeCandidate {
  if (typeof x !== "object" || x === null) return false;
  const c = x as Record<string, unknown>;
  return (
    typeof c["lat"] === "number" &&
    typeof c["lon"] === "number" &&
    typeof c["label"] === "string" &&
    Math.abs(c["lat"]) <= 90 &&
    Math.abs(c["lon"]) <= 180
  );
}
