import {
  GEOCODE_CACHE_SHEET,
  addressTargets,
  applyGeocodes,
  cacheRows,
  coordinateColumns,
  geocodeAddresses,
  readCacheSheet,
  type GeocodeCache,
  type GeocodeProgress,
  type LocatedTables,
} from "../geocode/index.js";
import type { SheetRead } from "../sheets/grid.js";
import type { WorkbookPort } from "./WorkbookPort.js";

/** The geocoding service and how to ask it, as the user set it up. */
export interface GeocoderSetup {
  /** URL template with `{address}`. */
  readonly template: string;
  readonly headers?: Readonly<Record<string, string>>;
  /** Requests per second at most (default 1). */
  readonly ratePerSecond?: number;
  /** Ignore the cache ("look up again"). */
  readonly again?: boolean;
  readonly timeoutMs?: number;
  readonly maxRetries?: number;
  readonly retryBaseMs?: number;
  readonly signal?: AbortSignal;
  readonly onProgress?: (p: GeocodeProgress) => void;
  readonly fetch?: typeof fetch;
}

/** What `locateWorkbook` did. */
export interface WorkbookLocation {
  /** The original tables as read. */
  readonly tables: { readonly stops: SheetRead; readonly fleet?: SheetRead };
  readonly located: LocatedTables;
  /** The cache with every answer (old and new); store it with `saveGeocodeCache`. */
  readonly cache: GeocodeCache;
  readonly requests: number;
  readonly cancelled: boolean;
  /** The service failed (unreachable, not GeoJSON): nothing should be written. */
  readonly error?: string;
}

/**
 * Geocode the addresses of a workbook's stops and fleet (start depots) that have no typed
 * coordinates: the cache sheet first, then the service for the rest. Nothing in the workbook
 * changes; the located tables live in memory.
 *
 * @param port - the workbook
 * @param sheets - the stops sheet and, optionally, the fleet sheet
 * @param setup - the service and limits
 * @param defaultCountry - country added to addresses whose row gives none
 * @returns the located tables, the cache, and how the run ended; `undefined` when a sheet is missing
 * @example const where = await locateWorkbook(book, { stops: "Stops", fleet: "Fleet" }, { template });
 */
export async function locateWorkbook(
  port: WorkbookPort,
  sheets: { readonly stops: string; readonly fleet?: string },
  setup: GeocoderSetup,
  defaultCountry?: string,
): Promise<WorkbookLocation | undefined> {
  const stops = await port.readSheet(sheets.stops);
  const fleet = sheets.fleet !== undefined ? await port.readSheet(sheets.fleet) : undefined;
  if (!stops) return undefined;
  const tables = { stops, ...(fleet ? { fleet } : {}) };
  const cache = readCacheSheet(
    (await port.listSheets()).includes(GEOCODE_CACHE_SHEET) ? await port.readSheet(GEOCODE_CACHE_SHEET) : undefined,
  );
  const { targets, typed } = addressTargets(tables, defaultCountry);
  const run = await geocodeAddresses(
    targets.map((t) => t.address),
    { ...setup, cache },
  );
  const located = applyGeocodes(tables, targets, typed, run.answers);
  return {
    tables,
    located,
    cache,
    requests: run.requests,
    cancelled: run.cancelled,
    ...(run.error !== undefined ? { error: run.error } : {}),
  };
}

/**
 * Keep the cache in the workbook's very hidden sheet `kiln-geocodes`, so the next run (and a
 * copy of the file) asks nothing twice.
 *
 * @param port - the workbook
 * @param cache - every answer
 * @example await saveGeocodeCache(book, where.cache)
 */
export async function saveGeocodeCache(port: WorkbookPort, cache: GeocodeCache): Promise<void> {
  if (cache.size === 0) return;
  await port.writeVeryHiddenSheet(GEOCODE_CACHE_SHEET, cacheRows(cache));
}

/**
 * "Add coordinates to the sheet": write the geocoded Latitude, Longitude and match label of each
 * row into empty cells of the stops and fleet sheets (new columns to the right of a table
 * without coordinate columns); a cell holding a value is never overwritten.
 *
 * @param port - the workbook
 * @param where - from `locateWorkbook`
 * @returns how many cells were written
 * @example await addCoordinatesToSheets(book, where) // => 36
 */
export async function addCoordinatesToSheets(port: WorkbookPort, where: WorkbookLocation): Promise<number> {
  let written = 0;
  const parts = [
    { original: where.tables.stops, filled: where.located.stops, kind: "stops" as const },
    ...(where.tables.fleet && where.located.fleet
      ? [{ original: where.tables.fleet, filled: where.located.fleet, kind: "fleet" as const }]
      : []),
  ];
  for (const p of parts) {
    const block = coordinateColumns(p.original, p.filled, where.located.review, p.kind);
    if (block) written += await port.fillEmptyCells(p.original.sheet, block.row, block.col, block.values);
  }
  return written;
}
