import type { Issue, LatLon } from "../core/index.js";
import { addressRows, type AddressRow } from "../sheets/addressRows.js";
import { fillGeographyCoordinates } from "../sheets/fillGeographyCoordinates.js";
import type { SheetRead } from "../sheets/grid.js";
import type { TableKind } from "../sheets/matchHeaders.js";
import type { GeocodeCandidate, GeocodeMatch, MatchQuality } from "./GeocodeTypes.js";
import { markFarAway, rateMatch, REVIEW_ORDER } from "./rateMatch.js";

/** The stops table and, optionally, the fleet table whose depots may be addresses. */
export interface LocateTables {
  readonly stops: SheetRead;
  readonly fleet?: SheetRead;
}

/** An address to look up, and where it is. */
export interface AddressTarget extends AddressRow {
  readonly table: TableKind;
}

/** One geocoded row for the review list and the match-label column. */
export interface ReviewItem extends GeocodeMatch {
  readonly table: TableKind;
  /** "Stops!C5": the row's first address cell. */
  readonly cell: string;
  readonly sheetRow0: number;
  readonly address: string;
  /** Set for a fleet row's end depot. */
  readonly end?: true;
}

/** The tables with geocoded coordinates filled in (in memory), and what the review shows. */
export interface LocatedTables {
  readonly stops: SheetRead;
  readonly fleet?: SheetRead;
  /** Reasons by 0-based stops-sheet row for stops whose address was not found (for `readProblem`). */
  readonly unlocated: ReadonlyMap<number, string>;
  /** Geocoded rows, the most doubtful first (not found, far, ambiguous, approximate, found). */
  readonly review: readonly ReviewItem[];
  /** Depot addresses not found: a plan cannot start from them. */
  readonly issues: readonly Issue[];
  /** How many rows got coordinates. */
  readonly filled: number;
}

/**
 * The addresses of the stops and of the fleet's start and end depots that have no typed
 * coordinates (typed coordinates always win), and the typed points.
 *
 * @param tables - the tables as read
 * @param defaultCountry - the country added to addresses whose row gives none
 * @returns the targets in sheet order, and the typed points
 * @example addressTargets({ stops }).targets.map((t) => t.address) // => ["1 Kiln Lane, Brickfield", ...]
 */
export function addressTargets(tables: LocateTables, defaultCountry?: string): { targets: AddressTarget[]; typed: LatLon[] } {
  const stops = addressRows(tables.stops, "stops", defaultCountry);
  const fleet = tables.fleet ? addressRows(tables.fleet, "fleet", defaultCountry) : { rows: [], typed: [] };
  const ends = tables.fleet ? addressRows(tables.fleet, "fleet", defaultCountry, true) : { rows: [], typed: [] };
  return {
    targets: [
      ...stops.rows.map((r) => ({ ...r, table: "stops" as const })),
      ...fleet.rows.map((r) => ({ ...r, table: "fleet" as const })),
      ...ends.rows.map((r) => ({ ...r, table: "fleet" as const })),
    ],
    typed: [...stops.typed, ...fleet.typed, ...ends.typed],
  };
}

/**
 * Put the service's answers into copies of the tables: each target with a match gets the best
 * candidate's coordinates (in its Latitude/Longitude cells, its Coordinates cell, or two
 * appended columns, see `fillGeographyCoordinates`); a stop not found is listed in `unlocated`
 * so the plan leaves it unassigned with that reason; a depot not found is an issue at its cell.
 * Targets without an answer (a cancelled run) are left as they are. Matches are rated
 * (`rateMatch`) and far points marked (`markFarAway`, with the typed points).
 *
 * @param tables - the tables as read
 * @param targets - from `addressTargets`
 * @param typed - the typed points, from `addressTargets`
 * @param answers - candidates by address, from `geocodeAddresses`
 * @returns the filled tables, the not-found stops, the review list and the depot issues
 * @example applyGeocodes({ stops }, targets, typed, run.answers).review[0].quality // => "not-found"
 */
export function applyGeocodes(
  tables: LocateTables,
  targets: readonly AddressTarget[],
  typed: readonly LatLon[],
  answers: ReadonlyMap<string, readonly GeocodeCandidate[]>,
): LocatedTables {
  const answered = targets.filter((t) => answers.has(t.address));
  const rated = markFarAway(
    answered.map((t) => rateMatch(answers.get(t.address)!)),
    typed,
  );
  const review: ReviewItem[] = answered.map((t, i) => ({
    ...rated[i]!,
    table: t.table,
    cell: t.cell,
    sheetRow0: t.sheetRow0,
    address: t.address,
    ...(t.end ? { end: true as const } : {}),
  }));
  const unlocated = new Map<number, string>();
  const issues: Issue[] = [];
  const fill = (read: SheetRead | undefined, kind: TableKind, end = false): { read?: SheetRead; filled: number } => {
    if (!read) return { filled: 0 };
    const places: (LatLon | undefined)[][] = read.values.map(() => []);
    review.forEach((item, i) => {
      if (item.table !== kind || (item.end === true) !== end) return;
      const t = answered[i]!;
      if (item.best) places[t.r]![t.c] = { lat: item.best.lat, lon: item.best.lon };
      else if (kind === "stops") unlocated.set(t.sheetRow0, `its address "${t.address}" was not found by the geocoding service`);
      else {
        const [sheet, cell] = t.cell.split("!") as [string, string];
        const which = end ? "end depot" : "depot";
        const typeIt = end ? "End latitude and End longitude" : "Start latitude and Start longitude";
        issues.push({
          sheet,
          cell,
          message: `${t.cell}: the ${which} address "${t.address}" was not found by the geocoding service; correct the address or type the ${typeIt}.`,
        });
      }
    });
    return fillGeographyCoordinates(read, places, kind, end);
  };
  const stops = fill(tables.stops, "stops");
  const starts = fill(tables.fleet, "fleet");
  // The end depots are filled into the copy that already holds the start depots.
  const ends = fill(starts.read ?? tables.fleet, "fleet", true);
  const fleet = { read: ends.read ?? starts.read, filled: starts.filled + ends.filled };
  const order = (q: MatchQuality): number => REVIEW_ORDER.indexOf(q);
  return {
    stops: stops.read ?? tables.stops,
    ...(fleet.read ? { fleet: fleet.read } : {}),
    unlocated,
    review: review
      .map((item, i) => ({ item, i }))
      .sort((a, b) => order(a.item.quality) - order(b.item.quality) || a.i - b.i)
      .map((x) => x.item),
    issues,
    filled: stops.filled + fleet.filled,
  };
}

/**
 * The match label written beside a geocoded row and shown in the review list.
 *
 * @param m - a rated match
 * @returns e.g. "found: 1 Kiln Lane, Brickfield" or "approximate (matched a street, not a house): Clay Street"
 * @example matchText({ quality: "not-found", candidates: 0 }) // => "not found"
 */
export function matchText(m: GeocodeMatch): string {
  const quality = m.quality === "not-found" ? "not found" : m.quality === "far" ? "far away" : m.quality;
  if (!m.best) return quality;
  return `${quality}${m.note ? ` (${m.note})` : ""}: ${m.best.label}`;
}
