import { DEPOT_HALF_PX, type MapPoint } from "./drawRouteLayer.js";
import { placeLabels, type Box, type LabelRequest } from "./placeLabels.js";
import type { RouteStyle } from "./vehicleColour.js";

const LABEL_FONT = "600 11px Segoe UI, sans-serif";
const LABEL_H_PX = 16;
const LABEL_PAD_PX = 4;

/**
 * The route map's depot and vehicle labels as elements in `target` (the layer over the canvas),
 * placed by `placeLabels` so they overlap neither each other, a depot nor the scale bar; labels
 * that find no place are left out and counted in `target.dataset.omitted`.
 */
export function placeMapLabels(
  target: HTMLElement,
  ctx: CanvasRenderingContext2D,
  depots: readonly (MapPoint & { name: string })[],
  routes: readonly { vehicle: string; first: MapPoint; style: RouteStyle }[],
  scaleBox: Box,
  w: number,
  h: number,
): void {
  ctx.font = LABEL_FONT;
  // A long name (a depot shared by many vehicles) is cut with an ellipsis so it still finds a place;
  // its hover text and the map in words carry it in full.
  const maxW = Math.round(Math.max(90, Math.min(220, w * 0.5)));
  const size = (text: string) => ({ w: Math.min(maxW, Math.ceil(ctx.measureText(text).width) + 2 * LABEL_PAD_PX + 2), h: LABEL_H_PX });
  const depotBoxes = depots.map((d) => ({
    x: d.x - DEPOT_HALF_PX - 1,
    y: d.y - DEPOT_HALF_PX - 1,
    w: 2 * DEPOT_HALF_PX + 2,
    h: 2 * DEPOT_HALF_PX + 2,
  }));
  // Depots first: a depot's name matters more than where a vehicle's label sits.
  const requests: (LabelRequest & { text: string; kind: "depot" | "vehicle"; colour?: string })[] = [
    ...depots.map((d) => ({ x: d.x, y: d.y, ...size(d.name), text: d.name, kind: "depot" as const })),
    ...routes.map((r) => ({
      x: r.first.x,
      y: r.first.y,
      ...size(r.vehicle),
      text: r.vehicle,
      kind: "vehicle" as const,
      colour: r.style.colour,
    })),
  ];
  const boxes = placeLabels(requests, { width: w, height: h, obstacles: [...depotBoxes, scaleBox] });
  const nodes: HTMLElement[] = [];
  requests.forEach((req, i) => {
    const box = boxes[i];
    if (!box) return;
    const span = document.createElement("span");
    span.className = `map-label ${req.kind}`;
    span.textContent = req.text;
    span.style.left = `${box.x}px`;
    span.style.top = `${box.y}px`;
    span.style.width = `${box.w}px`;
    span.style.height = `${box.h}px`;
    if (req.colour) span.style.borderLeftColor = req.colour;
    nodes.push(span);
  });
  target.replaceChildren(...nodes);
  target.dataset.omitted = String(boxes.filter((b) => !b).length);
}
