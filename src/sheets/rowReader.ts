import type { Issue } from "../core/index.js";
import { excelError, isBlank, plainCell, readNumber, shownValue } from "./cellValue.js";
import { parseDuration } from "./parseDuration.js";
import { parseTime } from "./parseTime.js";
import { cellAddress } from "./cellAddress.js";
import { cellIssue, type Table, type TableRow } from "./readTable.js";

/** Typed access to the cells of one table row; every defect goes to the shared issue list. */
export interface RowReader {
  /** 1-based sheet row number. */
  readonly sheetRow: number;
  /** Whether the table has a column for the field. */
  has(key: string): boolean;
  /** The raw cell of a field (`undefined` when the table has no such column). */
  raw(key: string): unknown;
  blank(key: string): boolean;
  /** A1 address of the field's cell (the row's first cell when the column is absent). */
  cell(key: string): string;
  /** Record an issue at the field's cell (or at the row's first cell when the column is absent). */
  fail(key: string, message: string): void;
  /** Trimmed text, `undefined` when blank; an Excel error value is an issue. */
  text(key: string): string | undefined;
  /** A number (`undefined` when blank or invalid; invalid ones are issues). */
  num(key: string, label: string, rule?: NumberRule): number | undefined;
  time(key: string, label: string): number | undefined;
  duration(key: string, label: string): number | undefined;
  /** True when the cell holds an Excel error value (the issue is recorded). */
  excelErrorAt(key: string): boolean;
}

/** Range rules of `RowReader.num`. */
export interface NumberRule {
  readonly min?: number;
  /** Strictly above `min`. */
  readonly above?: number;
  readonly integer?: boolean;
  /** An example value for the fix text. */
  readonly example?: string;
}

/**
 * A `RowReader` over one row of a table.
 *
 * @param table - the table the row belongs to
 * @param row - the row
 * @param issues - where defects are collected
 * @returns the reader
 * @example rowReader(table, table.rows[0], issues).num("demand", "demand", { min: 0 })
 */
export function rowReader(table: Table, row: TableRow, issues: Issue[]): RowReader {
  const col = (key: string): number | undefined => table.columns.fields.get(key);
  const raw = (key: string): unknown => {
    const c = col(key);
    return c === undefined ? undefined : row.cells[c];
  };
  const fail = (key: string, message: string): void => {
    issues.push(cellIssue(table.sheet, row.sheetRow0, table.col0 + (col(key) ?? 0), message));
  };
  const excelErrorAt = (key: string): boolean => {
    const e = excelError(raw(key));
    if (e === undefined) return false;
    fail(key, `the cell shows the Excel error ${e}; fix the formula or the cells it uses, or type the value.`);
    return true;
  };
  const reader: RowReader = {
    sheetRow: row.sheetRow0 + 1,
    has: (key) => col(key) !== undefined,
    raw,
    blank: (key) => isBlank(raw(key)),
    cell: (key) => cellAddress(row.sheetRow0, table.col0 + (col(key) ?? 0)),
    fail,
    excelErrorAt,
    text(key) {
      if (isBlank(raw(key)) || excelErrorAt(key)) return undefined;
      return String(plainCell(raw(key))).trim();
    },
    num(key, label, rule = {}) {
      const v = raw(key);
      if (isBlank(v) || excelErrorAt(key)) return undefined;
      const n = readNumber(v);
      const example = rule.example ?? "12";
      if (n === undefined) {
        fail(key, `${label} ${shownValue(v)} is not a number; type a number such as ${example}.`);
        return undefined;
      }
      if (rule.min !== undefined && n < rule.min) {
        fail(key, `${label} ${n} is below ${rule.min}; type a value of ${rule.min} or more.`);
        return undefined;
      }
      if (rule.above !== undefined && !(n > rule.above)) {
        fail(key, `${label} ${n} must be above ${rule.above}; type a value such as ${example}.`);
        return undefined;
      }
      if (rule.integer === true && !Number.isInteger(n)) {
        fail(key, `${label} ${n} is not a whole number; type a whole number such as ${example}.`);
        return undefined;
      }
      return n;
    },
    time(key, label) {
      const v = raw(key);
      if (isBlank(v) || excelErrorAt(key)) return undefined;
      const t = parseTime(v);
      if (t === undefined) fail(key, `${label} ${shownValue(v)} is not a time of day; type it as 08:30, 8:30 PM or an Excel time.`);
      return t;
    },
    duration(key, label) {
      const v = raw(key);
      if (isBlank(v) || excelErrorAt(key)) return undefined;
      const d = parseDuration(v);
      if (d === undefined)
        fail(key, `${label} ${shownValue(v)} is not a duration; type minutes as a number (such as 10) or h:mm text (such as 1:30).`);
      return d;
    },
  };
  return reader;
}
