/**
 * "Rerun" from a plan sheet: find the run record stored for the sheet and read it, or say why not.
 */
import type { RunRecord } from "../sheets/PlanSettings.js";
import { scenarioSettingsKey } from "../sheets/scenarioSettingsKey.js";
import { parseRunRecord } from "../sheets/settingsSchema.js";
import type { WorkbookPort } from "../workbook/WorkbookPort.js";

/**
 * The run record stored with a plan sheet.
 *
 * @param port - the workbook
 * @param sheet - the plan sheet's name
 * @returns the record, or the message to show when the sheet has none or it cannot be read
 */
export async function storedRunRecord(port: WorkbookPort, sheet: string): Promise<{ record: RunRecord } | { message: string }> {
  const stored = (await port.readSettings())[scenarioSettingsKey(sheet)];
  if (!stored) {
    return { message: `"${sheet}" is not a plan sheet made by Kiln (no stored settings). Go to a plan sheet and try again.` };
  }
  const loaded = parseRunRecord(stored);
  if (!loaded.ok) {
    return { message: `The settings stored for "${sheet}" cannot be read (${loaded.message}); optimize with the pane's settings instead.` };
  }
  return { record: loaded.record };
}
