import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { randomOrder } from "./randomStart.js";
import { parseSolomon, parseTsplib, solomonToProblem, tsplibToProblem } from "../../src/core/formats/index.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import type { Problem } from "../../src/core/model.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { BestPlan } from "../../src/core/search/BestPlan.js";
import { KickSearch } from "../../src/core/search/kickSearch.js";
import { createSolver, solve } from "../../src/core/solve.js";
import { checkPlan } from "./checkPlan.js";

const fixture = (name: string): string => readFileSync(new URL(`../fixtures/reference/${name}`, import.meta.url), "utf8");

// Proven optimal lengths published with TSPLIB95 (test/fixtures/reference/optimal.csv).
const OPTIMA = { burma14: 3323, ulysses16: 6859, ulysses22: 7013 } as const;

/** A state on a TSPLIB instance with a random tour of every city but the first (the depot). */
function randomTour(name: keyof typeof OPTIMA, seed: number) {
  const inst = parseTsplib(fixture(`${name}.tsp`));
  const problem = tsplibToProblem(inst);
  const cp = compileProblem(problem);
  const state = new SearchState(cp, 1, 1);
  const rng = createRandom(seed);
  const order = randomOrder(cp.n, rng);
  state.setRoute(0, order);
  const best = new BestPlan(problem, cp);
  best.consider(state);
  return { inst, problem, cp, state, best, rng, nb: buildNeighbours(cp, 20), active: Int32Array.from(order.keys()) };
}

/** TSPLIB length of the plan's one route, measured by the TSPLIB reader (city 1 is the depot). */
function tspLength(inst: ReturnType<typeof parseTsplib>, problem: Problem, stops: readonly number[]): number {
  return tsplibTourLength(inst, [1, ...stops.map((s) => Number(problem.stops[s]!.id))]);
}

describe("kick phase (iterated local search from the best plan)", () => {
  for (const name of Object.keys(OPTIMA) as (keyof typeof OPTIMA)[]) {
    it(`${name}: kicks and descents alone take a random tour to the TSPLIB95 optimum ${OPTIMA[name]}, seeds 1-3`, () => {
      let kicks = 0;
      for (const seed of [1, 2, 3]) {
        const { inst, problem, state, best, rng, nb, active } = randomTour(name, seed);
        const search = new KickSearch(state, nb, active, rng, false, () => best.consider(state));
        let used = 0;
        for (let got = 1; got > 0 && used < 3_000_000 && best.key2 > OPTIMA[name]; used += got) got = search.run(3_000_000 - used, 10_000);
        kicks += search.kicks;
        const plan = best.plan();
        expect(
          tspLength(
            inst,
            problem,
            plan.routes[0]!.visits.map((v) => v.stop),
          ),
          `${name} seed ${seed}`,
        ).toBe(OPTIMA[name]);
      }
      // The first descent alone can end on the optimum; over three seeds the kicks do some of the work.
      expect(kicks, name).toBeGreaterThan(0);
    });
  }

  it("a kick's worse result is kept by the Metropolis rule (here at a temperature of the mean leg, to see it often), yet the best plan is the lowest plan applied and ends on the TSPLIB95 optimum of ulysses22, 7013, seeds 1-3", () => {
    let keptWorse = 0;
    for (const seed of [1, 2, 3]) {
      const { inst, problem, state, best, rng, nb, active } = randomTour("ulysses22", seed);
      let lowest = Infinity;
      const search = new KickSearch(
        state,
        nb,
        active,
        rng,
        false,
        () => {
          best.consider(state);
          lowest = Math.min(lowest, state.realCost());
        },
        1,
      );
      // A fixed budget, well past the optimum: the search goes on kicking, and drifting, from it.
      for (let used = 0, got = 1; got > 0 && used < 1_000_000; used += got) got = search.run(1_000_000 - used, 10_000);
      keptWorse += search.keptWorse;
      const stops = best.plan().routes[0]!.visits.map((v) => v.stop);
      expect(tspLength(inst, problem, stops), `seed ${seed}`).toBe(OPTIMA.ulysses22);
      expect(best.key2, `seed ${seed}`).toBeCloseTo(lowest, 6);
    }
    expect(keptWorse).toBeGreaterThan(0);
  });

  it("never returns a plan worse than the one it started from, and every plan it returns keeps the rules (Solomon C101, R101, RC201; independent checker)", () => {
    for (const name of ["C101", "R101", "RC201"]) {
      const problem = solomonToProblem(parseSolomon(fixture(`${name}.txt`)));
      // A short annealing run gives a feasible start; then the kick phase alone from it.
      const start = solve(problem, { seed: 2, budget: { moves: 60_000 }, kickPhase: false }).plan;
      expect(checkPlan(problem, start), name).toEqual([]);
      const cp = compileProblem(problem);
      const state = new SearchState(cp, 1, 1);
      if (cp.hierarchical) state.vehicleWeight = 2 * start.totals.cost + 1;
      for (const r of start.routes)
        if (r.visits.length > 0)
          state.setRoute(
            r.vehicle,
            r.visits.map((v) => v.stop),
          );
      expect(state.isFeasible(), name).toBe(true);
      const best = new BestPlan(problem, cp);
      best.consider(state);
      const active = Int32Array.from({ length: cp.n }, (_, s) => s);
      const search = new KickSearch(state, buildNeighbours(cp, 20), active, createRandom(5), cp.hierarchical, () => best.consider(state));
      let used = 0;
      for (let got = 1; got > 0 && used < 200_000; used += got) got = search.run(200_000 - used, 20_000);
      expect(search.kicks, name).toBeGreaterThan(10);
      const plan = best.plan();
      // The independent checker of the tests, not the engine's evaluation.
      expect(checkPlan(problem, plan), name).toEqual([]);
      const usedOf = (p: typeof plan): number => p.routes.filter((r) => r.visits.length > 0).length;
      expect(usedOf(plan), name).toBeLessThanOrEqual(usedOf(start));
      if (usedOf(plan) === usedOf(start)) expect(plan.totals.distanceKm, name).toBeLessThanOrEqual(start.totals.distanceKm + 1e-6);
    }
  });

  it("a run with the phase: the move budget is used exactly, the plan the same however the run is sliced; off, no kick is made", () => {
    const problem = tsplibToProblem(parseTsplib(fixture("ulysses22.tsp")));
    const whole = solve(problem, { seed: 4, budget: { moves: 60_000 } });
    expect(whole.stats.moves).toBe(60_000);
    expect(whole.stats.kicks).toBeGreaterThan(0);
    const solver = createSolver(problem, { seed: 4, budget: { moves: 60_000 } });
    while (!solver.step(37)) {
      // small slices: the phase pauses between stops many times
    }
    expect(solver.result().plan.routes).toEqual(whole.plan.routes);
    expect(solver.result().stats.moves).toBe(60_000);
    expect(solver.result().stats.kicks).toBe(whole.stats.kicks);
    const off = solve(problem, { seed: 4, budget: { moves: 60_000 }, kickPhase: false });
    expect(off.stats.kicks).toBe(0);
    expect(off.stats.moves).toBe(60_000);
  });

  it("Solomon RC201 (a plan of several routes) ends with the quench, as with the phase off: the same plan, no kick; it keeps the rules (independent checker)", () => {
    const problem = solomonToProblem(parseSolomon(fixture("RC201.txt")));
    const on = solve(problem, { seed: 3, budget: { moves: 400_000 } });
    const off = solve(problem, { seed: 3, budget: { moves: 400_000 }, kickPhase: false });
    expect(on.stats.kicks).toBe(0);
    expect(on.plan.routes).toEqual(off.plan.routes);
    expect(checkPlan(problem, on.plan)).toEqual([]);
  });
});
