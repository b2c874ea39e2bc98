/**
 * The pane's settings and cooling fields as plain strings, and their conversion to and from
 * `PlanSettings`. Pure (no DOM), so a bad entry becomes an `Issue`, never an exception.
 */
import type { Issue } from "../core/model.js";
import type { CoolingSpec } from "../core/options.js";
import { PLAN_SETTINGS_DEFAULTS, type PlanSettings } from "../sheets/PlanSettings.js";

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

/**
 * Read the pane's fields into plan settings. Every bad field is reported at once; its default is
 * used in `settings` so previews can still draw.
 *
 * @param form - the raw field texts
 * @returns scenario name, settings and issues
 * @example settingsFromForm({ ...form, detour: "0.8" }).issues[0].message
 * // => "Detour factor 0.8 must be between 1 and 3 (road distance over straight-line distance)."
 */
export function settingsFromForm(form: PaneForm): FormReading {
  const issues: Issue[] = [];
  const d = PLAN_SETTINGS_DEFAULTS;
  const num = (field: keyof PaneForm, label: string, min: number, max: number, fallback: number, why = ""): number => {
    const text = String(form[field] ?? "").trim();
    const value = Number(text);
    if (text === "" || !Number.isFinite(value) || value < min || value > max) {
      issues.push({
        sheet: "Settings",
        cell: label,
        message: `${label} ${text === "" ? "is empty" : `"${text}"`}: enter a number between ${min} and ${max}${why}.`,
      });
      return fallback;
    }
    return value;
  };
  const scenario = form.scenario.trim() || "Plan 1";
  const detourFactor = num("detour", "Detour factor", 1, 3, d.detourFactor, " (road distance over straight-line distance)");
  const speedKmh = num("speed", "Speed", 1, 200, d.speedKmh, " km/h");
  const serviceMin = num("service", "Service minutes", 0, 600, d.serviceMin);
  const hardWindows = form.windows !== "soft";
  const lateCostPerMin = hardWindows ? d.lateCostPerMin : num("late-cost", "Late cost per minute", 0, 1e6, d.lateCostPerMin);
  const seconds = num("seconds", "Time limit", 1, 3600, d.seconds, " seconds");
  const seed = Math.trunc(num("seed", "Seed", -2_147_483_648, 2_147_483_647, d.seed));
  const rule = form.rule === "logistic" ? "logistic" : "metropolis";
  const manual = form.temperatures === "manual";
  const p0 = manual ? d.p0 : num("p0", "Initial acceptance", 0.01, 0.99, d.p0);
  const pEnd = manual ? d.pEnd : num("p-end", "Final acceptance", 1e-9, 0.5, d.pEnd);
  if (!manual && pEnd >= p0) {
    issues.push({
      sheet: "Settings",
      cell: "Final acceptance",
      message: `Final acceptance ${pEnd} must be below the initial acceptance ${p0}.`,
    });
  }
  const t0 = manual ? num("t0", "T0", 1e-9, 1e12, 100) : undefined;
  const tEnd = manual ? num("t-end", "T end", 1e-12, 1e12, 1) : undefined;
  if (t0 !== undefined && tEnd !== undefined && tEnd >= t0 && form.schedule !== "geometric" && form.schedule !== "lundyMees") {
    issues.push({ sheet: "Settings", cell: "T end", message: `T end ${tEnd} must be below T0 ${t0} for a cooling schedule.` });
  }
  const withT0 = t0 !== undefined ? { t0 } : {};
  const withTEnd = tEnd !== undefined ? { tEnd } : {};
  let cooling: CoolingSpec;
  switch (form.schedule) {
    case "geometric":
      cooling = {
        kind: "geometric",
        alpha: num("alpha", "Factor alpha", 0.5, 0.999999, 0.94),
        // Blank moves per level: the levels are spread over the run so T reaches its end value.
        ...(String(form["moves-per-level"] ?? "").trim() === ""
          ? {}
          : { movesPerLevel: Math.round(num("moves-per-level", "Moves per level", 1, 1e9, 20_000)) }),
        ...withT0,
      };
      break;
    case "linear":
      cooling = { kind: "linear", steps: Math.round(num("steps", "Steps", 1, 10_000, 20)), ...withT0, ...withTEnd };
      break;
    case "lundyMees":
      cooling = { kind: "lundyMees", beta: num("beta", "Beta", 1e-15, 1e6, 1e-4), ...withT0 };
      break;
    default:
      cooling = { kind: "timeFraction", ...withT0, ...withTEnd };
  }
  const settings: PlanSettings = {
    ...d,
    detourFactor,
    speedKmh,
    serviceMin,
    hardWindows,
    lateCostPerMin,
    seconds,
    seed,
    rule,
    cooling,
    p0,
    pEnd,
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
    rule: settings.rule,
    schedule: c.kind,
    ...(c.kind === "geometric"
      ? { alpha: String(c.alpha), "moves-per-level": c.movesPerLevel === undefined ? "" : String(c.movesPerLevel) }
      : {}),
    ...(c.kind === "linear" ? { steps: String(c.steps) } : {}),
    ...(c.kind === "lundyMees" ? { beta: String(c.beta) } : {}),
    temperatures: manual ? "manual" : "calibrate",
    p0: String(settings.p0),
    "p-end": String(settings.pEnd),
    ...(manual ? { t0: String(c.t0) } : {}),
    ...("tEnd" in c && c.tEnd !== undefined ? { "t-end": String(c.tEnd) } : {}),
  };
}
