import type { Stop, TimeWindow, Visit } from "../core/index.js";

/** Minutes of slack when comparing times that went through floating-point sums. */
const EPS_MIN = 1e-6;

/**
 * The time window a visit was served in, for the Earliest/Latest columns: the window that
 * contains the start of service; for a late start, the window whose latest start plus the
 * visit's late minutes gives its start (the window the schedule measured lateness against).
 *
 * @param stop - the stop, with at least one window
 * @param visit - its visit in the plan
 * @returns one of `stop.windows`
 * @throws RangeError when the stop has no window
 * @example windowUsed({ windows: [{earliestMin: 480, latestMin: 600}, ...] }, { startMin: 500, lateMin: 0 })
 * // => { earliestMin: 480, latestMin: 600 }
 */
export function windowUsed(stop: Stop, visit: Visit): TimeWindow {
  const windows = stop.windows;
  if (windows.length === 0) throw new RangeError(`windowUsed: stop ${stop.id} has no window`);
  if (visit.lateMin > EPS_MIN) {
    let best = windows[0]!;
    let bestGap = Infinity;
    for (const w of windows) {
      const gap = Math.abs(w.latestMin + visit.lateMin - visit.startMin);
      if (gap < bestGap) {
        best = w;
        bestGap = gap;
      }
    }
    return best;
  }
  const inside = windows.find((w) => w.earliestMin - EPS_MIN <= visit.startMin && visit.startMin <= w.latestMin + EPS_MIN);
  // No containing window means the schedule is inconsistent; the first window still open is
  // the most useful thing to show.
  return inside ?? windows.find((w) => w.latestMin >= visit.startMin) ?? windows[windows.length - 1]!;
}
