/**
 * "Rerun" from a plan sheet: find the run record stored for the sheet and read it, or say why not.
 */
import type { RunRecord } from "../sheets/PlanSettings.js";
import { SCENARIO_SETTINGS_PREFIX, scenarioSettingsKey } from "../sheets/scenarioSettingsKey.js";
import { parseRunRecord } from "../sheets/settingsSchema.js";
import { TERMS } from "../sheets/terms.js";
import type { WorkbookPort } from "../workbook/WorkbookPort.js";

/**
 * The run record stored with a plan sheet.
 *
 * @param port - the workbook
 * @param sheet - the plan sheet's name
 * @returns the record, or the message to show when the sheet has none or it cannot be read
 */
export async function storedRunRecord(port: WorkbookPort, sheet: string): Promise<{ record: RunRecord } | { message: string }> {
  const stored = runRecordText(await port.readSettings(), sheet, await port.sheetId(sheet));
  if (!stored) {
    return { message: `"${sheet}" is not a plan sheet made by Kiln (no stored settings). Go to a plan sheet and try again.` };
  }
  const loaded = parseRunRecord(stored);
  if (!loaded.ok) {
    return {
      message: `The settings stored for "${sheet}" cannot be read (${loaded.message}); press ${TERMS.planAction} with the pane's settings instead.`,
    };
  }
  return { record: loaded.record };
}

/**
 * The stored run record (JSON text) of a plan sheet: the one that names the sheet's id, else the
 * one stored under its name.
 *
 * @param settings - the workbook's settings store
 * @param sheet - the sheet's current name
 * @param id - its rename-proof id (`WorkbookPort.sheetId`)
 * @returns the JSON text, or `undefined` when the sheet has none
 * @example runRecordText({ "kiln.scenario.Plan": "{...}" }, "Plan", undefined) // => "{...}"
 */
export function runRecordText(settings: Readonly<Record<string, string>>, sheet: string, id: string | undefined): string | undefined {
  return recordBySheetId(settings, id) ?? settings[scenarioSettingsKey(sheet)];
}

/**
 * The stored record that names this sheet id: it still belongs to the sheet after a rename,
 * when the key (made from the old name) no longer does.
 */
function recordBySheetId(settings: Readonly<Record<string, string>>, id: string | undefined): string | undefined {
  if (id === undefined) return undefined;
  for (const [key, value] of Object.entries(settings)) {
    if (!key.startsWith(SCENARIO_SETTINGS_PREFIX)) continue;
    const loaded = parseRunRecord(value);
    if (loaded.ok && loaded.record.sheetId === id) return value;
  }
  return undefined;
}
