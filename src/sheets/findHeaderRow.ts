import { plainCell } from "./cellValue.js";
import { matchHeader, type TableKind } from "./matchHeaders.js";

/** How many rows from the top are searched for the header. */
const SEARCH_ROWS = 30;

/**
 * The header row of a range: among the first 30 rows, the one where the most cells name a
 * known field (at least two), so blank leading rows and a title row above the table are fine.
 *
 * @param values - the range's raw values
 * @param kind - the table looked for
 * @returns the 0-based row index within `values`, or `undefined` when no row has two known headers
 * @example findHeaderRow([["Tuesday's stops"], [], ["Stop", "Lat", "Lon"]], "stops") // => 2
 */
export function findHeaderRow(values: readonly (readonly unknown[])[], kind: TableKind): number | undefined {
  let best: number | undefined;
  let bestHits = 1;
  const rows = Math.min(values.length, SEARCH_ROWS);
  for (let r = 0; r < rows; r++) {
    let hits = 0;
    for (const raw of values[r] ?? []) {
      const v = plainCell(raw);
      if (typeof v === "string" && matchHeader(v, kind) !== undefined) hits++;
    }
    if (hits > bestHits) {
      best = r;
      bestHits = hits;
    }
  }
  return best;
}
