import type { RouteFilesInput } from "./RouteFilesInput.js";
import { type DriverRoute, driverRoutes, windowText } from "../sheets/driverRoutes.js";
import { formatClock } from "../sheets/formatClock.js";
import type { CellValue } from "../sheets/grid.js";
import { roundTo } from "../sheets/numberFormats.js";
import { COLLECT_PREFIX, DROP_PREFIX, loadHeaders } from "../sheets/routeTableRows.js";
import { UTF8_BOM, csvText } from "./csvText.js";
import { safeFileStem } from "./safeFileStem.js";

/** One CSV file: a file name (no folder) and its text. */
export interface CsvFile {
  readonly vehicle: string;
  readonly fileName: string;
  readonly text: string;
}

/**
 * One RFC 4180 CSV file per used vehicle with the rows a driver app or a mail merge needs:
 * Vehicle, Seq, Arrival, Departure, Window, Stop, Name, Address, `Drop <dimension>` per load
 * dimension and `Collect <dimension>` when any stop collects (headers as the plan sheet's,
 * `loadHeaders`), Service min, Latitude, Longitude,
 * then the stops' own columns. The first row is the start depot (Seq 0, the departure, the
 * shift as its window), the last the end depot (the return time as its arrival). Times are clock
 * texts ("09:12", "+1d" past midnight). Files start with a UTF-8 byte order mark so Excel reads
 * accents right (common practice); user text is never changed (see `csvText`).
 *
 * File names are the vehicle id made safe by `safeFileStem` and unique ignoring case ("Van 1.csv",
 * "Van 1-2.csv").
 *
 * @param input - problem, plan, stop rows and carried headers
 * @returns one file per used vehicle, in plan order
 * @throws RangeError when the plan refers to a vehicle, stop or location the problem does not have
 * @example routeCsvFiles({ problem, plan })[0].fileName // => "Van 1.csv"
 */
export function routeCsvFiles(input: RouteFilesInput): CsvFile[] {
  const { problem, plan } = input;
  const extraHeaders = input.extraHeaders ?? [];
  const dims = problem.loadDimensions;
  const collects = problem.stops.some((s) => (s.pickup ?? []).some((q) => q > 0));
  const header = [
    "Vehicle",
    "Seq",
    "Arrival",
    "Departure",
    "Window",
    "Stop",
    "Name",
    "Address",
    ...loadHeaders(DROP_PREFIX, dims),
    ...(collects ? loadHeaders(COLLECT_PREFIX, dims) : []),
    "Service min",
    "Latitude",
    "Longitude",
    ...extraHeaders,
  ];
  const taken = new Set<string>();
  return driverRoutes(problem, plan, input.stopRows ?? []).map((route) => ({
    vehicle: route.vehicleId,
    fileName: uniqueFileName(route.vehicleId, taken),
    text: UTF8_BOM + csvText([header, ...rowsOf(route, dims.length, collects, extraHeaders)]),
  }));
}

function rowsOf(route: DriverRoute, dimCount: number, collects: boolean, extraHeaders: readonly string[]): CellValue[][] {
  const blanks = (n: number): null[] => Array.from({ length: n }, () => null);
  const quantities = dimCount * (collects ? 2 : 1);
  const depotRow = (seq: number, arrival: string, departure: string, d: DriverRoute["start"]): CellValue[] => [
    route.vehicleId,
    seq,
    arrival,
    departure,
    `shift ${windowText({ earliestMin: route.shiftStartMin, latestMin: route.shiftEndMin })}`,
    "",
    d.name,
    "",
    ...blanks(quantities),
    null,
    d.lat,
    d.lon,
    ...blanks(extraHeaders.length),
  ];
  return [
    depotRow(0, "", formatClock(route.start.timeMin), route.start),
    ...route.stops.map((s): CellValue[] => [
      route.vehicleId,
      s.seq,
      formatClock(s.arrivalMin),
      formatClock(s.departureMin),
      windowText(s.window),
      s.id,
      s.name,
      s.address,
      ...s.drop.map((q) => roundTo(q, 2)),
      ...(collects ? s.collect.map((q) => roundTo(q, 2)) : []),
      roundTo(s.serviceMin, 1),
      s.lat,
      s.lon,
      ...extraHeaders.map((h) => (Object.hasOwn(s.extra, h) ? (s.extra[h] ?? null) : null)),
    ]),
    depotRow(route.stops.length + 1, formatClock(route.end.timeMin), "", route.end),
  ];
}

function uniqueFileName(vehicleId: string, taken: Set<string>): string {
  const base = safeFileStem(vehicleId, "vehicle");
  let name = base;
  for (let n = 2; taken.has(name.toLowerCase()); n++) name = `${base}-${n}`;
  taken.add(name.toLowerCase());
  return `${name}.csv`;
}
