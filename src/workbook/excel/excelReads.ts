import { cellAddress } from "../../sheets/cellAddress.js";
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
 * Cells read per request. Excel on the web caps a response at 5 MB (OFFICE-NOTES.md, "Resource
 * limits"); at 50 000 cells a block stays under it while cells average under 100 bytes of JSON
 * (a stops table's numbers, times and names do).
 */
export const READ_BLOCK_CELLS = 50_000;

/** What a values read needs to know first: where the block is and how big. */
const BLOCK_PROPS = "rowIndex, columnIndex, rowCount, columnCount";

/**
 * The values of a loaded range (`BLOCK_PROPS` loaded): in one more sync when it has at most
 * `READ_BLOCK_CELLS` cells, otherwise in row blocks of that many cells, one sync each, through
 * `worksheets.getItem(sheet).getRange(A1 block)` (ExcelApi 1.1).
 */
export async function readValues(
  context: Excel.RequestContext,
  sheet: string,
  range: Excel.Range,
  blockCells: number = READ_BLOCK_CELLS,
): Promise<SheetRead> {
  const { rowIndex: row, columnIndex: col, rowCount: rows, columnCount: cols } = range;
  if (!(rows * cols > blockCells)) {
    range.load("values");
    await context.sync();
    return { sheet, row, col, values: range.values };
  }
  const perBlock = Math.max(1, Math.floor(blockCells / Math.max(1, cols)));
  const values: unknown[][] = [];
  for (let r = 0; r < rows; r += perBlock) {
    const n = Math.min(perBlock, rows - r);
    const block = context.workbook.worksheets
      .getItem(sheet)
      .getRange(`${cellAddress(row + r, col)}:${cellAddress(row + r + n - 1, col + cols - 1)}`);
    block.load("values");
    await context.sync();
    values.push(...(block.values as unknown[][]));
  }
  return { sheet, row, col, values };
}

/**
 * Reads the selected block clipped to the used range, or the whole Excel table it lies
 * inside when `tables` (ExcelApi 1.9) is true. Two syncs only when a table is involved, one
 * more for the merged areas of what was read when `merges` (ExcelApi 1.13) is true, so a row of
 * merged group headers in the selection is told from the header as it is for a whole sheet.
 */
export async function readSelectionIn(
  context: Excel.RequestContext,
  tables: boolean,
  blockCells: number = READ_BLOCK_CELLS,
  merges = false,
): Promise<SelectionRead> {
  const range = context.workbook.getSelectedRange();
  range.load("address, rowIndex, columnIndex");
  const sheet = range.worksheet;
  sheet.load("name");
  const filled = range.getIntersectionOrNullObject(sheet.getUsedRange(true));
  filled.load(`isNullObject, address, ${BLOCK_PROPS}`);
  const found = tables ? range.getTables(false) : undefined;
  found?.load("items/name");
  await context.sync();
  const table = found?.items[0];
  const whole = table?.getRange();
  whole?.load(`address, ${BLOCK_PROPS}`);
  if (whole) await context.sync();
  if (filled.isNullObject) {
    return { read: { sheet: sheet.name, row: range.rowIndex, col: range.columnIndex, values: [] }, address: range.address };
  }
  const selected = { row: filled.rowIndex, col: filled.columnIndex, rows: filled.rowCount, cols: filled.columnCount };
  if (
    table &&
    whole &&
    blockContains({ row: whole.rowIndex, col: whole.columnIndex, rows: whole.rowCount, cols: whole.columnCount }, selected)
  ) {
    const read = await withMerges(context, await readValues(context, sheet.name, whole, blockCells), whole, merges);
    return { read, address: whole.address, tableName: table.name };
  }
  return {
    read: await withMerges(context, await readValues(context, sheet.name, filled, blockCells), filled, merges),
    address: filled.address,
  };
}

async function withMerges(context: Excel.RequestContext, read: SheetRead, range: Excel.Range, merges: boolean): Promise<SheetRead> {
  const areas = merges ? await readMerges(context, range) : [];
  return areas.length > 0 ? { ...read, merges: areas } : read;
}

/** A loaded range (values, rowIndex, columnIndex) as a `SheetRead`. */
export function toRead(sheet: string, range: Excel.Range): SheetRead {
  return { sheet, row: range.rowIndex, col: range.columnIndex, values: range.values };
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
