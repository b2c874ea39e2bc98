import type { RouteChart, SheetGrid } from "../../sheets/grid.js";
import { applyPrintSetup } from "./applyPrintSetup.js";
import type { ExcelCapabilities } from "./excelCapabilities.js";
import { writeNewSheet } from "./excelSheetWrite.js";
import type { GridWritePlan } from "./planGridWrite.js";
import { queueGridWrite } from "./queueGridWrite.js";
import { queueRouteChart } from "./queueRouteChart.js";
import { checkWrittenText } from "./verifyTextCells.js";

/**
 * One new sheet in the batch of `context` (`ExcelWorkbook.addSheet`): refuses a taken name, writes
 * `grid` by `plan` at A1, then the route chart when Excel has ExcelApi 1.7 (otherwise a notice);
 * a failed write deletes the half-written sheet. The text read-back and print settings follow.
 *
 * @param notice - told, in a sentence for the pane, what this Excel could not do
 */
export async function addSheetIn(
  context: Excel.RequestContext,
  name: string,
  grid: SheetGrid,
  chart: RouteChart | undefined,
  plan: GridWritePlan,
  caps: ExcelCapabilities,
  notice: (message: string) => void,
): Promise<void> {
  const existing = context.workbook.worksheets.getItemOrNullObject(name);
  existing.load("isNullObject");
  await context.sync();
  if (!existing.isNullObject) throw new Error(`a sheet named "${name}" already exists; choose a free name`);
  await writeNewSheet(context, name, async (sheet) => {
    await queueGridWrite(context, sheet, plan, { freeze: caps.freezePanes });
    if (chart && chart.series.length > 0) {
      if (caps.charts) queueRouteChart(sheet, chart);
      else notice(`The route chart on "${name}" was skipped: it needs Excel with ExcelApi 1.7 or later.`);
    }
  });
  if (!caps.freezePanes && plan.freezeRows > 0) notice(`Header rows of "${name}" are not frozen: that needs ExcelApi 1.7.`);
  await checkWrittenText(context, name, plan, notice);
  if (grid.print) await applyPrintSetup(context, name, grid.print, caps.printLayout, notice);
}
