import type ExcelJS from "exceljs";
import { rawCellValue } from "./rawCellValue.js";
import { lastUsedRow } from "./usedRange.js";
import { writeGrid } from "./writeGrid.js";

/**
 * Name of the very hidden sheet that holds the add-in's key/value settings in a file.
 * Excel's own per-add-in store (`workbook.settings`) is not reachable from a file library,
 * so files carry the same keys as `Key | Value` rows on a sheet users cannot unhide from
 * the Excel UI ("veryHidden", ECMA-376 Part 1, 18.18.68 ST_SheetState).
 */
export const SETTINGS_SHEET = "kiln-settings";

/** Excel's longest cell text (Excel specifications and limits: 32,767 characters). */
export const MAX_CELL_TEXT = 32_767;

/** The key/value rows of the settings sheet `ws` (below its header row): every stored key and its text. */
export function readSettingRows(ws: ExcelJS.Worksheet): Record<string, string> {
  const settings: Record<string, string> = {};
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    if (r === 1) return; // header
    const key = rawCellValue(row.getCell(1).value);
    if (key === "") return;
    settings[String(key)] = String(rawCellValue(row.getCell(2).value));
  });
  return settings;
}

/** Store `key` on the settings sheet `ws` as text, replacing its row when the key is there, else in a new row below the last. */
export function writeSettingRow(ws: ExcelJS.Worksheet, key: string, value: string): void {
  let target = lastUsedRow(ws) + 1;
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    if (r > 1 && rawCellValue(row.getCell(1).value) === key) target = r;
  });
  // Text format so a value such as "=1" or "0012" comes back exactly as written.
  writeGrid(ws, { values: [[key, value]], numberFormats: [["@", "@"]] }, target, { layout: false });
}
