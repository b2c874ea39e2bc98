import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { concatWindows, WindowSummary } from "../../src/core/schedule/concatWindows.js";

/** A stop: service minutes and its window (invented data). */
interface Stop {
  s: number;
  e: number;
  l: number;
}

/**
 * Drive the stops from start time `x`, as the time-warp relaxation defines it (Vidal, Crainic,
 * Gendreau & Prins 2013, Computers & Operations Research 40(1), from memory): wait when early,
 * and when late count the lateness as time warp and go on as if arrived at the window's end.
 * Returns the duration (travel, waiting and service, from the start of the first service) and
 * the total warp.
 */
function drive(stops: readonly Stop[], travel: readonly number[], x: number): [number, number] {
  let time = x;
  let duration = 0;
  let warp = 0;
  stops.forEach((stop, k) => {
    if (k > 0) {
      time += travel[k - 1]!;
      duration += travel[k - 1]!;
    }
    if (time < stop.e) {
      duration += stop.e - time;
      time = stop.e;
    }
    if (time > stop.l) {
      warp += time - stop.l;
      time = stop.l;
    }
    time += stop.s;
    duration += stop.s;
  });
  return [duration, warp];
}

/** Summary of stops[from..to] folded from the left: ((s1 s2) s3) ... */
function foldLeft(stops: readonly Stop[], travel: readonly number[], from: number, to: number): number[] {
  const w = new WindowSummary();
  let acc = [stops[from]!.s, 0, stops[from]!.e, stops[from]!.l];
  for (let k = from + 1; k <= to; k++) {
    const st = stops[k]!;
    concatWindows(w, acc[0]!, acc[1]!, acc[2]!, acc[3]!, travel[k - 1]!, st.s, 0, st.e, st.l);
    acc = [w.duration, w.timeWarp, w.earliest, w.latest];
  }
  return acc;
}

describe("concatWindows (segment concatenation with time windows, Vidal et al. 2013)", () => {
  it("waits when the second segment opens later (worked by hand from the definitions)", () => {
    const w = new WindowSummary();
    // Stop A: 10 min service in 08:00-09:00; 5 min drive; stop B: 15 min in 10:00-11:00.
    concatWindows(w, 10, 0, 480, 540, 5, 15, 0, 600, 660);
    // Starting A at 09:00 at the latest, B is reached at 09:15: 45 min waiting.
    expect({ ...w }).toEqual({ duration: 75, timeWarp: 0, earliest: 540, latest: 540, joinWarp: 0 });
  });

  it("counts lateness as time warp where the segments meet", () => {
    const w = new WindowSummary();
    // A in 10:00-11:00 (20 min), 30 min drive, B closes at 10:30: reached at 10:50 at best, 20 min late.
    concatWindows(w, 20, 0, 600, 660, 30, 10, 0, 540, 630);
    expect({ ...w }).toEqual({ duration: 60, timeWarp: 20, earliest: 600, latest: 600, joinWarp: 20 });
  });

  it("gives the duration and warp of driving the stops, whichever way the segments are split", () => {
    const rng = createRandom("concat-windows");
    const w = new WindowSummary();
    for (let trial = 0; trial < 300; trial++) {
      const n = 2 + rng.int(7);
      const stops: Stop[] = Array.from({ length: n }, () => {
        const e = 420 + rng.int(480);
        return { s: rng.int(20), e, l: e + rng.int(120) };
      });
      const travel = Array.from({ length: n - 1 }, () => 1 + rng.int(60));
      const whole = foldLeft(stops, travel, 0, n - 1);
      const [D, TW, E, L] = whole;
      // Any start in [E, L] (E when warp is unavoidable) drives with exactly D and TW.
      expect(drive(stops, travel, E!)).toEqual([D, TW]);
      expect(drive(stops, travel, L!)).toEqual([D, TW]);
      // Starting earlier only adds waiting; later only adds warp.
      expect(drive(stops, travel, E! - 7)).toEqual([D! + 7, TW]);
      expect(drive(stops, travel, L! + 7)).toEqual([D, TW! + 7]);
      // Split anywhere: prefix then suffix gives the same summary.
      for (let cut = 0; cut < n - 1; cut++) {
        const a = foldLeft(stops, travel, 0, cut);
        const b = foldLeft(stops, travel, cut + 1, n - 1);
        concatWindows(w, a[0]!, a[1]!, a[2]!, a[3]!, travel[cut]!, b[0]!, b[1]!, b[2]!, b[3]!);
        expect([w.duration, w.timeWarp, w.earliest, w.latest]).toEqual(whole);
        expect(w.joinWarp).toBe(w.timeWarp - a[1]! - b[1]!);
      }
    }
  });
});
