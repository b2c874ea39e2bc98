import type ExcelJS from "exceljs";
import type { SheetGrid } from "../../sheets/grid.js";

/**
 * Write a grid into an exceljs worksheet, starting at a 1-based row (column A): values,
 * number formats, bold rows, column widths and frozen rows.
 *
 * Strings are always stored as text cells. exceljs only writes a formula for an object value
 * `{ formula }`, and a grid holds no objects, so "=SUM(A1)" stays the literal text it is;
 * such cells also get the text format "@" so Excel keeps them as text when the user edits them.
 *
 * @param ws - the target worksheet
 * @param grid - the block to write (its strings are literal text)
 * @param startRow - 1-based sheet row of `grid.values[0]`
 * @param options - `layout: false` skips widths and frozen rows (used when appending rows)
 * @throws TypeError when a value is not a string, number, boolean or null (a programming mistake)
 * @example writeGrid(ws, { values: [["Stop", "Name"]], boldRows: [0] }, 1) // A1:B1, bold
 */
export function writeGrid(
  ws: ExcelJS.Worksheet,
  grid: SheetGrid,
  startRow: number,
  options: { readonly layout?: boolean } = {},
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
        cell.value = value;
        if (format === null && /^[=+\-@]/.test(value)) cell.numFmt = "@";
      } else if (typeof value === "number") {
        if (!Number.isFinite(value)) throw new TypeError(`grid.values[${r}][${c}] must be a finite number, got ${value}`);
        cell.value = value;
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
