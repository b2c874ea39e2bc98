import { drawDoubtful } from "./drawRouteLayer.js";
import type { RouteStyle } from "./vehicleColour.js";

/**
 * The route map's legend in `target`: one button per used vehicle (colour and dash of its route,
 * stops and km) that calls `toggle` to highlight its route, pressed while `highlighted`; and, when
 * places are doubtful, a key for their marker.
 */
export function renderMapLegend(
  target: HTMLElement,
  routes: readonly { vehicle: string; style: RouteStyle; stops: string[]; km: number }[],
  doubtful: number,
  highlighted: string | undefined,
  toggle: (vehicle: string) => void,
): void {
  const notes: HTMLElement[] = [];
  if (doubtful > 0) {
    // The legend's key for the doubtful marker: the same ring and "?" drawn on a small canvas.
    const item = document.createElement("li");
    item.className = "legend-note doubtful";
    const key = document.createElement("canvas");
    const ratio = window.devicePixelRatio || 1;
    key.width = Math.round(28 * ratio);
    key.height = Math.round(28 * ratio);
    key.className = "legend-key";
    key.setAttribute("aria-hidden", "true");
    const kctx = key.getContext("2d");
    if (kctx) {
      kctx.setTransform(ratio, 0, 0, ratio, 0, 0);
      drawDoubtful(kctx, { x: 13, y: 15 });
    }
    item.append(key, `doubtful address match (${doubtful}): check the place; see the geocoding review`);
    notes.push(item);
  }
  target.replaceChildren(
    ...routes.map((r) => {
      const item = document.createElement("li");
      const button = document.createElement("button");
      button.type = "button";
      button.className = "legend-entry";
      button.dataset.vehicle = r.vehicle;
      button.setAttribute("aria-pressed", String(highlighted === r.vehicle));
      button.title = highlighted === r.vehicle ? "Show all routes" : `Highlight the route of ${r.vehicle}`;
      const swatch = document.createElement("span");
      swatch.className = "swatch";
      swatch.style.borderTopColor = r.style.colour;
      swatch.style.borderTopStyle =
        r.style.dash.length === 0 ? "solid" : r.style.dash.length === 2 ? (r.style.dash[0]! > 4 ? "dashed" : "dotted") : "double";
      button.append(swatch, `${r.vehicle}: ${r.stops.length} stops, ${Math.round(r.km * 10) / 10} km`);
      button.addEventListener("click", () => toggle(r.vehicle));
      item.append(button);
      return item;
    }),
    ...notes,
  );
}
