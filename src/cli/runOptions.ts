/**
 * The options of the commands that read a workbook (`plan`, `profile`), declared once each with
 * their help text: the input sheets, then every plan setting of `SETTING_FIELDS` (range and
 * default in the help come from the one settings schema).
 */
import { Option, type Command } from "commander";
import { PLAN_SETTINGS_DEFAULTS, STABILITY_COST_DEFAULT } from "../sheets/PlanSettings.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { rangeText, type SettingKey } from "../sheets/settingFieldTypes.js";
import { RUN_SETTING_KEYS } from "./settingFlags.js";

/** Options that name input sheets (commander attribute name -> flag). */
export interface InputSheetOptions {
  readonly stops?: string;
  readonly fleet?: string;
  readonly settings?: string;
  readonly matrix?: string;
  /** `--map "Drop time=service"`, repeatable: column mappings in the order given. */
  readonly map?: readonly string[];
  /** `kiln plan --from-plan SHEET`: re-plan from an earlier plan sheet of the workbook. */
  readonly fromPlan?: string;
  /** `--lock VEHICLE`, repeatable (or comma-separated): routes of the earlier plan kept exactly. */
  readonly lock?: readonly string[];
}

/** The sheet options of a workbook command. */
const SHEET_OPTIONS: readonly [flag: keyof InputSheetOptions, help: string][] = [
  [
    "stops",
    'sheet with the stops (default: the sheet named "Stops", or the first whose header, anywhere in its first 30 rows, has the stops\' location columns)',
  ],
  [
    "fleet",
    'sheet with the vehicles (default: the sheet named "Fleet", or the first whose header has fleet columns such as Capacity or Shift start)',
  ],
  ["settings", 'sheet of Setting | Value rows (default: the sheet named "Settings", if any); options below win over it'],
  ["matrix", "sheet with a road-distance matrix in km (first row and column name the locations) used instead of great-circle distances"],
];

function defaultText(key: SettingKey): string {
  const d = PLAN_SETTINGS_DEFAULTS;
  switch (key) {
    case "windows":
      return d.hardWindows ? "hard" : "soft";
    case "schedule":
      return "time-based";
    case "alpha":
      return "0.94";
    case "steps":
      return "20";
    case "moves":
    case "movesPerLevel":
    case "beta":
    case "t0":
    case "tEnd":
    case "country":
      return "";
    case "driveBeforeBreakH":
    case "breakMin":
    case "windowBreakMin":
    case "breakFrom":
    case "breakTo":
      return "";
    case "stabilityCost":
      return String(STABILITY_COST_DEFAULT);
    default:
      return String(d[key as keyof typeof d]);
  }
}

/**
 * Declare the sheet options and the plan-setting options on a command.
 *
 * @param cmd - a commander command
 * @param keys - the settings to offer (default: every run setting)
 * @returns the command, for chaining
 * @example addRunOptions(program.command("plan"))
 */
export function addRunOptions(cmd: Command, keys: readonly SettingKey[] = RUN_SETTING_KEYS): Command {
  for (const [flag, help] of SHEET_OPTIONS) cmd.addOption(new Option(`--${flag} <SHEET>`, help));
  for (const key of keys) {
    const f = SETTING_FIELDS[key];
    const d = defaultText(key);
    cmd.addOption(new Option(`--${f.flag} <${f.valueName}>`, `${f.label}: ${f.help}; ${rangeText(f)}${d ? ` (default ${d})` : ""}`));
  }
  cmd.addOption(new Option("--soft-windows", "same as --windows soft"));
  cmd.addOption(
    new Option(
      "--map <MAPPING>",
      'a column mapping HEADER=FIELD: use the column headed HEADER as FIELD (a field such as "Service min" or "service"), or carry or ignore it; repeatable; wins over the Settings sheet',
    ).argParser((value: string, previous: string[] | undefined) => [...(previous ?? []), value]),
  );
  return cmd;
}

/**
 * The setting options the user gave, by flag name (as `settingFlags` takes them).
 *
 * @param cmd - the command after parsing
 * @param keys - the settings the command offers (default: every run setting)
 * @returns option texts by flag, only those given
 * @example givenSettings(cmd) // => { detour: "1.5", seed: "7" }
 */
export function givenSettings(cmd: Command, keys: readonly SettingKey[] = RUN_SETTING_KEYS): Record<string, string> {
  const opts = cmd.opts<Record<string, unknown>>();
  const out: Record<string, string> = {};
  for (const key of keys) {
    const flag = SETTING_FIELDS[key].flag;
    const value = opts[attributeName(flag)];
    if (typeof value === "string") out[flag] = value;
  }
  return out;
}

/**
 * Commander's attribute name of a long option ("late-cost" -> "lateCost").
 *
 * @param flag - the option name without dashes
 * @returns the key in `cmd.opts()`
 * @example attributeName("soft-windows") // => "softWindows"
 */
export function attributeName(flag: string): string {
  return flag.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
}
