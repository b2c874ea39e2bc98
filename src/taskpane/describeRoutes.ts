/**
 * The route map in words, for screen readers and anyone who cannot see the colours: one entry
 * per used vehicle with its depot, its stops in order with arrival times, and the return; then
 * the stops left unassigned. The same words feed the map's hover text, so both say the same.
 */
import type { Plan, Problem, Visit } from "../core/index.js";
import { formatClock } from "../sheets/formatClock.js";

/** One route in words. */
export interface RouteDescription {
  readonly vehicle: string;
  /** "Van A, blue line: leaves Depot North 07:00, 12 stops, 34.5 km, back 11:40". */
  readonly summary: string;
  /** One line per stop in order (the caller numbers them, e.g. in an ordered list): "Shop 3, arrives 08:12". */
  readonly stops: readonly string[];
}

/**
 * Describe every used route of `plan`.
 *
 * @param problem - the solved problem
 * @param plan - its plan
 * @param colourNames - the line's colour name and pattern per route index (as on the map)
 * @returns the routes in plan order, and the unassigned stops as lines
 * @example describeRoutes(problem, plan, ["blue"]).routes[0].stops[0] // => "Shop 3, arrives 08:12"
 */
export function describeRoutes(
  problem: Problem,
  plan: Plan,
  colourNames: readonly string[],
): { routes: RouteDescription[]; unassigned: string[] } {
  const routes: RouteDescription[] = [];
  plan.routes.forEach((route, r) => {
    const vehicle = problem.vehicles[route.vehicle];
    if (!vehicle || route.visits.length === 0) return;
    const start = depotName(problem, vehicle.startLocation);
    const end = depotName(problem, vehicle.endLocation);
    const n = route.visits.length;
    const back = end === start ? `back ${formatClock(route.returnMin)}` : `ends at ${end} ${formatClock(route.returnMin)}`;
    routes.push({
      vehicle: vehicle.id,
      summary: `${vehicle.id}, ${colourNames[r] ?? "line"}: leaves ${start} ${formatClock(route.departureMin)}, ${n} stop${n === 1 ? "" : "s"}, ${round1(route.distanceKm)} km, ${back}`,
      stops: route.visits.map((v) => `${stopName(problem, v.stop)}, arrives ${formatClock(v.arrivalMin)}`),
    });
  });
  const unassigned = plan.unassigned.map((u) => `${stopName(problem, u.stop)}: not served, ${u.reason}`);
  return { routes, unassigned };
}

/**
 * The hover text of one served stop, as short lines that wrap inside a narrow pane.
 *
 * @param problem - the solved problem
 * @param vehicleId - the serving vehicle
 * @param visit - the visit
 * @param seq - 1-based position in the route
 * @param count - stops in the route
 * @returns lines joined by "\n"
 * @example stopHoverText(problem, "Van A", visit, 3, 12) // => "Shop 3\nVan A · stop 3 of 12\narrives 08:12 · window 08:00–12:00\nload after 120 kg"
 */
export function stopHoverText(problem: Problem, vehicleId: string, visit: Visit, seq: number, count: number): string {
  const stop = problem.stops[visit.stop];
  const window = stop?.windows.find((w) => w.latestMin >= visit.startMin) ?? stop?.windows[0];
  const windowText =
    window && Number.isFinite(window.latestMin) ? ` · window ${formatClock(window.earliestMin)}–${formatClock(window.latestMin)}` : "";
  const load = visit.loadAfter.map((l, d) => `${round1(l)} ${problem.loadDimensions[d] ?? ""}`.trim()).join(", ");
  const late = visit.lateMin > 0 ? `\n${Math.round(visit.lateMin)} min late` : "";
  return `${stopName(problem, visit.stop)}\n${vehicleId} · stop ${seq} of ${count}\narrives ${formatClock(visit.arrivalMin)}${windowText}${late}\nload after ${load}`;
}

/**
 * A depot's name as the map labels it.
 *
 * @param problem - the problem
 * @param location - index into `problem.locations`
 * @returns the location's name, or "Depot" when it has none
 * @example depotName(problem, 0) // => "Depot North"
 */
export function depotName(problem: Problem, location: number): string {
  return problem.locations[location]?.name?.trim() || "Depot";
}

function stopName(problem: Problem, index: number): string {
  const stop = problem.stops[index];
  return stop ? stop.name || stop.id : `stop ${index + 1}`;
}

function round1(x: number): number {
  return Math.round(x * 10) / 10;
}
