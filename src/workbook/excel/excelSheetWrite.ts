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
