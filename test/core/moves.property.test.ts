import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { applyMove, Move, proposeMove } from "../../src/core/moves/proposeMove.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { penalisedFromPlan } from "./penalisedFromPlan.js";
import { randomStart } from "./randomStart.js";
import { randomInstance } from "./randomInstance.js";

function checkOnce(state: SearchState, n: number): void {
  const count = new Array<number>(n).fill(0);
  for (const r of state.routes) for (let p = 1; p <= r.len; p++) count[r.nodes[p]!]!++;
  for (let k = 0; k < state.poolSize; k++) count[state.pool[k]!]!++;
  expect(count.every((c) => c === 1)).toBe(true);
}

describe("incremental move evaluation (segment concatenation, Vidal et al. 2013)", () => {
  const cases = [
    { seed: 1, stops: 12, vehicles: 3, hard: true },
    { seed: 2, stops: 25, vehicles: 4, hard: false, optional: true },
    { seed: 3, stops: 18, vehicles: 3, windows: false },
    { seed: 4, stops: 30, vehicles: 5, hard: true, optional: true },
  ];
  for (const c of cases) {
    it(`cost change equals a full re-evaluation by evaluatePlan and keeps every stop once (seed ${c.seed})`, () => {
      const problem = randomInstance(c.seed, c);
      const cp = compileProblem(problem);
      const state = new SearchState(cp, 3, 7);
      state.vehicleWeight = c.seed === 4 ? 500 : 0;
      const rng = createRandom(c.seed);
      // Random start: every stop on a random vehicle.
      randomStart(state, rng, () => c.optional === true && rng.next() < 0.2);
      const nb = buildNeighbours(cp, 6);
      const mv = new Move();
      let before = penalisedFromPlan(problem, cp, state);
      expect(state.total()).toBeCloseTo(before, 6);
      let applied = 0;
      for (let k = 0; k < 3000; k++) {
        if (!proposeMove(state, nb, rng, mv)) continue;
        if (rng.next() < 0.5) continue;
        applyMove(state, mv);
        applied++;
        const after = penalisedFromPlan(problem, cp, state);
        expect(Math.abs(after - before - mv.delta)).toBeLessThan(1e-9 * Math.max(1, Math.abs(after)) + 1e-7);
        expect(Math.abs(state.total() - after)).toBeLessThan(1e-6 * Math.max(1, Math.abs(after)));
        checkOnce(state, cp.n);
        before = after;
      }
      expect(applied).toBeGreaterThan(300);
    });
  }
});
