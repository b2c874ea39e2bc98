import type { CellValue } from "../sheets/grid.js";

/** Byte order mark written first: Excel reads a CSV file as UTF-8 only when it starts with one (common practice). */
export const UTF8_BOM = "\uFEFF";

/**
 * Rows as CSV text by RFC 4180 §2: fields separated by commas, every record (the last too)
 * ended by CRLF; a field holding a comma, a double quote, a CR or an LF is enclosed in double
 * quotes, its quotes doubled. Numbers are written as JavaScript prints them (a point as decimal
 * separator), booleans as TRUE/FALSE, empty cells as empty fields.
 *
 * Text is kept exactly as the user typed it: no apostrophe or space is put before a value
 * starting with `=`, `+`, `-` or `@`. A spreadsheet that opens the file may read such a value as
 * a formula; the files are data for driver apps and mail merges, and changing a stop's name or
 * note would be worse (the same choice as the sheets, which never prefix user text).
 *
 * @param rows - records of cells
 * @returns the text, without a byte order mark
 * @example csvText([["Name", "Note"], ["Smith, J", 'say "hi"']]) // => 'Name,Note\r\n"Smith, J","say ""hi"""\r\n'
 */
export function csvText(rows: readonly (readonly CellValue[])[]): string {
  return rows.map((row) => row.map(csvField).join(",") + "\r\n").join("");
}

/**
 * One CSV field (RFC 4180 §2 rules 5–7).
 *
 * @param value - a cell value
 * @returns the field text, quoted when needed
 * @example csvField("a,b") // => '"a,b"'
 */
export function csvField(value: CellValue): string {
  if (value === null) return "";
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
