import { headerFooterSections, type PrintHeaderFooter, type PrintSetup } from "../../sheets/printSetup.js";
import { cellA1 } from "./rangeAddress.js";

/**
 * Queues a grid's print setup on a worksheet whose grid starts at row 1, through
 * `worksheet.pageLayout` and `worksheet.horizontalPageBreaks` (all ExcelApi 1.9, available
 * on the web; the caller gates them with `isSetSupported("ExcelApi", "1.9")`):
 * `orientation`, `paperSize` ("A4", "Letter" are `Excel.PaperType` values), `zoom` assigned
 * whole as fit-to-pages, `setPrintTitleRows("$1:$3")` with whole rows,
 * `headersFooters.defaultForAllPages` sections in Excel's format codes, and one
 * `horizontalPageBreaks.add(range)` per break (a break above the range's top row).
 * @example queuePrintSetup(sheet, { orientation: "landscape", fitToWidth: true }); await context.sync();
 */
export function queuePrintSetup(sheet: Excel.Worksheet, print: PrintSetup): void {
  const layout = sheet.pageLayout;
  if (print.orientation) layout.orientation = print.orientation === "landscape" ? "Landscape" : "Portrait";
  if (print.paperSize) layout.paperSize = print.paperSize;
  if (print.printTitleRows) layout.setPrintTitleRows(`$${print.printTitleRows.first + 1}:$${print.printTitleRows.last + 1}`);
  if (print.header) assignSections(layout.headersFooters.defaultForAllPages, "Header", print.header);
  if (print.footer) assignSections(layout.headersFooters.defaultForAllPages, "Footer", print.footer);
  for (const r of print.rowBreaks ?? []) sheet.horizontalPageBreaks.add(cellA1(r, 0));
  // Last, so the settings above stay if a host refuses it. One page wide; 0 pages tall = as many
  // as needed (the file format's fitToHeight="0"; unverified through Office.js, checked by hand
  // in docs/excel-smoke-test.md).
  if (print.fitToWidth) layout.zoom = { horizontalFitToPages: 1, verticalFitToPages: 0 };
}

function assignSections(target: Excel.HeaderFooter, part: "Header" | "Footer", hf: PrintHeaderFooter): void {
  const s = headerFooterSections(hf);
  target[`left${part}`] = s.left;
  target[`center${part}`] = s.center;
  target[`right${part}`] = s.right;
}
