import type ExcelJS from "exceljs";
import { headerFooterCode, type PrintSetup } from "../../sheets/printSetup.js";

/** ECMA-376 paper codes (Part 1, 18.3.1.63 pageSetup@paperSize): 1 Letter, 9 A4. */
const PAPER_CODE = { Letter: 1, A4: 9 } as const;

/**
 * Applies a grid's print setup to an exceljs worksheet whose grid starts at row 1.
 * A row break above 0-based grid row r is `<brk id="r">` (ECMA-376 Part 1, 18.3.1.3: the
 * zero-based id is the row the break lies above), which exceljs writes for 1-based row r.
 * @example writePrintSetup(ws, { orientation: "landscape", fitToWidth: true, rowBreaks: [20] })
 */
export function writePrintSetup(ws: ExcelJS.Worksheet, print: PrintSetup): void {
  const setup: Partial<ExcelJS.PageSetup> = {};
  if (print.orientation) setup.orientation = print.orientation;
  if (print.paperSize) setup.paperSize = PAPER_CODE[print.paperSize] as ExcelJS.PaperSize;
  if (print.fitToWidth) Object.assign(setup, { fitToPage: true, fitToWidth: 1, fitToHeight: 0 });
  if (print.printTitleRows) setup.printTitlesRow = `${print.printTitleRows.first + 1}:${print.printTitleRows.last + 1}`;
  ws.pageSetup = { ...ws.pageSetup, ...setup };
  const headerFooter: Partial<ExcelJS.HeaderFooter> = {};
  if (print.header) headerFooter.oddHeader = headerFooterCode(print.header);
  if (print.footer) headerFooter.oddFooter = headerFooterCode(print.footer);
  if (print.header || print.footer) ws.headerFooter = { ...ws.headerFooter, ...headerFooter };
  for (const r of print.rowBreaks ?? []) ws.getRow(r).addPageBreak();
}
