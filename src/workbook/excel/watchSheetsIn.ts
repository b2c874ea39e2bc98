import type { ExcelCapabilities } from "./excelCapabilities.js";

/** A change to the workbook's list of sheets (`ExcelWorkbook.watchSheets`). */
export type SheetChange = { readonly kind: "added" | "deleted" } | { readonly kind: "renamed"; readonly from: string; readonly to: string };

/**
 * Registers `listener` in the batch of `context` for sheets added and deleted (ExcelApi 1.7) and,
 * when `caps.sheetRenameEvents` (ExcelApi 1.17), renamed; the caller has checked `caps.sheetEvents`.
 *
 * @returns which events are watched
 */
export async function watchSheetsIn(
  context: Excel.RequestContext,
  caps: ExcelCapabilities,
  listener: (change: SheetChange) => void,
): Promise<{ added: boolean; deleted: boolean; renamed: boolean }> {
  const sheets = context.workbook.worksheets;
  sheets.onAdded.add(async () => listener({ kind: "added" }));
  sheets.onDeleted.add(async () => listener({ kind: "deleted" }));
  if (caps.sheetRenameEvents) sheets.onNameChanged.add(async (e) => listener({ kind: "renamed", from: e.nameBefore, to: e.nameAfter }));
  await context.sync();
  return { added: true, deleted: true, renamed: caps.sheetRenameEvents };
}
