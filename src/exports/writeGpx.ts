import type { RouteFilesInput } from "./RouteFilesInput.js";
import type { Plan, Problem } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { type DriverRoute, type DriverStop, driverRoutes, routeSummary, windowText } from "../sheets/driverRoutes.js";
import { formatClock } from "../sheets/formatClock.js";
import { decimalText } from "./decimalText.js";
import { xmlText } from "./xmlText.js";

/** GPX 1.1 namespace and schema (topografix.com, GPX 1.1 schema of 2004). */
export const GPX_NAMESPACE = "http://www.topografix.com/GPX/1/1";
const GPX_SCHEMA = "http://www.topografix.com/GPX/1/1/gpx.xsd";
/** The `creator` attribute of every GPX file Kiln writes. */
export const GPX_CREATOR = "Kiln Route Planner";

/**
 * A plan as a GPX 1.1 document (the open GPS Exchange Format): one `<rte>` per used vehicle,
 * named after it, its `<desc>` the route's totals; one `<rtept lat lon>` per point in driving
 * order, the depot first and last. A stop's point carries its name, its address in `<cmt>` and a
 * `<desc>` with the sequence, planned arrival and window ("Seq 3 · arrive 09:12 · window
 * 09:00–11:00"); the depot points say when to leave and when the vehicle is back. The metadata
 * carries the scenario name and the caution, and names the stops left out of the plan.
 * Elements follow the schema's order; text is escaped by `xmlText`. No times are written as
 * `<time>` because a plan has clock times but no date.
 *
 * @param input - problem, plan, stop rows and scenario name
 * @returns the document, UTF-8 text with an XML declaration
 * @throws RangeError when the plan refers to a vehicle, stop or location the problem does not have
 * @example writeGpx({ problem, plan, scenario: "Monday" }).startsWith("<?xml") // => true
 */
export function writeGpx(input: RouteFilesInput): string {
  const { problem, plan } = input;
  const routes = driverRoutes(problem, plan, input.stopRows ?? []);
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<gpx version="1.1" creator="${xmlText(GPX_CREATOR)}" xmlns="${GPX_NAMESPACE}" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="${GPX_NAMESPACE} ${GPX_SCHEMA}">`,
    "  <metadata>",
    ...(input.scenario !== undefined && input.scenario !== "" ? [`    ${element("name", input.scenario)}`] : []),
    `    ${element("desc", [unplannedText(problem, plan), CAUTION_TEXT].filter((t) => t !== "").join(" "))}`,
    "  </metadata>",
  ];
  routes.forEach((route, i) => out.push(...routeLines(route, i + 1)));
  out.push("</gpx>", "");
  return out.join("\n");
}

function routeLines(route: DriverRoute, number: number): string[] {
  return [
    "  <rte>",
    `    ${element("name", route.vehicleId)}`,
    `    ${element("desc", routeSummary(route))}`,
    `    <number>${number}</number>`,
    point(route.start.lat, route.start.lon, route.start.name, undefined, `Leave the depot at ${formatClock(route.start.timeMin)}`),
    ...route.stops.map((s) => point(s.lat, s.lon, s.name, s.address, stopDesc(s))),
    point(route.end.lat, route.end.lon, route.end.name, undefined, `Back at the depot at ${formatClock(route.end.timeMin)}`),
    "  </rte>",
  ];
}

function stopDesc(s: DriverStop): string {
  const w = windowText(s.window);
  return [`Seq ${s.seq}`, `stop ${s.id}`, `arrive ${formatClock(s.arrivalMin)}`, ...(w ? [`window ${w}`] : [])].join(" · ");
}

/** A route point; GPX 1.1 wptType order: name, cmt, desc. Longitude 180 is written as -180 (the schema's range is [-180, 180)). */
function point(lat: number, lon: number, name: string, comment: string | undefined, desc: string): string {
  const parts = [element("name", name), ...(comment ? [element("cmt", comment)] : []), element("desc", desc)];
  return `    <rtept lat="${decimalText(lat)}" lon="${decimalText(lon === 180 ? -180 : lon)}">${parts.join("")}</rtept>`;
}

function element(tag: string, text: string): string {
  return `<${tag}>${xmlText(text)}</${tag}>`;
}

function unplannedText(problem: Problem, plan: Plan): string {
  if (plan.unassigned.length === 0) return "";
  const ids = plan.unassigned.map((u) => problem.stops[u.stop]?.id ?? String(u.stop));
  return `Not in any route: ${ids.length} stop${ids.length === 1 ? "" : "s"} (${ids.join(", ")}).`;
}
