import { PLAIN_DIMENSION, type Issue } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import type { ParsedFleet } from "./parseFleet.js";
import type { ParsedStops } from "./parseStops.js";
import { cellIssue } from "./readTable.js";
import type { LoadDimension } from "./resolveStopRules.js";

/**
 * Pairs the stops' Demand <unit> columns with the fleet's Capacity <unit> columns into load
 * dimensions: a plain Demand and a plain Capacity (or one of each) make one dimension named
 * "load"; a demand with no matching capacity is an issue at its header cell.
 *
 * @returns the dimensions, or undefined when a table was not read or a pair is missing (issues pushed)
 */
export function pairDimensions(
  input: { stops: SheetRead; fleet: SheetRead },
  stops: ParsedStops,
  fleet: ParsedFleet,
  issues: Issue[],
): LoadDimension[] | undefined {
  if (!stops.columns || !fleet.columns) return undefined;
  const sd = stops.dimensions;
  const fd = fleet.dimensions;
  if (sd.length === 1 && fd.length === 1 && (sd[0] === "" || fd[0] === "" || sd[0] === fd[0])) {
    return [{ name: sd[0] || fd[0] || PLAIN_DIMENSION, stops: sd[0]!, fleet: fd[0]! }];
  }
  if (sd.length > 0 && fd.length === 0) {
    issues.push(
      cellIssue(
        input.fleet.sheet,
        fleet.headerRow0,
        input.fleet.col,
        `the stops have a demand column but the fleet has no Capacity column; add ${sd.map((d) => (d === "" ? "Capacity" : `Capacity ${d}`)).join(" and ")}.`,
      ),
    );
    return undefined;
  }
  const out: LoadDimension[] = [];
  let ok = true;
  for (const d of sd) {
    if (fd.includes(d)) {
      out.push({ name: d === "" ? PLAIN_DIMENSION : d, stops: d, fleet: d });
      continue;
    }
    const col = stops.columns.fields.get(d === "" ? "demand" : `demand:${d}`) ?? 0;
    issues.push(
      cellIssue(
        input.stops.sheet,
        stops.headerRow0,
        stops.col0 + col,
        `demand column ${d === "" ? "Demand" : `"Demand ${d}"`} has no matching capacity column on the fleet (which has ${fd.map((f) => (f === "" ? "Capacity" : `Capacity ${f}`)).join(", ")}); name the pair with the same unit word, such as Demand kg and Capacity kg.`,
      ),
    );
    ok = false;
  }
  for (const f of fd) if (!sd.includes(f)) out.push({ name: f === "" ? PLAIN_DIMENSION : f, fleet: f });
  return ok ? out : undefined;
}
