/**
 * The canvas part of the route map: route lines with direction arrows, stop markers (numbered
 * when there is room or the route is highlighted), depot squares, unassigned stops, a dashed ring
 * with a "?" around each place whose address matched doubtfully, and a scale bar.
 * Labels are not drawn here: they are DOM elements placed by `placeLabels`, so they stay
 * selectable, readable by tests and never overlap.
 */
import type { Box } from "./placeLabels.js";
import type { RouteStyle } from "./vehicleColour.js";

/** A point on the map, px. */
export interface MapPoint {
  readonly x: number;
  readonly y: number;
}

/** One route as drawn: its style and its points (depot, stops in order, depot). */
export interface DrawnRoute {
  readonly style: RouteStyle;
  readonly path: readonly MapPoint[];
  /** True for the highlighted route; false for the others while one is highlighted; undefined when none is. */
  readonly highlighted?: boolean;
}

/** Everything the canvas shows. */
export interface RouteLayer {
  readonly routes: readonly DrawnRoute[];
  readonly depots: readonly MapPoint[];
  readonly unassigned: readonly MapPoint[];
  /** Places whose geocoded address is doubtful (approximate, ambiguous, far away). */
  readonly doubtful?: readonly MapPoint[];
  readonly pxPerKm: number;
  /** Draw sequence numbers in every stop marker (the caller decides whether there is room). */
  readonly numbers: boolean;
}

/** Half the side of a depot square, px. */
export const DEPOT_HALF_PX = 6;
const STOP_RADIUS_PX = 4.5;
const NUMBERED_RADIUS_PX = 7.5;
const ARROW_MIN_LEG_PX = 28;

/**
 * Draw the layer on a cleared canvas context of `width x height` CSS px.
 *
 * @param ctx - a 2-D context already scaled to CSS px
 * @param layer - what to draw
 * @param height - canvas height in CSS px (the scale bar sits at the bottom left)
 * @returns the scale bar's box, which labels must avoid
 * @example const scaleBox = drawRouteLayer(ctx, layer, 260)
 */
export function drawRouteLayer(ctx: CanvasRenderingContext2D, layer: RouteLayer, height: number): Box {
  // Faded routes first, the highlighted one last so it is on top.
  const order = [...layer.routes].sort((a, b) => Number(a.highlighted === true) - Number(b.highlighted === true));
  for (const route of order) drawRoute(ctx, route, layer.numbers || route.highlighted === true);
  ctx.globalAlpha = 1;
  for (const p of layer.depots) {
    ctx.fillStyle = "#242424";
    ctx.strokeStyle = "#fff";
    ctx.lineWidth = 1.5;
    ctx.setLineDash([]);
    ctx.fillRect(p.x - DEPOT_HALF_PX, p.y - DEPOT_HALF_PX, 2 * DEPOT_HALF_PX, 2 * DEPOT_HALF_PX);
    ctx.strokeRect(p.x - DEPOT_HALF_PX, p.y - DEPOT_HALF_PX, 2 * DEPOT_HALF_PX, 2 * DEPOT_HALF_PX);
  }
  for (const p of layer.unassigned) {
    ctx.strokeStyle = "#6b6b6b";
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.moveTo(p.x - 4, p.y - 4);
    ctx.lineTo(p.x + 4, p.y + 4);
    ctx.moveTo(p.x + 4, p.y - 4);
    ctx.lineTo(p.x - 4, p.y + 4);
    ctx.stroke();
  }
  for (const p of layer.doubtful ?? []) drawDoubtful(ctx, p);
  return drawScale(ctx, layer.pxPerKm, height);
}

/** Radius of the ring around a doubtful place, px (outside a numbered stop marker). */
export const DOUBTFUL_RING_PX = 11;

/**
 * A doubtful geocode: a dashed dark ring around the place and a "?" badge at its upper right.
 * Shape, not colour, tells it apart, so it reads in any palette and over any route colour.
 *
 * @param ctx - a 2-D context scaled to CSS px
 * @param p - the place
 */
export function drawDoubtful(ctx: CanvasRenderingContext2D, p: MapPoint): void {
  ctx.globalAlpha = 1;
  ctx.lineWidth = 4;
  ctx.strokeStyle = "rgba(255,255,255,0.9)";
  ctx.setLineDash([]);
  ctx.beginPath();
  ctx.arc(p.x, p.y, DOUBTFUL_RING_PX, 0, 2 * Math.PI);
  ctx.stroke();
  ctx.lineWidth = 2;
  ctx.strokeStyle = "#242424";
  ctx.setLineDash([3, 3]);
  ctx.beginPath();
  ctx.arc(p.x, p.y, DOUBTFUL_RING_PX, 0, 2 * Math.PI);
  ctx.stroke();
  ctx.setLineDash([]);
  const bx = p.x + DOUBTFUL_RING_PX * 0.75;
  const by = p.y - DOUBTFUL_RING_PX * 0.75;
  ctx.fillStyle = "#242424";
  ctx.strokeStyle = "#fff";
  ctx.lineWidth = 1.5;
  ctx.beginPath();
  ctx.arc(bx, by, 5.5, 0, 2 * Math.PI);
  ctx.fill();
  ctx.stroke();
  ctx.fillStyle = "#fff";
  ctx.font = "700 9px Segoe UI, sans-serif";
  ctx.textAlign = "center";
  ctx.textBaseline = "middle";
  ctx.fillText("?", bx, by + 0.5);
  ctx.textAlign = "start";
  ctx.textBaseline = "alphabetic";
}

function drawRoute(ctx: CanvasRenderingContext2D, route: DrawnRoute, numbers: boolean): void {
  const { style, path } = route;
  ctx.globalAlpha = route.highlighted === false ? 0.22 : 1;
  const width = route.highlighted ? 3.5 : 2.5;
  ctx.lineJoin = "round";
  ctx.lineCap = "round";
  // A light casing under the line keeps pale colours (yellow, sky blue) visible on any background.
  strokePath(ctx, path, "rgba(255,255,255,0.9)", width + 2.5, []);
  strokePath(ctx, path, style.colour, width, style.dash);
  ctx.setLineDash([]);
  for (let i = 1; i < path.length; i++) drawArrow(ctx, path[i - 1]!, path[i]!, style.colour);
  const stops = path.slice(1, -1);
  const r = numbers ? NUMBERED_RADIUS_PX : STOP_RADIUS_PX;
  stops.forEach((p, i) => {
    ctx.fillStyle = "#fff";
    ctx.strokeStyle = style.colour;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(p.x, p.y, r, 0, 2 * Math.PI);
    ctx.fill();
    ctx.stroke();
    if (!numbers) return;
    ctx.fillStyle = "#242424";
    ctx.font = `600 ${i + 1 >= 100 ? 7 : 9}px Segoe UI, sans-serif`;
    ctx.textAlign = "center";
    ctx.textBaseline = "middle";
    ctx.fillText(String(i + 1), p.x, p.y + 0.5);
  });
  ctx.textAlign = "start";
  ctx.textBaseline = "alphabetic";
}

function strokePath(
  ctx: CanvasRenderingContext2D,
  path: readonly MapPoint[],
  colour: string,
  width: number,
  dash: readonly number[],
): void {
  ctx.strokeStyle = colour;
  ctx.lineWidth = width;
  ctx.setLineDash([...dash]);
  ctx.beginPath();
  path.forEach((p, i) => (i === 0 ? ctx.moveTo(p.x, p.y) : ctx.lineTo(p.x, p.y)));
  ctx.stroke();
}

/** A filled arrowhead at the middle of a leg, pointing the way the vehicle drives. */
function drawArrow(ctx: CanvasRenderingContext2D, a: MapPoint, b: MapPoint, colour: string): void {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len = Math.hypot(dx, dy);
  if (len < ARROW_MIN_LEG_PX) return;
  const ux = dx / len;
  const uy = dy / len;
  const mx = a.x + dx / 2 + ux * 3;
  const my = a.y + dy / 2 + uy * 3;
  const size = 6;
  ctx.fillStyle = colour;
  ctx.strokeStyle = "rgba(255,255,255,0.9)";
  ctx.lineWidth = 1;
  ctx.beginPath();
  ctx.moveTo(mx, my);
  ctx.lineTo(mx - ux * size * 1.6 - uy * size, my - uy * size * 1.6 + ux * size);
  ctx.lineTo(mx - ux * size * 1.6 + uy * size, my - uy * size * 1.6 - ux * size);
  ctx.closePath();
  ctx.fill();
  ctx.stroke();
}

function drawScale(ctx: CanvasRenderingContext2D, pxPerKm: number, height: number): Box {
  const km = niceStep(80 / pxPerKm);
  const px = km * pxPerKm;
  const x = 10;
  const y = height - 10;
  const label = `${km} km (straight line)`;
  ctx.globalAlpha = 1;
  ctx.setLineDash([]);
  ctx.font = "11px Segoe UI, sans-serif";
  const box = { x: x - 4, y: y - 18, w: Math.max(px, ctx.measureText(label).width + 8) + 8, h: 22 };
  // A light box keeps the scale readable over routes and tiles.
  ctx.fillStyle = "rgba(247,245,242,0.85)";
  ctx.fillRect(box.x, box.y, box.w, box.h);
  ctx.strokeStyle = "#424242";
  ctx.lineWidth = 1.5;
  ctx.beginPath();
  ctx.moveTo(x, y - 4);
  ctx.lineTo(x, y);
  ctx.lineTo(x + px, y);
  ctx.lineTo(x + px, y - 4);
  ctx.stroke();
  ctx.fillStyle = "#424242";
  ctx.fillText(label, x + 4, y - 5);
  return box;
}

/** 1, 2 or 5 times a power of ten, at most `x`. */
function niceStep(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * p;
}
