import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { randomOrder } from "./randomStart.js";
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

  /** Stops of the route as TSPLIB locations, depot first: stop s is node s + 2, at location s + 1. */
  function tourOf(state: SearchState): number[] {
    const r = state.routes[0]!;
    return [0, ...Array.from(r.nodes.subarray(1, r.len + 1), (s) => s + 1)];
  }

  /**
   * The shortest tour one 2-opt exchange (Croes 1958: reverse tour[i+1..j]) or one or-opt move
   * (Or 1976: a chain of 1 to 3 cities moved elsewhere, either way round) makes, enumerated
   * here on the tour alone (definitions from memory); the depot (tour[0]) stays first.
   */
  function bestNeighbour(tour: readonly number[]): number {
    const n = tour.length;
    let best = Infinity;
    for (let i = 0; i < n - 1; i++) {
      for (let j = i + 2; j < n; j++) {
        if (i === 0 && j === n - 1) continue;
        best = Math.min(best, length([...tour.slice(0, i + 1), ...tour.slice(i + 1, j + 1).reverse(), ...tour.slice(j + 1)]));
      }
    }
    for (let c = 1; c <= 3; c++) {
      for (let i = 1; i + c <= n; i++) {
        const chain = tour.slice(i, i + c);
        const rest = [...tour.slice(0, i), ...tour.slice(i + c)];
        for (let p = 1; p <= rest.length; p++) {
          for (const turned of [chain, [...chain].reverse()])
            best = Math.min(best, length([...rest.slice(0, p), ...turned, ...rest.slice(p)]));
        }
      }
    }
    return best;
  }

  /** A state on ulysses22 with the route `order` (stop indices). */
  function stateWith(order: readonly number[]): { state: SearchState; nb: ReturnType<typeof buildNeighbours> } {
    const cp = compileProblem(tsplibToProblem(parseTsplib(text)));
    const state = new SearchState(cp, 1, 1);
    state.setRoute(0, order);
    const nb = buildNeighbours(cp, 20);
    expect(nb.k).toBe(cp.n - 1); // 21 stops: every other stop is a neighbour
    return { state, nb };
  }

  for (const seed of [1, 2, 3]) {
    it(`ends a random ulysses22 tour on a 2-opt and or-opt local optimum, first and last legs included (independent check, seed ${seed})`, () => {
      const order = randomOrder(21, createRandom(seed));
      const { state, nb } = stateWith(order);
      const start = length([0, ...order.map((s) => s + 1)]);
      let applied = 0;
      const used = finalDescent(state, nb, Int32Array.from(order.keys()), 10_000_000, () => applied++);
      expect(used).toBeLessThan(10_000_000);
      expect(applied).toBeGreaterThan(0);
      const tour = tourOf(state);
      const len = length(tour);
      expect(len).toBeLessThan(start);
      expect(len).toBeGreaterThanOrEqual(OPTIMAL);
      expect(state.realCost()).toBeCloseTo(len, 6);
      expect(bestNeighbour(tour)).toBeGreaterThanOrEqual(len);
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
