import type { Issue, Stop, Vehicle } from "../core/index.js";
import type { ParsedStops } from "./parseStops.js";
import { cellIssue } from "./readTable.js";

/** A load dimension: its name and the unit words of its stop and fleet columns. */
export interface LoadDimension {
  readonly name: string;
  readonly stops?: string;
  readonly fleet?: string;
}

/**
 * Which load dimension each pickup column fills: a plain Pickup (or Collect, Returns) when
 * there is one dimension, else the dimension with the same unit word ("Pickup crates" with
 * "Demand crates" or "Capacity crates").
 *
 * @param stops - the stops as read
 * @param dims - the load dimensions
 * @param sheet - the stops sheet's name
 * @param issues - where an unmatched pickup column is reported (at its header cell)
 * @returns pickup unit word -> dimension index
 * @example pickupDimensions(stops, [{ name: "kg", stops: "kg", fleet: "kg" }], "Stops", issues) // => Map { "" => 0 }
 */
export function pickupDimensions(stops: ParsedStops, dims: readonly LoadDimension[], sheet: string, issues: Issue[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const p of stops.pickupDimensions) {
    const index = p === "" ? (dims.length === 1 ? 0 : -1) : dims.findIndex((d) => d.stops === p || d.fleet === p || d.name === p);
    if (index >= 0) {
      out.set(p, index);
      continue;
    }
    const col = stops.columns?.fields.get(p === "" ? "pickup" : `pickup:${p}`) ?? 0;
    const names = dims.map((d) => d.name).join(", ");
    issues.push(
      cellIssue(
        sheet,
        stops.headerRow0,
        stops.col0 + col,
        p === ""
          ? `a plain Pickup column needs exactly one load dimension, and there are ${dims.length} (${names}); name it after its unit, such as "Pickup ${dims[0]?.name ?? "kg"}".`
          : `pickup column "${p}" has no load dimension of that name (there are ${names}); use the unit word of a Demand or Capacity column, such as "Pickup ${dims[0]?.name ?? "kg"}".`,
      ),
    );
  }
  return out;
}

/**
 * Turn the Vehicle (pin) and Not vehicle cells into vehicle ids, and check that a pinned stop
 * can be served by some vehicle it is pinned to. A name is a vehicle's own name ("Van A 2") or
 * the name of its fleet row ("Van A": every vehicle that row makes). Unknown names and pins
 * no allowed vehicle can serve (missing features, demand or pickup over capacity) are issues
 * at the cell.
 *
 * @param parsed - the stops as read
 * @param stops - the model stops built from them (same order), without pins yet
 * @param vehicles - the model vehicles
 * @param rowNames - the fleet row name of each vehicle
 * @param sheet - the stops sheet's name
 * @param issues - where defects go
 * @returns the stops with `allowedVehicles` / `excludedVehicles` set
 */
export function resolvePins(
  parsed: ParsedStops,
  stops: readonly Stop[],
  vehicles: readonly Vehicle[],
  rowNames: readonly string[],
  sheet: string,
  issues: Issue[],
): Stop[] {
  const f = parsed.columns?.fields;
  const lookup = (name: string): string[] => {
    const key = name.toLowerCase();
    const own = vehicles.filter((v) => v.id.toLowerCase() === key).map((v) => v.id);
    return own.length > 0 ? own : vehicles.filter((_, k) => rowNames[k]!.toLowerCase() === key).map((v) => v.id);
  };
  return stops.map((stop, i) => {
    const p = parsed.stops[i]!;
    const at = (field: string): [number, number] => [p.sheetRow0, parsed.col0 + (f?.get(field) ?? 0)];
    const resolve = (names: readonly string[] | undefined, field: string): string[] | undefined => {
      if (names === undefined) return undefined;
      const ids: string[] = [];
      for (const name of names) {
        const hit = lookup(name);
        if (hit.length === 0) {
          const known = [...new Set(rowNames)].slice(0, 6).join(", ");
          issues.push(
            cellIssue(
              sheet,
              ...at(field),
              `stop "${stop.id}" names vehicle "${name}", which the fleet does not have; type a vehicle name such as ${known}.`,
            ),
          );
        }
        ids.push(...hit);
      }
      return [...new Set(ids)];
    };
    const allowed = resolve(p.vehicleNames, "vehicle");
    const excluded = resolve(p.notVehicleNames, "notVehicle");
    const out: Stop = { ...stop, ...(allowed ? { allowedVehicles: allowed } : {}), ...(excluded ? { excludedVehicles: excluded } : {}) };
    if (allowed === undefined && excluded === undefined) return out;
    const left = vehicles.filter((v) => (allowed === undefined || allowed.includes(v.id)) && !excluded?.includes(v.id));
    const field = allowed !== undefined ? "vehicle" : "notVehicle";
    if (left.length === 0 && (allowed === undefined || allowed.length > 0)) {
      issues.push(
        cellIssue(
          sheet,
          ...at(field),
          `stop "${stop.id}" has no vehicle left once Vehicle and Not vehicle are applied; pin it to a vehicle it does not exclude.`,
        ),
      );
      return out;
    }
    const why = left.map((v) => cannotServe(stop, v)).filter((x): x is string => x !== undefined);
    if (left.length > 0 && why.length === left.length) {
      issues.push(
        cellIssue(
          sheet,
          ...at(field),
          `stop "${stop.id}" is pinned to vehicles that cannot serve it (${why.join("; ")}); pin it to a vehicle that can, or clear the cell.`,
        ),
      );
    }
    return out;
  });
}

/** Why vehicle `v` cannot serve `stop` at all (features, demand or pickup over capacity), or undefined. */
function cannotServe(stop: Stop, v: Vehicle): string | undefined {
  const missing = (stop.requiredFeatures ?? []).filter((x) => !(v.features ?? []).includes(x));
  if (missing.length > 0) return `${v.id} lacks ${missing.join(", ")}`;
  for (let d = 0; d < v.capacity.length; d++) {
    const most = Math.max(stop.demand[d] ?? 0, stop.pickup?.[d] ?? 0);
    if (most > v.capacity[d]!) return `${v.id} carries at most ${v.capacity[d]}, the stop needs ${most}`;
  }
  return undefined;
}
