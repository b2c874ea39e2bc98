import { geographyFromCell, type GeographyCell } from "./geographyFromCell.js";

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

/** Reads `valuesAsJson` (ExcelApi 1.16) of `sheet!range` and the coordinates of its Geography cells. */
export async function readGeographyIn(context: Excel.RequestContext, sheet: string, range: string): Promise<GeographyRead> {
  const target = context.workbook.worksheets.getItem(sheet).getRange(range);
  target.load("valuesAsJson, rowIndex, columnIndex");
  await context.sync();
  const cells = target.valuesAsJson.map((row) => row.map((cell) => geographyFromCell(cell)));
  return { available: true, sheet, row: target.rowIndex, col: target.columnIndex, cells };
}
