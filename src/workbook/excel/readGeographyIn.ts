import { geographyFromCell, type GeographyCell } from "./geographyFromCell.js";
import { OfficeActionError } from "./OfficeActionError.js";
import { blockA1 } from "./rangeAddress.js";

/** Coordinates found in Geography cells, or why none could be read. */
export type GeographyRead =
  | { readonly available: false; readonly reason: string }
  | {
      readonly available: true;
      readonly sheet: string;
      /** 0-based row and column of `cells[0][0]`. */
      readonly row: number;
      readonly col: number;
      readonly cells: readonly (readonly GeographyCell[])[];
    };

/**
 * Rows of `valuesAsJson` read per request. A linked entity's JSON carries its properties
 * (several kilobytes each, size unverified), so this stays far below the 2 MB a request the
 * adapter budgets for (Excel on the web caps a response at 5 MB, OFFICE-NOTES.md).
 */
export const GEOGRAPHY_ROWS_PER_READ = 100;

/**
 * Reads `valuesAsJson` (ExcelApi 1.16) of a block in row blocks, one sync each, and the
 * coordinates of its Geography cells. Never throws for Office's sake: a proxy without the
 * member (office.js builds that lack it although the host reports 1.16) or any failure gives
 * `available: false` with the reason, so the caller keeps the plain values.
 */
export async function readGeographyIn(
  context: Excel.RequestContext,
  sheet: string,
  block: { readonly row: number; readonly col: number; readonly rows: number; readonly cols: number },
): Promise<GeographyRead> {
  const cells: GeographyCell[][] = [];
  try {
    const ws = context.workbook.worksheets.getItem(sheet);
    for (let r = 0; r < block.rows; r += GEOGRAPHY_ROWS_PER_READ) {
      const rows = Math.min(GEOGRAPHY_ROWS_PER_READ, block.rows - r);
      const target = ws.getRange(blockA1({ row: block.row + r, col: block.col, rows, cols: block.cols }));
      if (!("valuesAsJson" in target)) {
        return { available: false, reason: "this Excel's office.js has no Range.valuesAsJson, so Geography cells cannot be read" };
      }
      target.load("valuesAsJson");
      await context.sync();
      const json: unknown = target.valuesAsJson;
      if (!Array.isArray(json)) return { available: false, reason: "Excel returned no valuesAsJson for the Geography cells" };
      for (const row of json as unknown[]) cells.push(Array.isArray(row) ? row.map((cell) => geographyFromCell(cell)) : []);
    }
  } catch (error) {
    return { available: false, reason: new OfficeActionError("read the Geography cells", error).message };
  }
  return { available: true, sheet, row: block.row, col: block.col, cells };
}
