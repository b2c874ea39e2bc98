/** Prefix of every scenario entry in the workbook's add-in settings store. */
export const SCENARIO_SETTINGS_PREFIX = "kiln.scenario.";

/**
 * The settings-store key under which a scenario's run record (JSON) is kept. Stable: it
 * depends only on the sheet name, so the pane and the CLI find each other's scenarios.
 *
 * @param sheetName - the scenario sheet's name (as returned by `uniqueSheetName`)
 * @returns `kiln.scenario.<sheetName>`
 * @throws TypeError when `sheetName` is not a non-empty string
 * @example scenarioSettingsKey("Plan 2") // => "kiln.scenario.Plan 2"
 */
export function scenarioSettingsKey(sheetName: string): string {
  if (typeof sheetName !== "string" || sheetName === "") {
    throw new TypeError("scenarioSettingsKey: sheetName must be a non-empty string");
  }
  return SCENARIO_SETTINGS_PREFIX + sheetName;
}
