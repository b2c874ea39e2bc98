/**
 * The running optimization's read-out: progress bar, elapsed and remaining time, current and
 * best cost, acceptance rate, temperature, the part of the run under way and the convergence plot.
 */
import { RUN_PHASE_LABELS, type Progress, type SolveResult } from "../core/index.js";
import type { ConvergencePlot } from "./ConvergencePlot.js";
import { formatDuration } from "./formatClock.js";
import type { PaneDom } from "./paneDom.js";
import type { PoolResult } from "./SolverPool.js";

/**
 * Show one progress report.
 *
 * @param d - the pane's elements
 * @param convergence - the convergence plot, which gets the point
 * @param p - the report
 * @param seconds - the run's seconds budget; undefined for a move budget (remaining time extrapolated)
 * @param workers - chains running (the report is their combined progress when more than one)
 */
export function showProgress(d: PaneDom, convergence: ConvergencePlot, p: Progress, seconds: number | undefined, workers = 1): void {
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
  d.statPhase.textContent = p.phase ? RUN_PHASE_LABELS[p.phase] : "–";
  d.statWorkers.textContent = `${workers} running, ${p.moves.toLocaleString("en")} moves in all`;
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
export function showFinished(d: PaneDom, result: SolveResult | PoolResult, stopped: boolean): void {
  d.progressBar.style.width = "100%";
  d.progressBar.parentElement?.setAttribute("aria-valuenow", "100");
  d.statElapsed.textContent = formatDuration(result.stats.elapsedMs / 1000);
  d.statRemaining.textContent = stopped ? "stopped" : "finished";
  d.statPhase.textContent = stopped ? "stopped" : "finished";
  d.statBest.textContent = formatCost(result.plan.totals.cost);
  d.statWorkers.textContent = workersText(result);
  d.statMemory.textContent = memoryText(result);
}

/**
 * The Workers figure after a run: how many chains ran, how often they shared their best plan,
 * their moves together, and whose plan is kept.
 *
 * @param result - a run's result (one chain, or the pool's with every chain)
 * @returns e.g. "2, the best plan shared 7 times; the plan is chain 2's (1,234,567 moves in all)"
 * @example workersText(oneChainResult) // => "1 (52,000 moves)"
 */
export function workersText(result: SolveResult | PoolResult): string {
  const chains = "chains" in result ? result.chains : [result];
  const moves = chains.reduce((s, c) => s + c.stats.moves, 0).toLocaleString("en");
  if (chains.length === 1) return `1 (${moves} moves)`;
  const shares = "shares" in result ? result.shares : 0;
  return `${chains.length}, the best plan shared ${shares} times; the plan is chain ${("chain" in result ? result.chain : 0) + 1}'s (${moves} moves in all)`;
}

/**
 * The peak-memory figure after a run: the largest JS heap a worker reported, or why there is none.
 *
 * @param result - a run's result
 * @returns e.g. "41 MB JS heap (largest worker)", or "not available: …"
 * @example memoryText({ ...result, peakHeapBytes: 42e6 }) // => "40 MB JS heap (largest worker)"
 */
export function memoryText(result: SolveResult | PoolResult): string {
  const bytes = "peakHeapBytes" in result ? result.peakHeapBytes : undefined;
  if (bytes === undefined) return "not available: this browser reports no memory figure inside a worker";
  return `${Math.round(bytes / 2 ** 20)} MB JS heap (largest worker)`;
}

function formatCost(cost: number): string {
  return Number.isFinite(cost) ? cost.toLocaleString("en", { maximumFractionDigits: 1 }) : "–";
}
