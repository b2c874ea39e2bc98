/**
 * The convergence plot of a run (uPlot): current and best cost over elapsed seconds. Fed with
 * progress reports, which the worker sends at most every 200 ms.
 */
import uPlot from "uplot";
import type { Progress } from "../core/index.js";

/** A uPlot chart of cost over the run. */
export class ConvergencePlot {
  private plot: uPlot | undefined;
  private readonly xs: number[] = [];
  private readonly current: (number | null)[] = [];
  private readonly best: (number | null)[] = [];

  /** @param container - the element the chart is drawn in */
  constructor(private readonly container: HTMLElement) {
    window.addEventListener("resize", () => this.plot?.setSize(this.size()));
  }

  /** Forget the previous run. */
  reset(): void {
    this.xs.length = 0;
    this.current.length = 0;
    this.best.length = 0;
    this.plot?.setData([[], [], []]);
    this.container.dataset.points = "0";
  }

  /**
   * Add one progress report and redraw.
   *
   * @param p - a progress report of the running solve
   * @example plot.add({ moves: 1e5, fraction: 0.1, temperature: 12, currentCost: 830, bestCost: 812, acceptanceRate: 0.2, elapsedMs: 1000 })
   */
  add(p: Progress): void {
    this.xs.push(p.elapsedMs / 1000);
    this.current.push(Number.isFinite(p.currentCost) ? p.currentCost : null);
    this.best.push(Number.isFinite(p.bestCost) ? p.bestCost : null);
    const data: uPlot.AlignedData = [this.xs, this.current, this.best];
    this.container.dataset.points = String(this.xs.length);
    if (!this.plot) {
      const font = "11px Segoe UI, sans-serif";
      this.plot = new uPlot(
        {
          ...this.size(),
          cursor: { drag: { x: false, y: false } },
          legend: { live: false },
          scales: { x: { time: false } },
          axes: [
            { label: "seconds", size: 34, labelSize: 14, font, labelFont: font },
            { label: "cost", size: 56, labelSize: 14, font, labelFont: font },
          ],
          series: [
            { label: "seconds" },
            { label: "current cost", stroke: "#9e9e9e", width: 1 },
            { label: "best feasible cost", stroke: "#0f6cbd", width: 2 },
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
    return { width: Math.max(240, this.container.clientWidth || 320), height: 160 };
  }
}
