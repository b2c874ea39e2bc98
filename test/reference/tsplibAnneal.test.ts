import { describe, expect, it } from "vitest";
import { parseTsplib } from "../../src/core/formats/parseTsplib.js";
import { tsplibToProblem } from "../../src/core/formats/tsplibToProblem.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import { solve } from "../../src/core/solve.js";
import { benchmarksAvailable, benchmarkText } from "./benchmarksDir.js";

// Proven optimal lengths published with TSPLIB95 (optimal.csv).
const OPTIMA: Record<string, number> = { burma14: 3323, ulysses16: 6859, ulysses22: 7013 };
const MOVES: Record<string, number> = { burma14: 100_000, ulysses16: 100_000, ulysses22: 200_000 };
const SEEDS = [1, 2, 3];

describe.skipIf(!benchmarksAvailable("annealer on TSPLIB GEO optima"))("the annealer reaches TSPLIB95 optima (move budget, deterministic)", () => {
  for (const [name, optimum] of Object.entries(OPTIMA)) {
    it(`${name}: tour length ${optimum} (TSPLIB95 optimal.csv) for seeds ${SEEDS.join(", ")}`, () => {
      const inst = parseTsplib(benchmarkText(`tsplib/${name}.tsp`));
      const problem = tsplibToProblem(inst);
      for (const seed of SEEDS) {
        const { plan } = solve(problem, { seed, budget: { moves: MOVES[name]! } });
        expect(plan.feasible).toBe(true);
        const route = plan.routes[0]!;
        const tour = [1, ...route.visits.map((v) => Number(problem.stops[v.stop]!.id))];
        expect(tsplibTourLength(inst, tour), `${name} seed ${seed}`).toBe(optimum);
        // The engine's own distance of the plan is the same TSPLIB length.
        expect(plan.totals.distanceKm).toBe(optimum);
      }
    });
  }

  it("the same seed and move budget give the same tour (reproducibility)", () => {
    const problem = tsplibToProblem(parseTsplib(benchmarkText("tsplib/ulysses16.tsp")));
    const tourOf = (seed: number): number[] =>
      solve(problem, { seed, budget: { moves: 20_000 } }).plan.routes[0]!.visits.map((v) => v.stop);
    expect(tourOf(5)).toEqual(tourOf(5));
  });
});
