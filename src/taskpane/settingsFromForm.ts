/**
 * The pane's settings and cooling fields as plain strings, and their conversion to and from
 * `PlanSettings`. Pure (no DOM), so a bad entry becomes an `Issue`, never an exception.
 */
import type { Issue, CoolingSpec } from "../core/index.js";
import { PLAN_SETTINGS_DEFAULTS, STABILITY_COST_DEFAULT, type PlanSettings } from "../sheets/PlanSettings.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { PARAMETERS_OF } from "../sheets/scheduleNames.js";
import { type NumberField, type SettingKey } from "../sheets/settingFieldTypes.js";
import { buildCooling, crossProblems, parseSettingValue, type ScheduleParams } from "../sheets/settingsSchema.js";

/** The raw text of every settings field, keyed by the input's id. */
export interface PaneForm {
  readonly scenario: string;
  readonly detour: string;
  readonly speed: string;
  readonly service: string;
  /** "hard" or "soft". */
  readonly windows: string;
  readonly "late-cost": string;
  readonly seconds: string;
  readonly seed: string;
  readonly "stability-cost": string;
  /** Chains run at once (the Workers setting). */
  readonly workers: string;
  readonly rule: string;
  /** CoolingSpec kind. */
  readonly schedule: string;
  readonly alpha: string;
  readonly "moves-per-level": string;
  readonly steps: string;
  readonly beta: string;
  /** "calibrate" or "manual". */
  readonly temperatures: string;
  readonly p0: string;
  readonly "p-end": string;
  readonly t0: string;
  readonly "t-end": string;
}

/** The ids of the form fields, in form order. */
export const PANE_FORM_FIELDS: readonly (keyof PaneForm)[] = [
  "scenario",
  "detour",
  "speed",
  "service",
  "windows",
  "late-cost",
  "seconds",
  "seed",
  "stability-cost",
  "workers",
  "rule",
  "schedule",
  "alpha",
  "moves-per-level",
  "steps",
  "beta",
  "temperatures",
  "p0",
  "p-end",
  "t0",
  "t-end",
];

/** What `settingsFromForm` returns. */
export interface FormReading {
  readonly scenario: string;
  readonly settings: PlanSettings;
  /** One issue per bad field (sheet "Settings", cell = field label); empty when all is well. */
  readonly issues: Issue[];
}

/** The pane field (input id) of each setting the form shows; its label reads as the setting's label. */
export const FIELD_OF: Partial<Record<SettingKey, keyof PaneForm>> = {
  detourFactor: "detour",
  speedKmh: "speed",
  serviceMin: "service",
  windows: "windows",
  lateCostPerMin: "late-cost",
  seconds: "seconds",
  seed: "seed",
  stabilityCost: "stability-cost",
  workers: "workers",
  rule: "rule",
  schedule: "schedule",
  alpha: "alpha",
  movesPerLevel: "moves-per-level",
  steps: "steps",
  beta: "beta",
  p0: "p0",
  pEnd: "p-end",
  t0: "t0",
  tEnd: "t-end",
};

/**
 * Read the pane's fields into plan settings with the one settings schema (the same ranges and
 * messages as the Settings sheet and the CLI). Every bad field is reported at once; its default
 * is used in `settings` so previews can still draw.
 *
 * @param form - the raw field texts
 * @returns scenario name, settings and issues
 * @example settingsFromForm({ ...form, detour: "0.8" }).issues[0].message
 * // => "Detour factor 0.8 is not valid: enter a number from 1 to 3, such as 1.3."
 */
export function settingsFromForm(form: PaneForm): FormReading {
  const issues: Issue[] = [];
  const d = PLAN_SETTINGS_DEFAULTS;
  const issue = (key: SettingKey, message: string): void => {
    issues.push({ sheet: "Settings", cell: SETTING_FIELDS[key].label, message });
  };
  const read = <T extends number | string>(key: SettingKey, fallback: T): T => {
    const parsed = parseSettingValue(key, String(form[FIELD_OF[key]!] ?? ""));
    if (parsed.ok) return parsed.value as T;
    issue(key, parsed.message);
    return fallback;
  };
  const scenario = form.scenario.trim() || "Plan 1";
  const detourFactor = read("detourFactor", d.detourFactor);
  const speedKmh = read("speedKmh", d.speedKmh);
  const serviceMin = read("serviceMin", d.serviceMin);
  const hardWindows = read("windows", "hard") === "hard";
  // Under hard windows the late-cost field is hidden: keep its value when it is valid, never complain.
  const hiddenLate = parseSettingValue("lateCostPerMin", form["late-cost"] ?? "");
  const lateCostPerMin = !hardWindows
    ? read("lateCostPerMin", d.lateCostPerMin)
    : hiddenLate.ok
      ? (hiddenLate.value as number)
      : d.lateCostPerMin;
  const seconds = read("seconds", d.seconds);
  const seed = read("seed", d.seed);
  // Blank: the default stability cost (as when the Settings sheet and the CLI give none).
  const stabilityCost = form["stability-cost"].trim() === "" ? undefined : read<number>("stabilityCost", STABILITY_COST_DEFAULT);
  const workers = read("workers", 1);
  const rule = read("rule", d.rule);
  const manual = form.temperatures === "manual";
  const p0 = manual ? d.p0 : read("p0", d.p0);
  const pEnd = manual ? d.pEnd : read("pEnd", d.pEnd);
  const kind = read("schedule", d.cooling.kind) as CoolingSpec["kind"];
  // Only the shown fields count: the selected schedule's parameters, T0 and T end when manual.
  const params: ScheduleParams = {};
  const before = issues.length;
  for (const p of PARAMETERS_OF[kind]) {
    if ((p === "t0" || p === "tEnd") && !manual) continue;
    // Blank factor, moves per level or beta: fitted so that T reaches its end value at the end of
    // the run; blank typed temperatures: calibrated, as when they are not typed.
    if (AUTOMATIC_WHEN_BLANK.includes(p) && String(form[FIELD_OF[p]!] ?? "").trim() === "") continue;
    const v = read<number | string>(p, Number.NaN);
    if (typeof v === "number" && !Number.isNaN(v)) params[p] = v;
  }
  const built = buildCooling(kind, params);
  let cooling: CoolingSpec = d.cooling;
  if ("spec" in built) cooling = built.spec;
  else if (issues.length === before) for (const p of built.problems) issue(p.key, p.message);
  if (!manual) for (const p of crossProblems({ p0, pEnd, cooling })) issue(p.key, p.message);
  const settings: PlanSettings = {
    ...d,
    detourFactor,
    speedKmh,
    serviceMin,
    hardWindows,
    lateCostPerMin,
    seconds,
    seed,
    ...(stabilityCost !== undefined ? { stabilityCost } : {}),
    rule,
    cooling,
    p0,
    pEnd,
    workers,
  };
  return { scenario, settings, issues };
}

/**
 * The form fields that show `settings` (for "Rerun" from a plan sheet).
 *
 * @param settings - settings stored with a plan
 * @param scenario - the scenario name to show
 * @param current - the current form, kept for fields the settings do not set (e.g. unused schedule parameters)
 * @returns the new field texts
 * @example formFromSettings(PLAN_SETTINGS_DEFAULTS, "Plan 2", form).schedule // => "timeFraction"
 */
export function formFromSettings(settings: PlanSettings, scenario: string, current: PaneForm): PaneForm {
  const c = settings.cooling;
  const manual = c.t0 !== undefined;
  return {
    ...current,
    scenario,
    detour: String(settings.detourFactor),
    speed: String(settings.speedKmh),
    service: String(settings.serviceMin),
    windows: settings.hardWindows ? "hard" : "soft",
    "late-cost": String(settings.lateCostPerMin),
    seconds: String(settings.seconds),
    seed: String(settings.seed),
    "stability-cost": settings.stabilityCost === undefined ? "" : String(settings.stabilityCost),
    // No Workers given (older plans, a Settings sheet without the row): the field keeps its value.
    ...(settings.workers !== undefined ? { workers: String(settings.workers) } : {}),
    rule: settings.rule,
    schedule: c.kind,
    ...(c.kind === "geometric" ? { alpha: blankIfUndefined(c.alpha), "moves-per-level": blankIfUndefined(c.movesPerLevel) } : {}),
    ...(c.kind === "linear" ? { steps: String(c.steps) } : {}),
    ...(c.kind === "lundyMees" ? { beta: blankIfUndefined(c.beta) } : {}),
    temperatures: manual ? "manual" : "calibrate",
    p0: String(settings.p0),
    "p-end": String(settings.pEnd),
    ...(manual ? { t0: String(c.t0) } : {}),
    ...("tEnd" in c && c.tEnd !== undefined ? { "t-end": String(c.tEnd) } : {}),
  };
}

/**
 * The Workers field's starting value in the pane: the cores the browser reports
 * (`navigator.hardwareConcurrency`) minus one, so the page stays responsive, at least 1 and at
 * most the field's 64. The CLI's default stays 1.
 *
 * @param cores - what the browser reports (undefined or 0 when it reports nothing)
 * @returns the number of workers
 * @example defaultPaneWorkers(8) // => 7; defaultPaneWorkers(1) // => 1
 */
export function defaultPaneWorkers(cores: number | undefined): number {
  const max = (SETTING_FIELDS.workers as NumberField).max ?? 64;
  if (cores === undefined || !Number.isFinite(cores)) return 1;
  return Math.max(1, Math.min(max, Math.floor(cores) - 1));
}

/** Schedule parameters a blank field leaves to fitting or calibration (see `resolveCooling`). */
const AUTOMATIC_WHEN_BLANK: readonly string[] = ["alpha", "movesPerLevel", "beta", "t0", "tEnd"];

function blankIfUndefined(x: number | undefined): string {
  return x === undefined ? "" : String(x);
}
