import type { CellValue } from "../../sheets/grid.js";

/**
 * Writes `values` into the empty cells of the block at (`row`, `col`) of `sheet` in the batch of
 * `context`: one sync reads the block, one writes it with `null` for every cell to keep (Office.js
 * leaves a cell given `null` in a 2-D array unchanged: "Blank and null values in Excel add-ins").
 *
 * @param width - the block's width (the longest row of `values`, at least 1)
 * @returns how many cells were written
 */
export async function fillEmptyCellsIn(
  context: Excel.RequestContext,
  sheet: string,
  row: number,
  col: number,
  values: readonly (readonly CellValue[])[],
  width: number,
): Promise<number> {
  const range = context.workbook.worksheets.getItem(sheet).getRangeByIndexes(row, col, values.length, width);
  range.load("values");
  await context.sync();
  let written = 0;
  const grid = range.values.map((line, r) =>
    line.map((now, c) => {
      const v = values[r]?.[c] ?? null;
      if (v === null || v === "" || (now !== "" && now !== null)) return null;
      written++;
      return v;
    }),
  );
  if (written === 0) return 0;
  range.values = grid as unknown as (string | number | boolean)[][];
  await context.sync();
  return written;
}
