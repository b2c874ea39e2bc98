import type { PrintSetup } from "../../sheets/grid.js";
import { OfficeActionError } from "./OfficeActionError.js";
import { queuePrintSetup } from "./queuePrintSetup.js";

/**
 * Print settings go in their own sync after the sheet is written, so a host that refuses
 * one of them keeps the plan; what could not be set is told as a notice.
 *
 * @param supported - whether this Excel has ExcelApi 1.9 (page layout)
 * @param notice - told, in a sentence for the pane, what was not set
 */
export async function applyPrintSetup(
  context: Excel.RequestContext,
  name: string,
  print: PrintSetup,
  supported: boolean,
  notice: (message: string) => void,
): Promise<void> {
  const skipped = `Print settings of "${name}" (orientation, paper, fit to width, title rows, page breaks, header and footer)`;
  const sheet = context.workbook.worksheets.getItem(name);
  if (!supported || !("pageLayout" in sheet) || !("horizontalPageBreaks" in sheet)) {
    notice(`${skipped} were not set: they need Excel with ExcelApi 1.9 or later. Set them under Page Layout if you print the sheet.`);
    return;
  }
  try {
    queuePrintSetup(sheet, print);
    await context.sync();
  } catch (error) {
    const why = new OfficeActionError("set them", error).message;
    notice(`${skipped} were not all set. ${why}. The plan was written; check them under Page Layout before printing.`);
  }
}
