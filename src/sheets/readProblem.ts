import { buildMatrix, userMatrix, validateProblem, type Issue, type LatLon, type Problem, type Stop, type Vehicle } from "../core/index.js";
import { checkServable, unplannedWarnings } from "./checkServable.js";
import { mergeColumnMaps, unmatchedMappings } from "./columnMap.js";
import { BREAK_FIELDS, defaultBreaks } from "./defaultBreaks.js";
import type { SheetRead } from "./grid.js";
import { nameDepots } from "./nameDepots.js";
import { pairDimensions } from "./pairDimensions.js";
import { parseFleet, type ParsedVehicle } from "./parseFleet.js";
import { parseMatrixSheet } from "./parseMatrixSheet.js";
import { parseSettingsSheet } from "./parseSettingsSheet.js";
import { parseStops } from "./parseStops.js";
import { PLAN_SETTINGS_DEFAULTS, type PlanSettings } from "./PlanSettings.js";
import type { ReadResult, StopRow } from "./ReadResult.js";
import { cellIssue } from "./readTable.js";
import { pickupDimensions, resolvePins } from "./resolveStopRules.js";
import { SETTING_FIELDS } from "./settingFields.js";
import { crossProblems } from "./settingsSchema.js";
import { sizeWarning } from "./sizeWarning.js";
import { foldWarnings, stopWarnings, type KindedIssue } from "./stopWarnings.js";
import { unusedColumnWarnings } from "./unusedColumnWarnings.js";

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

/** The checks across settings (P end below P0, ...) on the merged settings, placed where the value came from. */
function checkSettings(s: PlanSettings, overrides: Partial<PlanSettings>): Issue[] {
  return crossProblems(s).map((p) => {
    const field = p.key === "tEnd" ? "cooling" : p.key;
    const sheet = field in overrides ? "options" : "Settings";
    return { sheet, cell: SETTING_FIELDS[p.key].label, message: `${sheet} ${SETTING_FIELDS[p.key].label}: ${p.message}` };
  });
}

function defined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
