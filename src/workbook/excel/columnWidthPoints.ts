/**
 * Converts a column width in characters (what `SheetGrid.columnWidths` holds and what
 * Excel's own column-width box shows) to points (what Office.js `format.columnWidth` takes).
 *
 * Method: ECMA-376 Part 1, the `col` element's `width` (from memory: §18.3.1.13) counts
 * characters of the maximum digit width, which is 7 px for the default Calibri 11, plus
 * 5 px of cell padding; one pixel is 0.75 pt at 96 px per inch (CSS reference pixel).
 *
 * @param chars - width in characters (>= 0)
 * @returns width in points
 * @throws RangeError when `chars` is negative or not finite
 * @example columnWidthPoints(10) // 56.25  (75 px)
 */
export function columnWidthPoints(chars: number): number {
  if (!Number.isFinite(chars) || chars < 0) throw new RangeError(`chars must be a finite number >= 0, got ${chars}`);
  if (chars === 0) return 0;
  return Math.round(chars * MAX_DIGIT_WIDTH_PX + PADDING_PX) * POINTS_PER_PX;
}

const MAX_DIGIT_WIDTH_PX = 7;
const PADDING_PX = 5;
const POINTS_PER_PX = 72 / 96;
