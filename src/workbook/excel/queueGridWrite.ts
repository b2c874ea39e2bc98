import type { GridWritePlan } from "./planGridWrite.js";

/**
 * Queues the assignments of a `GridWritePlan` on a worksheet, in the order OFFICE-NOTES.md
 * asks for: per chunk the number formats (so text cells are "@" already) before the values.
 * Chunks before the last are synced one by one (they exist only above the size threshold);
 * the last chunk, column widths, bold rows and frozen rows stay queued for the caller's sync.
 *
 * @param context - the request context of the current `Excel.run`
 * @param sheet - the worksheet to write (one the adapter created)
 * @param plan - from `planGridWrite`
 * @param options - `freeze: false` skips `freezePanes` (it needs ExcelApi 1.7)
 * @returns once every chunk but the last has been synced
 * @example await queueGridWrite(context, sheet, planGridWrite(grid), { freeze: true }); await context.sync();
 */
export async function queueGridWrite(
  context: Excel.RequestContext,
  sheet: Excel.Worksheet,
  plan: GridWritePlan,
  options: { readonly freeze: boolean },
): Promise<void> {
  for (let i = 0; i < plan.chunks.length; i++) {
    const chunk = plan.chunks[i]!;
    const range = sheet.getRange(chunk.address);
    range.numberFormat = chunk.numberFormats;
    range.values = chunk.values;
    if (i < plan.chunks.length - 1) await context.sync();
  }
  for (const { address, widthPt } of plan.columnWidths) sheet.getRange(address).format.columnWidth = widthPt;
  for (const address of plan.boldRanges) sheet.getRange(address).format.font.bold = true;
  if (options.freeze && plan.freezeRows > 0) sheet.freezePanes.freezeRows(plan.freezeRows);
}
