/**
 * The geocoded places the map marks as doubtful: stops and depots whose address matched only a
 * street or town (approximate), several places far apart (ambiguous), or a point far from the
 * others (far away). A stop not found is not on the map as a place: the plan lists it unassigned.
 */
import type { Problem } from "../core/index.js";
import { matchText, type ReviewItem } from "../geocode/index.js";
import type { StopRow } from "../sheets/ReadResult.js";
import { depotName } from "./describeRoutes.js";

/** One doubtful place on the map. */
export interface DoubtfulPlace {
  /** Index into `Problem.locations`. */
  readonly location: number;
  /** The stop's name (or id), or the depot's name. */
  readonly name: string;
  /** Where the address was typed, "Stops!C5". */
  readonly cell: string;
  /** What the address was matched to, e.g. "approximate (matched a street, not a house): Clay Street". */
  readonly match: string;
}

/** The qualities drawn as doubtful. */
const DOUBTFUL = new Set(["approximate", "ambiguous", "far"]);

/**
 * The doubtful places of a located read: stops by their sheet row (`StopRow.sheetRow`), depots
 * by their geocoded point (a depot's location holds the best candidate's coordinates).
 *
 * @param problem - the problem read from the located tables
 * @param stopRows - where each stop came from (`ReadResult.stopRows`)
 * @param review - the geocoding review of those tables (`LocatedTables.review`)
 * @returns one entry per doubtful place, in review order (the most doubtful first)
 * @example doubtfulPlaces(read.problem, read.stopRows, located.review)[0]
 * // => { location: 4, name: "Mill Street Deli", cell: "Round!C7", match: "approximate (...): Mill Street, Crustwick" }
 */
export function doubtfulPlaces(problem: Problem, stopRows: readonly StopRow[], review: readonly ReviewItem[]): DoubtfulPlace[] {
  const bySheetRow = new Map(stopRows.map((r) => [r.sheetRow, r.stop]));
  const depots = [...new Set(problem.vehicles.flatMap((v) => [v.startLocation, v.endLocation]))];
  const out: DoubtfulPlace[] = [];
  const seen = new Set<number>();
  for (const item of review) {
    if (!DOUBTFUL.has(item.quality) || !item.best) continue;
    const best = item.best;
    let location: number | undefined;
    let name: string;
    if (item.table === "stops") {
      const stop = problem.stops[bySheetRow.get(item.sheetRow0 + 1) ?? -1];
      if (!stop) continue;
      location = stop.location;
      name = stop.name || stop.id;
    } else {
      location = depots.find((loc) => problem.locations[loc]?.lat === best.lat && problem.locations[loc]?.lon === best.lon);
      if (location === undefined) continue;
      name = depotName(problem, location);
    }
    if (seen.has(location)) continue;
    seen.add(location);
    out.push({ location, name, cell: item.cell, match: matchText(item) });
  }
  return out;
}
