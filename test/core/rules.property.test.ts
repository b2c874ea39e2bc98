import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import type { Problem, Route } from "../../src/core/model.js";
import { applyMove, Move, proposeMove } from "../../src/core/moves/proposeMove.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem, type CompiledProblem } from "../../src/core/schedule/compileProblem.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { rulesInstance } from "./rulesInstance.js";

/** Penalised total computed only from `evaluatePlan`'s independent numbers (max load at any point, every rule). */
function penalisedFromPlan(problem: Problem, cp: CompiledProblem, state: SearchState): number {
  const routes = state.routes.map((r) => Array.from(r.nodes.subarray(1, r.len + 1)));
  const plan = evaluatePlan(problem, routes);
  let total = 0;
  plan.routes.forEach((r: Route, v) => {
    if (r.visits.length === 0) return;
    const veh = problem.vehicles[v]!;
    const limits =
      Math.max(0, r.drivingMin - (veh.maxDrivingMin ?? Infinity)) +
      Math.max(0, r.dutyMin - (veh.maxDutyMin ?? Infinity)) +
      Math.max(0, r.distanceKm - (veh.maxKm ?? Infinity));
    total += r.cost + state.wTime * (r.lateMin + r.overtimeMin + r.breakViolationMin + limits);
    let excess = 0;
    problem.loadDimensions.forEach((_, d) => {
      excess += Math.max(0, r.maxLoad[d]! - veh.capacity[d]!) / cp.loadScale[d]!;
    });
    if (veh.maxStops !== undefined) excess += Math.max(0, r.visits.length - veh.maxStops);
    total += state.wLoad * excess;
  });
  for (const u of plan.unassigned) total += cp.unservedCost[u.stop]!;
  return total;
}

describe("the dispatcher's rules in the search (pickups, limits, breaks, pins)", () => {
  const cases = [
    { seed: 11, stops: 14, vehicles: 3, breaks: false, limits: false },
    { seed: 12, stops: 20, vehicles: 4, breaks: false, limits: true },
    { seed: 13, stops: 16, vehicles: 3, breaks: true, limits: true },
    { seed: 14, stops: 22, vehicles: 4, breaks: true, limits: false },
  ];
  for (const c of cases) {
    it(`every applied move's cost change, load at every point and rules equal a full re-evaluation (seed ${c.seed})`, () => {
      const problem = rulesInstance(c.seed, c.stops, c.vehicles, c);
      const cp = compileProblem(problem);
      const state = new SearchState(cp, 3, 7);
      const rng = createRandom(c.seed);
      const init: number[][] = problem.vehicles.map(() => []);
      for (let s = 0; s < cp.n; s++) {
        if (cp.unservableReason[s]) continue;
        const allowed = problem.vehicles.map((_, v) => v).filter((v) => cp.compatible[s * cp.vehicleCount + v]);
        init[allowed[rng.int(allowed.length)]!]!.push(s);
      }
      init.forEach((r, v) => state.setRoute(v, r));
      const nb = buildNeighbours(cp, 6);
      const mv = new Move();
      let before = penalisedFromPlan(problem, cp, state);
      expect(state.total()).toBeCloseTo(before, 6);
      let applied = 0;
      for (let k = 0; k < 2500; k++) {
        if (!proposeMove(state, nb, rng, mv)) continue;
        if (rng.next() < 0.5) continue;
        applyMove(state, mv);
        applied++;
        const after = penalisedFromPlan(problem, cp, state);
        expect(Math.abs(after - before - mv.delta)).toBeLessThan(1e-9 * Math.max(1, Math.abs(after)) + 1e-7);
        expect(Math.abs(state.total() - after)).toBeLessThan(1e-6 * Math.max(1, Math.abs(after)));
        // Pins and exclusions are never broken by a move.
        for (let v = 0; v < cp.vehicleCount; v++) {
          const r = state.routes[v]!;
          for (let p = 1; p <= r.len; p++) expect(cp.compatible[r.nodes[p]! * cp.vehicleCount + v]).toBe(1);
        }
        before = after;
      }
      expect(applied).toBeGreaterThan(200);
    });
  }
});
