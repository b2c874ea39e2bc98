/**
 * The best-cost curves of a "Compare plans…" run overlaid (uPlot, as the convergence plot): one
 * line per run, coloured by its temperature plan, over the share of the run's budget. Each run's
 * progress reports are resampled onto one grid of 0..100 % as a step function (the best cost is
 * the lowest found so far, so it holds until the next report), which lets uPlot draw runs whose
 * reports came at different moments on one x axis. As in the convergence plot, the curves are the
 * runs' own reports; the table beside it gives each returned plan's exact cost.
 */
import uPlot from "uplot";
import type { Progress } from "../core/index.js";

/** Points of the shared x grid (0, 1, ..., 100 % of the run). */
const GRID = 101;

/** One run's line: its plan's number and colour, and its best cost by share of the run. */
interface RunLine {
  readonly label: string;
  readonly colour: string;
  readonly dash: readonly number[];
  readonly fractions: number[];
  readonly best: number[];
}

/** A uPlot chart of several runs' best cost. */
export class ComparePlot {
  private plot: uPlot | undefined;
  private readonly runs: RunLine[] = [];

  /** @param container - the element the chart is drawn in */
  constructor(private readonly container: HTMLElement) {
    window.addEventListener("resize", () => this.plot?.setSize(this.size()));
  }

  /** Forget every run. */
  reset(): void {
    this.runs.length = 0;
    this.plot?.destroy();
    this.plot = undefined;
    this.container.dataset.runs = "0";
  }

  /**
   * Start the line of a new run.
   *
   * @param label - legend text, e.g. "plan 2, seed 8"
   * @param colour - CSS colour of its plan
   * @param dash - line dash of its seed (empty: solid)
   */
  addRun(label: string, colour: string, dash: readonly number[] = []): void {
    this.runs.push({ label, colour, dash, fractions: [], best: [] });
    this.container.dataset.runs = String(this.runs.length);
  }

  /**
   * Add a progress report of the latest run and redraw.
   *
   * @param p - the report
   */
  add(p: Progress): void {
    const run = this.runs[this.runs.length - 1];
    if (!run || !Number.isFinite(p.bestCost)) return;
    run.fractions.push(Math.min(1, Math.max(0, p.fraction)));
    run.best.push(p.bestCost);
    this.draw();
  }

  private draw(): void {
    const xs = Array.from({ length: GRID }, (_, i) => i);
    const data: uPlot.AlignedData = [xs, ...this.runs.map((r) => resample(r))];
    if (this.plot && this.plot.series.length === this.runs.length + 1) {
      this.plot.setData(data);
      return;
    }
    this.plot?.destroy();
    const font = "11px Segoe UI, sans-serif";
    this.plot = new uPlot(
      {
        ...this.size(),
        cursor: { drag: { x: false, y: false } },
        legend: { show: false },
        scales: { x: { time: false } },
        axes: [
          { label: "% of each run", size: 34, labelSize: 14, font, labelFont: font },
          { label: "best cost", size: 56, labelSize: 14, font, labelFont: font },
        ],
        series: [
          { label: "% of the run" },
          // Points too: a run that finds its first feasible plan late may have a single point.
          ...this.runs.map((r) => ({
            label: r.label,
            stroke: r.colour,
            width: 1.5,
            dash: [...r.dash],
            spanGaps: true,
            points: { show: true, size: 4, fill: r.colour },
          })),
        ],
      },
      data,
      this.container,
    );
  }

  private size(): { width: number; height: number } {
    return { width: Math.max(240, this.container.clientWidth || 320), height: 170 };
  }
}

/** A run's best cost at 0, 1, ..., 100 % of the run: the last report at or before each point (null before the first). */
function resample(run: RunLine): (number | null)[] {
  const out: (number | null)[] = [];
  let k = -1;
  for (let i = 0; i < GRID; i++) {
    const f = i / (GRID - 1);
    while (k + 1 < run.fractions.length && run.fractions[k + 1]! <= f + 1e-9) k++;
    out.push(k >= 0 ? run.best[k]! : null);
  }
  return out;
}
