import type { CellValue } from "./grid.js";
import { excelSerialFromDate } from "./excelSerial.js";

/**
 * Small readers of raw cell values shared by the table parsers. Raw values come from
 * Office.js (numbers, strings, booleans, "" for empty, error cells as their text) or from
 * exceljs (which may also hand over Date objects, `{ error }`, `{ result }`, `{ richText }`
 * and `{ text }` objects); these helpers flatten both to one shape.
 */

/** Error values a cell can show: the seven of ECMA-376 Part 1 plus newer ones of dynamic arrays and data types. */
const EXCEL_ERRORS = new Set([
  "#NULL!",
  "#DIV/0!",
  "#VALUE!",
  "#REF!",
  "#NAME?",
  "#NUM!",
  "#N/A",
  "#GETTING_DATA",
  "#SPILL!",
  "#CALC!",
  "#FIELD!",
  "#BLOCKED!",
  "#BUSY!",
  "#UNKNOWN!",
]);

/**
 * A raw value as a plain `CellValue`: Dates become serials, exceljs objects their shown value.
 *
 * @param raw - a value as read from a sheet
 * @returns text, number, boolean, or `null` for an empty cell
 * @example plainCell({ richText: [{ text: "Ab" }, { text: "c" }] }) // => "Abc"
 */
export function plainCell(raw: unknown): CellValue {
  if (raw === undefined || raw === null || raw === "") return null;
  if (typeof raw === "string" || typeof raw === "boolean") return raw;
  if (typeof raw === "number") return Number.isFinite(raw) ? raw : null;
  if (raw instanceof Date) return Number.isFinite(raw.getTime()) ? excelSerialFromDate(raw) : null;
  if (typeof raw === "object") {
    const o = raw as Record<string, unknown>;
    if (typeof o.error === "string") return o.error;
    if ("result" in o) return plainCell(o.result);
    if (Array.isArray(o.richText)) {
      return o.richText.map((r) => (typeof r?.text === "string" ? r.text : "")).join("");
    }
    if (typeof o.text === "string") return o.text;
  }
  return String(raw);
}

/**
 * The Excel error value shown in a cell, if the cell holds one.
 *
 * @param raw - a value as read from a sheet
 * @returns e.g. "#N/A", or `undefined` for any other value
 * @example excelError("#DIV/0!") // => "#DIV/0!"
 */
export function excelError(raw: unknown): string | undefined {
  const v = plainCell(raw);
  if (typeof v !== "string") return undefined;
  const t = v.trim().toUpperCase();
  return EXCEL_ERRORS.has(t) ? t : undefined;
}

/**
 * Whether a cell is empty (nothing, "", or only spaces).
 *
 * @param raw - a value as read from a sheet
 * @returns true for an empty cell
 * @example isBlank("  ") // => true
 */
export function isBlank(raw: unknown): boolean {
  const v = plainCell(raw);
  return v === null || (typeof v === "string" && v.trim() === "");
}

/**
 * A number from a cell: a finite number, or text that is one (CSV files carry numbers as
 * text). Thousands separators and units are not read.
 *
 * @param raw - a value as read from a sheet
 * @returns the number, or `undefined` when the cell is empty or holds no plain number
 * @example readNumber(" 12.5 ") // => 12.5
 */
export function readNumber(raw: unknown): number | undefined {
  const v = plainCell(raw);
  if (typeof v === "number") return v;
  if (typeof v !== "string") return undefined;
  const t = v.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : undefined;
}

/**
 * A cell shown as short text for messages: text in quotes, numbers as they are.
 *
 * @param raw - a value as read from a sheet
 * @returns e.g. `"abc"` or `123.4`
 * @example shownValue("abc") // => '"abc"'
 */
export function shownValue(raw: unknown): string {
  const v = plainCell(raw);
  if (v === null) return "(empty)";
  if (typeof v === "string") return JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}...` : v);
  return String(v);
}
