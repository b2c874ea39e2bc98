/**
 * Greedy point-label placement: each label tries candidate positions around its anchor, nearest
 * first (the eight-position model of cartographic point labelling, common practice), and takes
 * the first whose bounding box stays inside the map and overlaps neither an obstacle (a depot
 * marker) nor a label placed before it. A label that finds no free place is left out rather than
 * drawn over another; the legend still names it.
 */

/** An axis-aligned box in pixels (y grows downwards). */
export interface Box {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

/** A label to place: its anchor point and its size in pixels. */
export interface LabelRequest {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

/** Options of `placeLabels`. */
export interface PlaceLabelsOptions {
  /** The map's size; every placed box stays inside it. */
  readonly width: number;
  readonly height: number;
  /** Boxes no label may overlap (depot markers, a scale bar ...). */
  readonly obstacles?: readonly Box[];
  /** Gap between the anchor and the label, px (default 6). */
  readonly gapPx?: number;
  /** How many rings of candidates, each one gap further out (default 6). */
  readonly rings?: number;
}

/**
 * Place labels in the given order (put the most important first).
 *
 * @param labels - anchors and sizes, px
 * @param options - the map's size, obstacles, gap and number of candidate rings
 * @returns one box per label, or `undefined` where no free place was found
 * @throws RangeError when the map size is not positive
 * @example placeLabels([{ x: 50, y: 50, w: 20, h: 10 }], { width: 100, height: 100 }) // => [{ x: 56, y: 39, w: 20, h: 10 }]
 */
export function placeLabels(labels: readonly LabelRequest[], options: PlaceLabelsOptions): (Box | undefined)[] {
  const { width, height } = options;
  if (!(width > 0 && height > 0)) throw new RangeError(`width and height must be > 0, got ${width} x ${height}`);
  const gap = options.gapPx ?? 6;
  const rings = options.rings ?? 6;
  const taken: Box[] = [...(options.obstacles ?? [])];
  return labels.map((label) => {
    for (let ring = 0; ring < rings; ring++) {
      for (const box of candidates(label, gap * (ring + 1))) {
        if (!isInside(box, width, height)) continue;
        if (taken.some((t) => overlaps(t, box))) continue;
        taken.push(box);
        return box;
      }
    }
    return undefined;
  });
}

/**
 * Whether two boxes share any area (touching edges do not count).
 *
 * @param a - a box
 * @param b - another box
 * @returns true when the interiors intersect
 * @example overlaps({ x: 0, y: 0, w: 10, h: 10 }, { x: 10, y: 0, w: 5, h: 5 }) // => false
 */
export function overlaps(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

/** Upper right, right, lower right, upper left, left, lower left, above, below: the usual preference order. */
function candidates(l: LabelRequest, d: number): Box[] {
  const { x, y, w, h } = l;
  return [
    { x: x + d, y: y - d - h * 0.5, w, h },
    { x: x + d, y: y - h / 2, w, h },
    { x: x + d, y: y + d - h * 0.5, w, h },
    { x: x - d - w, y: y - d - h * 0.5, w, h },
    { x: x - d - w, y: y - h / 2, w, h },
    { x: x - d - w, y: y + d - h * 0.5, w, h },
    { x: x - w / 2, y: y - d - h, w, h },
    { x: x - w / 2, y: y + d, w, h },
  ];
}

function isInside(b: Box, width: number, height: number): boolean {
  return b.x >= 0 && b.y >= 0 && b.x + b.w <= width && b.y + b.h <= height;
}
