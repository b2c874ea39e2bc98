import { PLAIN_DIMENSION } from "../core/index.js";
import { formatClock } from "./formatClock.js";
import type { ParsedFleet } from "./parseFleet.js";
import type { ParsedStops } from "./parseStops.js";
import { cellIssue } from "./readTable.js";
import type { LoadDimension } from "./resolveStopRules.js";
import type { KindedIssue } from "./stopWarnings.js";

/**
 * Stops no vehicle can serve, judged on the rows that were read cleanly: well-formed data that
 * makes a stop unservable is planned around (the stop is left unassigned with its reason), so
 * each gets a warning naming its cell, never an input error. A fleet without capacity in a load
 * dimension gets one message instead of one per stop.
 */
export function checkServable(
  stops: ParsedStops,
  fleet: ParsedFleet,
  dims: readonly LoadDimension[] | undefined,
  hardWindows: boolean,
  sheets: { readonly stops: string; readonly fleet: string },
  warnings: KindedIssue[],
  warned: Set<number>,
): void {
  const vs = fleet.vehicles;
  if (vs.length === 0 || !stops.columns) return;
  const sheet = sheets.stops;
  const f = stops.columns.fields;
  const windowCol = f.get("earliest") ?? f.get("windows") ?? f.get("latest") ?? 0;
  const demandCol = [...f.entries()].find(([k]) => k === "demand" || k.startsWith("demand:"))?.[1] ?? 0;
  const firstShift = Math.min(...vs.map((v) => v.shiftStartMin));
  const lastShift = Math.max(...vs.map((v) => v.shiftEndMin));
  const empty = (dims ?? []).filter(
    (d) => d.fleet !== undefined && d.stops !== undefined && vs.every((v) => (v.capacity.get(d.fleet!) ?? 0) === 0),
  );
  const emptyNeeded = empty.filter((d) => stops.stops.some((s) => (s.demand.get(d.stops!) ?? 0) > 0));
  if (emptyNeeded.length > 0) {
    const names = emptyNeeded.map((d) => (d.name === PLAIN_DIMENSION ? "capacity" : `capacity ${d.name}`)).join(", ");
    const capCol = fleet.columns?.fields.get(emptyNeeded[0]!.fleet ? `capacity:${emptyNeeded[0]!.fleet}` : "capacity");
    warnings.push({
      kind: "fleet-empty",
      issue: cellIssue(
        sheets.fleet,
        fleet.headerRow0,
        fleet.col0 + (capCol ?? fleet.columns?.fields.get("capacity") ?? 0),
        `every vehicle has ${names} 0, so no stop with a demand can be served (they will all be left unassigned); fill in the Capacity column of the fleet.`,
      ),
    });
  }
  for (const [i, s] of stops.stops.entries()) {
    const overlaps = s.windows.some((w) => vs.some((v) => w.latestMin >= v.shiftStartMin && w.earliestMin <= v.shiftEndMin));
    if (!overlaps) {
      const when = s.windows.map((w) => `${formatClock(w.earliestMin)}-${formatClock(w.latestMin)}`).join(", ");
      const side = s.windows.every((w) => w.latestMin < firstShift)
        ? `closes before any vehicle's shift starts (first shift start ${formatClock(firstShift)})`
        : s.windows.every((w) => w.earliestMin > lastShift)
          ? `opens after every vehicle's shift ends (last shift end ${formatClock(lastShift)})`
          : "falls outside every vehicle's shift";
      const text = `the time window of stop "${s.id}" (${when}) ${side};`;
      // Under soft windows a stop can still be served late; under hard ones it is left unassigned.
      const then = hardWindows
        ? " it will be left unassigned unless you widen the window or change a shift."
        : " with soft windows it can only be served late; widen the window or change a shift.";
      warnings.push({ kind: "window-outside-shifts", issue: cellIssue(sheet, s.sheetRow0, stops.col0 + windowCol, text + then) });
      warned.add(i);
    }
    if (dims !== undefined && dims.length > 0) {
      const demand = dims.map((d) => (d.stops === undefined ? 0 : (s.demand.get(d.stops) ?? 0)));
      const carriable = vs.some((v) => dims.every((d, k) => d.fleet === undefined || demand[k]! <= (v.capacity.get(d.fleet) ?? 0)));
      if (!carriable) warned.add(i);
      if (!carriable && !dims.some((d, k) => emptyNeeded.includes(d) && demand[k]! > 0)) {
        const amounts = demand.map((x, k) => (dims[k]!.name === PLAIN_DIMENSION ? `${x}` : `${x} ${dims[k]!.name}`)).join(", ");
        warnings.push({
          kind: "over-capacity",
          issue: cellIssue(
            sheet,
            s.sheetRow0,
            stops.col0 + demandCol,
            `the demand of stop "${s.id}" (${amounts}) exceeds every vehicle's capacity; it will be left unassigned unless you split the stop into smaller ones or add a larger vehicle.`,
          ),
        });
      }
    }
    const need = s.requiredFeatures ?? [];
    if (need.length > 0 && !vs.some((v) => need.every((x) => (v.features ?? []).includes(x)))) {
      warned.add(i);
      warnings.push({
        kind: "features",
        issue: cellIssue(
          sheet,
          s.sheetRow0,
          stops.col0 + (f.get("features") ?? 0),
          `no vehicle has all the features stop "${s.id}" requires (${need.join(", ")}); it will be left unassigned unless a vehicle lists them under Features.`,
        ),
      });
    }
  }
}

/** One warning per stop that cannot be planned (address not found), at its row's first address cell. */
export function unplannedWarnings(stops: ParsedStops, sheet: string, warned: Set<number>): KindedIssue[] {
  const f = stops.columns?.fields;
  const col = ["address", "street", "postcode", "town"].map((k) => f?.get(k)).find((c) => c !== undefined) ?? 0;
  const out: KindedIssue[] = [];
  stops.stops.forEach((s, i) => {
    if (s.unplannedReason === undefined) return;
    warned.add(i);
    out.push({
      kind: "unplanned",
      issue: cellIssue(
        sheet,
        s.sheetRow0,
        stops.col0 + col,
        `stop "${s.id}" will be left unassigned: ${s.unplannedReason}; correct the address or type its Latitude and Longitude.`,
      ),
    });
  });
  return out;
}
