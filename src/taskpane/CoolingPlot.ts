/**
 * The live preview of a cooling schedule (uPlot): temperature (log scale, left) and the
 * probability of accepting the sampled mean uphill change (right) over the run. The
 * container's `data-profile` holds the plotted pAccept at 0, 25, 50, 75 and 100% of the run,
 * so a test can see the preview change.
 */
import uPlot from "uplot";
import type { ProfilePoint } from "../core/index.js";

/** A uPlot chart of a cooling profile that follows its container's width. */
export class CoolingPlot {
  private plot: uPlot | undefined;

  /** @param container - the element the chart is drawn in */
  constructor(private readonly container: HTMLElement) {
    window.addEventListener("resize", () => this.plot?.setSize(this.size()));
  }

  /**
   * Show `points` (replaces the previous profile).
   *
   * @param points - a profile from `profile`, fraction 0 first
   * @example plot.show(profile({ kind: "timeFraction" }, "metropolis", 20, 1e5))
   */
  show(points: readonly ProfilePoint[]): void {
    const data: uPlot.AlignedData = [
      points.map((p) => p.fraction * 100),
      points.map((p) => Math.max(p.temperature, 1e-12)),
      points.map((p) => p.pAccept),
    ];
    this.container.dataset.profile = JSON.stringify(
      [0, 0.25, 0.5, 0.75, 1].map((f) => {
        const i = Math.round(f * (points.length - 1));
        return Number((points[i]?.pAccept ?? 0).toPrecision(4));
      }),
    );
    if (!this.plot) {
      this.plot = new uPlot(
        {
          ...this.size(),
          cursor: { drag: { x: false, y: false } },
          legend: { live: false },
          scales: { x: { time: false }, T: { distr: 3 }, P: { range: [0, 1] } },
          axes: [
            { label: "% of run", size: 34, labelSize: 14, font: "11px Segoe UI, sans-serif", labelFont: "11px Segoe UI, sans-serif" },
            {
              scale: "T",
              label: "Temperature",
              size: 52,
              labelSize: 14,
              font: "11px Segoe UI, sans-serif",
              labelFont: "11px Segoe UI, sans-serif",
              values: (_u, splits) => splits.map((v) => (v == null ? "" : compact(v))),
            },
            {
              scale: "P",
              side: 1,
              label: "Worse moves accepted",
              size: 40,
              labelSize: 14,
              grid: { show: false },
              font: "11px Segoe UI, sans-serif",
              labelFont: "11px Segoe UI, sans-serif",
            },
          ],
          series: [
            { label: "% of run" },
            { label: "temperature", scale: "T", stroke: "#b4532a", width: 2 },
            { label: "Worse moves accepted (share)", scale: "P", stroke: "#0f6cbd", width: 2 },
          ],
        },
        data,
        this.container,
      );
    } else {
      this.plot.setData(data);
    }
  }

  private size(): { width: number; height: number } {
    return { width: Math.max(240, this.container.clientWidth || 320), height: 170 };
  }
}

function compact(v: number): string {
  if (v === 0) return "0";
  const a = Math.abs(v);
  return a >= 1e4 || a < 1e-2 ? v.toExponential(0) : String(Number(v.toPrecision(3)));
}
