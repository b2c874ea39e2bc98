/**
 * The routes drawn on a canvas: stops and depots projected from latitude/longitude (no tile
 * server, nothing fetched), one colour per vehicle, a hover tooltip with the stop's name,
 * arrival and load. The canvas' `data-routes` attribute lists the drawn routes for tests.
 */
import type { Plan, Problem } from "../core/index.js";
import { fitEquirectangular } from "./fitEquirectangular.js";
import { formatClock } from "./formatClock.js";
import { vehicleColour } from "./vehicleColour.js";

interface HoverPoint {
  readonly x: number;
  readonly y: number;
  readonly text: string;
}

/** Draws a plan and answers hovers. */
export class RouteMap {
  private hoverPoints: HoverPoint[] = [];
  private last: { problem: Problem; plan: Plan } | undefined;

  /**
   * @param canvas - the canvas to draw on (sized by CSS; redrawn at device resolution)
   * @param tooltip - an absolutely positioned element inside the canvas' positioned parent
   * @param legend - a list element that receives one item per used vehicle
   */
  constructor(
    private readonly canvas: HTMLCanvasElement,
    private readonly tooltip: HTMLElement,
    private readonly legend: HTMLElement,
  ) {
    canvas.addEventListener("mousemove", (e) => this.hover(e.offsetX, e.offsetY));
    canvas.addEventListener("mouseleave", () => (this.tooltip.hidden = true));
    window.addEventListener("resize", () => this.last && this.draw(this.last.problem, this.last.plan));
  }

  /**
   * Draw `plan` of `problem`, replacing what was there.
   *
   * @param problem - the solved problem (locations, stops, vehicles)
   * @param plan - its plan
   * @example map.draw(read.problem, result.plan)
   */
  draw(problem: Problem, plan: Plan): void {
    this.last = { problem, plan };
    const cssW = this.canvas.clientWidth || 320;
    const cssH = this.canvas.clientHeight || 260;
    const ratio = window.devicePixelRatio || 1;
    this.canvas.width = Math.round(cssW * ratio);
    this.canvas.height = Math.round(cssH * ratio);
    const ctx = this.canvas.getContext("2d");
    if (!ctx) return;
    ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
    ctx.clearRect(0, 0, cssW, cssH);
    const used = new Set<number>([
      ...problem.stops.map((s) => s.location),
      ...problem.vehicles.flatMap((v) => [v.startLocation, v.endLocation]),
    ]);
    const shown = [...used].map((i) => problem.locations[i]).filter((p) => p !== undefined);
    if (shown.length === 0) return;
    const proj = fitEquirectangular(shown, cssW, cssH, 22);
    const at = (loc: number) => proj.project(problem.locations[loc] ?? { lat: 0, lon: 0 });
    this.hoverPoints = [];
    this.legend.replaceChildren();
    const drawn: { vehicle: string; stops: string[] }[] = [];
    // The scale goes first, under routes and depots, so it never hides a depot.
    this.drawScale(ctx, proj.pxPerKm, cssH);

    plan.routes.forEach((route, r) => {
      if (route.visits.length === 0) return;
      const vehicle = problem.vehicles[route.vehicle];
      if (!vehicle) return;
      const colour = vehicleColour(r);
      const path = [vehicle.startLocation, ...route.visits.map((v) => problem.stops[v.stop]?.location ?? 0), vehicle.endLocation];
      ctx.strokeStyle = colour;
      ctx.lineWidth = 2;
      ctx.lineJoin = "round";
      ctx.beginPath();
      path.forEach((loc, i) => {
        const p = at(loc);
        if (i === 0) ctx.moveTo(p.x, p.y);
        else ctx.lineTo(p.x, p.y);
      });
      ctx.stroke();
      route.visits.forEach((visit, i) => {
        const stop = problem.stops[visit.stop];
        if (!stop) return;
        const p = at(stop.location);
        ctx.fillStyle = "#fff";
        ctx.beginPath();
        ctx.arc(p.x, p.y, 4.5, 0, 2 * Math.PI);
        ctx.fill();
        ctx.lineWidth = 2;
        ctx.stroke();
        const load = visit.loadAfter.map((l, d) => `${round1(l)} ${problem.loadDimensions[d] ?? ""}`.trim()).join(", ");
        this.hoverPoints.push({
          x: p.x,
          y: p.y,
          text: `${stop.name || stop.id} · ${vehicle.id} #${i + 1} · arrives ${formatClock(visit.arrivalMin)} · load after ${load}`,
        });
      });
      // The vehicle label sits at its first stop, so routes from one depot stay distinguishable.
      const first = route.visits[0];
      const firstStop = first ? problem.stops[first.stop] : undefined;
      if (firstStop) {
        const p = at(firstStop.location);
        ctx.font = "600 11px Segoe UI, sans-serif";
        // Keep the label inside the canvas: flip it to the left of the stop near the right edge.
        const labelW = ctx.measureText(vehicle.id).width;
        const lx = p.x + 7 + labelW > cssW - 2 ? p.x - 7 - labelW : p.x + 7;
        const ly = Math.max(12, p.y - 6);
        ctx.lineWidth = 3;
        ctx.strokeStyle = "rgba(255,255,255,0.9)";
        ctx.strokeText(vehicle.id, lx, ly);
        ctx.fillStyle = colour;
        ctx.fillText(vehicle.id, lx, ly);
      }
      drawn.push({ vehicle: vehicle.id, stops: route.visits.map((v) => problem.stops[v.stop]?.id ?? "?") });
      const item = document.createElement("li");
      const swatch = document.createElement("span");
      swatch.className = "swatch";
      swatch.style.background = colour;
      item.append(swatch, `${vehicle.id}: ${route.visits.length} stops, ${round1(route.distanceKm)} km`);
      this.legend.append(item);
    });

    // Depots on top: a dark square.
    const depots = new Set(problem.vehicles.flatMap((v) => [v.startLocation, v.endLocation]));
    for (const loc of depots) {
      const p = at(loc);
      ctx.fillStyle = "#242424";
      ctx.fillRect(p.x - 5, p.y - 5, 10, 10);
      const name = problem.locations[loc]?.name ?? "Depot";
      this.hoverPoints.push({ x: p.x, y: p.y, text: `${name} (depot)` });
    }
    // Unassigned stops: grey crosses.
    for (const u of plan.unassigned) {
      const stop = problem.stops[u.stop];
      if (!stop) continue;
      const p = at(stop.location);
      ctx.strokeStyle = "#8a8a8a";
      ctx.lineWidth = 2;
      ctx.beginPath();
      ctx.moveTo(p.x - 4, p.y - 4);
      ctx.lineTo(p.x + 4, p.y + 4);
      ctx.moveTo(p.x + 4, p.y - 4);
      ctx.lineTo(p.x - 4, p.y + 4);
      ctx.stroke();
      this.hoverPoints.push({ x: p.x, y: p.y, text: `${stop.name || stop.id} · not served: ${u.reason}` });
    }
    this.canvas.dataset.routes = JSON.stringify(drawn);
  }

  private drawScale(ctx: CanvasRenderingContext2D, pxPerKm: number, cssH: number): void {
    const targetPx = 80;
    const km = niceStep(targetPx / pxPerKm);
    const px = km * pxPerKm;
    const x = 10,
      y = cssH - 10;
    const label = `${km} km (straight line)`;
    ctx.font = "11px Segoe UI, sans-serif";
    // A light box keeps the scale readable over routes and depots.
    ctx.fillStyle = "rgba(247,245,242,0.85)";
    ctx.fillRect(x - 4, y - 18, Math.max(px, ctx.measureText(label).width + 8) + 8, 22);
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
  }

  private hover(x: number, y: number): void {
    let best: HoverPoint | undefined;
    let bestD = 8 * 8;
    for (const p of this.hoverPoints) {
      const d = (p.x - x) ** 2 + (p.y - y) ** 2;
      if (d <= bestD) {
        best = p;
        bestD = d;
      }
    }
    if (!best) {
      this.tooltip.hidden = true;
      return;
    }
    this.tooltip.textContent = best.text;
    this.tooltip.hidden = false;
    const maxLeft = Math.max(0, this.canvas.clientWidth - this.tooltip.offsetWidth - 4);
    this.tooltip.style.left = `${Math.min(best.x + 10, maxLeft)}px`;
    this.tooltip.style.top = `${Math.max(0, best.y - 30)}px`;
  }
}

function round1(x: number): number {
  return Math.round(x * 10) / 10;
}

/** 1, 2 or 5 times a power of ten, at most `x`. */
function niceStep(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * p;
}
