/**
 * Plan settings from command-line options, through the one settings schema: each option is the
 * `flag` of a `SETTING_FIELDS` entry and is parsed and refused exactly like the same value on a
 * Settings sheet or in the pane (the message is the same; the CLI puts the option in front).
 */
import type { CoolingSpec } from "../core/index.js";
import type { PlanSettings } from "../sheets/PlanSettings.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { SCHEDULE_PARAMETERS } from "../sheets/scheduleNames.js";
import { type SettingKey } from "../sheets/settingFieldTypes.js";
import { buildCooling, parseSettingValue, type ScheduleParams } from "../sheets/settingsSchema.js";

/** The settings a run command takes as options, in help order. */
export const RUN_SETTING_KEYS: readonly SettingKey[] = [
  "seconds",
  "moves",
  "seed",
  "detourFactor",
  "speedKmh",
  "serviceMin",
  "windows",
  "lateCostPerMin",
  "objective",
  "rule",
  "schedule",
  "alpha",
  "movesPerLevel",
  "steps",
  "beta",
  "t0",
  "tEnd",
  "p0",
  "pEnd",
  "country",
  "stabilityCost",
  "driveBeforeBreakH",
  "breakMin",
  "windowBreakMin",
  "breakFrom",
  "breakTo",
];

/** Settings read from options: overrides of the Settings sheet and the schedule options. */
export interface SettingFlags {
  readonly overrides: Partial<PlanSettings>;
  readonly schedule: { readonly kind?: CoolingSpec["kind"]; readonly params: ScheduleParams };
  /** One line per bad option, such as "--detour: Detour factor 0.8 is not valid: ...". */
  readonly errors: string[];
}

/**
 * Parse the setting options given (by flag name, without dashes) with the settings schema.
 *
 * @param given - option values by flag name; absent options are left out
 * @param softWindows - the `--soft-windows` shorthand was given
 * @returns overrides, schedule options and every error at once
 * @example settingFlags({ detour: "1.5" }).overrides // => { detourFactor: 1.5 }
 */
export function settingFlags(given: Readonly<Record<string, string | undefined>>, softWindows = false): SettingFlags {
  const errors: string[] = [];
  const values = new Map<SettingKey, number | string>();
  for (const key of RUN_SETTING_KEYS) {
    const flag = SETTING_FIELDS[key].flag;
    const text = given[flag];
    if (text === undefined) continue;
    const parsed = parseSettingValue(key, text);
    if (parsed.ok) values.set(key, parsed.value);
    else errors.push(`--${flag}: ${parsed.message}`);
  }
  const o: { -readonly [K in keyof PlanSettings]?: PlanSettings[K] } = {};
  const num = (k: SettingKey): number | undefined => values.get(k) as number | undefined;
  const put = <K extends keyof PlanSettings>(k: K, v: PlanSettings[K] | undefined): void => {
    if (v !== undefined) o[k] = v;
  };
  if (given["seconds"] !== undefined && given["moves"] !== undefined) errors.push("use --seconds or --moves, not both");
  else if (values.has("moves")) o.moves = num("moves");
  else if (values.has("seconds")) {
    o.seconds = num("seconds");
    o.moves = undefined; // a time limit beats a move budget from the Settings sheet
  }
  put("seed", num("seed"));
  put("detourFactor", num("detourFactor"));
  put("speedKmh", num("speedKmh"));
  put("serviceMin", num("serviceMin"));
  put("lateCostPerMin", num("lateCostPerMin"));
  put("p0", num("p0"));
  put("pEnd", num("pEnd"));
  put("rule", values.get("rule") as PlanSettings["rule"] | undefined);
  put("objective", values.get("objective") as PlanSettings["objective"] | undefined);
  put("country", values.get("country") as string | undefined);
  put("stabilityCost", num("stabilityCost"));
  for (const k of ["driveBeforeBreakH", "breakMin", "windowBreakMin", "breakFrom", "breakTo"] as const) put(k, num(k));
  if (values.has("windows")) o.hardWindows = values.get("windows") === "hard";
  if (softWindows) {
    if (values.get("windows") === "hard") errors.push("--soft-windows: contradicts --windows hard; give one of them");
    o.hardWindows = false;
  }
  const params: ScheduleParams = {};
  for (const p of SCHEDULE_PARAMETERS) if (values.has(p)) params[p] = num(p);
  const kind = values.get("schedule") as CoolingSpec["kind"] | undefined;
  return { overrides: o, schedule: { ...(kind ? { kind } : {}), params }, errors };
}

/**
 * The schedule after the options: `--schedule` (or the base's kind) with the options' parameters
 * over the base's. Refusals are the schema's (`buildCooling`), with the option in front.
 *
 * @param base - the schedule from the Settings sheet or the defaults
 * @param flags - `settingFlags(...).schedule`
 * @returns the schedule, or one line per problem
 * @example applySchedule({ kind: "timeFraction" }, { kind: "geometric", params: {} }) // => { spec: { kind: "geometric", alpha: 0.94 } }
 */
export function applySchedule(base: CoolingSpec, flags: SettingFlags["schedule"]): { spec: CoolingSpec } | { errors: string[] } {
  const built = buildCooling(flags.kind ?? base.kind, flags.params, base);
  if ("spec" in built) return built;
  return { errors: built.problems.map((p) => `--${SETTING_FIELDS[p.key].flag}: ${p.message}`) };
}
