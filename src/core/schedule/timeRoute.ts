import type { Problem, Stop } from "../model.js";

const EPS = 1e-9;

/** Timing of one visit. */
export interface StopTiming {
  readonly arrivalMin: number;
  readonly waitMin: number;
  readonly startMin: number;
  readonly departureMin: number;
  readonly lateMin: number;
}

/** A break placed at visit `at` (index into the route's stops). */
export interface BreakTiming {
  readonly at: number;
  readonly beforeService: boolean;
  readonly kind: "driving" | "window";
  readonly startMin: number;
  readonly endMin: number;
}

/** Timing of a whole route from one departure time. */
export interface RouteTiming {
  /** Per visit (empty unless `detail`). */
  readonly times: StopTiming[];
  /** Breaks in time order (empty unless `detail`). */
  readonly breaks: BreakTiming[];
  readonly departureMin: number;
  readonly returnMin: number;
  readonly drivingMin: number;
  /** Waiting at stops and before a window break, break minutes excluded. */
  readonly waitMin: number;
  /** Minutes late summed over stops (service booked at the window's close: time warp). */
  readonly lateMin: number;
  readonly overtimeMin: number;
  /** How much later the vehicle could leave without being later anywhere (no breaks taken into account). */
  readonly slack: number;
  /**
   * Break rule broken, in minutes: driving beyond the limit before a stop is reached,
   * a window break running past its window's end, or a due window break never taken.
   */
  readonly breakViolationMin: number;
}

/**
 * Time a route exactly with every window of every stop and the vehicle's break rules, and
 * choose its departure: from the shift start, delayed by the waiting it can absorb when that
 * makes nothing worse (no more lateness, overtime or break violation, no longer duty).
 *
 * Break placement (a greedy rule, the same in the search and in every reported plan): breaks
 * are taken at stops, never on the road and never at a depot.
 * - Driving break: taken at the first stop where it fits entirely inside the waiting, and
 *   otherwise at the last stop before the driving since the last break would pass
 *   `driveMin`; on arrival when that makes the stop no later, else after its service.
 *   A leg that alone passes the limit is a violation (minutes over).
 * - Window break: due when the duty overlaps its window so that it can neither end by the
 *   departure (departure >= earliest + length) nor start after the return (return <= latest -
 *   length). Taken at the first stop where it fits entirely inside the waiting, otherwise at
 *   the last stop before the window would be missed (waiting for the window to open when need
 *   be), on arrival when that makes the stop no later, else after service. A window break at
 *   least as long as the driving break also resets the driving count.
 *
 * @param problem - the problem
 * @param v - vehicle index
 * @param stops - stop indices in visiting order
 * @param count - how many of `stops` to use
 * @param detail - fill `times` and `breaks` (off in the search's hot path)
 * @returns the timing
 * @example scheduleRoute(problem, 0, [2, 0, 1], 3, true).breaks // => breaks with their times
 */
export function scheduleRoute(problem: Problem, v: number, stops: ArrayLike<number>, count: number, detail: boolean): RouteTiming {
  const veh = problem.vehicles[v]!;
  const factor = problem.matrix.userSupplied ? 1 : problem.referenceSpeedKmh / veh.speedKmh;
  const first = timeRoute(problem, v, stops, count, factor, veh.shiftStartMin, detail);
  const delay = Math.min(first.slack, first.waitMin);
  if (!(delay > 0)) return first;
  const second = timeRoute(problem, v, stops, count, factor, veh.shiftStartMin + delay, detail);
  if (veh.drivingBreak === undefined && veh.windowBreak === undefined) return second;
  const noWorse =
    second.lateMin <= first.lateMin + EPS &&
    second.overtimeMin <= first.overtimeMin + EPS &&
    second.breakViolationMin <= first.breakViolationMin + EPS &&
    second.returnMin - second.departureMin <= first.returnMin - first.departureMin + EPS;
  return noWorse ? second : first;
}

// Results of `serve` (module scratch: the search calls this in its hot path).
let servedStart = 0;
let servedLate = 0;

/** Start of service at stop `s` for a vehicle ready at `x`: the first window still open, else booked at the close. */
function serve(s: Stop, x: number): void {
  for (const w of s.windows) {
    if (w.latestMin >= x) {
      servedStart = Math.max(x, w.earliestMin);
      servedLate = 0;
      return;
    }
  }
  const close = s.windows.length > 0 ? s.windows[s.windows.length - 1]!.latestMin : x;
  servedStart = close;
  servedLate = x - close;
}

const NONE: never[] = [];

/**
 * Forward pass from a departure time (see `scheduleRoute` for the break placement).
 *
 * @param problem - the problem
 * @param v - vehicle index
 * @param stops - stop indices in visiting order
 * @param count - how many of `stops` to use
 * @param factor - travel-time multiplier of the vehicle
 * @param departMin - departure from the start depot
 * @param detail - fill `times` and `breaks`
 * @returns the timing
 */
export function timeRoute(
  problem: Problem,
  v: number,
  stops: ArrayLike<number>,
  count: number,
  factor: number,
  departMin: number,
  detail: boolean,
): RouteTiming {
  const veh = problem.vehicles[v]!;
  const m = problem.matrix;
  const L = m.size;
  const db = veh.drivingBreak;
  const wb = veh.windowBreak;
  const times: StopTiming[] = detail ? [] : NONE;
  const breaks: BreakTiming[] = detail ? [] : NONE;
  let t = departMin;
  let prev = veh.startLocation;
  let waitBefore = 0;
  let slack = Infinity;
  let propagates = true;
  let drivingMin = 0;
  let lateSum = 0;
  let viol = 0;
  let since = 0;
  let windowPending = wb !== undefined && departMin < wb.earliestMin + wb.breakMin - EPS;
  const resets = wb !== undefined && (db === undefined || wb.breakMin >= db.breakMin);
  for (let k = 0; k < count; k++) {
    const index = stops[k]!;
    const s = problem.stops[index]!;
    const leg = m.travelMin[prev * L + s.location]! * factor;
    drivingMin += leg;
    since += leg;
    if (db !== undefined && since > db.driveMin + EPS) viol += since - db.driveMin;
    const a = t + leg;
    const nextLoc = k + 1 < count ? problem.stops[stops[k + 1]!]!.location : veh.endLocation;
    const nextLeg = m.travelMin[s.location * L + nextLoc]! * factor;
    serve(s, a);
    const start0 = servedStart;
    const late0 = servedLate;
    // Before service: at most one break (its start and length).
    let bStart = 0;
    let bLen = 0;
    let bKind: "driving" | "window" = "driving";
    if (windowPending && late0 === 0) {
      const bs = Math.max(a, wb!.earliestMin);
      if (bs + wb!.breakMin <= wb!.latestMin + EPS && bs + wb!.breakMin <= start0 + EPS) {
        bStart = bs;
        bLen = wb!.breakMin;
        bKind = "window";
        windowPending = false;
        if (resets) since = 0;
      }
    }
    if (db !== undefined && bLen === 0 && since > 0 && late0 === 0 && a + db.breakMin <= start0 + EPS) {
      bStart = a;
      bLen = db.breakMin;
      since = 0;
    }
    serve(s, bLen > 0 ? bStart + bLen : a);
    let start = servedStart;
    let late = servedLate;
    let dep = start + s.serviceMin;
    // After service: up to one window break, then one driving break.
    let wStart = -1;
    let dStart = -1;
    if (windowPending && Math.max(dep + nextLeg, wb!.earliestMin) + wb!.breakMin > wb!.latestMin + EPS) {
      windowPending = false;
      if (resets) since = 0;
      // On arrival (waiting for the window to open if need be) or after service, whichever
      // leaves earlier without making this stop later.
      const afterStart = Math.max(dep, wb!.earliestMin);
      const afterOver = Math.max(0, afterStart + wb!.breakMin - wb!.latestMin);
      const bs = Math.max(a, wb!.earliestMin);
      let before = false;
      if (bLen === 0 && bs + wb!.breakMin <= wb!.latestMin + EPS) {
        serve(s, bs + wb!.breakMin);
        const leave = servedStart + s.serviceMin;
        if (servedLate <= late + EPS && (afterOver > 0 || leave <= afterStart + wb!.breakMin + EPS)) {
          before = true;
          bStart = bs;
          bLen = wb!.breakMin;
          bKind = "window";
          start = servedStart;
          late = servedLate;
          dep = leave;
        }
      }
      if (!before) {
        wStart = afterStart;
        viol += afterOver;
      }
    }
    const after = wStart >= 0 ? wStart + wb!.breakMin : dep;
    if (db !== undefined && since > 0 && since + nextLeg > db.driveMin + EPS) {
      since = 0;
      let before = false;
      if (bLen === 0 && wStart < 0) {
        serve(s, a + db.breakMin);
        if (servedLate <= late + EPS) {
          before = true;
          bStart = a;
          bLen = db.breakMin;
          bKind = "driving";
          start = servedStart;
          late = servedLate;
          dep = start + s.serviceMin;
        }
      }
      if (!before) dStart = after;
    }
    let arrivalMin = a;
    // A departure delayed by exactly the waiting lands on the opening up to rounding: no wait.
    if (bLen === 0 && start > arrivalMin && start - arrivalMin < 1e-9) arrivalMin = start;
    const ready = bLen > 0 ? bStart + bLen : arrivalMin;
    const waitMin = (bLen > 0 ? bStart - a : 0) + Math.max(0, start - ready);
    const gap = wStart >= 0 ? wStart - dep : 0;
    if (late > 0) {
      // Any later arrival here is later still; past a warp, delays no longer propagate.
      if (propagates) slack = Math.min(slack, waitBefore);
      propagates = false;
    } else if (propagates) {
      // A break taken while waiting for the break window to open absorbs a later arrival too.
      slack = Math.min(slack, waitBefore + latestOpen(s, start) - (bLen > 0 ? a + bLen : arrivalMin));
    }
    waitBefore += waitMin + gap;
    lateSum += late;
    if (detail) {
      if (bLen > 0) breaks.push({ at: k, beforeService: true, kind: bKind, startMin: bStart, endMin: bStart + bLen });
      times.push({ arrivalMin, waitMin, startMin: start, departureMin: dep, lateMin: late });
      if (wStart >= 0) breaks.push({ at: k, beforeService: false, kind: "window", startMin: wStart, endMin: wStart + wb!.breakMin });
      if (dStart >= 0) breaks.push({ at: k, beforeService: false, kind: "driving", startMin: dStart, endMin: dStart + db!.breakMin });
    }
    t = dStart >= 0 ? dStart + db!.breakMin : wStart >= 0 ? wStart + wb!.breakMin : dep;
    prev = s.location;
  }
  const back = m.travelMin[prev * L + veh.endLocation]! * factor;
  drivingMin += back;
  since += back;
  if (db !== undefined && since > db.driveMin + EPS) viol += since - db.driveMin;
  const arriveEnd = t + back;
  if (windowPending && count > 0 && arriveEnd > wb!.latestMin - wb!.breakMin + EPS) viol += wb!.breakMin;
  let overtimeMin = 0;
  let returnMin = arriveEnd;
  if (arriveEnd > veh.shiftEndMin) {
    overtimeMin = arriveEnd - veh.shiftEndMin;
    returnMin = veh.shiftEndMin;
    if (propagates) slack = Math.min(slack, waitBefore);
  } else if (propagates) {
    slack = Math.min(slack, waitBefore + (veh.shiftEndMin - arriveEnd));
  }
  return {
    times,
    breaks,
    departureMin: departMin,
    returnMin,
    drivingMin,
    waitMin: waitBefore,
    lateMin: lateSum,
    overtimeMin,
    slack: Math.max(0, slack),
    breakViolationMin: viol,
  };
}

/** The latest start of the window service starts in (how late it could still start). */
function latestOpen(s: Stop, start: number): number {
  for (const w of s.windows) if (w.latestMin >= start - EPS) return w.latestMin;
  return start;
}
