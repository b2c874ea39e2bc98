/** A segment summary as `concatWindows` writes it (one reused object: no allocation). */
export class WindowSummary {
  /** Duration: travel, waiting and service. */
  duration = 0;
  /** Time warp (lateness) of the whole. */
  timeWarp = 0;
  /** Earliest start with no waiting. */
  earliest = 0;
  /** Latest start with no added warp. */
  latest = 0;
  /** Time warp added where the two segments met (part of `timeWarp`). */
  joinWarp = 0;
}

/**
 * Concatenation of two segment summaries with time windows (Vidal, Crainic, Gendreau & Prins
 * 2013, "A hybrid genetic algorithm with adaptive diversity management for a large class of
 * vehicle routing problems with time-windows", Computers & Operations Research 40(1)):
 * segment 1 (duration `d1`, time warp `tw1`, earliest and latest start `e1`, `l1`), then
 * `t` minutes of travel, then segment 2. Waiting at the junction goes into the duration, and
 * arriving too late into the time warp. A single stop is the segment (service, 0, earliest,
 * latest). Allocation-free (the annealer's hot path): the result goes to `out`.
 *
 * @param out - where the summary of the whole goes
 * @param d1 - duration of segment 1
 * @param tw1 - time warp of segment 1
 * @param e1 - earliest start of segment 1
 * @param l1 - latest start of segment 1
 * @param t - travel time from the end of segment 1 to the start of segment 2
 * @param d2 - duration of segment 2
 * @param tw2 - time warp of segment 2
 * @param e2 - earliest start of segment 2
 * @param l2 - latest start of segment 2
 * @example concatWindows(out, 10, 0, 480, 540, 5, 15, 0, 600, 660) // out: duration 75 (45 min waiting), warp 0, earliest 540, latest 540
 */
export function concatWindows(
  out: WindowSummary,
  d1: number,
  tw1: number,
  e1: number,
  l1: number,
  t: number,
  d2: number,
  tw2: number,
  e2: number,
  l2: number,
): void {
  const delta = d1 - tw1 + t;
  const wait = Math.max(e2 - delta - l1, 0);
  const warp = Math.max(e1 + delta - l2, 0);
  // Summed onto segment 1's figures last, as a running route adds a stop.
  out.duration = d1 + (d2 + t + wait);
  out.timeWarp = tw1 + (tw2 + warp);
  out.earliest = Math.max(e2 - delta, e1) - wait;
  out.latest = Math.min(l2 - delta, l1) + warp;
  out.joinWarp = warp;
}
