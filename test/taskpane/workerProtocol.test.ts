import { describe, expect, it } from "vitest";
import { getDistance } from "geolib";
import type { Problem, Stop, Vehicle } from "../../src/core/model.js";
import { buildMatrix } from "../../src/core/geo/buildMatrix.js";
import { describeProfile, profile } from "../../src/core/index.js";
import { createEngineHost, type FromWorker, type ToWorker } from "../../src/taskpane/workerProtocol.js";

// Demo data (invented): a depot in the middle of Lyon and eight drops around it.
const DEPOT = { lat: 45.764, lon: 4.8357, name: "Depot" };
const DROPS = [
  [45.7578, 4.832],
  [45.7676, 4.8344],
  [45.7485, 4.8467],
  [45.7772, 4.8554],
  [45.7597, 4.8422],
  [45.7433, 4.8155],
  [45.771, 4.8203],
  [45.7525, 4.8628],
] as const;
const DETOUR = 1.3;

function demoProblem(): Problem {
  const locations = [DEPOT, ...DROPS.map(([lat, lon], i) => ({ lat, lon, name: `Drop ${i + 1}` }))];
  const stops: Stop[] = DROPS.map((_, i) => ({
    id: `S${i + 1}`,
    name: `Drop ${i + 1}`,
    location: i + 1,
    demand: [10],
    windows: [{ earliestMin: 8 * 60, latestMin: 18 * 60 }],
    serviceMin: 5,
  }));
  const vehicle = (id: string): Vehicle => ({
    id,
    capacity: [100],
    startLocation: 0,
    endLocation: 0,
    shiftStartMin: 7 * 60,
    shiftEndMin: 19 * 60,
    fixedCost: 50,
    costPerKm: 0.5,
    costPerHour: 20,
    speedKmh: 30,
  });
  return {
    locations,
    stops,
    vehicles: [vehicle("Van 1"), vehicle("Van 2")],
    loadDimensions: ["kg"],
    matrix: buildMatrix(locations, { detourFactor: DETOUR, speedKmh: 30 }),
    referenceSpeedKmh: 30,
    hardWindows: true,
    lateCostPerMin: 1,
    objective: "weighted",
  };
}

/** A host with a hand-driven event loop and a clock that moves 250 ms per reading. */
function harness(sliceMoves = 200) {
  const sent: FromWorker[] = [];
  const queue: (() => void)[] = [];
  let clockMs = 0;
  const host = createEngineHost({
    post: (m) => sent.push(m),
    now: () => (clockMs += 250),
    defer: (cb) => queue.push(cb),
    sliceMoves,
  });
  const runNext = (): boolean => {
    const cb = queue.shift();
    if (!cb) return false;
    cb();
    return true;
  };
  return { host, sent, runNext, pending: () => queue.length };
}

describe("worker protocol", () => {
  it("start -> progress -> stop -> result keeps every stop exactly once, distances match geolib (reference)", () => {
    const { host, sent, runNext } = harness();
    const problem = demoProblem();
    const start: ToWorker = { type: "start", runId: 7, problem, options: { seed: 3, budget: { moves: 1e9 } } };
    host.handle(start);
    expect(host.busy).toBe(true);
    // Let the run report a few times, then ask it to stop between slices.
    for (let i = 0; i < 1000 && sent.filter((m) => m.type === "progress").length < 3; i++) runNext();
    const progress = sent.filter((m) => m.type === "progress");
    expect(progress.length).toBe(3);
    for (const m of progress) {
      expect(m.runId).toBe(7);
      expect(m.progress.moves).toBeGreaterThan(0);
      expect(m.progress.fraction).toBeGreaterThanOrEqual(0);
      expect(m.progress.fraction).toBeLessThanOrEqual(1);
    }
    host.handle({ type: "stop", runId: 7 } satisfies ToWorker);
    while (runNext());
    expect(host.busy).toBe(false);
    const results = sent.filter((m) => m.type === "result");
    expect(results).toHaveLength(1);
    const result = results[0]!;
    if (result.type !== "result") throw new Error("unreachable");
    expect(result.runId).toBe(7);
    expect(result.stopped).toBe(true);
    const plan = result.result.plan;
    const served = plan.routes.flatMap((r) => r.visits.map((v) => v.stop)).concat(plan.unassigned.map((u) => u.stop));
    expect([...served].sort((a, b) => a - b)).toEqual(problem.stops.map((_, i) => i));
    expect(plan.violations).toEqual([]);
    expect(plan.feasible).toBe(true);
    // geolib's haversine (earth radius 6378137 m) differs from the mean radius by ~0.1%: 0.5% tolerance.
    for (const route of plan.routes) {
      if (route.visits.length === 0) continue;
      const path = [0, ...route.visits.map((v) => problem.stops[v.stop]!.location), 0].map((l) => problem.locations[l]!);
      let km = 0;
      for (let i = 1; i < path.length; i++) {
        km += (getDistance(path[i - 1]!, path[i]!, 0.01) / 1000) * DETOUR;
      }
      expect(Math.abs(route.distanceKm - km) / km).toBeLessThan(0.005);
    }
  });

  it("a run that reaches its move budget posts its result without a stop", () => {
    const { host, sent, runNext } = harness(500);
    host.handle({ type: "start", runId: 1, problem: demoProblem(), options: { seed: 1, budget: { moves: 3000 } } });
    for (let i = 0; i < 10_000 && runNext(); i++);
    const last = sent[sent.length - 1];
    expect(last?.type).toBe("result");
    if (last?.type === "result") expect(last.stopped).toBe(false);
  });

  it("a bad problem comes back as an error message with issues, never a throw", () => {
    const { host, sent, runNext } = harness();
    const good = demoProblem();
    const bad: Problem = {
      ...good,
      stops: good.stops.map((s, i) => (i === 2 ? { ...s, location: 99 } : s)),
    };
    expect(() => host.handle({ type: "start", runId: 2, problem: bad, options: {} })).not.toThrow();
    while (runNext());
    expect(sent).toHaveLength(1);
    const msg = sent[0]!;
    expect(msg.type).toBe("error");
    if (msg.type === "error") {
      expect(msg.runId).toBe(2);
      expect(msg.issues.length).toBeGreaterThan(0);
    }
    expect(host.busy).toBe(false);
  });

  it("an unreadable message is answered with an error naming the expected types", () => {
    const { host, sent } = harness();
    expect(() => host.handle({ type: "launch", requestId: 4 })).not.toThrow();
    expect(() => host.handle(null)).not.toThrow();
    expect(() => host.handle({ type: "start", runId: 5 })).not.toThrow();
    expect(sent.map((m) => m.type)).toEqual(["error", "error", "error"]);
    const first = sent[0]!;
    if (first.type === "error") {
      expect(first.requestId).toBe(4);
      expect(first.message).toMatch(/start, stop, share or sample/);
    }
  });

  it("sample, then the pane's preview profile: the first point accepts the mean uphill change at p0 by the Metropolis formula exp(-dE/T)", () => {
    const { host, sent } = harness();
    host.handle({ type: "sample", requestId: 1, problem: demoProblem(), seed: 1, samples: 200 });
    const sampled = sent[0]!;
    expect(sampled.type).toBe("sampled");
    if (sampled.type !== "sampled") return;
    expect(sampled.meanUphill).toBeGreaterThan(0);
    // The pane draws the preview itself from the sampled changes (CoolingPreview), as here.
    const points = profile({ kind: "timeFraction" }, "metropolis", sampled.meanUphill, 10_000, { p0: 0.5, pEnd: 0.001, points: 11 });
    expect(points).toHaveLength(11);
    const first = points[0]!;
    const last = points[10]!;
    // Metropolis et al. (1953): P = exp(-dE / T).
    expect(Math.exp(-sampled.meanUphill / first.temperature)).toBeCloseTo(0.5, 6);
    expect(Math.exp(-sampled.meanUphill / last.temperature)).toBeCloseTo(0.001, 6);
    expect(describeProfile(points, "metropolis").length).toBeGreaterThan(10);
  });

  it("one run at a time: a second start posts the first run's best plan (stopped) before the new run goes", () => {
    const { host, sent, runNext } = harness();
    host.handle({ type: "start", runId: 10, problem: demoProblem(), options: { seed: 1, budget: { moves: 1e9 } } });
    runNext();
    host.handle({ type: "start", runId: 11, problem: demoProblem(), options: { seed: 2, budget: { moves: 400 } } });
    const first = sent.find((m) => m.type === "result");
    expect(first?.type === "result" && first.runId === 10 && first.stopped).toBe(true);
    for (let i = 0; i < 1000 && runNext(); i++);
    const results = sent.filter((m) => m.type === "result");
    expect(results.map((m) => (m.type === "result" ? [m.runId, m.stopped] : []))).toEqual([
      [10, true],
      [11, false],
    ]);
  });
});
