import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { EarlierPlan, Plan, Problem } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { solve } from "../../src/core/solve.js";
import { validateProblem } from "../../src/core/validateProblem.js";
import { randomInstance } from "./randomInstance.js";

// Re-planning a published day. Expected values come from the earlier plan itself (stability),
// from an exhaustive enumeration written here (independent of the annealer), or from the rule
// stated in the model (locked routes are kept exactly).

/** The stop ids of each route. */
function routeIds(problem: Problem, plan: Plan): string[][] {
  return plan.routes.map((r) => r.visits.map((v) => problem.stops[v.stop]!.id));
}

/** `problem` without the stops whose ids are in `drop` (the matrix keeps every location). */
function withoutStops(problem: Problem, drop: ReadonlySet<string>): Problem {
  return { ...problem, stops: problem.stops.filter((s) => !drop.has(s.id)) };
}

/** An earlier plan given by stop ids, as indices of `problem` (stops it no longer has are left out). */
function earlierFrom(problem: Problem, ids: readonly (readonly string[])[], stabilityCost: number, locked: number[] = []): EarlierPlan {
  const index = new Map(problem.stops.map((s, i) => [s.id, i]));
  return {
    routes: ids.map((r) => r.filter((id) => index.has(id)).map((id) => index.get(id)!)),
    stabilityCost,
    locked,
  };
}

describe("re-planning a published day", () => {
  it("a plan re-solved with no change to the input and a high stability cost is identical", () => {
    const problem = randomInstance(5, { stops: 18, vehicles: 5, windows: true, hard: true });
    const first = solve(problem, { seed: 1, budget: { moves: 60_000 } }).plan;
    expect(first.unassigned).toEqual([]);
    const earlier = earlierFrom(problem, routeIds(problem, first), 1e6);
    const again = solve({ ...problem, earlier }, { seed: 9, budget: { moves: 60_000 } }).plan;
    expect(routeIds(problem, again)).toEqual(routeIds(problem, first));
    expect(again.totals.vehicleChanges).toBe(0);
    expect(again.totals.cost).toBeCloseTo(first.totals.cost, 9);
  });

  for (const seed of [3, 8, 13]) {
    it(`with one stop added, at most the route that takes it changes (seed ${seed})`, () => {
      const full = randomInstance(seed, { stops: 15, vehicles: 5, windows: seed % 2 === 1, hard: true });
      const added = full.stops[full.stops.length - 1]!.id;
      const before = withoutStops(full, new Set([added]));
      const first = solve(before, { seed, budget: { moves: 50_000 } }).plan;
      expect(first.unassigned).toEqual([]);
      const old = routeIds(before, first);
      const next = solve({ ...full, earlier: earlierFrom(full, old, 1e5) }, { seed: seed + 1, budget: { moves: 50_000 } }).plan;
      const now = routeIds(full, next);
      const changed = now.map((r, v) => r.join() !== old[v]!.join()).filter(Boolean).length;
      expect(changed).toBeLessThanOrEqual(1);
      now.forEach((r, v) => {
        if (r.includes(added)) expect(r.filter((id) => id !== added)).toEqual(old[v]);
        else expect(r).toEqual(old[v]);
      });
      expect(next.totals.vehicleChanges).toBe(0);
    });
  }

  it("locked routes never change, whatever stops were added, cancelled or the stability cost (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10_000 }),
        fc.integer({ min: 0, max: 200 }),
        fc.array(fc.boolean(), { minLength: 3, maxLength: 3 }),
        (seed, stability, lockFlags) => {
          const full = randomInstance(seed, { stops: 14, vehicles: 3, windows: seed % 2 === 0, hard: true, optional: seed % 3 === 0 });
          const ids = full.stops.map((s) => s.id);
          const added = new Set(ids.filter((_, i) => i % 5 === seed % 5));
          const cancelled = new Set(ids.filter((_, i) => i % 4 === seed % 4 && !added.has(ids[i]!)));
          const before = withoutStops(full, added);
          // A short run: its plan is far from the best, so the re-plan has reasons to move stops.
          const old = routeIds(before, solve(before, { seed, budget: { moves: 2_000 } }).plan);
          const locked = lockFlags.flatMap((on, v) => (on ? [v] : []));
          const now = withoutStops(full, cancelled);
          const problem = { ...now, earlier: earlierFrom(now, old, stability, locked) };
          expect(validateProblem(problem)).toEqual([]);
          const plan = solve(problem, { seed: seed + 7, budget: { moves: 8_000 } }).plan;
          const got = routeIds(now, plan);
          for (const v of locked) expect(got[v]).toEqual(old[v]!.filter((id) => !cancelled.has(id)));
          // Every stop is served once or listed unassigned once.
          const seen = [...got.flat(), ...plan.unassigned.map((u) => now.stops[u.stop]!.id)].sort();
          expect(seen).toEqual(now.stops.map((s) => s.id).sort());
        },
      ),
      { numRuns: 25, seed: 12 },
    );
  });

  /**
   * Exhaustive optimum of the re-plan objective: the plan cost plus the stability cost times the
   * stops served by another vehicle than before, over every ordered split of the stops between
   * the two vehicles that keeps the rules and keeps each vehicle's earlier stops in their earlier order.
   */
  function bruteForce(problem: Problem, home: readonly number[], rank: readonly number[], stability: number) {
    const n = problem.stops.length;
    let best = { value: Infinity, moved: -1 };
    const perm = Array.from({ length: n }, (_, i) => i);
    const keepsOrder = (route: readonly number[], v: number): boolean => {
      const ranks = route.filter((s) => home[s] === v).map((s) => rank[s]!);
      return ranks.every((r, k) => k === 0 || r > ranks[k - 1]!);
    };
    const visit = (k: number): void => {
      if (k === n) {
        for (let cut = 0; cut <= n; cut++) {
          const routes = [perm.slice(0, cut), perm.slice(cut)];
          if (!routes.every(keepsOrder)) continue;
          const plan = evaluatePlan(problem, routes);
          if (!plan.feasible) continue;
          const moved = routes.reduce((sum, r, v) => sum + r.filter((s) => home[s]! >= 0 && home[s] !== v).length, 0);
          const value = plan.totals.cost + stability * moved;
          if (value < best.value) best = { value, moved };
        }
        return;
      }
      for (let i = k; i < n; i++) {
        [perm[k], perm[i]] = [perm[i]!, perm[k]!];
        visit(k + 1);
        [perm[k], perm[i]] = [perm[i]!, perm[k]!];
      }
    };
    visit(0);
    return best;
  }

  // The earlier plan is deliberately poor (stops dealt out alternately), so moving stops pays at
  // a low stability cost and not at a high one; the last stop is new (no earlier vehicle).
  for (const [seed, stability] of [
    [21, 0],
    [21, 8],
    [22, 25],
    [23, 1e4],
  ] as const) {
    it(`the stability cost is counted exactly: the annealer's best equals the enumerated optimum (seed ${seed}, cost ${stability} per stop moved)`, () => {
      const problem = randomInstance(seed, { stops: 7, vehicles: 2, windows: seed % 2 === 0, hard: true });
      const n = problem.stops.length;
      const routes: number[][] = [[], []];
      for (let s = 0; s < n - 1; s++) routes[s % 2]!.push(s);
      const home = Array.from({ length: n }, (_, s) => (s < n - 1 ? s % 2 : -1));
      const rank = Array.from({ length: n }, (_, s) => Math.floor(s / 2));
      const earlier: EarlierPlan = { routes, stabilityCost: stability, locked: [] };
      const optimum = bruteForce(problem, home, rank, stability);
      expect(Number.isFinite(optimum.value)).toBe(true);
      const plan = solve({ ...problem, earlier }, { seed, budget: { moves: 60_000 } }).plan;
      expect(plan.feasible).toBe(true);
      const moved = plan.routes.reduce(
        (sum, r) => sum + r.visits.filter((x) => home[x.stop]! >= 0 && home[x.stop] !== r.vehicle).length,
        0,
      );
      expect(plan.totals.vehicleChanges).toBe(moved);
      expect(plan.totals.cost + stability * moved).toBeCloseTo(optimum.value, 6);
    });
  }
});
