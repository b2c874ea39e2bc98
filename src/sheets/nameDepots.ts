import type { LatLon, Vehicle } from "../core/index.js";
import type { ParsedVehicle } from "./parseFleet.js";

/** How many vehicle names a depot's name lists before "+ n more". */
const DEPOT_NAME_LIST = 3;

/**
 * Names each depot location after itself, so every route's depot rows name their own depot: the
 * one depot of a fleet is "Depot"; with several, each is "Depot (" + the fleet rows that start or
 * end there, in fleet order + ")", e.g. "Depot (Van A, Van B)" and "Depot (Van C)", so a van
 * never shows a depot named only after another van.
 */
export function nameDepots(
  locations: (LatLon & { name?: string })[],
  parsed: readonly ParsedVehicle[],
  vehicles: readonly Vehicle[],
): void {
  const users = new Map<number, string[]>();
  vehicles.forEach((v, k) => {
    for (const at of [v.startLocation, v.endLocation]) {
      const list = users.get(at) ?? [];
      const name = parsed[k]!.rowName;
      if (!list.includes(name)) list.push(name);
      users.set(at, list);
    }
  });
  for (const [at, names] of users) {
    const more = names.length > DEPOT_NAME_LIST ? ` + ${names.length - DEPOT_NAME_LIST} more` : "";
    locations[at]!.name = users.size === 1 ? "Depot" : `Depot (${names.slice(0, DEPOT_NAME_LIST).join(", ")}${more})`;
  }
}
