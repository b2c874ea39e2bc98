import type { CellValue } from "../../sheets/grid.js";
import { OfficeActionError } from "./OfficeActionError.js";

/**
 * Adds the sheet `name`, runs `write` on it and syncs; on failure deletes the half-written
 * sheet again in a new batch and throws an `OfficeActionError` that says whether that worked.
 */
export async function writeNewSheet(
  context: Excel.RequestContext,
  name: string,
  write: (sheet: Excel.Worksheet) => Promise<void>,
): Promise<void> {
  try {
    await write(context.workbook.worksheets.add(name));
    await context.sync();
  } catch (error) {
    const removed = await deleteSheetIfPresent(context, name);
    throw new OfficeActionError(
      `write the sheet "${name}" (${removed ? "the half-written sheet was removed" : "remove the half-written sheet by hand"})`,
      error,
    );
  }
}

async function deleteSheetIfPresent(context: Excel.RequestContext, name: string): Promise<boolean> {
  return deleteSheets(context, [name]);
}

/**
 * Deletes those of `names` that exist, in a new batch, after a failed write.
 * @returns false when that failed too (the original failure is the one to report)
 */
export async function deleteSheets(context: Excel.RequestContext, names: readonly string[]): Promise<boolean> {
  if (names.length === 0) return true;
  try {
    const sheets = names.map((name) => context.workbook.worksheets.getItemOrNullObject(name));
    for (const sheet of sheets) sheet.load("isNullObject");
    await context.sync();
    for (const sheet of sheets) if (!sheet.isNullObject) sheet.delete();
    await context.sync();
    return true;
  } catch {
    return false;
  }
}

export { checkSheetName } from "../../sheets/uniqueSheetName.js";

/**
 * Replaces the content of the very hidden sheet `name` (`Excel.SheetVisibility.veryHidden`,
 * ExcelApi 1.1) in the batch of `context`, adding it when absent; values are written as text
 * ("@"). One sync to find the sheet, one to write.
 */
export async function writeVeryHiddenSheetIn(
  context: Excel.RequestContext,
  name: string,
  values: readonly (readonly CellValue[])[],
): Promise<void> {
  const width = Math.max(0, ...values.map((r) => r.length));
  const grid = values.map((r) => Array.from({ length: width }, (_, c) => r[c] ?? ""));
  const found = context.workbook.worksheets.getItemOrNullObject(name);
  found.load("isNullObject");
  await context.sync();
  let sheet = found;
  if (found.isNullObject) {
    sheet = context.workbook.worksheets.add(name);
    sheet.visibility = Excel.SheetVisibility.veryHidden;
  } else sheet.getRange().clear(Excel.ClearApplyTo.contents);
  if (grid.length > 0 && width > 0) {
    const range = sheet.getRangeByIndexes(0, 0, grid.length, width);
    range.numberFormat = grid.map((r) => r.map(() => "@"));
    range.values = grid;
  }
  await context.sync();
}
