import type { Problem } from "../../src/core/model.js";
import type { SearchState } from "../../src/core/moves/SearchState.js";
import type { CompiledProblem } from "../../src/core/schedule/compileProblem.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";

/** Penalised total of a plan computed only from `evaluatePlan`'s independent numbers. */
export function penalisedFromPlan(problem: Problem, cp: CompiledProblem, state: SearchState): number {
  const routes = state.routes.map((r) => Array.from(r.nodes.subarray(1, r.len + 1)));
  const plan = evaluatePlan(problem, routes);
  let total = 0;
  plan.routes.forEach((r, v) => {
    if (r.visits.length === 0) return;
    const veh = problem.vehicles[v]!;
    total += r.cost + state.wTime * ((problem.hardWindows ? r.lateMin : 0) + r.overtimeMin);
    let excess = 0;
    problem.loadDimensions.forEach((_, d) => {
      excess += Math.max(0, r.load[d]! - veh.capacity[d]!) / cp.loadScale[d]!;
    });
    if (veh.maxStops !== undefined) excess += Math.max(0, r.visits.length - veh.maxStops);
    total += state.wLoad * excess + state.vehicleWeight;
  });
  for (const u of plan.unassigned) total += cp.unservedCost[u.stop]!;
  return total;
}
