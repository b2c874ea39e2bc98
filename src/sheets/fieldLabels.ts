import type { TableKind } from "./matchHeaders.js";

/**
 * The canonical header of every field a column can be mapped to, per table (DESIGN.md §5), in
 * the order the pane lists them. Each label reads back as its own field through `matchHeader`,
 * so a mapping may name the field by its label ("Drop time=Service min") or by any synonym
 * ("Drop time=service").
 */
export const FIELD_LABELS: Readonly<Record<TableKind, Readonly<Record<string, string>>>> = {
  stops: {
    id: "Stop",
    name: "Name",
    address: "Address",
    latitude: "Latitude",
    longitude: "Longitude",
    coordinates: "Coordinates",
    demand: "Demand",
    earliest: "Earliest",
    latest: "Latest",
    windows: "Windows",
    serviceMin: "Service min",
    priority: "Priority",
    features: "Features",
    pickup: "Pickup",
    vehicle: "Vehicle",
    notVehicle: "Not vehicle",
  },
  fleet: {
    id: "Vehicle",
    count: "Count",
    capacity: "Capacity",
    address: "Depot address",
    endAddress: "End address",
    startLatitude: "Start latitude",
    startLongitude: "Start longitude",
    endLatitude: "End latitude",
    endLongitude: "End longitude",
    startCoordinates: "Depot",
    endCoordinates: "End depot",
    shiftStart: "Shift start",
    shiftEnd: "Shift end",
    fixedCost: "Fixed cost",
    costPerKm: "Cost per km",
    costPerHour: "Cost per hour",
    speedKmh: "Speed km/h",
    maxStops: "Max stops",
    features: "Features",
    driveBeforeBreak: "Drive before break",
    breakMin: "Break min",
    windowBreakMin: "Window break min",
    breakFrom: "Break from",
    breakTo: "Break to",
    maxDrivingH: "Max driving h",
    maxDutyH: "Max duty h",
    maxKm: "Max km",
    lock: "Lock",
  },
};

/**
 * The label of a field key as the pane and messages show it.
 *
 * @param kind - the table
 * @param key - a field key of `mapColumns` ("serviceMin", "demand:kg", "earliest:2")
 * @returns "Service min", "Demand kg", "Earliest 2"; the key itself when unknown
 * @example fieldLabel("stops", "demand:kg") // => "Demand kg"
 */
export function fieldLabel(kind: TableKind, key: string): string {
  const [base, rest] = key.split(":", 2) as [string, string | undefined];
  const label = FIELD_LABELS[kind][base] ?? base;
  return rest === undefined ? label : `${label} ${rest}`;
}
