import type { ParsedStops } from "./parseStops.js";
import { cellIssue } from "./readTable.js";
import type { KindedIssue } from "./stopWarnings.js";

/**
 * Most locations (stops and depots) the pane plans: the run keeps two n × n tables of 8-byte
 * numbers (distance and travel time), 400 MB at 5 000 locations, which is about what a browser tab
 * or Excel's add-in web view can hold beside the page (common practice; the command line has the
 * whole machine's memory).
 */
export const PANE_MAX_LOCATIONS = 5000;

/** From this many locations on, the run is told what the tables cost before it starts. */
export const LARGE_LOCATIONS = 2000;

/**
 * Memory of the distance and travel-time tables the core builds for `locations` places.
 *
 * @param locations - stops plus depots
 * @returns bytes
 * @example matrixBytes(1000) // => 16000000
 */
export function matrixBytes(locations: number): number {
  return 2 * 8 * locations * locations;
}

/**
 * A warning on the stops table's first header cell when the day is large: what the tables take
 * in memory, and (above `PANE_MAX_LOCATIONS`) that the pane will not plan it, so the user hears
 * it before a run instead of watching Excel freeze.
 *
 * @param n - places: stops and depots
 * @param stopCount - stops
 * @param stops - the parsed stops table (for the header cell)
 * @param sheet - the stops sheet name
 * @returns the warning, or undefined below `LARGE_LOCATIONS`
 * @example sizeWarning(5203, 5200, stops, "Stops")?.issue.message // "5 200 stops and their depots make 5 203 places; ..."
 */
export function sizeWarning(n: number, stopCount: number, stops: ParsedStops, sheet: string): KindedIssue | undefined {
  if (n < LARGE_LOCATIONS) return undefined;
  const mb = Math.round(matrixBytes(n) / 1e6);
  const what = `${count(stopCount)} stops and their depots make ${count(n)} places; the distance and time tables take about ${count(mb)} MB of memory.`;
  const advice =
    n > PANE_MAX_LOCATIONS
      ? ` The pane in Excel or a browser plans at most ${count(PANE_MAX_LOCATIONS)} places: plan this day with the command line (kiln plan), or split it into areas.`
      : " In the pane a run may be slow to start; the command line (kiln plan) has more memory.";
  return { kind: "size", issue: cellIssue(sheet, stops.headerRow0, stops.col0, what + advice) };
}

function count(n: number): string {
  return n.toLocaleString("en").replace(/,/g, " ");
}
