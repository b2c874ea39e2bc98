/**
 * What a setting field of `SETTING_FIELDS` (settingFields.ts) is: its key, its kinds (number,
 * choice, text) with their ranges, and its accepted values in words (`rangeText`).
 */

/** Every setting a user can give, by its `PlanSettings` (or schedule parameter) name. */
export type SettingKey =
  | "detourFactor"
  | "speedKmh"
  | "serviceMin"
  | "windows"
  | "lateCostPerMin"
  | "rule"
  | "schedule"
  | "alpha"
  | "movesPerLevel"
  | "steps"
  | "beta"
  | "t0"
  | "tEnd"
  | "p0"
  | "pEnd"
  | "seed"
  | "seconds"
  | "moves"
  | "objective"
  | "country"
  | "stabilityCost"
  | "driveBeforeBreakH"
  | "breakMin"
  | "windowBreakMin"
  | "breakFrom"
  | "breakTo"
  | "workers";

interface FieldBase {
  /** Name shown in messages, the pane and the Settings sheet ("Detour factor"). */
  readonly label: string;
  /** The CLI option without dashes ("detour"). */
  readonly flag: string;
  /** Placeholder of the option's value in `--help` ("F"). */
  readonly valueName: string;
  /** Key words a Settings-sheet row may use (compared as joined header words). */
  readonly sheetKeys: readonly string[];
  /** One line of help (CLI `--help`, the Settings sheet notes). */
  readonly help: string;
}

/** A numeric setting: bounds (inclusive unless marked), whole number or not. */
export interface NumberField extends FieldBase {
  readonly type: "number";
  readonly min: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly maxExclusive?: boolean;
  readonly integer?: boolean;
  /** Unit word shown after the range ("km/h", "minutes"). */
  readonly unit?: string;
  readonly example: string;
  /** Also accepts durations such as "1:30" or "5 min" (minutes). */
  readonly duration?: boolean;
  /** A time of day, read as minutes from midnight (Excel day fraction or text such as "12:30"). */
  readonly time?: boolean;
}

/** A setting chosen from words: `choices` maps every accepted word (joined header words) to its value. */
export interface ChoiceField extends FieldBase {
  readonly type: "choice";
  /** The tokens to show, in order (the first word of each value). */
  readonly tokens: readonly string[];
  readonly choices: Readonly<Record<string, string>>;
}

/** A setting of free text (trimmed), at most `maxLength` characters. */
export interface TextField extends FieldBase {
  readonly type: "text";
  readonly maxLength: number;
  /** What the text is, for messages ("a country name or code"). */
  readonly what: string;
  readonly example: string;
}

export type SettingField = NumberField | ChoiceField | TextField;

/**
 * The accepted values of a setting in words, for messages and help.
 *
 * @param field - a setting field
 * @returns e.g. "a number from 1 to 3, such as 1.3" or "one of hard, soft"
 * @example rangeText(SETTING_FIELDS.seed) // => "a whole number from 0 to 4294967295, such as 1"
 */
export function rangeText(field: SettingField): string {
  if (field.type === "choice") return `one of ${field.tokens.join(", ")}`;
  if (field.type === "text") return `${field.what} of at most ${field.maxLength} characters, such as ${field.example}`;
  const what = field.integer ? "a whole number" : "a number";
  const lo = field.minExclusive ? `above ${field.min}` : `${field.min}`;
  let bounds: string;
  if (field.max === undefined) bounds = field.minExclusive ? `above ${field.min}` : `of ${field.min} or more`;
  else if (!field.minExclusive && !field.maxExclusive) bounds = `from ${field.min} to ${field.max}`;
  else bounds = `${field.minExclusive ? lo : `from ${field.min}`} ${field.maxExclusive ? `and below ${field.max}` : `up to ${field.max}`}`;
  return `${what} ${bounds}${field.unit ? ` ${field.unit}` : ""}, such as ${field.example}`;
}
