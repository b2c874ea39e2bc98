import type { Plan, Problem, TimeWindow } from "../core/index.js";
import { formatClock } from "./formatClock.js";
import type { CellValue } from "./grid.js";
import type { StopRow } from "./ReadResult.js";
import { windowUsed } from "./windowUsed.js";

/** A depot end of a route: where it is and when the vehicle leaves (start) or comes back (end). */
export interface DriverDepot {
  /** The depot's location name, or "Depot" when it has none. */
  readonly name: string;
  readonly lat: number;
  readonly lon: number;
  /** Departure from the start depot, or return to the end depot (minutes from midnight). */
  readonly timeMin: number;
}

/** One stop of a route as a driver reads it. */
export interface DriverStop {
  /** 1-based position on the route (the depot start is 0). */
  readonly seq: number;
  /** Index into `Problem.stops`. */
  readonly stop: number;
  readonly id: string;
  readonly name: string;
  /** The stop's Address cell, "" when none. */
  readonly address: string;
  readonly lat: number;
  readonly lon: number;
  /** Planned arrival, start of service and departure, minutes from midnight. */
  readonly arrivalMin: number;
  readonly startMin: number;
  readonly departureMin: number;
  /** The window the visit is planned in; `undefined` when the stop has no window. */
  readonly window: TimeWindow | undefined;
  /** Quantity to drop here per load dimension (the stop's demand). */
  readonly drop: readonly number[];
  /** Quantity to collect here per load dimension (0 when nothing). */
  readonly collect: readonly number[];
  readonly serviceMin: number;
  /** Minutes after the window's latest start (0 when on time). */
  readonly lateMin: number;
  /** The stop's carried-through columns, keyed by header. */
  readonly extra: Readonly<Record<string, CellValue>>;
}

/** One used vehicle's route, top to bottom, as the route sheets and the navigation files show it. */
export interface DriverRoute {
  /** Index into `Problem.vehicles`. */
  readonly vehicle: number;
  /** The vehicle's id (the user's text). */
  readonly vehicleId: string;
  /** The fleet table's Driver cell, when it has one. */
  readonly driver?: string;
  readonly start: DriverDepot;
  readonly end: DriverDepot;
  readonly shiftStartMin: number;
  readonly shiftEndMin: number;
  readonly stops: readonly DriverStop[];
  readonly distanceKm: number;
  readonly drivingMin: number;
  readonly dutyMin: number;
  /** Load leaving the start depot per dimension. */
  readonly load: readonly number[];
}

/**
 * The routes of a plan as a driver needs them: for each used vehicle (plan order) its depots,
 * then its stops in order with planned arrival, window, address, the quantity to drop and
 * collect per load dimension, service minutes and the stop's own columns. Unused vehicles are
 * left out. One model for the route sheets and the GPX, GeoJSON and CSV files, so they agree.
 *
 * @param problem - the problem the plan solves
 * @param plan - the plan
 * @param stopRows - where each stop came from: its address and carried columns (may be empty)
 * @returns one entry per used vehicle
 * @throws RangeError when the plan refers to a vehicle, stop or location the problem does not have
 * @example driverRoutes(problem, plan, read.stopRows)[0].stops[0].seq // => 1
 */
export function driverRoutes(problem: Problem, plan: Plan, stopRows: readonly StopRow[] = []): DriverRoute[] {
  const rowOf = new Map(stopRows.map((r) => [r.stop, r]));
  const zero = problem.loadDimensions.map(() => 0);
  return plan.routes
    .filter((route) => route.visits.length > 0)
    .map((route) => {
      const v = problem.vehicles[route.vehicle];
      if (!v) throw new RangeError(`driverRoutes: plan uses vehicle ${route.vehicle}, problem has ${problem.vehicles.length}`);
      const stops = route.visits.map((visit, i): DriverStop => {
        const stop = problem.stops[visit.stop];
        if (!stop) throw new RangeError(`driverRoutes: plan visits stop ${visit.stop}, problem has ${problem.stops.length}`);
        const at = locationOf(problem, stop.location);
        const w = windowUsed(stop, visit);
        const row = rowOf.get(visit.stop);
        return {
          seq: i + 1,
          stop: visit.stop,
          id: stop.id,
          name: stop.name,
          address: row?.address ?? "",
          lat: at.lat,
          lon: at.lon,
          arrivalMin: visit.arrivalMin,
          startMin: visit.startMin,
          departureMin: visit.departureMin,
          window: w.earliestMin <= 0 && w.latestMin === Infinity ? undefined : w,
          drop: stop.demand,
          collect: stop.pickup ?? zero,
          serviceMin: stop.serviceMin,
          lateMin: visit.lateMin,
          extra: row?.extra ?? {},
        };
      });
      return {
        vehicle: route.vehicle,
        vehicleId: v.id,
        ...(v.driver !== undefined ? { driver: v.driver } : {}),
        start: depot(problem, v.startLocation, route.departureMin),
        end: depot(problem, v.endLocation, route.returnMin),
        shiftStartMin: v.shiftStartMin,
        shiftEndMin: v.shiftEndMin,
        stops,
        distanceKm: route.distanceKm,
        drivingMin: route.drivingMin,
        dutyMin: route.dutyMin,
        load: route.load,
      };
    });
}

/**
 * A time window in words for a driver: "09:00–11:00", "from 09:00", "until 11:00", or "" when
 * the stop has none. Clock times as `formatClock` writes them ("+1d" past midnight).
 *
 * @param window - the window, or undefined
 * @returns the text
 * @example windowText({ earliestMin: 540, latestMin: 660 }) // => "09:00–11:00"
 */
export function windowText(window: TimeWindow | undefined): string {
  if (!window) return "";
  const open = window.latestMin === Infinity;
  if (window.earliestMin <= 0 && open) return "";
  if (open) return `from ${formatClock(window.earliestMin)}`;
  if (window.earliestMin <= 0) return `until ${formatClock(window.latestMin)}`;
  return `${formatClock(window.earliestMin)}–${formatClock(window.latestMin)}`;
}

/**
 * The route's driver and totals in one line ("Driver Ana: 12 stops, 84.3 km, driving 2:05, duty 6:40").
 *
 * @param route - a driver route
 * @returns the text
 * @example routeSummary(route) // => "12 stops, 84.3 km, driving 2:05, duty 6:40"
 */
export function routeSummary(route: DriverRoute): string {
  const n = route.stops.length;
  return `${route.driver ? `Driver ${route.driver}: ` : ""}${n} stop${n === 1 ? "" : "s"}, ${route.distanceKm.toFixed(1)} km, driving ${hoursMinutes(route.drivingMin)}, duty ${hoursMinutes(route.dutyMin)}`;
}

function hoursMinutes(min: number): string {
  const whole = Math.round(min);
  return `${Math.floor(whole / 60)}:${String(whole % 60).padStart(2, "0")}`;
}

function depot(problem: Problem, index: number, timeMin: number): DriverDepot {
  const at = locationOf(problem, index);
  return { name: at.name || "Depot", lat: at.lat, lon: at.lon, timeMin };
}

function locationOf(problem: Problem, index: number) {
  const loc = problem.locations[index];
  if (!loc) throw new RangeError(`driverRoutes: location ${index} is outside 0..${problem.locations.length - 1}`);
  return loc;
}
