import { plainCell } from "./cellValue.js";

/** Words read as "yes" in a yes/no column (lower case, trimmed). */
const YES = new Set(["yes", "y", "true", "x", "1", "on", "locked", "lock"]);
/** Words read as "no"; a blank cell is "no" too. */
const NO = new Set(["no", "n", "false", "0", "off", "-"]);

/**
 * A yes/no cell: Excel's TRUE and FALSE (ECMA-376 boolean cells), the numbers 1 and 0, and the
 * words yes/no, y/n, true/false, x (a ticked cell), on/off, case-insensitively. Blank is no.
 *
 * @param raw - a value as read from a sheet
 * @returns true or false, or `undefined` when the cell holds anything else (the caller names the cell)
 * @example parseYesNo(" Yes ") // => true
 * @example parseYesNo("") // => false
 * @example parseYesNo("maybe") // => undefined
 */
export function parseYesNo(raw: unknown): boolean | undefined {
  const v = plainCell(raw);
  if (v === null) return false;
  if (typeof v === "boolean") return v;
  if (typeof v === "number") return v === 1 ? true : v === 0 ? false : undefined;
  const t = v.trim().toLowerCase();
  if (t === "") return false;
  if (YES.has(t)) return true;
  if (NO.has(t)) return false;
  return undefined;
}
