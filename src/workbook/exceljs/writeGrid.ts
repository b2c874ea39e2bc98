import type ExcelJS from "exceljs";
import type { SheetGrid } from "../../sheets/grid.js";

/** Days between serial 0 of the 1900 and of the 1904 date system. */
const DAYS_1900_TO_1904 = 1462;

/**
 * Write a grid into an exceljs worksheet, starting at a 1-based row (column A): values,
 * number formats, bold rows, column widths and frozen rows.
 *
 * Strings are always stored as text cells, exactly as given: exceljs only writes a formula for
 * an object value `{ formula }`, and a grid holds no objects, so "=SUM(A1)" stays the literal
 * text it is, with no apostrophe added; such cells also get the text format "@" so Excel keeps
 * them as text when the user edits them. This is the one place that protects text in files.
 *
 * @param ws - the target worksheet
 * @param grid - the block to write (its strings are literal text)
 * @param startRow - 1-based sheet row of `grid.values[0]`
 * @param options - `layout: false` skips widths and frozen rows (used when appending rows);
 *   `date1904: true` for a workbook in the 1904 date system: grid serials are 1900-system
 *   (ECMA-376 default), so cells under a date format are shifted by 1462 days to show the same date
 * @throws TypeError when a value is not a string, number, boolean or null (a programming mistake)
 * @example writeGrid(ws, { values: [["Stop", "Name"]], boldRows: [0] }, 1) // A1:B1, bold
 */
export function writeGrid(
  ws: ExcelJS.Worksheet,
  grid: SheetGrid,
  startRow: number,
  options: { readonly layout?: boolean; readonly date1904?: boolean } = {},
): void {
  if (!Number.isInteger(startRow) || startRow < 1) throw new RangeError(`startRow must be an integer >= 1, got ${startRow}`);
  const bold = new Set(grid.boldRows ?? []);
  grid.values.forEach((rowValues, r) => {
    const row = ws.getRow(startRow + r);
    rowValues.forEach((value, c) => {
      const cell = row.getCell(c + 1);
      const format = grid.numberFormats?.[r]?.[c] ?? null;
      if (value === null) {
        cell.value = null;
      } else if (typeof value === "string") {
        cell.value = escapeForXml(value);
        if (format === null && /^[=+\-@]/.test(value)) cell.numFmt = "@";
      } else if (typeof value === "number") {
        if (!Number.isFinite(value)) throw new TypeError(`grid.values[${r}][${c}] must be a finite number, got ${value}`);
        // 1904 system: serial 0 is 1904-01-01, 1462 days after the 1900 system's (ECMA-376 Part 1, 18.17.4.1).
        cell.value = options.date1904 && format !== null && isDateFormat(format) ? value - DAYS_1900_TO_1904 : value;
      } else if (typeof value === "boolean") {
        cell.value = value;
      } else {
        throw new TypeError(`grid.values[${r}][${c}] must be a string, number, boolean or null, got ${typeof value}`);
      }
      if (format !== null) cell.numFmt = format;
      if (bold.has(r)) cell.font = { bold: true };
    });
  });
  if (options.layout === false) return;
  grid.columnWidths?.forEach((width, c) => {
    if (Number.isFinite(width) && width > 0) ws.getColumn(c + 1).width = width;
  });
  const freeze = grid.freezeRows ?? 0;
  if (freeze > 0) ws.views = [{ state: "frozen", xSplit: 0, ySplit: freeze, topLeftCell: `A${freeze + 1}` }];
}

/**
 * Characters XML 1.0 cannot carry as they are: C0 controls other than tab and line feed
 * (W3C XML 1.0, 2.2 Characters), the carriage return (read back as a line feed, 2.11
 * End-of-Line Handling), and the non-characters U+FFFE and U+FFFF.
 */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const NOT_IN_XML = /[\u0000-\u0008\u000b-\u001f\ufffe\uffff]/g;

/**
 * Write such characters as ECMA-376's escape `_xHHHH_` (Part 1, 22.9.2.19 ST_Xstring), and
 * escape the underscore of text that already looks like such an escape (`_x005F_`) so it
 * reads back literally. exceljs and Excel both decode these on reading, so the cell holds
 * exactly the user's text and the file stays valid XML.
 */
function escapeForXml(text: string): string {
  if (!text.includes("_x") && text.search(NOT_IN_XML) < 0) return text;
  return text
    .replace(/_x([0-9A-Fa-f]{4})_/g, "_x005F_x$1_")
    .replace(NOT_IN_XML, (c) => `_x${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}_`);
}

/** A number format that shows a calendar date (has a year or day token outside quotes and brackets). */
function isDateFormat(format: string): boolean {
  const bare = format.replace(/"[^"]*"|\[[^\]]*\]|\\./g, "");
  return /[yd]/i.test(bare);
}
