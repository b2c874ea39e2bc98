import type { Issue } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { excelError, isBlank, plainCell, readNumber, shownValue } from "./cellValue.js";
import { cellIssue } from "./readTable.js";

/**
 * Read a user's distance matrix sheet (for example exported from a road-routing engine).
 *
 * Layout: the first non-blank row is the header; its first cell is a free label (such as
 * "km"), the cells to its right are location ids. Each row below starts with a location id
 * and holds the kilometres from that location to the location of each header column.
 * Ids are stop ids, vehicle names (for the vehicle's start depot; a vehicle's end depot when
 * it differs is named by the depot's location name) or "Depot" when the fleet has one depot;
 * matching ignores case and surrounding spaces. Rows and columns may come in any order, ids
 * the problem does not use are ignored, and an empty diagonal cell reads as 0. Minutes follow
 * from km at the settings speed.
 *
 * @param read - the matrix range
 * @param names - for each problem location, the ids that may name it
 * @returns the km table in problem location order, or the issues (missing ids, bad cells)
 * @example parseMatrixSheet({ sheet: "Km", row: 0, col: 0, values: [["km", "D", "a"], ["D", 0, 5], ["a", 6, 0]] }, [["D"], ["a"]]).distanceKm
 * // => [[0, 5], [6, 0]]
 */
export function parseMatrixSheet(read: SheetRead, names: readonly (readonly string[])[]): { distanceKm?: number[][]; issues: Issue[] } {
  const issues: Issue[] = [];
  const h = read.values.findIndex((row) => !row.every(isBlank));
  if (h < 0) {
    return {
      issues: [
        cellIssue(
          read.sheet,
          read.row,
          read.col,
          "the matrix sheet is empty; put location ids across the first row and down the first column, and km between them.",
        ),
      ],
    };
  }
  const index = new Map<string, number>();
  names.forEach((list, loc) => list.forEach((n) => index.set(norm(n), loc)));
  const header = read.values[h] ?? [];
  const colOf = new Map<number, number>(); // location -> column in values
  header.forEach((raw, c) => {
    if (c === 0 || isBlank(raw)) return;
    const loc = index.get(norm(String(plainCell(raw))));
    if (loc === undefined) return;
    if (colOf.has(loc))
      issues.push(cellIssue(read.sheet, read.row + h, read.col + c, `location ${shownValue(raw)} heads two columns; keep one.`));
    else colOf.set(loc, c);
  });
  const rowOf = new Map<number, number>();
  for (let r = h + 1; r < read.values.length; r++) {
    const raw = read.values[r]?.[0];
    if (isBlank(raw)) continue;
    const loc = index.get(norm(String(plainCell(raw))));
    if (loc === undefined) continue;
    if (rowOf.has(loc))
      issues.push(cellIssue(read.sheet, read.row + r, read.col, `location ${shownValue(raw)} starts two rows; keep one.`));
    else rowOf.set(loc, r);
  }
  names.forEach((list, loc) => {
    const id = list[0] ?? `location ${loc + 1}`;
    if (!colOf.has(loc))
      issues.push(cellIssue(read.sheet, read.row + h, read.col, `location "${id}" has no column; add a header cell "${id}" and its km.`));
    if (!rowOf.has(loc))
      issues.push(
        cellIssue(read.sheet, read.row + h, read.col, `location "${id}" has no row; add a row starting with "${id}" and its km.`),
      );
  });
  if (issues.length > 0) return { issues };
  const n = names.length;
  const distanceKm: number[][] = [];
  for (let i = 0; i < n; i++) {
    const r = rowOf.get(i)!;
    const row: number[] = [];
    for (let j = 0; j < n; j++) {
      const c = colOf.get(j)!;
      const raw = read.values[r]?.[c];
      const e = excelError(raw);
      const km = isBlank(raw) && i === j ? 0 : readNumber(raw);
      if (e !== undefined)
        issues.push(cellIssue(read.sheet, read.row + r, read.col + c, `the cell shows the Excel error ${e}; type the km.`));
      else if (km === undefined || km < 0)
        issues.push(
          cellIssue(read.sheet, read.row + r, read.col + c, `${shownValue(raw)} is not a distance; type km as a number of 0 or more.`),
        );
      row.push(km ?? 0);
    }
    distanceKm.push(row);
  }
  return issues.length > 0 ? { issues } : { distanceKm, issues };
}

function norm(id: string): string {
  return id.trim().toLowerCase();
}

/**
 * Whether a sheet reads as a distance matrix, for offering it in a picker: its first non-blank
 * row names at least two locations after a label cell, and `parseMatrixSheet`, given those ids
 * as the locations, finds a row for each and a number in every cell between them.
 *
 * @param read - the sheet's used range
 * @returns true for a square table of km headed by location ids
 * @example looksLikeMatrixSheet({ sheet: "Km", row: 0, col: 0, values: [["km", "D", "a"], ["D", 0, 5], ["a", 6, 0]] }) // => true
 */
export function looksLikeMatrixSheet(read: SheetRead): boolean {
  const header = read.values.find((row) => !row.every(isBlank)) ?? [];
  const ids = header.slice(1).filter((c) => !isBlank(c) && excelError(c) === undefined);
  if (ids.length < 2) return false;
  return (
    parseMatrixSheet(
      read,
      ids.map((c) => [String(plainCell(c))]),
    ).distanceKm !== undefined
  );
}
