/**
 * Kiln's route palette: the eight colours of Okabe & Ito (2008), "Color Universal Design (CUD):
 * how to make figures and presentations that are friendly to colorblind people" — a qualitative
 * scheme chosen so that people with protan, deutan or tritan colour vision can tell them apart.
 * Hex values as published there (from memory: the sRGB values Okabe & Ito list for each colour).
 * Order: the strongest colours on a light map first; yellow last, as it is faint on white.
 */
export const ROUTE_PALETTE = [
  { name: "blue", hex: "#0072B2" },
  { name: "vermillion", hex: "#D55E00" },
  { name: "bluish green", hex: "#009E73" },
  { name: "reddish purple", hex: "#CC79A7" },
  { name: "orange", hex: "#E69F00" },
  { name: "sky blue", hex: "#56B4E9" },
  { name: "black", hex: "#000000" },
  { name: "yellow", hex: "#F0E442" },
] as const;

/** Line dash patterns (px) for the second, third ... lap through the palette. */
const DASHES: readonly (readonly number[])[] = [[], [8, 4], [2, 3], [10, 3, 2, 3]];

/** How a route is drawn: a colour from the palette and a dash pattern (empty: solid). */
export interface RouteStyle {
  /** CSS colour (hex). */
  readonly colour: string;
  /** The palette colour's name, for the legend's text. */
  readonly colourName: string;
  /** Canvas line dash (px); empty for a solid line. */
  readonly dash: readonly number[];
}

/**
 * The style of the route of vehicle number `index`: colours repeat after eight, each lap with a
 * different dash pattern, so no two of the first 32 routes look alike (colour is never the only cue).
 *
 * @param index - 0-based vehicle index (>= 0)
 * @returns the route's colour, colour name and dash pattern
 * @throws RangeError on a negative or non-integer index
 * @example vehicleStyle(1) // => { colour: "#D55E00", colourName: "vermillion", dash: [] }
 */
export function vehicleStyle(index: number): RouteStyle {
  if (!(Number.isInteger(index) && index >= 0)) throw new RangeError(`index must be a non-negative integer, got ${index}`);
  const entry = ROUTE_PALETTE[index % ROUTE_PALETTE.length]!;
  const lap = Math.floor(index / ROUTE_PALETTE.length);
  return { colour: entry.hex, colourName: entry.name, dash: DASHES[lap % DASHES.length]! };
}

/**
 * The colour of the route of vehicle number `index` (see `vehicleStyle` for the dash pattern).
 *
 * @param index - 0-based vehicle index (>= 0)
 * @returns a CSS colour
 * @throws RangeError on a negative or non-integer index
 * @example vehicleColour(0) // => "#0072B2"
 */
export function vehicleColour(index: number): string {
  return vehicleStyle(index).colour;
}
