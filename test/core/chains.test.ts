import { describe, expect, it } from "vitest";
import { chainSeed, combineProgress, keptChain, type Plan, type Problem, type Progress } from "../../src/core/index.js";

// Hand-worked examples of the chain bookkeeping (the order itself is comparePlans', tested with the solver).
const problem = { objective: "hierarchical" } as Problem;
const plan = (cost: number, vehiclesUsed: number, broken = false): Plan =>
  ({ violations: broken ? ["late at S1"] : [], totals: { cost, vehiclesUsed, mustServeUnassigned: 0 } }) as unknown as Plan;

describe("chains in the core", () => {
  it("chain 0 keeps the run's seed, the others derive theirs", () => {
    expect(chainSeed(7, 0)).toBe(7);
    expect(chainSeed(7, 2)).toBe("7/chain 2");
    expect(chainSeed("a", 1)).toBe("a/chain 1");
  });

  it("keeps the best plan by the solver's order, the lowest chain among equals", () => {
    expect(keptChain(problem, [plan(100, 3), plan(90, 3)])).toBe(1);
    expect(keptChain(problem, [plan(100, 3), plan(100, 3), plan(100, 3)])).toBe(0);
    // Hierarchical: fewer vehicles first, even at a higher cost; a plan that breaks a rule loses to one that keeps them.
    expect(keptChain(problem, [plan(80, 4), plan(120, 3)])).toBe(1);
    expect(keptChain(problem, [plan(50, 2, true), plan(120, 3)])).toBe(1);
    expect(() => keptChain(problem, [])).toThrow(RangeError);
  });

  it("combines progress: moves summed, the lowest best cost, the slowest chain's fraction and time", () => {
    const p = (moves: number, fraction: number, bestCost: number, elapsedMs: number, worseAccepted?: number): Progress => ({
      moves,
      fraction,
      temperature: moves,
      currentCost: bestCost + 10,
      bestCost,
      acceptanceRate: 0.5,
      ...(worseAccepted !== undefined ? { worseAccepted } : {}),
      elapsedMs,
    });
    const c = combineProgress([p(100, 0.5, 900, 40, 0.2), p(80, 0.4, 850, 55, 0.4)]);
    expect(c).toMatchObject({ moves: 180, fraction: 0.4, bestCost: 850, currentCost: 860, temperature: 100, elapsedMs: 55 });
    expect(c.worseAccepted).toBeCloseTo(0.3, 12);
    // Before every chain has reported, the fraction stays 0; a chain with no feasible plan yet does not hide another's.
    expect(combineProgress([p(100, 0.5, Infinity, 10), undefined]).fraction).toBe(0);
    expect(combineProgress([p(100, 0.5, Infinity, 10), p(5, 0.1, 700, 12)]).bestCost).toBe(700);
  });
});
