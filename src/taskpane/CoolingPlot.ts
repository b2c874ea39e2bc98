/**
 * The live preview of a cooling schedule (uPlot): temperature (log scale, left) and the share of
 * the sampled worse moves accepted (right) over the run, planned; during and after a run, the
 * share the run actually accepted is plotted beside it (dots), so the user sees whether the
 * temperature plan behaved as planned. The container's `data-profile` holds the planned share at
 * 0, 25, 50, 75 and 100% of the run and `data-observed` the observed points, so a test can see both.
 */
import uPlot from "uplot";
import type { ProfilePoint } from "../core/index.js";

/** A uPlot chart of a cooling profile that follows its container's width. */
export class CoolingPlot {
  private plot: uPlot | undefined;
  private points: readonly ProfilePoint[] = [];
  /** Observed share per percent of the run (index 0..100), null where none was reported. */
  private observed: (number | null)[] = new Array<number | null>(101).fill(null);

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
    this.points = points;
    const data = this.data();
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
            {
              label: "observed",
              scale: "P",
              stroke: "#1f7a3a",
              width: 0,
              points: { show: true, size: 5, fill: "#1f7a3a" },
              spanGaps: false,
            },
          ],
        },
        data,
        this.container,
      );
    } else {
      this.plot.setData(data);
    }
  }

  /**
   * Add the share of worse moves the run accepted around `fraction` of the run.
   *
   * @param fraction - share of the run done, 0..1
   * @param share - worse moves accepted over worse moves drawn since the previous report
   */
  observe(fraction: number, share: number): void {
    const i = Math.min(100, Math.max(0, Math.round(fraction * 100)));
    this.observed[i] = share;
    this.container.dataset.observed = JSON.stringify(
      this.observed.flatMap((v, k) => (v === null ? [] : [[k / 100, Number(v.toPrecision(4))]])),
    );
    if (this.plot && this.points.length > 0) this.plot.setData(this.data());
  }

  /** Forget the observed shares. */
  clearObserved(): void {
    this.observed = new Array<number | null>(101).fill(null);
    delete this.container.dataset.observed;
    if (this.plot && this.points.length > 0) this.plot.setData(this.data());
  }

  /** The planned profile and the observed shares on one x axis (observed at the nearest percent). */
  private data(): uPlot.AlignedData {
    const pts = this.points;
    const last = Math.max(1, pts.length - 1);
    return [
      pts.map((p) => p.fraction * 100),
      pts.map((p) => Math.max(p.temperature, 1e-12)),
      pts.map((p) => p.pAccept),
      pts.map((_, i) => this.observed[Math.round((i / last) * 100)] ?? null),
    ];
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
