import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { BreakVisit, Problem, Route, Vehicle } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";

/**
 * A problem on a user matrix (invented data): location 0 is the depot, stop k sits at location k+1.
 * `travel[i][j]` minutes and as many km between locations.
 */
function matrixProblem(
  travel: number[][],
  vehicle: Partial<Vehicle>,
  windows: ({ earliestMin: number; latestMin: number } | undefined)[] = [],
): Problem {
  const L = travel.length;
  const flat = Float64Array.from(travel.flat());
  return {
    locations: Array.from({ length: L }, (_, i) => ({ lat: 50, lon: i / 10 })),
    stops: Array.from({ length: L - 1 }, (_, k) => ({
      id: `S${k + 1}`,
      name: `S${k + 1}`,
      location: k + 1,
      demand: [1],
      windows: [windows[k] ?? { earliestMin: 0, latestMin: Infinity }],
      serviceMin: 10,
    })),
    vehicles: [
      {
        id: "Van",
        capacity: [100],
        startLocation: 0,
        endLocation: 0,
        shiftStartMin: 360,
        shiftEndMin: 1080,
        fixedCost: 0,
        costPerKm: 1,
        costPerHour: 0,
        speedKmh: 40,
        ...vehicle,
      },
    ],
    loadDimensions: ["kg"],
    matrix: { size: L, distanceKm: flat.slice(), travelMin: flat, userSupplied: true },
    referenceSpeedKmh: 40,
    hardWindows: true,
    lateCostPerMin: 1,
    objective: "weighted",
  };
}

/**
 * Independent replay of a route: given the departure and where each break is taken, compute
 * every time by plain arithmetic (arrive, break, wait for the window, serve) and the driving
 * done between breaks. Knows nothing of how the evaluator chooses break places.
 */
function replay(p: Problem, route: Route) {
  const veh = p.vehicles[route.vehicle]!;
  const L = p.matrix.size;
  let t = route.departureMin;
  let prev = veh.startLocation;
  let drive = 0;
  const drives: number[] = [];
  const visits: { arrivalMin: number; startMin: number; departureMin: number }[] = [];
  const breaks: BreakVisit[] = [];
  const length = (b: BreakVisit): number => (b.kind === "driving" ? veh.drivingBreak!.breakMin : veh.windowBreak!.breakMin);
  const earliest = (b: BreakVisit, x: number): number => (b.kind === "window" ? Math.max(x, veh.windowBreak!.earliestMin) : x);
  route.visits.forEach((v, k) => {
    const s = p.stops[v.stop]!;
    const leg = p.matrix.travelMin[prev * L + s.location]!;
    drive += leg;
    const arrivalMin = t + leg;
    let ready = arrivalMin;
    for (const b of route.breaks.filter((x) => x.at === k && x.beforeService)) {
      const start = earliest(b, ready);
      breaks.push({ ...b, startMin: start, endMin: start + length(b) });
      ready = start + length(b);
      if (length(b) >= (veh.drivingBreak?.breakMin ?? 0)) {
        drives.push(drive);
        drive = 0;
      }
    }
    // Arriving after the window closes books service at the close (the time-warp convention).
    const w = s.windows[0]!;
    const startMin = ready > w.latestMin ? w.latestMin : Math.max(ready, w.earliestMin);
    let leave = startMin + s.serviceMin;
    visits.push({ arrivalMin, startMin, departureMin: leave });
    for (const b of route.breaks.filter((x) => x.at === k && !x.beforeService)) {
      const start = earliest(b, leave);
      breaks.push({ ...b, startMin: start, endMin: start + length(b) });
      leave = start + length(b);
      if (length(b) >= (veh.drivingBreak?.breakMin ?? 0)) {
        drives.push(drive);
        drive = 0;
      }
    }
    t = leave;
    prev = s.location;
  });
  drive += p.matrix.travelMin[prev * L + veh.endLocation]!;
  drives.push(drive);
  // Back after the shift end: booked at the end, the rest is overtime (time-warp convention).
  const returnMin = Math.min(veh.shiftEndMin, t + p.matrix.travelMin[prev * L + veh.endLocation]!);
  return { visits, breaks, returnMin, drives };
}

const times = (r: Route) => r.visits.map((v) => ({ arrivalMin: v.arrivalMin, startMin: v.startMin, departureMin: v.departureMin }));

describe("driver breaks (hand-worked timings, replayed independently)", () => {
  it("takes a 45 min break at the last stop before 4.5 h (270 min) of driving would pass", () => {
    // Ring depot -> S1 -> S2 -> S3 -> depot, 90 min each leg, 10 min service, shift from 06:00.
    // Worked by hand: S1 07:30, S2 09:10, S3 arrival 10:50 with 270 min driven; the leg home
    // (90 min) would make 360, so the break is taken on arrival at S3 (10:50-11:35), service
    // 11:35-11:45, home 13:15. Driving 360 min, duty 435 min.
    const ring = [
      [0, 90, 180, 90],
      [90, 0, 90, 180],
      [180, 90, 0, 90],
      [90, 180, 90, 0],
    ];
    const p = matrixProblem(ring, { drivingBreak: { driveMin: 270, breakMin: 45 } });
    const plan = evaluatePlan(p, [[0, 1, 2]]);
    const r = plan.routes[0]!;
    expect(plan.feasible).toBe(true);
    expect(r.departureMin).toBe(360);
    expect(times(r)).toEqual([
      { arrivalMin: 450, startMin: 450, departureMin: 460 },
      { arrivalMin: 550, startMin: 550, departureMin: 560 },
      { arrivalMin: 650, startMin: 695, departureMin: 705 },
    ]);
    expect(r.breaks).toEqual([{ at: 2, beforeService: true, kind: "driving", startMin: 650, endMin: 695 }]);
    expect(r.returnMin).toBe(795);
    expect(r.drivingMin).toBe(360);
    expect(r.dutyMin).toBe(435);
    const again = replay(p, r);
    expect(again.visits).toEqual(times(r));
    expect(again.breaks).toEqual(r.breaks);
    expect(again.returnMin).toBe(r.returnMin);
    expect(Math.max(...again.drives)).toBeLessThanOrEqual(270);
  });

  it("waits for a lunch window (12:00-13:30, 30 min) when the next stop would be reached too late", () => {
    // Shift from 10:00; depot -> S1 90 min, S1 -> S2 100 min, S2 -> depot 60 min; S1 opens
    // 11:30-11:40. Worked by hand: leave 10:10 (the latest that still makes S1 by 11:40),
    // S1 11:40-11:50; S2 would be reached at 13:30, after 13:00 (the latest lunch start), so
    // lunch is taken at S1 after service: wait 11:50-12:00, lunch 12:00-12:30; S2 14:10-14:20,
    // home 15:20. Duty 310 min, driving 250 min, waiting 10 min.
    const m = [
      [0, 90, 60],
      [90, 0, 100],
      [60, 100, 0],
    ];
    const p = matrixProblem(m, { shiftStartMin: 600, windowBreak: { earliestMin: 720, latestMin: 810, breakMin: 30 } }, [
      { earliestMin: 690, latestMin: 700 },
    ]);
    const plan = evaluatePlan(p, [[0, 1]]);
    const r = plan.routes[0]!;
    expect(plan.violations).toEqual([]);
    expect(r.departureMin).toBe(610);
    expect(times(r)).toEqual([
      { arrivalMin: 700, startMin: 700, departureMin: 710 },
      { arrivalMin: 850, startMin: 850, departureMin: 860 },
    ]);
    expect(r.breaks).toEqual([{ at: 0, beforeService: false, kind: "window", startMin: 720, endMin: 750 }]);
    expect(r.returnMin).toBe(920);
    expect(r.dutyMin).toBe(310);
    expect(r.drivingMin).toBe(250);
    expect(r.waitMin).toBe(10);
    const again = replay(p, r);
    expect(again.visits).toEqual(times(r));
    expect(again.breaks).toEqual(r.breaks);
    expect(again.returnMin).toBe(r.returnMin);
  });

  it("fits a due lunch into the wait for a window, and takes none when the day ends before it", () => {
    // Shift from 10:30; depot <-> S1 60 min; S1 opens 12:40-13:00; lunch 12:00-13:30, 30 min.
    // Worked by hand: leaving 10:30 would wait 40 min, so the van leaves 11:10, arrives 12:10,
    // lunches 12:10-12:40 while the window is still closed, serves 12:40-12:50, is home 13:50.
    const m = [
      [0, 60],
      [60, 0],
    ];
    const lunch = { earliestMin: 720, latestMin: 810, breakMin: 30 };
    const p = matrixProblem(m, { shiftStartMin: 630, windowBreak: lunch }, [{ earliestMin: 760, latestMin: 780 }]);
    const r = evaluatePlan(p, [[0]]).routes[0]!;
    expect(r.departureMin).toBe(670);
    expect(r.breaks).toEqual([{ at: 0, beforeService: true, kind: "window", startMin: 730, endMin: 760 }]);
    expect(times(r)).toEqual([{ arrivalMin: 730, startMin: 760, departureMin: 770 }]);
    expect(r.waitMin).toBe(0);
    expect(r.returnMin).toBe(830);
    expect(replay(p, r).visits).toEqual(times(r));
    // A morning tour home by 10:10 needs no lunch break.
    const q = matrixProblem(m, { shiftStartMin: 480, windowBreak: lunch });
    expect(evaluatePlan(q, [[0]]).routes[0]!.breaks).toEqual([]);
  });

  it("reports a leg longer than the driving limit as a broken break rule", () => {
    const m = [
      [0, 300],
      [300, 0],
    ];
    const plan = evaluatePlan(matrixProblem(m, { drivingBreak: { driveMin: 270, breakMin: 45 } }), [[0]]);
    expect(plan.feasible).toBe(false);
    expect(plan.violations.join(" ")).toMatch(/break rule/);
  });

  it("random routes: every feasible plan's breaks replay to the same times and keep both rules", () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.integer({ min: 10, max: 120 }), { minLength: 6, maxLength: 6 }), { minLength: 6, maxLength: 6 }),
        fc.array(fc.integer({ min: 480, max: 900 }), { minLength: 5, maxLength: 5 }),
        fc.integer({ min: 150, max: 270 }),
        (raw, opens, driveMin) => {
          const travel = raw.map((row, i) => row.map((x, j) => (i === j ? 0 : x)));
          const windows = opens.map((o, k) => (k % 2 === 0 ? { earliestMin: o, latestMin: o + 60 } : undefined));
          const lunch = { earliestMin: 720, latestMin: 810, breakMin: 30 };
          const p = matrixProblem(travel, { shiftStartMin: 420, drivingBreak: { driveMin, breakMin: 45 }, windowBreak: lunch }, windows);
          const plan = evaluatePlan(p, [[0, 1, 2, 3, 4]]);
          const r = plan.routes[0]!;
          const again = replay(p, r);
          expect(again.visits).toEqual(times(r));
          expect(again.breaks).toEqual(r.breaks);
          expect(again.returnMin).toBeCloseTo(r.returnMin, 9);
          if (!plan.feasible) return;
          expect(Math.max(...again.drives)).toBeLessThanOrEqual(driveMin + 1e-9);
          const lunches = r.breaks.filter((b) => b.kind === "window");
          const due = r.departureMin < lunch.earliestMin + lunch.breakMin && r.returnMin > lunch.latestMin - lunch.breakMin;
          if (due) expect(lunches.length).toBe(1);
          for (const b of lunches) {
            expect(b.startMin).toBeGreaterThanOrEqual(lunch.earliestMin);
            expect(b.endMin).toBeLessThanOrEqual(lunch.latestMin + 1e-9);
          }
        },
      ),
      { seed: 12, numRuns: 300 },
    );
  });
});
