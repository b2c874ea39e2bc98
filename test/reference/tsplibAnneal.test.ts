import { describe, expect, it } from "vitest";
import { parseTsplib } from "../../src/core/formats/parseTsplib.js";
import { tsplibToProblem } from "../../src/core/formats/tsplibToProblem.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import { solve } from "../../src/core/solve.js";
import { fixtureText } from "./benchmarksDir.js";

// Proven optimal lengths published with TSPLIB95 (optimal.csv); the instances are committed fixtures.
const OPTIMA: Record<string, number> = { burma14: 3323, ulysses16: 6859, ulysses22: 7013 };
const MOVES: Record<string, number> = { burma14: 100_000, ulysses16: 100_000, ulysses22: 300_000 };
const SEEDS = [1, 2, 3];
// A geometric factor of 0.94 is a usual choice (common practice); 100 levels over the budget.
const geometric = (moves: number) => ({ kind: "geometric", alpha: 0.94, movesPerLevel: Math.round(moves / 100) }) as const;

function tourLengthOf(name: string, options: Parameters<typeof solve>[1]): { length: number; engineKm: number; feasible: boolean } {
  const inst = parseTsplib(fixtureText(`${name}.tsp`));
  const problem = tsplibToProblem(inst);
  const { plan } = solve(problem, options);
  const tour = [1, ...plan.routes[0]!.visits.map((v) => Number(problem.stops[v.stop]!.id))];
  return { length: tsplibTourLength(inst, tour), engineKm: plan.totals.distanceKm, feasible: plan.feasible };
}

describe("the annealer reaches TSPLIB95 optima (move budget, deterministic; fixtures)", () => {
  for (const [name, optimum] of Object.entries(OPTIMA)) {
    it(`${name}: tour length ${optimum} (TSPLIB95 optimal.csv) for seeds ${SEEDS.join(", ")}, geometric alpha 0.94`, () => {
      for (const seed of SEEDS) {
        const moves = MOVES[name]!;
        const r = tourLengthOf(name, { seed, budget: { moves }, cooling: geometric(moves) });
        expect(r.feasible).toBe(true);
        expect(r.length, `${name} seed ${seed}`).toBe(optimum);
        // The engine's own distance of the plan is the same TSPLIB length.
        expect(r.engineKm).toBe(optimum);
      }
    });

    it(`${name}: tour length ${optimum} (TSPLIB95 optimal.csv) with the default schedule, seeds ${SEEDS.join(", ")}`, () => {
      for (const seed of SEEDS) {
        expect(tourLengthOf(name, { seed, budget: { moves: MOVES[name]! } }).length, `${name} seed ${seed}`).toBe(optimum);
      }
    });
  }

  it("the same seed and move budget give the same tour (reproducibility)", () => {
    const problem = tsplibToProblem(parseTsplib(fixtureText("ulysses16.tsp")));
    const tourOf = (seed: number): number[] =>
      solve(problem, { seed, budget: { moves: 20_000 } }).plan.routes[0]!.visits.map((v) => v.stop);
    expect(tourOf(5)).toEqual(tourOf(5));
  });
});
