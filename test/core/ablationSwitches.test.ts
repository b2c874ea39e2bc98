import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { parseSolomon, solomonToProblem } from "../../src/core/formats/index.js";
import type { Plan, Problem } from "../../src/core/model.js";
import { applyMove, Move, proposeMove } from "../../src/core/moves/proposeMove.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours, everyPartner } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { solve } from "../../src/core/solve.js";
import { checkSolomonPlan, readRawSolomon } from "../reference/solomonChecker.js";
import { penalisedFromPlan } from "./penalisedFromPlan.js";
import { randomStart } from "./randomStart.js";
import { randomInstance } from "./randomInstance.js";

// Solomon (1987) C101 and R101 are committed fixtures (test/fixtures/reference, sources in its README).
const text = (name: string): string => readFileSync(new URL(`../fixtures/reference/${name}`, import.meta.url), "utf8");
const C101 = text("C101.txt");
const R101 = text("R101.txt");
const BUDGET = { moves: 60_000 };

/** Every plan a switched-off run returns is re-checked against Solomon's rules by the independent checker. */
function expectSolomonFeasible(raw: string, problem: Problem, plan: Plan): void {
  const routes = plan.routes.filter((r) => r.visits.length > 0).map((r) => r.visits.map((v) => Number(problem.stops[v.stop]!.id)));
  expect(checkSolomonPlan(readRawSolomon(raw), routes).violations).toEqual([]);
  expect(plan.unassigned).toEqual([]);
}

describe("ablation switches of SolveOptions (each changes what the search does)", () => {
  it("granular neighbourhood off: partners come from every stop, not only the k nearest", () => {
    const problem = solomonToProblem(parseSolomon(R101));
    const cp = compileProblem(problem);
    const state = new SearchState(cp, 1, 1);
    // One route per 10 stops in index order, so most partners sit on a route.
    for (let v = 0; v < 10; v++)
      state.setRoute(
        v,
        Array.from({ length: 10 }, (_, i) => 10 * v + i),
      );
    const nb = buildNeighbours(cp, 5);
    const partners = (n: typeof nb): { outside: number; drawn: number; distinct: number } => {
      const rng = createRandom("partners");
      const mv = new Move();
      const seen = new Set<number>();
      let outside = 0;
      let drawn = 0;
      for (let k = 0; k < 4000; k++) {
        proposeMove(state, n, rng, mv);
        if (mv.v < 0 || mv.v === mv.u) continue;
        drawn++;
        seen.add(mv.v);
        if (!Array.from(nb.list.subarray(mv.u * nb.k, mv.u * nb.k + nb.k)).includes(mv.v)) outside++;
      }
      return { outside, drawn, distinct: seen.size };
    };
    const granular = partners(nb);
    expect(granular.drawn).toBeGreaterThan(3000);
    expect(granular.outside).toBe(0);
    // Uniform over the 100 customers: 94 of 99 partners of a stop lie outside its 5 nearest.
    const all = partners(everyPartner(cp, nb));
    expect(all.outside / all.drawn).toBeGreaterThan(0.85);
    expect(all.distinct).toBe(100);
  });

  it("granular neighbourhood off in solve: another search, still a feasible plan", () => {
    const problem = solomonToProblem(parseSolomon(C101));
    const on = solve(problem, { seed: 1, budget: BUDGET });
    const off = solve(problem, { seed: 1, budget: BUDGET, granularNeighbours: false });
    expectSolomonFeasible(C101, problem, off.plan);
    expect(off.plan.routes).not.toEqual(on.plan.routes);
  });

  it("O(1) evaluation off: every candidate route walked stop by stop, cost changes equal evaluatePlan's", () => {
    // The independent re-evaluation through evaluatePlan, as in moves.property.test.ts.
    const problem = randomInstance(5, { stops: 24, vehicles: 4, hard: true, optional: true });
    const cp = compileProblem(problem);
    const state = new SearchState(cp, 3, 7);
    state.fullEvaluation = true;
    const rng = createRandom(5);
    randomStart(state, rng);
    const nb = buildNeighbours(cp, 6);
    const mv = new Move();
    let before = penalisedFromPlan(problem, cp, state);
    let evaluated = 0;
    let routes = 0;
    for (let k = 0; k < 1500; k++) {
      const counted = state.fullEvaluations;
      if (!proposeMove(state, nb, rng, mv)) continue;
      evaluated++;
      routes += mv.vB >= 0 ? 2 : 1;
      expect(state.fullEvaluations - counted).toBe(mv.vB >= 0 ? 2 : 1);
      if (rng.next() < 0.5) continue;
      applyMove(state, mv);
      const after = penalisedFromPlan(problem, cp, state);
      expect(Math.abs(after - before - mv.delta)).toBeLessThan(1e-9 * Math.max(1, Math.abs(after)) + 1e-7);
      before = after;
    }
    expect(evaluated).toBeGreaterThan(500);
    expect(routes).toBeGreaterThan(evaluated);
  });

  it("O(1) evaluation off in solve: the run counts its full evaluations, the plan is feasible", () => {
    const problem = solomonToProblem(parseSolomon(R101));
    const on = solve(problem, { seed: 1, budget: BUDGET });
    const off = solve(problem, { seed: 1, budget: BUDGET, incrementalEvaluation: false });
    expect(on.stats.fullRouteEvaluations).toBe(0);
    expect(off.stats.fullRouteEvaluations).toBeGreaterThanOrEqual(off.stats.evaluations);
    expectSolomonFeasible(R101, problem, off.plan);
  });

  it("route minimisation off: no route is emptied on purpose", () => {
    const problem = solomonToProblem(parseSolomon(C101));
    const on = solve(problem, { seed: 1, budget: BUDGET });
    const off = solve(problem, { seed: 1, budget: BUDGET, routeMinimisation: false });
    expect(on.stats.routeEliminations).toBeGreaterThan(0);
    expect(off.stats.routeEliminations).toBe(0);
    expectSolomonFeasible(C101, problem, off.plan);
  });

  it("adaptive penalties off: the weights never change", () => {
    const problem = solomonToProblem(parseSolomon(R101));
    const on = solve(problem, { seed: 1, budget: BUDGET });
    const off = solve(problem, { seed: 1, budget: BUDGET, adaptivePenalties: false });
    expect(on.stats.penaltyUpdates).toBeGreaterThan(0);
    expect(off.stats.penaltyUpdates).toBe(0);
    expect(off.plan.routes).not.toEqual(on.plan.routes);
  });
});
