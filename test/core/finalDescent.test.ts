import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { parseTsplib, tsplibToProblem } from "../../src/core/formats/index.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { finalDescent } from "../../src/core/search/finalDescent.js";
import { createSolver, solve } from "../../src/core/solve.js";

// TSPLIB95 ulysses22 (committed fixture, test/fixtures/reference; optimal length 7013 in its optimal.csv).
const text = readFileSync(new URL("../fixtures/reference/ulysses22.tsp", import.meta.url), "utf8");
const OPTIMAL = 7013;

/** The GEO distance as the TSPLIB95 documentation (Reinelt 1995) writes it, here on its own. */
function geo(a: readonly [number, number], b: readonly [number, number]): number {
  const PI = 3.141592;
  const rad = (x: number): number => {
    const deg = Math.trunc(x);
    return (PI * (deg + (5 * (x - deg)) / 3)) / 180;
  };
  const [latA, lonA] = [rad(a[0]), rad(a[1])];
  const [latB, lonB] = [rad(b[0]), rad(b[1])];
  const q1 = Math.cos(lonA - lonB);
  const q2 = Math.cos(latA - latB);
  const q3 = Math.cos(latA + latB);
  return Math.trunc(6378.388 * Math.acos(0.5 * ((1 + q1) * q2 - (1 - q1) * q3)) + 1);
}

/** Node coordinates straight from the file's NODE_COORD_SECTION. */
function coordinates(): [number, number][] {
  const lines = text.split("\n");
  const from = lines.findIndex((l) => l.trim() === "NODE_COORD_SECTION") + 1;
  const out: [number, number][] = [];
  for (const l of lines.slice(from)) {
    const parts = l.trim().split(/\s+/).map(Number);
    if (parts.length !== 3 || parts.some((x) => !Number.isFinite(x))) break;
    out.push([parts[1]!, parts[2]!]);
  }
  return out;
}

describe("final descent (steepest descent over the moves the annealer draws)", () => {
  const xy = coordinates();
  const d = (i: number, j: number): number => (i === j ? 0 : geo(xy[i]!, xy[j]!));
  const length = (tour: readonly number[]): number => tour.reduce((s, c, i) => s + d(c, tour[(i + 1) % tour.length]!), 0);

  for (const seed of [1, 2, 3]) {
    it(`ends a random ulysses22 tour on a 2-opt and relocate local optimum (independent check, seed ${seed})`, () => {
      const problem = tsplibToProblem(parseTsplib(text));
      const cp = compileProblem(problem);
      const state = new SearchState(cp, 1, 1);
      const rng = createRandom(seed);
      const order = Array.from({ length: cp.n }, (_, s) => s);
      for (let i = order.length - 1; i > 0; i--) {
        const j = rng.int(i + 1);
        [order[i], order[j]] = [order[j]!, order[i]!];
      }
      state.setRoute(0, order);
      const start = length([0, ...order.map((s) => s + 1)]);
      const nb = buildNeighbours(cp, 20);
      expect(nb.k).toBe(cp.n - 1); // 21 stops: every other stop is a neighbour
      let applied = 0;
      const used = finalDescent(state, nb, Int32Array.from(order.keys()), 10_000_000, () => applied++);
      expect(used).toBeLessThan(10_000_000);
      expect(applied).toBeGreaterThan(0);
      const r = state.routes[0]!;
      // Node 1 is the depot (location 0); stop s is node s + 2, at location s + 1.
      const tour = [0, ...Array.from(r.nodes.subarray(1, r.len + 1), (s) => s + 1)];
      const len = length(tour);
      expect(len).toBeLessThan(start);
      expect(len).toBeGreaterThanOrEqual(OPTIMAL);
      expect(state.realCost()).toBeCloseTo(len, 6);
      const n = tour.length;
      // No 2-opt exchange (reverse tour[i+1..j]) shortens the tour, among those the annealer's
      // 2-opt within a route makes: they keep the route's first leg (i >= 1), so the exchanges
      // that replace it are not checked.
      for (let i = 1; i < n - 1; i++) {
        for (let j = i + 2; j < n; j++) {
          const a = tour[i]!;
          const b = tour[i + 1]!;
          const c = tour[j]!;
          const e = tour[(j + 1) % n]!;
          if (e === a) continue;
          expect(d(a, c) + d(b, e) - d(a, b) - d(c, e)).toBeGreaterThanOrEqual(0);
        }
      }
      // No single stop moved elsewhere shortens it.
      for (let i = 1; i < n; i++) {
        const rest = tour.filter((_, k) => k !== i);
        for (let p = 1; p <= rest.length; p++) {
          const moved = [...rest.slice(0, p), tour[i]!, ...rest.slice(p)];
          expect(length(moved)).toBeGreaterThanOrEqual(len);
        }
      }
    });
  }

  it("runs inside the budget: a move budget is used exactly, the plan the same however the run is sliced", () => {
    const problem = tsplibToProblem(parseTsplib(text));
    const whole = solve(problem, { seed: 4, budget: { moves: 40_000 } });
    expect(whole.stats.moves).toBe(40_000);
    expect(whole.plan.totals.distanceKm).toBeGreaterThanOrEqual(OPTIMAL);
    const solver = createSolver(problem, { seed: 4, budget: { moves: 40_000 } });
    while (!solver.step(37)) {
      // small slices: the descent pauses between stops many times
    }
    expect(solver.result().plan.routes).toEqual(whole.plan.routes);
    expect(solver.result().stats.moves).toBe(40_000);
  });
});
