import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import type { Problem } from "../../src/core/model.js";
import { applyMove, Move, proposeMove } from "../../src/core/moves/proposeMove.js";
import { R_COUNT, R_EXCESS, R_SIZE } from "../../src/core/moves/routeResults.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { penalisedFromPlan } from "./penalisedFromPlan.js";
import { randomStart } from "./randomStart.js";
import { randomInstance } from "./randomInstance.js";

/**
 * `randomInstance` (invented demo data) with `count` load dimensions instead of two: demands of
 * 0 to 9 per dimension and capacities that some routes exceed, so that the excess of every
 * dimension is counted. The search adds one dimension of its own (the stop count), so 0 to 4
 * here cover every way `evaluatePieces` and `RouteArrays.rebuild` hold the loads (the first three
 * in locals, the others in a scratch array).
 */
function withDimensions(seed: number, count: number): Problem {
  const p = randomInstance(seed, { stops: 24, vehicles: 4, hard: true });
  const rng = createRandom(`dims-${seed}-${count}`);
  return {
    ...p,
    loadDimensions: Array.from({ length: count }, (_, d) => `dim${d}`),
    stops: p.stops.map((s) => ({ ...s, demand: Array.from({ length: count }, () => rng.int(10)) })),
    vehicles: p.vehicles.map((v) => ({ ...v, capacity: Array.from({ length: count }, () => 20 + rng.int(30)) })),
  };
}

describe("loads of any number of dimensions in the move evaluation", () => {
  for (const count of [0, 1, 2, 3, 4]) {
    it(`gives the walked evaluation (loads bitwise), and cost changes the independent evaluator confirms (${count} load dimensions)`, () => {
      const problem = withDimensions(count + 1, count);
      const cp = compileProblem(problem);
      expect(cp.dims).toBe(count + 1);
      const state = new SearchState(cp, 3, 7);
      const rng = createRandom(count + 11);
      randomStart(state, rng);
      const nb = buildNeighbours(cp, 6);
      const mv = new Move();
      let before = penalisedFromPlan(problem, cp, state);
      let compared = 0;
      let overloaded = 0;
      for (let k = 0; k < 2000; k++) {
        if (!proposeMove(state, nb, rng, mv)) continue;
        // The same candidate routes walked stop by stop (`evaluateFully`, the generic path:
        // every stop a piece of its own): the stop count and the excess load (sums of whole
        // numbers) bitwise, the other results up to rounding (prefix-sum differences there).
        const fast = Array.from(state.out);
        state.evaluateFully(mv.vA, mv.piecesA, mv.mA, 0);
        if (mv.vB >= 0) state.evaluateFully(mv.vB, mv.piecesB, mv.mB, 1);
        for (let slot = 0; slot < (mv.vB >= 0 ? 2 : 1); slot++) {
          const o = slot * R_SIZE;
          expect(state.out[o + R_COUNT], `count, move ${k}`).toBe(fast[o + R_COUNT]);
          expect(state.out[o + R_EXCESS], `excess, move ${k}`).toBe(fast[o + R_EXCESS]);
          for (let i = 0; i < R_SIZE; i++)
            expect(Math.abs(state.out[o + i]! - fast[o + i]!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(fast[o + i]!)));
          if (fast[o + R_EXCESS]! > 0) overloaded++;
        }
        compared++;
        if (rng.next() < 0.5) continue;
        // Applied with the incremental numbers again (`apply` stores what `evaluate` left).
        state.evaluate(mv.vA, mv.piecesA, mv.mA, 0);
        if (mv.vB >= 0) state.evaluate(mv.vB, mv.piecesB, mv.mB, 1);
        applyMove(state, mv);
        const after = penalisedFromPlan(problem, cp, state);
        expect(Math.abs(after - before - mv.delta)).toBeLessThan(1e-9 * Math.max(1, Math.abs(after)) + 1e-7);
        before = after;
        // Every route's loads, rebuilt as prefix sums, are the demands of its stops.
        for (const r of state.routes) {
          for (let d = 0; d < cp.dims; d++) {
            let sum = 0;
            for (let p = 1; p <= r.len; p++) sum += cp.demand[r.nodes[p]! * cp.dims + d]!;
            expect(r.data[r.len * r.stride + r.oLoad + d]).toBe(sum);
          }
        }
      }
      expect(compared).toBeGreaterThan(1000);
      if (count > 0) expect(overloaded).toBeGreaterThan(0);
    });
  }
});
