/**
 * The settings schema (zod): one zod type per setting built from `SETTING_FIELDS`, the whole
 * `PlanSettings` and the stored `RunRecord`, plus the text parsing every input path shares.
 * Messages name the setting and the accepted range; callers add only where (cell, flag, field).
 */
import { z } from "zod";
import { GEOMETRIC_ALPHA, type CoolingSpec } from "../core/index.js";
import { plainCell, readNumber, shownValue } from "./cellValue.js";
import { headerWords } from "./matchHeaders.js";
import { parseDuration } from "./parseDuration.js";
import { parseTime } from "./parseTime.js";
import type { PlanSettings, RunRecord } from "./PlanSettings.js";
import { SETTING_FIELDS } from "./settingFields.js";
import { PARAMETERS_OF, SCHEDULE_NAMES, SCHEDULE_PARAMETERS, type ScheduleParameter } from "./scheduleNames.js";
import { rangeText, type NumberField, type TextField, type SettingKey } from "./settingFieldTypes.js";

// No generated code: zod otherwise probes `new Function` on first use, which the pages'
// Content-Security-Policy refuses and reports (docs/content-security-policy.md).
z.config({ jitless: true });

/** Geometric factor 0.94 (common practice); no moves per level: the levels then fit the run. */
export const GEOMETRIC_DEFAULTS = { alpha: GEOMETRIC_ALPHA, movesPerLevel: undefined } as const;
/** Number of levels of the linear schedule when none is given. */
export const LINEAR_DEFAULT_STEPS = 20;

function numberSchema(f: NumberField): z.ZodNumber {
  let s = z.number();
  if (f.integer) s = s.int();
  s = f.minExclusive ? s.gt(f.min) : s.gte(f.min);
  if (f.max !== undefined) s = f.maxExclusive ? s.lt(f.max) : s.lte(f.max);
  return s;
}
const n = (key: SettingKey): z.ZodNumber => numberSchema(SETTING_FIELDS[key] as NumberField);

/** The cooling schedules with their parameters' ranges. */
export const coolingSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("geometric"),
    alpha: n("alpha").optional(),
    movesPerLevel: n("movesPerLevel").optional(),
    t0: n("t0").optional(),
    tEnd: n("tEnd").optional(),
  }),
  z.object({ kind: z.literal("linear"), steps: n("steps"), t0: n("t0").optional(), tEnd: n("tEnd").optional() }),
  z.object({ kind: z.literal("lundyMees"), beta: n("beta").optional(), t0: n("t0").optional(), tEnd: n("tEnd").optional() }),
  z.object({ kind: z.literal("timeFraction"), t0: n("t0").optional(), tEnd: n("tEnd").optional() }),
]);

/** `PlanSettings` as a schema: the ranges of `SETTING_FIELDS` and the checks across fields. */
export const planSettingsSchema = z
  .object({
    detourFactor: n("detourFactor"),
    speedKmh: n("speedKmh"),
    serviceMin: n("serviceMin"),
    hardWindows: z.boolean(),
    lateCostPerMin: n("lateCostPerMin"),
    rule: z.enum(["metropolis", "logistic"]),
    cooling: coolingSchema,
    p0: n("p0"),
    pEnd: n("pEnd"),
    seed: n("seed"),
    seconds: n("seconds"),
    moves: n("moves").optional(),
    objective: z.enum(["weighted", "hierarchical"]),
    columnMap: z
      .array(z.object({ header: z.string(), field: z.string(), where: z.string().optional(), kind: z.enum(["stops", "fleet"]).optional() }))
      .optional(),
    country: z
      .string()
      .min(1)
      .max((SETTING_FIELDS.country as TextField).maxLength)
      .optional(),
    stabilityCost: n("stabilityCost").optional(),
    driveBeforeBreakH: n("driveBeforeBreakH").optional(),
    breakMin: n("breakMin").optional(),
    windowBreakMin: n("windowBreakMin").optional(),
    breakFrom: n("breakFrom").optional(),
    breakTo: n("breakTo").optional(),
    workers: n("workers").optional(),
  })
  .superRefine((s, ctx) => {
    for (const p of crossProblems(s)) ctx.addIssue({ code: "custom", path: [p.key], message: p.message });
  });

/** The run record stored with every plan sheet (older records without a matrix source load too). */
export const runRecordSchema = z.object({
  scenario: z.string(),
  createdSerial: z.number(),
  settings: planSettingsSchema,
  moves: z.number().int().nonnegative(),
  runSeconds: z.number().nonnegative(),
  stopsSource: z.string(),
  fleetSource: z.string(),
  matrixSource: z.string().optional(),
  fromPlan: z.string().optional(),
  locked: z.array(z.string()).optional(),
  sheetId: z.string().optional(),
});

// The schemas must describe exactly the TypeScript types the rest of the code uses.
const _settingsType: z.ZodType<PlanSettings> = planSettingsSchema;
const _recordType: z.ZodType<RunRecord> = runRecordSchema;
void _settingsType;
void _recordType;

/** A problem with one setting: which one and the message (without the place). */
export interface SettingProblem {
  readonly key: SettingKey;
  readonly message: string;
}

/** What `parseSettingValue` returns. */
export type ParsedSetting<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly message: string };

/**
 * Read one setting from a cell value or typed text (CLI flag, pane field): numbers (and, for the
 * service time, h:mm or "5 min"), or a word of the setting's choices, checked against its range.
 *
 * @param key - which setting
 * @param raw - a cell value, or text
 * @returns the value (choices: the canonical word) or the one message every input path shows
 * @example parseSettingValue("detourFactor", "0.8")
 * // => { ok: false, message: "Detour factor 0.8 is not valid: enter a number from 1 to 3, such as 1.3." }
 */
export function parseSettingValue(key: SettingKey, raw: unknown): ParsedSetting<number | string> {
  const field = SETTING_FIELDS[key];
  const v = plainCell(raw);
  if (v === null || (typeof v === "string" && v.trim() === "")) {
    return { ok: false, message: `${field.label} is empty: enter ${rangeText(field)}.` };
  }
  if (field.type === "text") {
    const text = String(v).trim();
    if (text.length <= field.maxLength) return { ok: true, value: text };
    return { ok: false, message: `${field.label} ${shownValue(v)} is not valid: enter ${rangeText(field)}.` };
  }
  if (field.type === "choice") {
    const hit = field.choices[headerWords(String(v)).join("")];
    if (hit !== undefined) return { ok: true, value: hit };
    return { ok: false, message: `${field.label} ${shownValue(v)} is not valid: enter ${rangeText(field)}.` };
  }
  const number = field.time ? parseTime(v) : (readNumber(v) ?? (field.duration ? parseDuration(v) : undefined));
  const shown = number !== undefined ? String(number) : shownValue(v);
  const checked = numberSchema(field).safeParse(number);
  if (checked.success) return { ok: true, value: checked.data };
  return { ok: false, message: `${field.label} ${shown} is not valid: enter ${rangeText(field)}.` };
}

/** The schedule parameters as given (undefined: not given). */
export type ScheduleParams = Partial<Record<ScheduleParameter, number>>;

/**
 * A cooling schedule from its kind and the parameters given, over a base schedule (parameters of
 * the same kind carry over). Parameters the schedule does not use, Lundy-Mees without Beta, and a
 * T end not below T0 are refused with the same messages on every input path.
 *
 * @param kind - the schedule
 * @param params - parameters given (they win over `base`)
 * @param base - the schedule they refine (the Settings sheet's under CLI flags), if any
 * @returns the schedule, or the problems
 * @example buildCooling("geometric", {}) // => { spec: { kind: "geometric", alpha: 0.94 } }
 */
export function buildCooling(
  kind: CoolingSpec["kind"],
  params: ScheduleParams,
  base?: CoolingSpec,
): { spec: CoolingSpec } | { problems: SettingProblem[] } {
  const problems: SettingProblem[] = [];
  for (const p of SCHEDULE_PARAMETERS) {
    if (params[p] !== undefined && !PARAMETERS_OF[kind].includes(p)) problems.push({ key: p, message: misfitMessage(p, kind) });
  }
  const same = base?.kind === kind ? (base as Partial<Record<ScheduleParameter, number>>) : {};
  const get = (p: ScheduleParameter): number | undefined => params[p] ?? same[p];
  const t0 = get("t0");
  const tEnd = get("tEnd");
  const opt = <T extends object>(o: T): T => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
  let spec: CoolingSpec | undefined;
  switch (kind) {
    case "geometric": {
      // Moves per level without a factor: the factor is fitted to reach T end at the end of the run.
      const movesPerLevel = get("movesPerLevel");
      spec = opt({
        kind,
        alpha: get("alpha") ?? (movesPerLevel === undefined ? GEOMETRIC_DEFAULTS.alpha : undefined),
        movesPerLevel,
        t0,
        tEnd,
      });
      break;
    }
    case "linear":
      spec = opt({ kind, steps: get("steps") ?? LINEAR_DEFAULT_STEPS, t0, tEnd });
      break;
    case "lundyMees":
      // Without Beta, beta is fitted to reach T end at the end of the run.
      spec = opt({ kind, beta: get("beta"), t0, tEnd });
      break;
    case "timeFraction":
      spec = opt({ kind, t0, tEnd });
  }
  if (spec) problems.push(...temperatureProblems(spec));
  return problems.length > 0 || spec === undefined ? { problems } : { spec };
}

/**
 * The message for a schedule parameter given to a schedule that does not use it.
 *
 * @param p - the parameter
 * @param kind - the schedule chosen
 * @returns the message
 * @example misfitMessage("alpha", "linear") // => "Alpha does not apply to the Linear schedule; clear it or choose the Geometric schedule."
 */
export function misfitMessage(p: ScheduleParameter, kind: CoolingSpec["kind"]): string {
  const homes = (Object.keys(PARAMETERS_OF) as CoolingSpec["kind"][]).filter((k) => PARAMETERS_OF[k].includes(p));
  const names = homes.map((k) => SCHEDULE_NAMES[k]).join(" or ");
  return `${SETTING_FIELDS[p].label} does not apply to the ${SCHEDULE_NAMES[kind]} schedule; clear it or choose the ${names} schedule.`;
}

function temperatureProblems(spec: { t0?: number; tEnd?: number }): SettingProblem[] {
  if (spec.t0 === undefined || spec.tEnd === undefined || spec.tEnd < spec.t0) return [];
  return [{ key: "tEnd", message: `T end ${spec.tEnd} must be below T0 ${spec.t0} for a cooling schedule.` }];
}

/**
 * Checks across settings that no single value shows: P end below P0, T end below T0.
 *
 * @param s - complete settings
 * @returns the problems (empty when consistent)
 * @example crossProblems({ ...PLAN_SETTINGS_DEFAULTS, pEnd: 0.6 })[0].key // => "pEnd"
 */
export function crossProblems(s: Pick<PlanSettings, "p0" | "pEnd" | "cooling" | BreakSettingKey>): SettingProblem[] {
  const out: SettingProblem[] = [...breakProblems(s)];
  if (!(s.pEnd < s.p0)) out.push({ key: "pEnd", message: `Final acceptance ${s.pEnd} must be below the initial acceptance ${s.p0}.` });
  if (s.cooling.kind === "linear" || s.cooling.kind === "timeFraction") out.push(...temperatureProblems(s.cooling));
  return out;
}

/** The break-default settings. */
type BreakSettingKey = "driveBeforeBreakH" | "breakMin" | "windowBreakMin" | "breakFrom" | "breakTo";

/** The break defaults must form whole rules: a drive limit with its break length, a window with both ends and a length that fits. */
function breakProblems(s: Pick<PlanSettings, BreakSettingKey>): SettingProblem[] {
  const out: SettingProblem[] = [];
  if (s.driveBeforeBreakH !== undefined && s.breakMin === undefined)
    out.push({
      key: "driveBeforeBreakH",
      message: "Drive before break needs a Break min: add your own rule's break length (such as 30), or clear Drive before break.",
    });
  if ((s.breakFrom === undefined) !== (s.breakTo === undefined))
    out.push({
      key: s.breakFrom === undefined ? "breakTo" : "breakFrom",
      message: "a break window needs both Break from and Break to (such as 12:00 and 13:30); give both or clear both.",
    });
  if (s.breakFrom !== undefined && s.breakTo !== undefined) {
    const length = s.windowBreakMin ?? s.breakMin;
    if (length === undefined)
      out.push({ key: "breakTo", message: "a break window needs a length: add Window break min or Break min (such as 30)." });
    else if (s.breakTo - s.breakFrom < length)
      out.push({
        key: "breakTo",
        message: `the break window ${s.breakFrom}..${s.breakTo} (minutes from midnight) is shorter than the ${length} min break; widen it or shorten the break.`,
      });
  }
  if (s.breakMin !== undefined && s.driveBeforeBreakH === undefined && s.breakFrom === undefined)
    out.push({
      key: "breakMin",
      message: "Break min is given but no rule uses it: add Drive before break or Break from and Break to, or clear Break min.",
    });
  if (s.windowBreakMin !== undefined && s.breakFrom === undefined)
    out.push({ key: "windowBreakMin", message: "Window break min needs Break from and Break to; add them or clear Window break min." });
  return out;
}

/**
 * Load a stored run record (the JSON kept with a plan sheet), checked against the schema.
 *
 * @param json - the stored text
 * @returns the record, or a message saying what is wrong with it
 * @example parseRunRecord("{}").ok // => false
 */
export function parseRunRecord(json: string): { ok: true; record: RunRecord } | { ok: false; message: string } {
  let data: unknown;
  try {
    data = JSON.parse(json);
  } catch {
    return { ok: false, message: "the stored text is not JSON" };
  }
  const r = runRecordSchema.safeParse(data);
  if (r.success) return { ok: true, record: r.data };
  const first = r.error.issues[0]!;
  return { ok: false, message: `${first.path.join(".") || "record"}: ${first.message}` };
}
