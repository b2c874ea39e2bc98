/**
 * The running optimization's read-out: progress bar, elapsed and remaining time, current and
 * best cost, acceptance rate, temperature and the convergence plot.
 */
import type { Progress, SolveResult } from "../core/index.js";
import type { ConvergencePlot } from "./ConvergencePlot.js";
import { formatDuration } from "./formatClock.js";
import type { PaneDom } from "./paneDom.js";

/**
 * Show one progress report.
 *
 * @param d - the pane's elements
 * @param convergence - the convergence plot, which gets the point
 * @param p - the report
 * @param seconds - the run's seconds budget; undefined for a move budget (remaining time extrapolated)
 */
export function showProgress(d: PaneDom, convergence: ConvergencePlot, p: Progress, seconds: number | undefined): void {
  d.progressBar.style.width = `${Math.round(p.fraction * 100)}%`;
  d.progressBar.parentElement?.setAttribute("aria-valuenow", String(Math.round(p.fraction * 100)));
  d.statElapsed.textContent = formatDuration(p.elapsedMs / 1000);
  const remaining =
    seconds !== undefined ? seconds - p.elapsedMs / 1000 : p.fraction > 0 ? (p.elapsedMs / 1000) * (1 / p.fraction - 1) : NaN;
  d.statRemaining.textContent = formatDuration(Math.max(0, remaining));
  d.statCurrent.textContent = formatCost(p.currentCost);
  d.statBest.textContent = Number.isFinite(p.bestCost) ? formatCost(p.bestCost) : "none feasible yet";
  d.statAccept.textContent = p.worseAccepted === undefined ? "–" : `${(p.worseAccepted * 100).toFixed(1)}%`;
  d.statTemp.textContent = p.temperature.toPrecision(3);
  convergence.add(p);
}

/**
 * The read-out once the run has ended: the bar full, "finished" or "stopped" instead of a time
 * left, and the best cost replaced by the cost of the plan the run returned (the exact evaluation
 * the result shows, so the two never differ).
 *
 * @param d - the pane's elements
 * @param result - the run's result
 * @param stopped - true when the user pressed Stop
 */
export function showFinished(d: PaneDom, result: SolveResult, stopped: boolean): void {
  d.progressBar.style.width = "100%";
  d.progressBar.parentElement?.setAttribute("aria-valuenow", "100");
  d.statElapsed.textContent = formatDuration(result.stats.elapsedMs / 1000);
  d.statRemaining.textContent = stopped ? "stopped" : "finished";
  d.statBest.textContent = formatCost(result.plan.totals.cost);
}

function formatCost(cost: number): string {
  return Number.isFinite(cost) ? cost.toLocaleString("en", { maximumFractionDigits: 1 }) : "–";
}
