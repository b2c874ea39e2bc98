import { describe, expect, it } from "vitest";
import {
  comparePlans,
  createSolver,
  parseSolomon,
  SHARE_AT,
  shareMarks,
  ShareRounds,
  SharingChain,
  solomonToProblem,
  solve,
  type Plan,
  type Problem,
} from "../../src/core/index.js";
import { checkPlan } from "./checkPlan.js";
import { fixtureText } from "../reference/benchmarksDir.js";

// Solomon R101 (Solomon 1987, committed fixture): 100 customers with tight windows.
const problem: Problem = solomonToProblem(parseSolomon(fixtureText("R101.txt")));
const routesOf = (plan: Plan): number[][] => plan.routes.map((r) => [r.vehicle, ...r.visits.map((v) => v.stop)]);

describe("the marks where chains share", () => {
  it("split a move budget into move counts and a seconds budget into milliseconds, all before the quench", () => {
    expect(shareMarks({ moves: 80_000 })).toEqual([10_000, 20_000, 30_000, 40_000, 50_000, 60_000, 70_000].map((moves) => ({ moves })));
    expect(shareMarks({ seconds: 8 })).toEqual([1000, 2000, 3000, 4000, 5000, 6000, 7000].map((elapsedMs) => ({ elapsedMs })));
    // The quench (temperature 0 from the best plan) starts at 95% of the budget: every chain quenches on its own.
    expect(Math.max(...SHARE_AT)).toBeLessThan(0.95);
    // A budget too small to split has marks only where they fall on distinct moves.
    expect(shareMarks({ moves: 4 }).map((m) => ("moves" in m ? m.moves : -1))).toEqual([1, 2, 3]);
  });
});

describe("the rounds of sharing chains", () => {
  // Two plans of R101 from runs of different seeds, named by the solver's own order.
  const plans = [1, 2].map((seed) => solve(problem, { seed, budget: { moves: 30_000 } }).plan);
  const [better, worse] = comparePlans(problem, plans[0]!, plans[1]!) <= 0 ? [plans[0]!, plans[1]!] : [plans[1]!, plans[0]!];

  it("wait for every chain, then send each the best plan by the solver's order, ties to the lowest chain", () => {
    const rounds = new ShareRounds(problem, 3);
    expect(rounds.arrive(1, worse)).toEqual([]);
    expect(rounds.arrive(2, better)).toEqual([]);
    const out = rounds.arrive(0, better);
    expect(out).toEqual([0, 1, 2].map((chain) => ({ chain, plan: better, from: 0 })));
    expect(rounds.rounds).toBe(1);
  });

  it("stop waiting for a chain that ended, keeping its final plan in the round", () => {
    const rounds = new ShareRounds(problem, 2);
    expect(rounds.arrive(0, worse)).toEqual([]);
    expect(rounds.leave(1, better)).toEqual([{ chain: 0, plan: better, from: 1 }]);
    // Later rounds do not wait for it.
    expect(rounds.arrive(0, worse)).toEqual([{ chain: 0, plan: better, from: 1 }]);
    expect(() => rounds.arrive(1, worse)).toThrow(RangeError);
  });

  it("let waiting chains go on without a plan when the run is stopped", () => {
    const rounds = new ShareRounds(problem, 2);
    rounds.arrive(1, worse);
    expect(rounds.release()).toEqual([{ chain: 1, plan: undefined, from: 1 }]);
    expect(rounds.rounds).toBe(0);
  });
});

describe("a chain that shares (SharingChain, solver.adopt)", () => {
  it("stops at a mark of moves (the same move on every run), adopts a better plan there and goes on at the same point of its schedule", () => {
    const budget = { moves: 80_000 };
    const marks = [{ moves: 40_000 }];
    const a = new SharingChain(problem, createSolver(problem, { seed: 1, budget }), marks);
    const b = new SharingChain(problem, createSolver(problem, { seed: 2, budget }), marks);
    const stoppedAt: number[] = [];
    for (const c of [a, b]) {
      let at = c.advance(3_000);
      while (at === "running") at = c.advance(3_000);
      expect(at).toBe("mark");
      // At the mark, or past it by the rest of one route-minimisation pop (a slice of that phase
      // ends on a whole pop, so that plans do not depend on how a run is sliced).
      expect(c.solver.progress.moves).toBeGreaterThanOrEqual(40_000);
      expect(c.solver.progress.moves).toBeLessThan(40_000 + 5_000);
      stoppedAt.push(c.solver.progress.moves);
      // Both have a plan that keeps every rule by then (R101 has them within a few thousand moves).
      expect(c.best().totals.mustServeUnassigned).toBe(0);
      expect(() => c.advance(1)).toThrow(RangeError);
    }
    // The same seed stops at the same move however it is sliced (here 1 000 moves a slice).
    const again = new SharingChain(problem, createSolver(problem, { seed: 1, budget }), marks);
    let atAgain = again.advance(1_000);
    while (atAgain === "running") atAgain = again.advance(1_000);
    expect(again.solver.progress.moves).toBe(stoppedAt[0]);
    expect(routesOf(again.best())).toEqual(routesOf(a.best()));
    const [winner, loser] = comparePlans(problem, a.best(), b.best()) <= 0 ? [a, b] : [b, a];
    const shared = winner.best();
    const before = { ...loser.solver.progress };
    // Seeds 1 and 2 reach different plans by then (so the loser does adopt).
    expect(comparePlans(problem, shared, loser.best())).toBeLessThan(0);
    loser.resume(shared);
    // The loser's best is now the shared plan, exactly; its moves and temperature did not move.
    expect(routesOf(loser.solver.result().plan)).toEqual(routesOf(shared));
    expect(loser.solver.progress.moves).toBe(before.moves);
    expect(loser.solver.progress.temperature).toBe(before.temperature);
    winner.resume(shared);
    for (const c of [a, b]) {
      let at = c.advance(4_096);
      while (at === "running") at = c.advance(4_096);
      expect(at).toBe("done");
      expect(c.solver.progress.moves).toBe(budget.moves);
      // Re-checked by the independent checker written for the tests.
      expect(checkPlan(problem, c.solver.result().plan)).toEqual([]);
      expect(comparePlans(problem, c.solver.result().plan, shared)).toBeLessThanOrEqual(0);
    }
  }, 120_000);

  it("adopt changes nothing while the route-minimisation phase owns the routes", () => {
    const other = solve(problem, { seed: 5, budget: { moves: 30_000 } }).plan;
    const solver = createSolver(problem, { seed: 1, budget: { moves: 1_000_000 } });
    solver.step(200);
    const before = routesOf(solver.result().plan);
    expect(solver.adopt(other)).toBe(false);
    expect(routesOf(solver.result().plan)).toEqual(before);
    // Without the phase (its ablation switch off) the plan is adopted at once.
    const plain = createSolver(problem, { seed: 1, budget: { moves: 1_000_000 }, routeMinimisation: false });
    plain.step(200);
    expect(plain.adopt(other)).toBe(true);
    expect(routesOf(plain.result().plan)).toEqual(routesOf(other));
  }, 120_000);

  it("adopt refuses a route of a vehicle the problem does not have", () => {
    const solver = createSolver(problem, { seed: 1, budget: { moves: 1_000 } });
    const plan = solver.result().plan;
    const route = plan.routes[0]!;
    expect(() => solver.adopt({ ...plan, routes: [{ ...route, vehicle: problem.vehicles.length }] })).toThrow(RangeError);
  });
});
