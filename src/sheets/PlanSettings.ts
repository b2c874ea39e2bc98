import type { AcceptanceRule, CoolingSpec } from "../core/index.js";
import type { ColumnMapEntry } from "./columnMap.js";

/**
 * Everything a user can set for one scenario run: from CLI flags, the optional
 * `Settings` sheet, or the pane. Defaults in `PLAN_SETTINGS_DEFAULTS`; ranges, labels and text
 * parsing in `settingFields.ts` and `settingsSchema.ts` (one schema for every input path).
 */
export interface PlanSettings {
  /** Road distance over great-circle distance (default 1.3, common practice). */
  readonly detourFactor: number;
  /** Speed of vehicles that give none (default 40 km/h). */
  readonly speedKmh: number;
  /** Service minutes of stops that give none. */
  readonly serviceMin: number;
  readonly hardWindows: boolean;
  /** Cost per minute late under soft windows. */
  readonly lateCostPerMin: number;
  readonly rule: AcceptanceRule;
  readonly cooling: CoolingSpec;
  readonly p0: number;
  readonly pEnd: number;
  readonly seed: number;
  /** Run length: seconds (wall clock) or, when `moves` is set, a move budget (reproducible). */
  readonly seconds: number;
  readonly moves?: number;
  readonly objective: "weighted" | "hierarchical";
  /**
   * The user's column mappings (header -> field, carry or ignore): given to `readProblem`, the
   * Settings sheet's merged with the options'; in a read result, those that applied, with the table.
   */
  readonly columnMap?: readonly (ColumnMapEntry & { readonly kind?: "stops" | "fleet" })[];
  /** Country added to addresses whose row gives none, when geocoding (none by default). */
  readonly country?: string;
  /**
   * Re-planning from a plan sheet: cost of each stop moved to another vehicle, in the units of
   * the plan cost (default `STABILITY_COST_DEFAULT`).
   */
  readonly stabilityCost?: number;
  /**
   * Break defaults for every vehicle when the Fleet has no break columns. None has a value unless
   * the user gives one: they are the user's own rules, never a legal default.
   * Drive before break in hours, the lengths in minutes, the window in minutes from midnight.
   */
  readonly driveBeforeBreakH?: number;
  readonly breakMin?: number;
  readonly windowBreakMin?: number;
  readonly breakFrom?: number;
  readonly breakTo?: number;
  /**
   * Annealing chains run at once, one per worker (thread), sharing their best plan at marks of the budget; the best plan is kept.
   * Absent: one chain (the CLI's default; the pane starts its field at the browser's cores minus one).
   */
  readonly workers?: number;
}

/**
 * Stability cost when none is given: about the cost of a short detour, so a stop changes van
 * only for a clear saving (our choice; raise it to keep routes as published).
 */
export const STABILITY_COST_DEFAULT = 20;

/** Defaults of `PlanSettings` (common practice unless noted). */
export const PLAN_SETTINGS_DEFAULTS: PlanSettings = {
  detourFactor: 1.3,
  speedKmh: 40,
  serviceMin: 5,
  hardWindows: true,
  lateCostPerMin: 1,
  rule: "metropolis",
  cooling: { kind: "timeFraction" },
  p0: 0.5,
  pEnd: 0.001,
  seed: 1,
  seconds: 10,
  objective: "weighted",
};

/** What a plan sheet records about the run that made it (the settings block). */
export interface RunRecord {
  readonly scenario: string;
  /** When the run finished, as an Excel serial date-time (ECMA-376 1900 system). */
  readonly createdSerial: number;
  readonly settings: PlanSettings;
  readonly moves: number;
  readonly runSeconds: number;
  /** Sheet and range the stops and fleet were read from, e.g. "Stops!A1:J81". */
  readonly stopsSource: string;
  readonly fleetSource: string;
  /** Sheet and range of the road-distance matrix, when one replaced the great-circle distances. */
  readonly matrixSource?: string;
  /** The plan sheet a re-plan started from, and the vehicles whose routes it kept exactly. */
  readonly fromPlan?: string;
  readonly locked?: readonly string[];
  /**
   * The plan sheet's id in the workbook that holds it (Excel's `worksheet.id`, which survives a
   * rename; the file's sheet id for workbooks written by the CLI or the page), so Rerun still finds
   * the record after the user renames the sheet.
   */
  readonly sheetId?: string;
}
