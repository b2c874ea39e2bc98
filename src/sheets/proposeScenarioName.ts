import { FALLBACK_SHEET_NAME, uniqueSheetName } from "./uniqueSheetName.js";

/**
 * The scenario name to offer for the next run, given the name in the field and the sheets the
 * workbook already has. A numbered default ("Plan 3", or a blank field) becomes the first free
 * "Plan N", so a rerun of "Plan 1" proposes "Plan 2" rather than landing as "Plan 1 (2)". A name
 * the user typed is kept while no sheet has it; once one does, the name the plan sheet would get
 * (`uniqueSheetName`: "Monday (2)") is offered instead, so the field shows what will be written.
 *
 * @param current - the text in the scenario field
 * @param existing - names of the sheets in the workbook
 * @returns the name to put in the field
 * @throws TypeError when `current` is not a string or `existing` is not an array of strings
 * @example proposeScenarioName("Plan 1", ["Stops", "Fleet", "Plan 1", "Plan 1 routes", "Compare"]) // => "Plan 2"
 * @example proposeScenarioName("Monday", ["Monday"]) // => "Monday (2)"
 * @example proposeScenarioName("Monday", ["Stops"]) // => "Monday"
 */
export function proposeScenarioName(current: string, existing: readonly string[]): string {
  if (typeof current !== "string") throw new TypeError("proposeScenarioName: current must be a string");
  const wanted = current.trim();
  if (wanted === "" || new RegExp(`^${FALLBACK_SHEET_NAME} \\d+$`, "i").test(wanted)) {
    const taken = new Set(existing.map((n) => n.toLowerCase()));
    let n = 1;
    while (taken.has(`${FALLBACK_SHEET_NAME} ${n}`.toLowerCase())) n++;
    return `${FALLBACK_SHEET_NAME} ${n}`;
  }
  const unique = uniqueSheetName(wanted, existing);
  // Still free (the same name as in an empty workbook): keep exactly what the user typed.
  return unique === uniqueSheetName(wanted, []) ? current : unique;
}
