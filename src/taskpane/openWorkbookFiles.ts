/**
 * Open workbook files chosen in the standalone page: one .xlsx, or one or more .csv files
 * (each becomes a sheet named after its file). Everything happens in the page.
 */
import { readCsv } from "../sheets/parseCsv.js";
import { uniqueSheetName } from "../sheets/uniqueSheetName.js";
import { ExcelJsWorkbook } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { describeUnreadableWorkbook } from "../workbook/exceljs/unreadableWorkbook.js";

/** An opened workbook and the name to offer for its download. */
export interface OpenedWorkbook {
  readonly book: ExcelJsWorkbook;
  /** e.g. "kiln-demo.plan.xlsx" for "kiln-demo.xlsx". */
  readonly downloadName: string;
  /** What was opened, for the pane ("kiln-demo.xlsx" or "stops.csv + fleet.csv"). */
  readonly label: string;
}

/**
 * Open the chosen files.
 *
 * @param files - the file input's files: one .xlsx, or .csv files
 * @returns the workbook, or a message saying what to choose instead
 * @example await openWorkbookFiles([xlsxFile]) // => { book, downloadName: "kiln-demo.plan.xlsx", label: "kiln-demo.xlsx" }
 */
export async function openWorkbookFiles(files: readonly File[]): Promise<OpenedWorkbook | { readonly error: string }> {
  if (files.length === 0) return { error: "No file chosen: open an .xlsx workbook or .csv files." };
  const xlsx = files.filter((f) => /\.xlsx$/i.test(f.name));
  const csv = files.filter((f) => /\.csv$/i.test(f.name));
  if (xlsx.length === 1 && csv.length === 0) {
    const file = xlsx[0]!;
    const bytes = new Uint8Array(await file.arrayBuffer());
    try {
      const book = await ExcelJsWorkbook.fromBuffer(bytes);
      return { book, downloadName: file.name.replace(/\.xlsx$/i, "") + ".plan.xlsx", label: file.name };
    } catch {
      return { error: describeUnreadableWorkbook(bytes, file.name) };
    }
  }
  if (csv.length > 0 && xlsx.length === 0) {
    const sheets: { name: string; values: string[][] }[] = [];
    for (const file of csv) {
      const name = uniqueSheetName(
        file.name.replace(/\.csv$/i, ""),
        sheets.map((s) => s.name),
      );
      const csvRead = readCsv(await file.text());
      if (csvRead.unclosedQuote) {
        const { line, column } = csvRead.unclosedQuote;
        return {
          error: `${file.name}: the quote (") that opens on line ${line}, column ${column} is never closed, so everything after it would be read as one cell. Close the quote there (write "" for a quote inside quoted text) and open the file again.`,
        };
      }
      sheets.push({ name, values: csvRead.rows });
    }
    const base = csv.length === 1 ? csv[0]!.name.replace(/\.csv$/i, "") : "kiln";
    return { book: ExcelJsWorkbook.fromGrids(sheets), downloadName: `${base}.plan.xlsx`, label: csv.map((f) => f.name).join(" + ") };
  }
  return { error: "Choose either one .xlsx workbook or one or more .csv files (for example stops.csv and fleet.csv), not a mix." };
}
