/**
 * The route map in the pane: routes drawn on a canvas in a colour-blind-safe palette with
 * direction arrows and sequence numbers, depots as labelled squares, vehicle and depot labels
 * placed so they overlap neither each other nor a depot, a hover text per stop and depot, a
 * legend whose entries highlight their route (click or keyboard), and the whole map in words
 * for screen readers. Places whose geocoded address is doubtful get a dashed ring with a "?", a
 * legend entry, a line in their hover text and a list in the map in words. Offline by default (an equirectangular fit, nothing fetched); an optional
 * background supplies its own projection (see `TileBackground`).
 * The canvas' `data-routes`, `data-depots`, `data-doubtful` and `data-highlight` attributes say what was drawn, for tests.
 */
import type { LatLon, Plan, Problem } from "../core/index.js";
import { depotName, describeRoutes, stopHoverText } from "./describeRoutes.js";
import type { DoubtfulPlace } from "./doubtfulPlaces.js";
import { drawRouteLayer, type DrawnRoute, type MapPoint } from "./drawRouteLayer.js";
import { fitEquirectangular, type FittedProjection } from "./fitEquirectangular.js";
import { placeMapLabels } from "./mapLabels.js";
import { renderMapLegend } from "./mapLegend.js";
import { renderMapText } from "./mapText.js";
import { vehicleStyle, type RouteStyle } from "./vehicleColour.js";

/** The elements the map draws into (see taskpane.html). */
export interface RouteMapElements {
  /** The canvas (sized by CSS; redrawn at device resolution). */
  readonly canvas: HTMLCanvasElement;
  /** An absolutely positioned element inside the canvas' positioned parent. */
  readonly tooltip: HTMLElement;
  /** A layer over the canvas, same size, that receives the labels. */
  readonly labels: HTMLElement;
  /** A list that receives one entry per used vehicle. */
  readonly legend: HTMLElement;
  /** A visually hidden element that receives the map in words. */
  readonly text: HTMLElement;
}

/** Where the map gets its pixel positions: a fit of its own, or a background's projection. */
export interface MapProjector {
  /** Fit `points` into `width x height` px and return the projection to draw with. */
  fit(points: readonly LatLon[], width: number, height: number, paddingPx: number): FittedProjection | Promise<FittedProjection>;
}

interface HoverPoint extends MapPoint {
  readonly text: string;
}

/** Numbers go into every stop marker when no two stops are closer than this, px. */
const NUMBER_SPACING_PX = 17;
const PADDING_PX = 26;

const offline: MapProjector = { fit: (points, w, h, pad) => fitEquirectangular(points, w, h, pad) };

/** Draws a plan and answers hovers and legend clicks. */
export class RouteMap {
  private hoverPoints: HoverPoint[] = [];
  private last:
    { problem: Problem; plan: Plan; doubtful: readonly DoubtfulPlace[]; projection: FittedProjection; w: number; h: number } | undefined;
  private highlighted: string | undefined;
  private projector: MapProjector = offline;

  /** @param el - the map's elements */
  constructor(private readonly el: RouteMapElements) {
    el.canvas.addEventListener("mousemove", (e) => this.hover(e.offsetX, e.offsetY));
    el.canvas.addEventListener("mouseleave", () => (el.tooltip.hidden = true));
    window.addEventListener("resize", () => void (this.last && this.draw(this.last.problem, this.last.plan, this.last.doubtful)));
  }

  /**
   * Use `projector` for the next draws (a tile background), or the offline fit when undefined;
   * redraws the last plan.
   *
   * @param projector - the background's projection, or undefined for none
   * @example await map.setProjector(undefined)
   */
  async setProjector(projector: MapProjector | undefined): Promise<void> {
    this.projector = projector ?? offline;
    if (this.last) await this.draw(this.last.problem, this.last.plan, this.last.doubtful);
  }

  /**
   * Draw `plan` of `problem`, replacing what was there.
   *
   * @param problem - the solved problem (locations, stops, vehicles)
   * @param plan - its plan
   * @param doubtful - places whose geocoded address is doubtful (`doubtfulPlaces`), marked distinctly
   * @example await map.draw(read.problem, result.plan)
   */
  async draw(problem: Problem, plan: Plan, doubtful: readonly DoubtfulPlace[] = []): Promise<void> {
    const w = this.el.canvas.clientWidth || 320;
    const h = this.el.canvas.clientHeight || 260;
    const used = new Set<number>([
      ...problem.stops.map((s) => s.location),
      ...problem.vehicles.flatMap((v) => [v.startLocation, v.endLocation]),
    ]);
    const shown = [...used].map((i) => problem.locations[i]).filter((p) => p !== undefined);
    if (this.last?.plan !== plan) this.highlighted = undefined;
    if (shown.length === 0) return;
    const projection = await this.projector.fit(shown, w, h, PADDING_PX);
    this.last = { problem, plan, doubtful, projection, w, h };
    this.render();
  }

  /** Redraw the last plan with the last projection (after a highlight change). */
  private render(): void {
    const last = this.last;
    if (!last) return;
    const { problem, plan, doubtful, projection, w, h } = last;
    const canvas = this.el.canvas;
    const ratio = window.devicePixelRatio || 1;
    canvas.width = Math.round(w * ratio);
    canvas.height = Math.round(h * ratio);
    const ctx = canvas.getContext("2d");
    if (!ctx) return;
    ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
    ctx.clearRect(0, 0, w, h);
    const at = (loc: number): MapPoint => projection.project(problem.locations[loc] ?? { lat: 0, lon: 0 });

    this.hoverPoints = [];
    const routes: (DrawnRoute & { vehicle: string; stops: string[]; first: MapPoint; km: number })[] = [];
    const styles: (RouteStyle | undefined)[] = [];
    plan.routes.forEach((route, r) => {
      const vehicle = problem.vehicles[route.vehicle];
      if (!vehicle || route.visits.length === 0) return;
      const style = vehicleStyle(routes.length);
      styles[r] = style;
      const stops = route.visits.map((v) => at(problem.stops[v.stop]?.location ?? 0));
      route.visits.forEach((visit, i) =>
        this.hoverPoints.push({ ...stops[i]!, text: stopHoverText(problem, vehicle.id, visit, i + 1, route.visits.length) }),
      );
      routes.push({
        style,
        path: [at(vehicle.startLocation), ...stops, at(vehicle.endLocation)],
        highlighted: this.highlighted === undefined ? undefined : this.highlighted === vehicle.id,
        vehicle: vehicle.id,
        stops: route.visits.map((v) => problem.stops[v.stop]?.id ?? "?"),
        first: stops[0]!,
        km: route.distanceKm,
      });
    });
    const depotLocs = [...new Set(problem.vehicles.flatMap((v) => [v.startLocation, v.endLocation]))];
    const depots = depotLocs.map((loc) => ({ ...at(loc), name: depotName(problem, loc) }));
    for (const d of depots) this.hoverPoints.push({ x: d.x, y: d.y, text: `${d.name}\ndepot` });
    const unassigned = plan.unassigned.flatMap((u) => {
      const stop = problem.stops[u.stop];
      if (!stop) return [];
      const p = at(stop.location);
      this.hoverPoints.push({ ...p, text: `${stop.name || stop.id}\nnot served: ${u.reason}` });
      return [p];
    });
    const doubtfulAt = doubtful.map((d) => ({ ...d, ...at(d.location) }));
    // Hover on a doubtful place also says what its address was matched to.
    for (const d of doubtfulAt) {
      const line = `doubtful address match (${d.cell}): ${d.match}`;
      const i = this.hoverPoints.findIndex((p) => p.x === d.x && p.y === d.y);
      if (i >= 0) this.hoverPoints[i] = { ...this.hoverPoints[i]!, text: `${this.hoverPoints[i]!.text}\n${line}` };
      else this.hoverPoints.push({ x: d.x, y: d.y, text: `${d.name}\n${line}` });
    }
    const served = routes.flatMap((r) => r.path.slice(1, -1));
    const scaleBox = drawRouteLayer(
      ctx,
      { routes, depots, unassigned, doubtful: doubtfulAt, pxPerKm: projection.pxPerKm, numbers: isSparse(served) },
      h,
    );

    placeMapLabels(this.el.labels, ctx, depots, routes, scaleBox, w, h);
    renderMapLegend(this.el.legend, routes, doubtful.length, this.highlighted, (v) => this.toggleHighlight(v));
    const words = describeRoutes(
      problem,
      plan,
      styles.map((s) => (s ? `${s.colourName}${s.dash.length ? " dashed" : ""} line` : "")),
    );
    renderMapText(
      this.el.text,
      words,
      depots.map((d) => d.name),
      doubtful,
    );
    canvas.dataset.doubtful = JSON.stringify(
      doubtfulAt.map((d) => ({ name: d.name, cell: d.cell, x: Math.round(d.x), y: Math.round(d.y) })),
    );
    canvas.dataset.routes = JSON.stringify(routes.map((r) => ({ vehicle: r.vehicle, stops: r.stops })));
    canvas.dataset.highlight = this.highlighted ?? "";
    canvas.dataset.depots = JSON.stringify(depots.map((d) => ({ name: d.name, x: Math.round(d.x), y: Math.round(d.y) })));
  }

  private toggleHighlight(vehicle: string): void {
    this.highlighted = this.highlighted === vehicle ? undefined : vehicle;
    this.render();
    // The legend was rebuilt: keep keyboard focus on the entry the user pressed.
    this.el.legend.querySelector<HTMLButtonElement>(`button[data-vehicle="${CSS.escape(vehicle)}"]`)?.focus();
  }

  private hover(x: number, y: number): void {
    let best: HoverPoint | undefined;
    let bestD = 9 * 9;
    for (const p of this.hoverPoints) {
      const d = (p.x - x) ** 2 + (p.y - y) ** 2;
      if (d <= bestD) {
        best = p;
        bestD = d;
      }
    }
    const tip = this.el.tooltip;
    if (!best) {
      tip.hidden = true;
      return;
    }
    tip.textContent = best.text;
    tip.hidden = false;
    // Keep the whole text inside the map (CSS caps its width to the map's): right of the point when
    // it fits, else pushed left; above the point when it fits, else below.
    const wrapW = this.el.canvas.clientWidth;
    const wrapH = this.el.canvas.clientHeight;
    const left = clamp(best.x + 10, 2, wrapW - tip.offsetWidth - 2);
    const above = best.y - tip.offsetHeight - 10;
    const top = clamp(above >= 2 ? above : best.y + 12, 2, wrapH - tip.offsetHeight - 2);
    tip.style.left = `${left}px`;
    tip.style.top = `${top}px`;
  }
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.max(lo, Math.min(v, Math.max(lo, hi)));
}

/** True when no two points are closer than `NUMBER_SPACING_PX` (checked on a grid, so large plans stay fast). */
function isSparse(points: readonly MapPoint[]): boolean {
  const cell = NUMBER_SPACING_PX;
  const grid = new Map<string, MapPoint[]>();
  for (const p of points) {
    const gx = Math.floor(p.x / cell);
    const gy = Math.floor(p.y / cell);
    for (let dx = -1; dx <= 1; dx++)
      for (let dy = -1; dy <= 1; dy++)
        for (const q of grid.get(`${gx + dx},${gy + dy}`) ?? []) if (Math.hypot(p.x - q.x, p.y - q.y) < cell) return false;
    const key = `${gx},${gy}`;
    grid.set(key, [...(grid.get(key) ?? []), p]);
  }
  return true;
}
