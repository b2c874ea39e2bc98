/** Kiln's route palette: ten hues that stay apart on a light map and in a legend. */
const PALETTE = ["#c2410c", "#1d4ed8", "#15803d", "#7e22ce", "#be185d", "#0e7490", "#854d0e", "#4d7c0f", "#4338ca", "#475569"] as const;

/**
 * The colour of the route of vehicle number `index`; hues repeat after ten, darker on each lap.
 *
 * @param index - 0-based vehicle index (>= 0)
 * @returns a CSS colour
 * @throws RangeError on a negative or non-integer index
 * @example vehicleColour(0) // => "#c2410c"
 */
export function vehicleColour(index: number): string {
  if (!(Number.isInteger(index) && index >= 0)) throw new RangeError(`index must be a non-negative integer, got ${index}`);
  const base = PALETTE[index % PALETTE.length]!;
  const lap = Math.floor(index / PALETTE.length);
  return lap === 0 ? base : `color-mix(in srgb, ${base} ${Math.max(40, 100 - lap * 25)}%, black)`;
}
