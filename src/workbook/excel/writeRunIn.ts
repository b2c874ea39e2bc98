import type { RunWrite } from "../WorkbookPort.js";
import type { ExcelCapabilities } from "./excelCapabilities.js";
import { deleteSheets } from "./excelSheetWrite.js";
import { OfficeActionError } from "./OfficeActionError.js";
import type { GridWritePlan } from "./planGridWrite.js";
import { queueAppend } from "./queueAppend.js";
import { queueGridWrite } from "./queueGridWrite.js";
import { queueRouteChart } from "./queueRouteChart.js";

/**
 * One run's sheets, run record and Compare rows in the batch of `context` (`ExcelWorkbook.writeRun`):
 * the new sheets (with charts) before the Compare sheet, the record keyed to the plan sheet's
 * `worksheet.id`, then the Compare rows. If any of it fails, the sheets it added are deleted in a
 * new batch and an `OfficeActionError` says whether that worked.
 *
 * @param plans - the write plan of each of `run.sheets`
 * @param options - the payload budget and the notice callback of the workbook
 * @returns the Compare rows' write plan (for the text read-back)
 */
export async function writeRunIn(
  context: Excel.RequestContext,
  run: RunWrite,
  plans: readonly GridWritePlan[],
  caps: ExcelCapabilities,
  options: { readonly budgetBytes: number | undefined; readonly notice: (message: string) => void },
): Promise<GridWritePlan> {
  const sheets = context.workbook.worksheets;
  sheets.load("items/name, items/position");
  await context.sync();
  const taken = new Set(sheets.items.map((s) => s.name.toLowerCase()));
  for (const sheet of run.sheets) {
    if (taken.has(sheet.name.toLowerCase())) throw new Error(`a sheet named "${sheet.name}" already exists; choose a free name`);
  }
  // New sheets go before the Compare sheet (worksheet.position, ExcelApi 1.1), so Compare stays
  // after the plans it compares; without a Compare sheet yet they go at the end, as `add` puts them.
  const compare = sheets.items.find((s) => s.name.toLowerCase() === run.append.name.toLowerCase());
  const added: string[] = [];
  try {
    for (const [i, sheet] of run.sheets.entries()) {
      const ws = sheets.add(sheet.name);
      if (compare) ws.position = compare.position + i;
      added.push(sheet.name);
      await queueGridWrite(context, ws, plans[i]!, { freeze: caps.freezePanes });
      if (sheet.chart && sheet.chart.series.length > 0) {
        if (caps.charts) queueRouteChart(ws, sheet.chart);
        else options.notice(`The route chart on "${sheet.name}" was skipped: it needs Excel with ExcelApi 1.7 or later.`);
      }
      if (!caps.freezePanes && plans[i]!.freezeRows > 0)
        options.notice(`Header rows of "${sheet.name}" are not frozen: that needs ExcelApi 1.7.`);
    }
    await context.sync();
    let id: string | undefined;
    const first = run.sheets[0];
    if (first) {
      const ws = sheets.getItem(first.name);
      ws.load("id");
      await context.sync();
      id = ws.id;
    }
    // The record goes into the same batch as the Compare rows, after the last read that may fail.
    const { key, value } = run.record(id);
    const appended = await queueAppend(
      context,
      run.append.name,
      run.append.header,
      run.append.rows,
      caps.freezePanes,
      options.budgetBytes,
      () => context.workbook.settings.add(key, value),
    );
    await context.sync();
    return appended;
  } catch (error) {
    const kept = await deleteSheets(context, added);
    const what =
      added.length === 0
        ? ""
        : kept
          ? " (the sheets it had added were removed)"
          : ` (remove the half-written sheets ${added.map((n) => `"${n}"`).join(", ")} by hand)`;
    throw new OfficeActionError(`write the plan${what}`, error);
  }
}
