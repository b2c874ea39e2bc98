/**
 * The names of the cooling schedules and acceptance rules (the CLI and Settings-sheet tokens and
 * the one display name of each) and the parameters each schedule uses; `settingFields.ts` builds
 * the schedule setting from them.
 */

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
export function scheduleTokenList(): string {
  return Object.entries(SCHEDULE_TOKENS)
    .map(([token, kind]) => `${token} = ${SCHEDULE_NAMES[kind]}`)
    .join(", ");
}

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
