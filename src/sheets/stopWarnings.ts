import { DAY_MIN, unservableStops, type Issue, type LatLon, type Problem } from "../core/index.js";
import { FAR_MIN_POINTS, farFromOthers } from "./farFromOthers.js";
import { formatClock } from "./formatClock.js";
import type { ParsedStops } from "./parseStops.js";
import { cellIssue } from "./readTable.js";

/** A warning and its kind, so repeated warnings of one kind fold into one line. */
export interface KindedIssue {
  readonly kind: string;
  readonly issue: Issue;
}

/** Within this many degrees of 0, 0 a point is "at or near 0, 0" (a failed geocode). */
const NEAR_ZERO_DEG = 1;
/** This many stops or more on exactly one point is worth a look (a geocoder's town-centre fallback). */
const SAME_POINT_MIN = 4;
/** More warnings of one kind than this fold into one line. */
const FOLD_ABOVE = 3;
/** Cells listed in a folded line. */
const FOLD_LIST = 10;

/**
 * Warnings about stops that are well-formed but doubtful or unservable, each naming its cell
 * (exit 0; the pane shows them before the run):
 * - coordinates at or near 0, 0; latitude and longitude probably swapped (swapping them brings
 *   the point among the others); a point far from the rest (more than 5 times the typical
 *   distance of the stops and depots from their median, and over 50 km; with 8 stops or more); 4 or more stops on
 *   exactly one point (limits: common practice, chosen for delivery rounds of one region);
 * - a window that closes before it opens, read as overnight;
 * - a stop no vehicle can reach inside its window and a shift even as its only stop (left
 *   unassigned), unless an earlier check already explained why.
 *
 * @param problem - the problem built from the tables
 * @param stops - the parsed stops table (stop i of the problem is `stops.stops[i]`)
 * @param sheet - the stops sheet name
 * @param alreadyWarned - indices of stops already warned as unservable (capacity, features, shifts)
 * @returns the warnings with their kinds
 * @example stopWarnings(problem, parsed, "Stops", new Set()) // => [{ kind: "zero", issue: { ..., message: "Stops!C7: ..." } }]
 */
export function stopWarnings(problem: Problem, stops: ParsedStops, sheet: string, alreadyWarned: ReadonlySet<number>): KindedIssue[] {
  const out: KindedIssue[] = [];
  const f = stops.columns?.fields;
  if (!f) return out;
  const latCol = stops.col0 + (f.get("latitude") ?? f.get("coordinates") ?? 0);
  const windowCol = stops.col0 + (f.get("earliest") ?? f.get("windows") ?? f.get("latest") ?? 0);
  // Stops left out for a missing address stand at a placeholder point: they are not judged here.
  const placed = problem.stops.map((s) => s.unplannedReason === undefined);
  const points = problem.stops.map((s) => problem.locations[s.location]!);
  const depots = problem.vehicles.flatMap((v) => [problem.locations[v.startLocation]!, problem.locations[v.endLocation]!]);
  // Stops and depots together set the middle; the stops alone must be numerous enough.
  const far = farFromOthers([...points.filter((_, i) => placed[i]), ...depots]);
  const manyStops = placed.filter(Boolean).length >= FAR_MIN_POINTS;
  const at = (i: number, col: number, kind: string, message: string): void => {
    out.push({ kind, issue: cellIssue(sheet, stops.stops[i]!.sheetRow0, col, message) });
  };
  points.forEach((p, i) => {
    if (!placed[i]) return;
    const id = problem.stops[i]!.id;
    if (Math.abs(p.lat) < NEAR_ZERO_DEG && Math.abs(p.lon) < NEAR_ZERO_DEG) {
      at(
        i,
        latCol,
        "zero",
        `stop "${id}" is at or near 0, 0 (${p.lat}, ${p.lon}), which usually means a failed geocode; check its coordinates.`,
      );
      return;
    }
    const km = far.km(p);
    if (!manyStops || !far.isFar(p)) return;
    const swapped = { lat: p.lon, lon: p.lat };
    if (Math.abs(swapped.lat) <= 90 && !far.isFar(swapped)) {
      at(
        i,
        latCol,
        "swapped",
        `stop "${id}" (${p.lat}, ${p.lon}) is ${Math.round(km)} km from the other stops, but with latitude and longitude swapped it would be among them; check that Latitude and Longitude are not exchanged.`,
      );
    } else {
      at(
        i,
        latCol,
        "far",
        `stop "${id}" is ${Math.round(km)} km from the middle of the stops and depots (typically ${Math.round(far.typicalKm)} km); check its coordinates.`,
      );
    }
  });
  samePointWarnings(problem, stops, sheet, latCol, points, out, placed);
  problem.stops.forEach((s, i) => {
    for (const w of s.windows) {
      if (w.earliestMin < DAY_MIN && w.latestMin > DAY_MIN && Number.isFinite(w.latestMin)) {
        const end = formatClock(w.latestMin - DAY_MIN);
        at(
          i,
          windowCol,
          "overnight",
          `the window of stop "${s.id}" closes (${end}) before it opens (${formatClock(w.earliestMin)}), so it is read as overnight, until ${end} the next day; if you meant ${end}-${formatClock(w.earliestMin)}, swap the two times.`,
        );
      }
    }
  });
  for (const u of unservableStops(problem)) {
    if (alreadyWarned.has(u.stop)) continue;
    at(
      u.stop,
      windowCol,
      "unservable",
      `stop "${problem.stops[u.stop]!.id}" will be left unassigned: ${u.reason}; check its coordinates and window, or the shifts.`,
    );
  }
  return out;
}

/**
 * Fold warnings of one kind into one line when there are more than 3: the first message,
 * then how many more and where ("and 12 more like it: Stops!C9, C12, ...").
 *
 * @param warnings - warnings with kinds, in reading order
 * @returns the warnings to show, in the order of each kind's first one
 * @example foldWarnings(fiveZeroWarnings).length // => 1
 */
export function foldWarnings(warnings: readonly KindedIssue[]): Issue[] {
  const groups = new Map<string, Issue[]>();
  for (const w of warnings) groups.set(w.kind, [...(groups.get(w.kind) ?? []), w.issue]);
  return [...groups.values()].flatMap((list) => {
    if (list.length <= FOLD_ABOVE) return list;
    const first = list[0]!;
    const more = list.slice(1);
    const cells = more.slice(0, FOLD_LIST).map((w) => w.cell);
    const tail = more.length > FOLD_LIST ? `, … (${more.length - FOLD_LIST} not listed)` : "";
    return [{ ...first, message: `${first.message} The same for ${more.length} more stops: ${cells.join(", ")}${tail}.` }];
  });
}

function samePointWarnings(
  problem: Problem,
  stops: ParsedStops,
  sheet: string,
  latCol: number,
  points: readonly LatLon[],
  out: KindedIssue[],
  placed: readonly boolean[],
): void {
  const groups = new Map<string, number[]>();
  points.forEach((p, i) => {
    if (!placed[i]) return;
    const key = `${p.lat},${p.lon}`;
    groups.set(key, [...(groups.get(key) ?? []), i]);
  });
  for (const [key, list] of groups) {
    if (list.length < SAME_POINT_MIN) continue;
    const ids = list.slice(0, FOLD_LIST).map((i) => `"${problem.stops[i]!.id}"`);
    const tail = list.length > FOLD_LIST ? `, … (${list.length - FOLD_LIST} more)` : "";
    out.push({
      kind: `same:${key}`,
      issue: cellIssue(
        sheet,
        stops.stops[list[0]!]!.sheetRow0,
        latCol,
        `${list.length} stops are at exactly the same point (${key.replace(",", ", ")}): ${ids.join(", ")}${tail}; a geocoder often puts addresses it could not find at a town's centre, so check their coordinates.`,
      ),
    });
  }
}
