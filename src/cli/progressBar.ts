import { RUN_PHASE_LABELS, type Progress } from "../core/index.js";
import type { CliIO } from "./CliIO.js";

/** A one-line progress display of a run. */
export interface ProgressBar {
  update(progress: Progress): void;
  /** Clear the line (call once when the run ends). */
  done(): void;
}

/**
 * A progress bar on stderr that redraws one line with carriage returns; silent (all methods
 * do nothing) when stderr is not a terminal, so piped or logged output stays clean.
 *
 * @param io - the CLI's streams; the bar writes only to `io.stderr`, only when `io.isTTY`
 * @param width - bar width in characters (default 24)
 * @returns the bar
 * @example const bar = progressBar(io); bar.update(progress); bar.done();
 * // stderr: "\r[############------------]  50%  T 12.3  best 456.78  acc 21%"
 */
export function progressBar(io: CliIO, width = 24): ProgressBar {
  if (!io.isTTY) return { update: () => undefined, done: () => undefined };
  let shown = false;
  return {
    update(p: Progress): void {
      io.stderr("\r" + progressLine(p, width));
      shown = true;
    },
    done(): void {
      if (shown) io.stderr("\r\x1b[2K");
      shown = false;
    },
  };
}

/**
 * The text of one progress line.
 *
 * @param p - the run's progress
 * @param width - bar width in characters
 * @returns e.g. "[######------]  50%  T 12.3  best 456.78  acc 21%  annealing" (the phase when reported)
 * @example progressLine({ fraction: 0.5, temperature: 12.3, bestCost: 456.78, acceptanceRate: 0.21, ... }, 12)
 */
export function progressLine(p: Progress, width: number): string {
  const f = Math.min(1, Math.max(0, p.fraction));
  const filled = Math.round(f * width);
  const best = Number.isFinite(p.bestCost) ? p.bestCost.toFixed(2) : "none feasible yet";
  return (
    `[${"#".repeat(filled)}${"-".repeat(width - filled)}] ${String(Math.round(f * 100)).padStart(3)}%` +
    `  T ${p.temperature.toPrecision(3)}  best ${best}  acc ${Math.round(p.acceptanceRate * 100)}%` +
    (p.phase ? `  ${RUN_PHASE_LABELS[p.phase]}` : "")
  );
}
