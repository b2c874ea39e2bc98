import type { SheetGrid } from "../../sheets/grid.js";
import { readUsedRange } from "./excelReads.js";
import { writeNewSheet } from "./excelSheetWrite.js";
import { planGridWrite, type GridWritePlan } from "./planGridWrite.js";
import { queueGridWrite } from "./queueGridWrite.js";

/**
 * Reads where `name` ends and queues the header (for a new or empty sheet) and the rows below
 * it; the caller syncs. A missing sheet is added (and removed again if its first write fails).
 *
 * @param budgetBytes - estimated request bytes above which the writes go in row chunks
 * @param beforeWrite - queued after the read and before the writes (a setting of the same batch)
 * @returns the rows' write plan (for the text read-back)
 */
export async function queueAppend(
  context: Excel.RequestContext,
  name: string,
  header: SheetGrid,
  rows: SheetGrid,
  freezePanes: boolean,
  budgetBytes: number | undefined,
  beforeWrite?: () => void,
): Promise<GridWritePlan> {
  const used = await readUsedRange(context, name, "isNullObject, rowIndex, rowCount");
  beforeWrite?.();
  const start = used === undefined || used.isNullObject ? 0 : used.rowIndex + used.rowCount;
  const headerPlan = start === 0 ? planGridWrite(header, { budgetBytes }) : undefined;
  const rowsPlan = planGridWrite(rows, { startRow: start + (headerPlan?.rows ?? 0), budgetBytes });
  const write = async (sheet: Excel.Worksheet): Promise<void> => {
    if (headerPlan) await queueGridWrite(context, sheet, headerPlan, { freeze: freezePanes && used === undefined });
    await queueGridWrite(context, sheet, rowsPlan, { freeze: false });
  };
  if (used === undefined) await writeNewSheet(context, name, write);
  else await write(context.workbook.worksheets.getItem(name));
  return rowsPlan;
}
