/**
 * A temperature plan written as one line of text, the notation `kiln compare-schedules --try`
 * and the pane's "Compare plans…" share: a schedule name as `--schedule` takes it, then
 * optionally a colon and comma-separated NAME=VALUE settings named by their `kiln plan` flags
 * (`geometric:alpha=0.95,level=2000`, `lundy-mees:beta=0.0002`, `time-based:p0=0.3,pend=0.0001`).
 * Every value is checked by the one settings schema, with the same messages as the flags.
 */
import type { AcceptanceRule, CoolingSpec } from "../core/index.js";
import { headerWords } from "./matchHeaders.js";
import type { PlanSettings } from "./PlanSettings.js";
import { SETTING_FIELDS } from "./settingFields.js";
import { PARAMETERS_OF, SCHEDULE_PARAMETERS, SCHEDULE_TOKENS, type ScheduleParameter } from "./scheduleNames.js";
import { buildCooling, crossProblems, parseSettingValue, type ScheduleParams } from "./settingsSchema.js";

/** A temperature plan: a cooling schedule and, when given, its own acceptance rule and targets. */
export interface TemperaturePlan {
  /** The text it was read from, trimmed (or the canonical text of a plan built in code). */
  readonly text: string;
  readonly cooling: CoolingSpec;
  readonly rule?: AcceptanceRule;
  readonly p0?: number;
  readonly pEnd?: number;
}

/** The settings a temperature plan may carry besides the schedule name, in the order they are written. */
export const TEMPERATURE_PLAN_KEYS = [...SCHEDULE_PARAMETERS, "p0", "pEnd", "rule"] as const;
type PlanKey = (typeof TEMPERATURE_PLAN_KEYS)[number];

/** An example of the notation, for messages and help. */
export const TEMPERATURE_PLAN_EXAMPLE = "geometric:alpha=0.95,level=2000";

/**
 * Read a temperature plan from its text. A bare schedule name is that schedule with its defaults
 * (geometric ×0.94 with levels spread over the run, linear in 20 steps, Lundy–Mees and the
 * time-based schedule fitted to the run); setting names are the `kiln plan` flags (alpha, level,
 * steps, beta, t0, tend, p0, pend, rule) or a Settings-sheet key word (moves-per-level).
 *
 * @param text - e.g. "geometric:alpha=0.95,level=2000"
 * @returns the plan, or one message saying what is wrong and how to write it
 * @example parseTemperaturePlan("lundy-mees:beta=0.0002") // => { plan: { text: "lundy-mees:beta=0.0002", cooling: { kind: "lundyMees", beta: 0.0002 } } }
 * @example parseTemperaturePlan("linear:alpha=0.9") // => { error: "Alpha does not apply to the Linear schedule; ..." }
 */
export function parseTemperaturePlan(text: string): { plan: TemperaturePlan } | { error: string } {
  const trimmed = text.trim();
  const colon = trimmed.indexOf(":");
  const name = (colon < 0 ? trimmed : trimmed.slice(0, colon)).trim();
  const how = `write a schedule name (${Object.keys(SCHEDULE_TOKENS).join(", ")}), optionally followed by a colon and NAME=VALUE settings separated by commas, e.g. ${TEMPERATURE_PLAN_EXAMPLE}`;
  if (name === "") return { error: `the schedule name is missing: ${how}.` };
  const schedule = parseSettingValue("schedule", name);
  if (!schedule.ok)
    return {
      error: `${schedule.message.replace(/\.$/, "")}, alone or followed by settings after a colon, e.g. ${TEMPERATURE_PLAN_EXAMPLE}.`,
    };
  const kind = schedule.value as CoolingSpec["kind"];
  const given = new Map<PlanKey, number | string>();
  const rest = colon < 0 ? "" : trimmed.slice(colon + 1);
  if (colon >= 0 && rest.trim() === "") return { error: `nothing follows the colon: ${how}, or leave out the colon.` };
  for (const part of colon < 0 ? [] : rest.split(",")) {
    const eq = part.indexOf("=");
    if (eq < 0) return { error: `"${part.trim()}" is not NAME=VALUE: ${how}.` };
    const keyText = part.slice(0, eq).trim();
    const key = planKey(keyText);
    if (key === undefined) {
      return {
        error: `"${keyText}" is not a setting of a temperature plan: use ${TEMPERATURE_PLAN_KEYS.map((k) => SETTING_FIELDS[k].flag).join(", ")}, e.g. ${TEMPERATURE_PLAN_EXAMPLE}.`,
      };
    }
    if (given.has(key)) return { error: `${SETTING_FIELDS[key].flag} is given twice; give each setting once.` };
    const parsed = parseSettingValue(key, part.slice(eq + 1));
    if (!parsed.ok) return { error: parsed.message };
    given.set(key, parsed.value);
  }
  const params: ScheduleParams = {};
  for (const p of SCHEDULE_PARAMETERS) if (given.has(p)) params[p] = given.get(p) as number;
  const built = buildCooling(kind, params);
  if ("problems" in built) return { error: built.problems.map((p) => p.message).join(" ") };
  const p0 = given.get("p0") as number | undefined;
  const pEnd = given.get("pEnd") as number | undefined;
  if (p0 !== undefined && pEnd !== undefined && !(pEnd < p0)) {
    return { error: `Final acceptance ${pEnd} must be below the initial acceptance ${p0}.` };
  }
  const rule = given.get("rule") as AcceptanceRule | undefined;
  return {
    plan: {
      text: trimmed,
      cooling: built.spec,
      ...(rule !== undefined ? { rule } : {}),
      ...(p0 !== undefined ? { p0 } : {}),
      ...(pEnd !== undefined ? { pEnd } : {}),
    },
  };
}

/**
 * The canonical text of a temperature plan: the schedule token, then every setting it carries by
 * its flag name, in `TEMPERATURE_PLAN_KEYS` order. `parseTemperaturePlan` reads it back to the same plan.
 *
 * @param plan - the schedule and, optionally, rule and acceptance targets
 * @returns e.g. "geometric:alpha=0.95,level=2000,p0=0.3"
 * @example formatTemperaturePlan({ cooling: { kind: "lundyMees", beta: 0.0002 } }) // => "lundy-mees:beta=0.0002"
 */
export function formatTemperaturePlan(plan: Omit<TemperaturePlan, "text">): string {
  const token = (Object.keys(SCHEDULE_TOKENS) as (keyof typeof SCHEDULE_TOKENS)[]).find((t) => SCHEDULE_TOKENS[t] === plan.cooling.kind);
  const values = plan.cooling as Partial<Record<ScheduleParameter, number>>;
  const parts: string[] = [];
  for (const p of PARAMETERS_OF[plan.cooling.kind]) if (values[p] !== undefined) parts.push(`${SETTING_FIELDS[p].flag}=${values[p]}`);
  if (plan.p0 !== undefined) parts.push(`${SETTING_FIELDS.p0.flag}=${plan.p0}`);
  if (plan.pEnd !== undefined) parts.push(`${SETTING_FIELDS.pEnd.flag}=${plan.pEnd}`);
  if (plan.rule !== undefined) parts.push(`${SETTING_FIELDS.rule.flag}=${plan.rule}`);
  return parts.length > 0 ? `${token}:${parts.join(",")}` : String(token);
}

/**
 * The settings of a run of this temperature plan: the base settings (Settings sheet and flags, or
 * the pane form) with the plan's schedule, and its rule and acceptance targets where it gives them.
 *
 * @param base - the settings the other plans share
 * @param plan - the temperature plan
 * @returns the settings, or the message when the targets then cross (final not below initial)
 * @example withTemperaturePlan(PLAN_SETTINGS_DEFAULTS, { text: "linear", cooling: { kind: "linear", steps: 20 } })
 * // => { settings: { ...PLAN_SETTINGS_DEFAULTS, cooling: { kind: "linear", steps: 20 } } }
 */
export function withTemperaturePlan(base: PlanSettings, plan: TemperaturePlan): { settings: PlanSettings } | { error: string } {
  const settings: PlanSettings = {
    ...base,
    cooling: plan.cooling,
    rule: plan.rule ?? base.rule,
    p0: plan.p0 ?? base.p0,
    pEnd: plan.pEnd ?? base.pEnd,
  };
  const problems = crossProblems(settings);
  return problems.length > 0 ? { error: problems.map((p) => p.message).join(" ") } : { settings };
}

/** The plan setting a NAME of the notation stands for: its flag, or a Settings-sheet key word. */
function planKey(text: string): PlanKey | undefined {
  const lower = text.toLowerCase();
  const joined = headerWords(text).join("");
  return (
    TEMPERATURE_PLAN_KEYS.find((k) => SETTING_FIELDS[k].flag === lower) ??
    TEMPERATURE_PLAN_KEYS.find((k) => SETTING_FIELDS[k].sheetKeys.includes(joined))
  );
}
