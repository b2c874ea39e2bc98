import type { CellBlock, SheetRead } from "../../sheets/grid.js";
import { isItemNotFound } from "./OfficeActionError.js";
import { blockContains } from "./rangeAddress.js";

/** The selected block, or the whole Excel table it lies in. */
export interface SelectionRead {
  readonly read: SheetRead;
  /** Sheet-qualified address as Excel reports it, e.g. "Stops!A1:J81". */
  readonly address: string;
  /** Set when the selection lay inside an Excel table and the whole table was read. */
  readonly tableName?: string;
}

/** Loads the used range of a sheet in one sync; `undefined` when the sheet does not exist. */
export async function readUsedRange(context: Excel.RequestContext, name: string, properties: string): Promise<Excel.Range | undefined> {
  const used = context.workbook.worksheets.getItem(name).getUsedRangeOrNullObject(true);
  used.load(properties);
  try {
    await context.sync();
  } catch (error) {
    if (isItemNotFound(error)) return undefined;
    throw error;
  }
  return used;
}

/**
 * Reads the selected block clipped to the used range, or the whole Excel table it lies
 * inside when `tables` (ExcelApi 1.9) is true. Two syncs only when a table is involved.
 */
export async function readSelectionIn(context: Excel.RequestContext, tables: boolean): Promise<SelectionRead> {
  const range = context.workbook.getSelectedRange();
  range.load("address, rowIndex, columnIndex");
  const sheet = range.worksheet;
  sheet.load("name");
  const filled = range.getIntersectionOrNullObject(sheet.getUsedRange(true));
  filled.load("isNullObject, address, values, rowIndex, columnIndex");
  const found = tables ? range.getTables(false) : undefined;
  found?.load("items/name");
  await context.sync();
  const selection: SelectionRead = filled.isNullObject
    ? { read: { sheet: sheet.name, row: range.rowIndex, col: range.columnIndex, values: [] }, address: range.address }
    : { read: toRead(sheet.name, filled), address: filled.address };
  const table = found?.items[0];
  if (table) {
    const whole = table.getRange();
    whole.load("address, values, rowIndex, columnIndex");
    await context.sync();
    const tableRead = toRead(sheet.name, whole);
    if (selection.read.values.length > 0 && blockContains(blockOf(tableRead), blockOf(selection.read))) {
      return { read: tableRead, address: whole.address, tableName: table.name };
    }
  }
  return selection;
}

/** A loaded range (values, rowIndex, columnIndex) as a `SheetRead`. */
export function toRead(sheet: string, range: Excel.Range): SheetRead {
  return { sheet, row: range.rowIndex, col: range.columnIndex, values: range.values };
}

function blockOf(read: SheetRead): { row: number; col: number; rows: number; cols: number } {
  return { row: read.row, col: read.col, rows: read.values.length, cols: read.values[0]?.length ?? 0 };
}

/**
 * The merged areas of a loaded range (ExcelApi 1.13), in one more sync. Excel reads the other
 * cells of a merge as empty, so the header search needs the areas only to tell a group-header
 * row from the header; without them (older Excel, more than 512 areas, a proxy without the
 * member) the read goes on with none.
 *
 * @param context - the request context
 * @param range - a loaded, non-null range
 * @returns the areas in sheet coordinates (0-based)
 * @example await readMerges(context, used) // => [{ row: 0, col: 1, rows: 1, cols: 3 }]
 */
export async function readMerges(context: Excel.RequestContext, range: Excel.Range): Promise<CellBlock[]> {
  if (typeof range.getMergedAreasOrNullObject !== "function") return [];
  try {
    const merged = range.getMergedAreasOrNullObject();
    merged.load("isNullObject");
    merged.areas.load("items/rowIndex, items/columnIndex, items/rowCount, items/columnCount");
    await context.sync();
    if (merged.isNullObject) return [];
    return merged.areas.items.map((a) => ({ row: a.rowIndex, col: a.columnIndex, rows: a.rowCount, cols: a.columnCount }));
  } catch {
    return [];
  }
}
