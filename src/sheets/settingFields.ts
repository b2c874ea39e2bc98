/**
 * The one table of plan settings: for every setting its label, unit, range, example, CLI flag,
 * pane field and Settings-sheet key words. The Settings sheet, the CLI flags, the pane form and
 * the stored run record all read their rules from here (through `settingsSchema.ts`), so a value
 * is accepted or refused with the same message everywhere.
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

/** The schedule tokens (CLI, Settings sheet) and the `CoolingSpec` kind each stands for. */
export const SCHEDULE_TOKENS = {
  geometric: "geometric",
  linear: "linear",
  "lundy-mees": "lundyMees",
  "time-based": "timeFraction",
} as const;

/**
 * Display names of the cooling schedules: the one name each has in the pane, on the plan and
 * Compare sheets, in messages and in the CLI help (test/sheets/displayNames.test.ts checks it).
 */
export const SCHEDULE_NAMES = {
  geometric: "Geometric",
  linear: "Linear",
  lundyMees: "Lundy–Mees",
  timeFraction: "Time-based",
} as const;

/** Display names of the acceptance rules (pane, plan and Compare sheets, CLI). */
export const RULE_NAMES = {
  metropolis: "Metropolis",
  logistic: "Logistic (Barker)",
} as const;

/** The schedule tokens and the display name each stands for, for help texts: "time-based = Time-based, …". */
function scheduleTokenList(): string {
  return Object.entries(SCHEDULE_TOKENS)
    .map(([token, kind]) => `${token} = ${SCHEDULE_NAMES[kind]}`)
    .join(", ");
}

/** The fields, by key. Ranges are the product's rules; defaults live in `PLAN_SETTINGS_DEFAULTS`. */
export const SETTING_FIELDS: Readonly<Record<SettingKey, SettingField>> = {
  detourFactor: {
    type: "number",
    label: "Detour factor",
    flag: "detour",
    valueName: "F",
    sheetKeys: ["detourfactor", "detour", "circuity", "circuityfactor", "roadfactor"],
    help: "road distance over straight-line distance, applied to great-circle distances",
    min: 1,
    max: 3,
    example: "1.3",
  },
  speedKmh: {
    type: "number",
    label: "Speed",
    flag: "speed",
    valueName: "KMH",
    sheetKeys: ["speedkmh", "speed", "averagespeed", "kmh", "speedkph"],
    help: "average speed of vehicles whose Fleet row gives none",
    min: 1,
    max: 200,
    unit: "km/h",
    example: "40",
  },
  serviceMin: {
    type: "number",
    label: "Service time",
    flag: "service",
    valueName: "MIN",
    sheetKeys: ["servicemin", "service", "servicetime", "serviceminutes", "dwell", "dwellmin"],
    help: "minutes at each stop whose row gives none (also h:mm)",
    min: 0,
    max: 600,
    unit: "minutes",
    example: "5",
    duration: true,
  },
  windows: {
    type: "choice",
    label: "Time windows",
    flag: "windows",
    valueName: "MODE",
    sheetKeys: ["windows", "timewindows", "windowmode", "windowtype", "window"],
    help: "hard: never late; soft: late arrivals allowed at the late cost",
    tokens: ["hard", "soft"],
    choices: { hard: "hard", soft: "soft", strict: "hard", flexible: "soft" },
  },
  lateCostPerMin: {
    type: "number",
    label: "Late cost per minute",
    flag: "late-cost",
    valueName: "C",
    sheetKeys: ["latecostpermin", "latecost", "latecostperminute", "latepenalty", "latenesscost"],
    help: "cost of each minute late under soft windows",
    min: 0,
    max: 1e6,
    example: "1",
  },
  rule: {
    type: "choice",
    label: "Acceptance rule",
    flag: "rule",
    valueName: "RULE",
    sheetKeys: ["acceptance", "acceptancerule", "rule"],
    help: "acceptance rule of uphill moves",
    tokens: ["metropolis", "logistic"],
    choices: { metropolis: "metropolis", logistic: "logistic", barker: "logistic" },
  },
  schedule: {
    type: "choice",
    label: "Cooling schedule",
    flag: "schedule",
    valueName: "NAME",
    sheetKeys: ["schedule", "cooling", "coolingschedule"],
    help: `how the temperature falls over the run (${scheduleTokenList()} schedule)`,
    tokens: Object.keys(SCHEDULE_TOKENS),
    // Older names stay accepted on input: "time" (CLI), "time-fraction" (Settings sheet).
    choices: {
      geometric: "geometric",
      exponential: "geometric",
      linear: "linear",
      linearsteps: "linear",
      lundymees: "lundyMees",
      lundy: "lundyMees",
      timebased: "timeFraction",
      time: "timeFraction",
      timefraction: "timeFraction",
    },
  },
  alpha: {
    type: "number",
    label: "Alpha",
    flag: "alpha",
    valueName: "A",
    sheetKeys: ["alpha", "coolingfactor"],
    help: "geometric schedule: T <- alpha T at each level",
    min: 0,
    minExclusive: true,
    max: 1,
    maxExclusive: true,
    example: "0.94",
  },
  movesPerLevel: {
    type: "number",
    label: "Moves per level",
    flag: "level",
    valueName: "L",
    sheetKeys: ["movesperlevel", "levelmoves", "movesperstep", "l"],
    help: "geometric schedule: moves at each temperature (leave out to fit the levels to the run)",
    min: 1,
    max: 1e9,
    integer: true,
    example: "10000",
  },
  steps: {
    type: "number",
    label: "Steps",
    flag: "steps",
    valueName: "N",
    sheetKeys: ["steps", "levels"],
    help: "linear schedule: number of equal temperature steps",
    min: 1,
    max: 10_000,
    integer: true,
    example: "20",
  },
  beta: {
    type: "number",
    label: "Beta",
    flag: "beta",
    valueName: "B",
    sheetKeys: ["beta"],
    help: "Lundy-Mees schedule: T <- T / (1 + beta T) every move",
    min: 0,
    minExclusive: true,
    example: "0.0001",
  },
  t0: {
    type: "number",
    label: "T0",
    flag: "t0",
    valueName: "T",
    sheetKeys: ["t0", "tstart", "starttemperature", "initialtemperature"],
    help: "start temperature (leave out to calibrate it from P0)",
    min: 0,
    minExclusive: true,
    example: "100",
  },
  tEnd: {
    type: "number",
    label: "T end",
    flag: "tend",
    valueName: "T",
    sheetKeys: ["tend", "endtemperature", "finaltemperature"],
    help: "end temperature of the linear and time-based schedules (leave out to calibrate it from P end)",
    min: 0,
    minExclusive: true,
    example: "1",
  },
  p0: {
    type: "number",
    label: "Initial acceptance",
    flag: "p0",
    valueName: "P",
    sheetKeys: ["p0", "initialacceptance", "startacceptance"],
    help: "initial acceptance probability of a typical uphill move (calibration)",
    min: 0,
    minExclusive: true,
    max: 1,
    maxExclusive: true,
    example: "0.5",
  },
  pEnd: {
    type: "number",
    label: "Final acceptance",
    flag: "pend",
    valueName: "P",
    sheetKeys: ["pend", "finalacceptance", "endacceptance"],
    help: "final acceptance probability of a typical uphill move (calibration)",
    min: 0,
    minExclusive: true,
    max: 1,
    maxExclusive: true,
    example: "0.001",
  },
  seed: {
    type: "number",
    label: "Seed",
    flag: "seed",
    valueName: "N",
    sheetKeys: ["seed", "randomseed"],
    help: "seed of the random generator (same seed and move budget, same plan)",
    min: 0,
    max: 4_294_967_295,
    integer: true,
    example: "1",
  },
  seconds: {
    type: "number",
    label: "Time limit",
    flag: "seconds",
    valueName: "S",
    sheetKeys: ["seconds", "timelimit", "timelimitseconds", "timelimits", "runseconds", "timelimitsec"],
    help: "run for this many seconds",
    min: 0,
    minExclusive: true,
    max: 86_400,
    unit: "seconds",
    example: "10",
  },
  moves: {
    type: "number",
    label: "Move budget",
    flag: "moves",
    valueName: "K",
    sheetKeys: ["moves", "movebudget", "budgetmoves", "maxmoves"],
    help: "run for this many moves instead of a time limit (reproducible)",
    min: 1,
    max: 1e12,
    integer: true,
    example: "200000",
  },
  objective: {
    type: "choice",
    label: "Objective",
    flag: "objective",
    valueName: "NAME",
    sheetKeys: ["objective", "goal"],
    help: "weighted: one cost; hierarchical: fewest vehicles first",
    tokens: ["weighted", "hierarchical"],
    choices: { weighted: "weighted", cost: "weighted", hierarchical: "hierarchical", vehiclesfirst: "hierarchical" },
  },
  stabilityCost: {
    type: "number",
    label: "Stability cost",
    flag: "stability-cost",
    valueName: "C",
    sheetKeys: ["stabilitycost", "stability", "vehiclechangecost", "movecost", "changecost"],
    help: "when re-planning from a plan sheet: cost (in plan cost units) of each stop moved to another vehicle; higher keeps more stops on their van",
    min: 0,
    max: 1e9,
    example: "20",
  },
  // Break defaults: none of them has a value unless the user sets one (no default is legal advice).
  driveBeforeBreakH: {
    type: "number",
    label: "Drive before break",
    flag: "drive-before-break",
    valueName: "H",
    sheetKeys: ["drivebeforebreak", "drivebeforebreakh", "drivingbeforebreak", "breakafter", "breakafterh"],
    help: "hours of driving after which a break of Break min is due, for every vehicle when the Fleet has no break columns; your own jurisdiction's value, not a default",
    min: 0,
    minExclusive: true,
    max: 24,
    unit: "hours",
    example: "4.5",
  },
  breakMin: {
    type: "number",
    label: "Break min",
    flag: "break-min",
    valueName: "MIN",
    sheetKeys: ["breakmin", "breakminutes", "breaklength", "breakduration"],
    help: "length of the break after Drive before break (and of the window break when Window break min is not given), when the Fleet has no break columns",
    min: 0,
    minExclusive: true,
    max: 600,
    unit: "minutes",
    example: "30",
    duration: true,
  },
  windowBreakMin: {
    type: "number",
    label: "Window break min",
    flag: "window-break-min",
    valueName: "MIN",
    sheetKeys: ["windowbreakmin", "lunchmin", "lunchbreakmin", "lunchminutes"],
    help: "length of the break inside Break from .. Break to, when the Fleet has no break columns",
    min: 0,
    minExclusive: true,
    max: 600,
    unit: "minutes",
    example: "30",
    duration: true,
  },
  breakFrom: {
    type: "number",
    label: "Break from",
    flag: "break-from",
    valueName: "TIME",
    sheetKeys: ["breakfrom", "breakstart", "breakwindowfrom", "lunchfrom", "lunchstart"],
    help: "start of the window a break must lie in (such as lunch), when the Fleet has no break columns",
    min: 0,
    max: 1440,
    unit: "minutes from midnight",
    example: "12:00",
    time: true,
  },
  breakTo: {
    type: "number",
    label: "Break to",
    flag: "break-to",
    valueName: "TIME",
    sheetKeys: ["breakto", "breakend", "breakuntil", "breakwindowto", "lunchto", "lunchend"],
    help: "end of that break window",
    min: 0,
    max: 1440,
    unit: "minutes from midnight",
    example: "13:30",
    time: true,
  },
  workers: {
    type: "number",
    label: "Workers",
    flag: "workers",
    valueName: "N",
    sheetKeys: ["workers", "chains", "workerchains"],
    help: "independent annealing chains run at once, one per worker (thread); each gets the whole budget and the best plan is kept; the same seed, move budget and workers give the same plan",
    min: 1,
    max: 64,
    integer: true,
    example: "2",
  },
  country: {
    type: "text",
    label: "Default country",
    flag: "country",
    valueName: "NAME",
    sheetKeys: ["defaultcountry", "country", "geocodingcountry"],
    help: "country added to the addresses whose row gives none, when geocoding",
    maxLength: 60,
    what: "a country name or code",
    example: "Portugal",
  },
};

/** The schedule parameters, in the order they are checked. */
export const SCHEDULE_PARAMETERS = ["alpha", "movesPerLevel", "steps", "beta", "t0", "tEnd"] as const;
export type ScheduleParameter = (typeof SCHEDULE_PARAMETERS)[number];

/** Which parameters each schedule uses. */
export const PARAMETERS_OF: Readonly<Record<keyof typeof SCHEDULE_NAMES, readonly ScheduleParameter[]>> = {
  geometric: ["alpha", "movesPerLevel", "t0", "tEnd"],
  linear: ["steps", "t0", "tEnd"],
  lundyMees: ["beta", "t0", "tEnd"],
  timeFraction: ["t0", "tEnd"],
};

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
