import { plainCell } from "./cellValue.js";
import type { CellBlock } from "./grid.js";
import { fieldKey, matchHeader, type TableKind } from "./matchHeaders.js";

/** How many rows from the top are searched for the header. */
export const HEADER_SEARCH_ROWS = 30;

/** Where `values[0][0]` sits in the sheet and the merged areas there (a `SheetRead` fits). */
export interface FindHeaderRowOptions {
  /** 0-based sheet row and column of `values[0][0]` (default 0). */
  readonly row?: number;
  readonly col?: number;
  /** Merged areas in sheet coordinates; only their first cell counts. */
  readonly merges?: readonly CellBlock[];
}

/**
 * The header row of a range: among the first 30 rows, the one where the most cells name a
 * known field (at least two), so blank leading rows and a title row above the table are fine.
 * A merged cell's value belongs to its first cell only, and a header spread over several merged
 * columns counts half, so a row of group headers ("Customer", "Location" spanning the real
 * headers below) loses to the real header row. On a tie the upper row wins.
 *
 * @param values - the range's raw values
 * @param kind - the table looked for
 * @param options - where the range sits and its merged areas (pass the `SheetRead`)
 * @returns the 0-based row index within `values`, or `undefined` when no row has two known headers
 * @example findHeaderRow([["Tuesday's stops"], [], ["Stop", "Lat", "Lon"]], "stops") // => 2
 */
export function findHeaderRow(
  values: readonly (readonly unknown[])[],
  kind: TableKind,
  options: FindHeaderRowOptions = {},
): number | undefined {
  let best: number | undefined;
  let bestScore = 1;
  const rows = Math.min(values.length, HEADER_SEARCH_ROWS);
  const covered = mergedCells(options);
  for (let r = 0; r < rows; r++) {
    const seen = new Set<string>();
    let score = 0;
    (values[r] ?? []).forEach((raw, c) => {
      const merge = covered.get(`${r},${c}`);
      if (merge === "covered") return;
      const v = plainCell(raw);
      if (typeof v !== "string") return;
      const hit = matchHeader(v, kind);
      if (hit === undefined) return;
      const key = fieldKey(hit.base, hit.dimension, hit.index);
      // A field named twice in one row ("Earliest, Latest, Earliest, Latest") still counts each time.
      score += merge === "wide" ? 0.5 : seen.has(key) ? 0.75 : 1;
      seen.add(key);
    });
    if (score >= 2 && score > bestScore) {
      best = r;
      bestScore = score;
    }
  }
  return best;
}

/**
 * The cells of merged areas relative to the range: "wide" for the first cell of an area spanning
 * several columns, "covered" for every other cell of an area.
 */
function mergedCells(options: FindHeaderRowOptions): Map<string, "wide" | "covered"> {
  const out = new Map<string, "wide" | "covered">();
  const top = options.row ?? 0;
  const left = options.col ?? 0;
  for (const m of options.merges ?? []) {
    for (let r = m.row; r < m.row + m.rows; r++) {
      for (let c = m.col; c < m.col + m.cols; c++) {
        const first = r === m.row && c === m.col;
        if (first && m.cols < 2) continue;
        const rr = r - top;
        const cc = c - left;
        if (rr < 0 || cc < 0 || rr >= HEADER_SEARCH_ROWS) continue;
        out.set(`${rr},${cc}`, first ? "wide" : "covered");
      }
    }
  }
  return out;
}
