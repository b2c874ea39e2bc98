/**
 * Leading characters that make Excel (and most spreadsheet programs reading CSV) treat a
 * cell as a formula: = + - @, plus tab and carriage return (OWASP "CSV Injection" guidance,
 * common practice).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * Excel's own text prefix. Typed or written through the Office.js `values` API, a leading
 * apostrophe tells Excel "this is text" and is not shown; written literally into a file (as
 * the exceljs adapter does) it stays visible as a plain, harmless marker. So the worst case
 * in any adapter is a visible apostrophe, never a formula and never an invisible character
 * hidden in the user's data (a zero-width prefix would break copy, lookup and equality).
 */
export const TEXT_PREFIX = "'";

/**
 * Make a piece of user text safe to write into a cell: text that Excel would read as a
 * formula gets Excel's text prefix `'`. Everything else is returned unchanged. Layouts also
 * set the number format `@` on such cells, so adapters can apply both protections that
 * OFFICE-NOTES.md asks for.
 *
 * @param text - any user-supplied text (stop id, name, extra column, scenario name)
 * @returns the text, prefixed with `'` when it starts with = + - @ (or tab / CR)
 * @throws TypeError when `text` is not a string
 * @example safeText("=SUM(A1)") // => "'=SUM(A1)"
 * @example safeText("Bakery") // => "Bakery"
 */
export function safeText(text: string): string {
  if (typeof text !== "string") throw new TypeError(`safeText: text must be a string, got ${typeof text}`);
  return needsTextPrefix(text) ? TEXT_PREFIX + text : text;
}

/**
 * Whether `text` would be read as a formula if written as is.
 *
 * @param text - cell text
 * @returns true when it starts with = + - @ (or tab / CR)
 * @example needsTextPrefix("-x") // => true
 */
export function needsTextPrefix(text: string): boolean {
  return FORMULA_START.test(text);
}
