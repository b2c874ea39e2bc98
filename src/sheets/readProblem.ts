import {
  buildMatrix,
  userMatrix,
  validateProblem,
  type DrivingBreakRule,
  type Issue,
  type LatLon,
  type Problem,
  type Stop,
  type Vehicle,
  type WindowBreakRule,
} from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { formatClock } from "./formatClock.js";
import { parseFleet, type ParsedFleet, type ParsedVehicle } from "./parseFleet.js";
import { parseMatrixSheet } from "./parseMatrixSheet.js";
import { parseSettingsSheet } from "./parseSettingsSheet.js";
import { parseStops, type ParsedStops } from "./parseStops.js";
import { PLAN_SETTINGS_DEFAULTS, type PlanSettings } from "./PlanSettings.js";
import type { ReadResult, StopRow } from "./ReadResult.js";
import { cellIssue } from "./readTable.js";
import { pickupDimensions, resolvePins, type LoadDimension } from "./resolveStopRules.js";
import { SETTING_FIELDS } from "./settingFields.js";
import { crossProblems } from "./settingsSchema.js";
import { sizeWarning } from "./sizeWarning.js";
import { foldWarnings, stopWarnings, type KindedIssue } from "./stopWarnings.js";
import { unusedColumnWarnings } from "./unusedColumnWarnings.js";
import { mergeColumnMaps, type ColumnMapEntry } from "./columnMap.js";

/** Name of the one load dimension when neither Demand nor Capacity carries a unit word (defined in core). */
import { PLAIN_DIMENSION } from "../core/index.js";
export { PLAIN_DIMENSION };

/**
 * Read the stops and fleet tables (and the optional Settings and matrix sheets) into a
 * `Problem`, or report every defect at once. Nothing here throws on user data.
 *
 * Settings: `overrides` (CLI flags, the pane) over the Settings sheet over
 * `PLAN_SETTINGS_DEFAULTS`. Locations: the distinct depot points of the fleet first (by equal
 * coordinates, each named after itself by `nameDepots`), then one per stop.
 * The matrix is `buildMatrix(locations, { detourFactor, speedKmh })`, or the matrix sheet's km
 * (`userMatrix`) when one is given. Load dimensions pair Demand <unit> with Capacity <unit>;
 * a plain Demand and a plain Capacity make one dimension named "load".
 *
 * Checks beyond single cells, all warnings (the stop is planned around, left unassigned with
 * its reason): a stop whose every window lies outside every vehicle's shift, whose demand no
 * vehicle can carry, whose features no vehicle has, or whose window no vehicle reaches; doubtful
 * coordinates and backwards windows (`stopWarnings`). Repeated warnings of one kind fold into one line.
 *
 * @param input - the tables as read from the workbook
 * @param overrides - settings that win over the Settings sheet
 * @param limits - `maxLocations`: above this many stops and depots the read fails with the size
 *   message before the distance tables are built (the pane passes `PANE_MAX_LOCATIONS`)
 * @returns `{ ok: true, problem, ... }` or `{ ok: false, issues }`
 * @example readProblem({ stops, fleet }).ok // => true when the tables are clean
 */
export function readProblem(
  input: {
    stops: SheetRead;
    fleet: SheetRead;
    settings?: SheetRead;
    matrix?: SheetRead;
    /** Reasons by 0-based stops-sheet row for stops whose address was not found (see `parseStops`). */
    unlocated?: ReadonlyMap<number, string>;
  },
  overrides: Partial<PlanSettings> = {},
  limits: { readonly maxLocations?: number } = {},
): ReadResult {
  const issues: Issue[] = [];
  const warnings: KindedIssue[] = [];
  const warned = new Set<number>();
  const fromSheet = input.settings ? parseSettingsSheet(input.settings) : { settings: {}, issues: [] };
  issues.push(...fromSheet.issues);
  const merged: PlanSettings = { ...PLAN_SETTINGS_DEFAULTS, ...defined(fromSheet.settings), ...defined(overrides) };
  const { columnMap: _given, ...settingsWithoutMap } = merged;
  issues.push(...checkSettings(settingsWithoutMap, overrides));
  const columnMap = mergeColumnMaps(fromSheet.settings.columnMap, overrides.columnMap);
  const stops = parseStops(input.stops, columnMap, input.unlocated);
  const fleet = parseFleet(input.fleet, columnMap);
  issues.push(...stops.issues, ...fleet.issues);
  const usedMap = [
    ...(stops.columns?.mapped ?? []).map((e) => ({ ...e, kind: "stops" as const })),
    ...(fleet.columns?.mapped ?? []).map((e) => ({ ...e, kind: "fleet" as const })),
  ];
  issues.push(...unmatchedMappings(columnMap, usedMap, input, stops.columns !== undefined && fleet.columns !== undefined));
  const settings: PlanSettings = usedMap.length > 0 ? { ...settingsWithoutMap, columnMap: usedMap } : settingsWithoutMap;
  const stopColumns = stops.columns?.matches ?? [];
  const fleetColumns = fleet.columns?.matches ?? [];
  const dims = pairDimensions(input, stops, fleet, issues);
  if (fleet.vehicles.length === 0 && fleet.issues.length === 0) {
    issues.push(
      cellIssue(
        input.fleet.sheet,
        fleet.headerRow0,
        input.fleet.col,
        "no vehicle is available (every Count is 0); give at least one row a Count of 1 or more.",
      ),
    );
  }
  checkServable(stops, fleet, dims, settings.hardWindows, { stops: input.stops.sheet, fleet: input.fleet.sheet }, warnings, warned);
  const pickupDims = dims === undefined ? new Map<string, number>() : pickupDimensions(stops, dims, input.stops.sheet, issues);
  if (issues.length > 0 || dims === undefined) return { ok: false, issues, stopColumns, fleetColumns };

  const locations: (LatLon & { name?: string })[] = [];
  const depotNames: string[][] = [];
  const depotIndex = (p: LatLon, v: ParsedVehicle): number => {
    let i = locations.findIndex((l) => l.lat === p.lat && l.lon === p.lon);
    if (i < 0) {
      i = locations.push({ lat: p.lat, lon: p.lon }) - 1;
      depotNames.push([`Depot (${v.rowName})`]);
    }
    // A matrix sheet may name the depot by any vehicle starting there, or by its row name.
    depotNames[i]!.push(v.id, v.rowName);
    return i;
  };
  const fleetHasBreaks = fleetColumns.some((c) => BREAK_FIELDS.includes(c.field));
  const vehicles: Vehicle[] = fleet.vehicles.map((v) => ({
    id: v.id,
    ...(v.driver !== undefined ? { driver: v.driver } : {}),
    capacity: dims.map((d) => (d.fleet === undefined ? Infinity : (v.capacity.get(d.fleet) ?? 0))),
    startLocation: depotIndex(v.start, v),
    endLocation: depotIndex(v.end, v),
    shiftStartMin: v.shiftStartMin,
    shiftEndMin: v.shiftEndMin,
    fixedCost: v.fixedCost,
    costPerKm: v.costPerKm,
    costPerHour: v.costPerHour,
    speedKmh: v.speedKmh ?? settings.speedKmh,
    ...(v.features !== undefined ? { features: v.features } : {}),
    ...(v.maxStops !== undefined ? { maxStops: v.maxStops } : {}),
    ...(fleetHasBreaks ? {} : defaultBreaks(settings)),
    ...v.rules,
  }));
  nameDepots(locations, fleet.vehicles, vehicles);
  depotNames.forEach((names, i) => names.push(locations[i]!.name!));
  const depots = locations.length;
  const unpinned: Stop[] = stops.stops.map((s, i) => {
    // A stop whose address was not found is never routed: it stands at the first depot.
    const at = s.position ?? locations[0]!;
    locations.push({ lat: at.lat, lon: at.lon, name: s.name });
    const pickup = dims.map(() => 0);
    for (const [unit, d] of pickupDims) pickup[d] = pickup[d]! + (s.pickup.get(unit) ?? 0);
    return {
      id: s.id,
      name: s.name,
      location: depots + i,
      demand: dims.map((d) => (d.stops === undefined ? 0 : (s.demand.get(d.stops) ?? 0))),
      windows: s.windows,
      serviceMin: s.serviceMin ?? settings.serviceMin,
      ...(s.unservedCost !== undefined ? { unservedCost: s.unservedCost } : {}),
      ...(s.requiredFeatures !== undefined ? { requiredFeatures: s.requiredFeatures } : {}),
      ...(pickup.some((q) => q > 0) ? { pickup } : {}),
      ...(s.unplannedReason !== undefined ? { unplannedReason: s.unplannedReason } : {}),
    };
  });
  const problemStops = resolvePins(
    stops,
    unpinned,
    vehicles,
    fleet.vehicles.map((v) => v.rowName),
    input.stops.sheet,
    issues,
  );
  if (issues.length > 0) return { ok: false, issues, stopColumns, fleetColumns };
  const size = sizeWarning(locations.length, problemStops.length, stops, input.stops.sheet);
  if (size && limits.maxLocations !== undefined && locations.length > limits.maxLocations) {
    return { ok: false, issues: [size.issue], stopColumns, fleetColumns };
  }
  if (size) warnings.push(size);
  let matrix = buildMatrix(locations, { detourFactor: settings.detourFactor, speedKmh: settings.speedKmh });
  if (input.matrix) {
    const names = [...depotNames, ...problemStops.map((s) => [s.id])];
    const m = parseMatrixSheet(input.matrix, names);
    if (m.distanceKm === undefined) return { ok: false, issues: m.issues, stopColumns, fleetColumns };
    matrix = userMatrix(m.distanceKm, undefined, settings.speedKmh);
  }
  const problem: Problem = {
    locations,
    stops: problemStops,
    vehicles,
    loadDimensions: dims.map((d) => d.name),
    matrix,
    referenceSpeedKmh: settings.speedKmh,
    hardWindows: settings.hardWindows,
    lateCostPerMin: settings.lateCostPerMin,
    objective: settings.objective,
  };
  // Safety net: whatever the rows looked like, the solver only ever sees a consistent problem.
  const model = validateProblem(problem);
  if (model.length > 0) return { ok: false, issues: model, stopColumns, fleetColumns };
  const stopRows: StopRow[] = stops.stops.map((s, i) => ({
    stop: i,
    sheetRow: s.sheetRow,
    extra: s.extra,
    ...(s.address !== undefined ? { address: s.address } : {}),
  }));
  warnings.push(...unplannedWarnings(stops, input.stops.sheet, warned));
  warnings.push(...stopWarnings(problem, stops, input.stops.sheet, warned));
  // Columns that look like a field but are not used: each its own warning, never folded.
  for (const [read, parsed, kind] of [
    [input.stops, stops, "stops"],
    [input.fleet, fleet, "fleet"],
  ] as const) {
    const unused = (parsed.columns?.extras ?? []).filter((e) => !e.chosen);
    for (const issue of unusedColumnWarnings(read, parsed.headerRow0, unused, kind)) {
      warnings.push({ kind: `unused-column ${issue.sheet}!${issue.cell}`, issue });
    }
  }
  return {
    ok: true,
    problem,
    settings,
    stopRows,
    extraHeaders: stops.extraHeaders,
    stopColumns,
    fleetColumns,
    warnings: foldWarnings(warnings),
    lockedVehicles: fleet.vehicles.flatMap((v) =>
      v.lockCell !== undefined ? [{ vehicle: v.id, sheet: input.fleet.sheet, cell: v.lockCell }] : [],
    ),
  };
}

type Dimension = LoadDimension;

/** One warning per stop that cannot be planned (address not found), at its row's first address cell. */
function unplannedWarnings(stops: ParsedStops, sheet: string, warned: Set<number>): KindedIssue[] {
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

function pairDimensions(
  input: { stops: SheetRead; fleet: SheetRead },
  stops: ParsedStops,
  fleet: ParsedFleet,
  issues: Issue[],
): Dimension[] | undefined {
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
  const out: Dimension[] = [];
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

/**
 * Stops no vehicle can serve, judged on the rows that were read cleanly: well-formed data that
 * makes a stop unservable is planned around (the stop is left unassigned with its reason), so
 * each gets a warning naming its cell, never an input error. A fleet without capacity in a load
 * dimension gets one message instead of one per stop.
 */
function checkServable(
  stops: ParsedStops,
  fleet: ParsedFleet,
  dims: readonly Dimension[] | undefined,
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

/**
 * Mappings the user typed (an option or a Settings row, so with a `where`) whose header is in
 * neither table: an issue each, since a misspelt header would otherwise change nothing silently.
 * Mappings remembered by the pane are for whatever tables come next and are not checked.
 */
function unmatchedMappings(
  columnMap: readonly ColumnMapEntry[],
  used: readonly ColumnMapEntry[],
  input: { stops: SheetRead; fleet: SheetRead },
  tablesRead: boolean,
): Issue[] {
  if (!tablesRead) return [];
  const applied = new Set(used.map((e) => e.header));
  return columnMap
    .filter((e) => e.where !== undefined && !applied.has(e.header))
    .map((e) => ({
      sheet: e.where!.includes("!") ? e.where!.slice(0, e.where!.lastIndexOf("!")) : "options",
      cell: e.where!.includes("!") ? e.where!.slice(e.where!.lastIndexOf("!") + 1) : "",
      message: `${e.where}: no column headed "${e.header}" in the stops table (${input.stops.sheet}) or the fleet table (${input.fleet.sheet}); check the header as it is typed in the table (case, spaces and punctuation do not matter) or remove the mapping.`,
    }));
}

/** The checks across settings (P end below P0, ...) on the merged settings, placed where the value came from. */
function checkSettings(s: PlanSettings, overrides: Partial<PlanSettings>): Issue[] {
  return crossProblems(s).map((p) => {
    const field = p.key === "tEnd" ? "cooling" : p.key;
    const sheet = field in overrides ? "options" : "Settings";
    return { sheet, cell: SETTING_FIELDS[p.key].label, message: `${sheet} ${SETTING_FIELDS[p.key].label}: ${p.message}` };
  });
}

/** Fleet fields that give a vehicle its own break rule (then the Settings' break defaults do not apply). */
const BREAK_FIELDS = ["driveBeforeBreak", "breakMin", "windowBreakMin", "breakFrom", "breakTo"];

/** The Settings' break defaults as vehicle rules (checked whole by `crossProblems`); none when none is set. */
function defaultBreaks(s: PlanSettings): Pick<Vehicle, "drivingBreak" | "windowBreak"> {
  const out: { drivingBreak?: DrivingBreakRule; windowBreak?: WindowBreakRule } = {};
  if (s.driveBeforeBreakH !== undefined && s.breakMin !== undefined)
    out.drivingBreak = { driveMin: s.driveBeforeBreakH * 60, breakMin: s.breakMin };
  const length = s.windowBreakMin ?? s.breakMin;
  if (s.breakFrom !== undefined && s.breakTo !== undefined && length !== undefined)
    out.windowBreak = { earliestMin: s.breakFrom, latestMin: s.breakTo, breakMin: length };
  return out;
}

function defined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** How many vehicle names a depot's name lists before "+ n more". */
const DEPOT_NAME_LIST = 3;

/**
 * Names each depot location after itself, so every route's depot rows name their own depot: the
 * one depot of a fleet is "Depot"; with several, each is "Depot (" + the fleet rows that start or
 * end there, in fleet order + ")", e.g. "Depot (Van A, Van B)" and "Depot (Van C)", so a van
 * never shows a depot named only after another van.
 */
function nameDepots(locations: (LatLon & { name?: string })[], parsed: readonly ParsedVehicle[], vehicles: readonly Vehicle[]): void {
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
