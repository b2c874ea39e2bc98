import type ExcelJS from "exceljs";

/** Serial 0 of the ECMA-376 1900 system as exceljs counts it (1899-12-30, UTC). */
const SERIAL_EPOCH_MS = Date.UTC(1899, 11, 30);
const MS_PER_DAY = 86_400_000;

/**
 * The raw value of an exceljs cell, as the Office.js `values` property would give it:
 * numbers (dates and times as ECMA-376 serial days of the 1900 system), strings, booleans,
 * and `""` for empty cells.
 *
 * exceljs hands out richer objects; each is reduced the way Excel shows it:
 * - `Date` (a number under a date format) -> its serial number again;
 * - rich text -> the concatenated plain text of its runs;
 * - formula / shared formula -> the cached result (never the formula text);
 * - hyperlink -> its display text;
 * - error -> its text, e.g. "#N/A".
 *
 * @param value - `cell.value` from exceljs
 * @returns a number, string or boolean ("" when empty)
 * @example rawCellValue(new Date(Date.UTC(2026, 0, 1, 12))) // => 46023.5
 */
export function rawCellValue(value: ExcelJS.CellValue | undefined): number | string | boolean {
  if (value === null || value === undefined) return "";
  if (typeof value === "number" || typeof value === "string" || typeof value === "boolean") return value;
  if (value instanceof Date) return serialFromDate(value);
  if (typeof value !== "object") return String(value);
  // The remaining shapes are plain objects; tell them apart by their keys (exceljs' own test).
  const obj = value as unknown as Record<string, unknown>;
  if ("error" in obj) return String(obj.error);
  if ("richText" in obj) return richTextPlain(obj.richText);
  if ("formula" in obj || "sharedFormula" in obj) {
    const result = obj.result as ExcelJS.CellValue | undefined;
    // A formula that was never calculated has no cached result: Excel shows it empty until recalculated.
    return result === undefined ? "" : rawCellValue(result);
  }
  if ("hyperlink" in obj) {
    const text = obj.text;
    if (typeof text === "string") return text;
    if (text && typeof text === "object" && "richText" in text) {
      return richTextPlain((text as { richText: unknown }).richText);
    }
    return String(obj.hyperlink ?? "");
  }
  return "";
}

/**
 * The ECMA-376 (1900 system) serial of a UTC date-time: whole days since 1899-12-30 plus the
 * fraction of the day. exceljs builds its Date objects in UTC from the stored serial, so this
 * is the exact inverse of its conversion (to the millisecond it rounds to).
 *
 * @param d - a date-time read as UTC
 * @returns serial days (e.g. 45658 for 2025-01-01)
 * @example serialFromDate(new Date(Date.UTC(1900, 2, 1))) // => 61
 */
export function serialFromDate(d: Date): number {
  // One division of whole milliseconds: 07:30 comes back as exactly 450 / 1440 of a day,
  // where adding 25569 to a fraction of the Unix epoch would leave a 1e-12 residue.
  return (d.getTime() - SERIAL_EPOCH_MS) / MS_PER_DAY;
}

function richTextPlain(runs: unknown): string {
  if (!Array.isArray(runs)) return "";
  return runs.map((r) => (r && typeof r === "object" && typeof r.text === "string" ? r.text : "")).join("");
}
