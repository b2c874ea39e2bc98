import type { CellValue } from "./grid.js";
import { roundTo } from "./numberFormats.js";

/**
 * The Load cell of a route row: one load dimension as a number, several as text joined with
 * " / " ("120 kg / 8 crates"), none as an empty cell. Values are rounded to 0.01 so sums of
 * fractional demands do not show floating-point noise.
 *
 * @param load - load per dimension
 * @param dimensions - names of the load dimensions (same length)
 * @returns a number, a safe text, or null
 * @throws RangeError when the lengths differ
 * @example formatLoad([120, 8], ["kg", "crates"]) // => "120 kg / 8 crates"
 * @example formatLoad([120], ["kg"]) // => 120
 */
export function formatLoad(load: readonly number[], dimensions: readonly string[]): CellValue {
  if (load.length !== dimensions.length) {
    throw new RangeError(`loadCell: load has ${load.length} values for ${dimensions.length} dimensions`);
  }
  if (load.length === 0) return null;
  if (load.length === 1) return roundTo(load[0]!, 2);
  return load.map((x, i) => `${roundTo(x, 2)} ${dimensions[i]!}`.trim()).join(" / ");
}
