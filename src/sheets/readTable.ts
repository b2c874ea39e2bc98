import type { Issue } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { cellAddress } from "./cellAddress.js";
import { isBlank } from "./cellValue.js";
import { findHeaderRow } from "./findHeaderRow.js";
import type { ColumnMapEntry } from "./columnMap.js";
import { mapColumns, type TableColumns, type TableKind } from "./matchHeaders.js";

/** A data row of a table: its raw cells and where it sits. */
export interface TableRow {
  /** 0-based row index in the sheet. */
  readonly sheetRow0: number;
  readonly cells: readonly unknown[];
}

/** A table found in a sheet range: header columns and the non-blank rows below it. */
export interface Table {
  readonly sheet: string;
  /** 0-based column of the range's first cell in the sheet. */
  readonly col0: number;
  /** 0-based sheet row of the header. */
  readonly headerRow0: number;
  readonly columns: TableColumns;
  readonly rows: readonly TableRow[];
}

/**
 * Find the header row of a range, map its columns, and collect the rows below it
 * (blank rows are skipped, not the end of the table).
 *
 * @param read - the sheet range as read
 * @param kind - which table is expected
 * @param columnMap - the user's column mappings (header -> field, carry or ignore)
 * @returns the table, or issues when the range is empty, has no header row or no data rows
 * @example readTable({ sheet: "Stops", row: 0, col: 0, values: [["Stop", "Lat", "Lon"], ["a", 1, 2]] }, "stops").table?.rows.length // => 1
 */
export function readTable(read: SheetRead, kind: TableKind, columnMap: readonly ColumnMapEntry[] = []): { table?: Table; issues: Issue[] } {
  const what = kind === "stops" ? "stops" : "vehicles";
  if (read.values.every((row) => row.every(isBlank))) {
    return {
      issues: [
        cellIssue(
          read.sheet,
          read.row,
          read.col,
          `the sheet is empty; add a header row and one row per ${kind === "stops" ? "stop" : "vehicle"} below it.`,
        ),
      ],
    };
  }
  const h = findHeaderRow(read.values, kind, read);
  if (h === undefined) {
    const examples =
      kind === "stops"
        ? "Stop, Name, Latitude, Longitude, Demand, Earliest, Latest"
        : "Vehicle, Capacity, Start latitude, Start longitude, Shift start, Shift end";
    return {
      issues: [
        cellIssue(
          read.sheet,
          read.row,
          read.col,
          `no header row found in the first 30 rows; put headers such as ${examples} above the ${what}.`,
        ),
      ],
    };
  }
  const headerRow0 = read.row + h;
  const columns = mapColumns(headerCells(read, h), kind, { sheet: read.sheet, row: headerRow0, col: read.col }, columnMap);
  const rows: TableRow[] = [];
  for (let r = h + 1; r < read.values.length; r++) {
    const cells = read.values[r] ?? [];
    if (!cells.every(isBlank)) rows.push({ sheetRow0: read.row + r, cells });
  }
  const issues = [...columns.issues];
  if (rows.length === 0) {
    issues.push(
      cellIssue(
        read.sheet,
        headerRow0 + 1,
        read.col,
        `the table has a header row but no ${what}; add one row per ${kind === "stops" ? "stop" : "vehicle"} from row ${headerRow0 + 2} down.`,
      ),
    );
  }
  return { table: { sheet: read.sheet, col0: read.col, headerRow0, columns, rows }, issues };
}

/**
 * An issue about one cell, its message prefixed with "Sheet!A1: ".
 *
 * @param sheet - sheet name
 * @param row0 - 0-based sheet row
 * @param col0 - 0-based sheet column
 * @param message - what is wrong and how to fix it
 * @returns the issue
 * @example cellIssue("Stops", 6, 4, "latitude 123.4 is outside -90..90").message // => "Stops!E7: latitude 123.4 is outside -90..90"
 */
export function cellIssue(sheet: string, row0: number, col0: number, message: string): Issue {
  const cell = cellAddress(row0, col0);
  return { sheet, cell, message: `${sheet}!${cell}: ${message}` };
}

/**
 * The header row's cells (row `h` of `read.values`), where a cell covered by a merge from the row above (a "Stop" header
 * merged over the group-header row and the header row) takes the merge's value, so both
 * adapters read the same header whatever they return for covered cells.
 *
 * @param read - the range as read, with its merged areas
 * @param h - 0-based row within `read.values`
 * @returns the header's cells
 * @example headerCells({ sheet: "S", row: 0, col: 0, values: [["Stop", "Where"], ["", "Lat"]], merges: [{ row: 0, col: 0, rows: 2, cols: 1 }] }, 1) // => ["Stop", "Lat"]
 */
export function headerCells(read: SheetRead, h: number): readonly unknown[] {
  const cells = [...(read.values[h] ?? [])];
  const row0 = read.row + h;
  for (const m of read.merges ?? []) {
    if (m.row >= row0 || m.row + m.rows <= row0) continue;
    const first = read.values[m.row - read.row]?.[m.col - read.col];
    for (let c = m.col; c < m.col + m.cols; c++) {
      const i = c - read.col;
      if (i >= 0 && i < cells.length && first !== undefined) cells[i] = first;
    }
  }
  return cells;
}
