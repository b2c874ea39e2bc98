import type ExcelJS from "exceljs";
import type { SheetRead } from "../WorkbookPort.js";
import { rawCellValue } from "./rawCellValue.js";

/**
 * The used range of `ws` as raw values (see `rawCellValue`): from the first to the last row and
 * column holding a value (formatted but empty cells do not count), with its merged areas.
 */
export function readUsedRange(ws: ExcelJS.Worksheet): SheetRead {
  let top = Infinity,
    left = Infinity,
    bottom = -1,
    right = -1;
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    row.eachCell({ includeEmpty: false }, (cell, c) => {
      if (rawCellValue(cell.value) === "") return;
      top = Math.min(top, r);
      bottom = Math.max(bottom, r);
      left = Math.min(left, c);
      right = Math.max(right, c);
    });
  });
  if (bottom < 0) return { sheet: ws.name, row: 0, col: 0, values: [] };
  const values: (number | string | boolean)[][] = [];
  // Merged areas, from their cells in the range (cheaper than `ws.model.merges`, which builds every row's model).
  const merges = new Map<string, { row: number; col: number; bottom: number; right: number }>();
  for (let r = top; r <= bottom; r++) {
    const row = ws.getRow(r);
    const line: (number | string | boolean)[] = [];
    for (let c = left; c <= right; c++) {
      const cell = row.getCell(c);
      line.push(rawCellValue(cell.value));
      if (!cell.isMerged) continue;
      const master = cell.master;
      const m = merges.get(master.address) ?? { row: Number(master.row), col: Number(master.col), bottom: r, right: c };
      m.bottom = Math.max(m.bottom, r);
      m.right = Math.max(m.right, c);
      merges.set(master.address, m);
    }
    values.push(line);
  }
  const blocks = [...merges.values()]
    .filter((m) => m.bottom > m.row || m.right > m.col)
    .map((m) => ({ row: m.row - 1, col: m.col - 1, rows: m.bottom - m.row + 1, cols: m.right - m.col + 1 }));
  return { sheet: ws.name, row: top - 1, col: left - 1, values, ...(blocks.length > 0 ? { merges: blocks } : {}) };
}

/** The 1-based number of the last row holding a value; 0 for an empty sheet. */
export function lastUsedRow(ws: ExcelJS.Worksheet): number {
  let last = 0;
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    row.eachCell({ includeEmpty: false }, (cell) => {
      if (rawCellValue(cell.value) !== "") last = Math.max(last, r);
    });
  });
  return last;
}
