import type { Plan, Problem, Unassigned } from "../model.js";
import type { SearchState } from "../moves/SearchState.js";
import type { CompiledProblem } from "../schedule/compileProblem.js";
import { evaluatePlan } from "../schedule/evaluatePlan.js";

/**
 * The best plan a run has seen: feasible plans by (vehicles, cost) under the hierarchical
 * objective or by cost, and while none is feasible the least violating one (by violation,
 * then penalised cost). Keeps a copy of the routes and pool of that state.
 */
export class BestPlan {
  /** Primary and secondary keys of the best state (see the class comment). */
  key1 = Infinity;
  key2 = Infinity;
  feasibleFound = false;
  /**
   * The best plan's stops per vehicle (the first `lengths[v]` of `routes[v]`) and its pool (the
   * first `poolCount` of `pool`): buffers reused from copy to copy, grown when a route outgrows
   * its buffer, so a copy allocates nothing.
   */
  private readonly routes: Int32Array[];
  private readonly lengths: Int32Array;
  private readonly pool: Int32Array;
  private poolCount = 0;
  /**
   * The search times a stop with several windows on their hull (first opening to last close),
   * so a plan it finds feasible can still arrive in a gap between windows: before such a plan
   * becomes the best feasible one, it is timed exactly.
   */
  private readonly multiWindow: boolean;

  constructor(
    private readonly problem: Problem,
    private readonly cp: CompiledProblem,
  ) {
    this.routes = Array.from({ length: cp.vehicleCount }, () => new Int32Array(8));
    this.lengths = new Int32Array(cp.vehicleCount);
    this.pool = new Int32Array(cp.n);
    this.multiWindow = problem.stops.some((s) => s.windows.length > 1);
  }

  /** Take the current state when it is better than the best so far. */
  consider(state: SearchState): void {
    const cp = this.cp;
    let feasible = state.isFeasible();
    if (!feasible && this.feasibleFound) return;
    if (feasible && this.multiWindow && this.improvesFeasibleBest(state) && !this.isExactlyFeasible(state)) feasible = false;
    if (!feasible && this.feasibleFound) return;
    // Feasible plans by (vehicles, cost) or cost; infeasible ones by (violation, penalised cost).
    const k1 = feasible ? (cp.hierarchical ? state.used : 0) : state.violation();
    if (k1 > this.key1 + 1e-9 && !(feasible && !this.feasibleFound)) return;
    const k2 = feasible ? state.realCost() : state.total();
    if (feasible && !this.feasibleFound) {
      this.feasibleFound = true;
    } else if (!(k1 < this.key1 - 1e-9 || (Math.abs(k1 - this.key1) <= 1e-9 && k2 < this.key2 - 1e-9))) {
      return;
    }
    this.key1 = k1;
    this.key2 = k2;
    this.take(state);
  }

  /** Put the best plan back into `state` (its routes and pool). */
  restore(state: SearchState): void {
    for (let v = 0; v < state.routes.length; v++) if (state.routes[v]!.len > 0) state.emptyRoute(v);
    this.routes.forEach((stops, v) => {
      if (this.lengths[v]! > 0) state.setRoute(v, stops, this.lengths[v]);
    });
  }

  /** The best plan, exactly re-evaluated, with its unassigned stops and why. */
  plan(): Plan {
    const cp = this.cp;
    const problem = this.problem;
    const unassigned: Unassigned[] = [];
    for (let s = 0; s < cp.n; s++) {
      if (cp.unservableReason[s]) unassigned.push({ stop: s, reason: cp.unservableReason[s]! });
    }
    for (const s of this.pool.subarray(0, this.poolCount)) {
      const stop = problem.stops[s]!;
      unassigned.push({
        stop: s,
        reason:
          stop.unservedCost !== undefined
            ? `serving it would cost more than leaving it, ${stop.unservedCost}`
            : "could not be fitted into any route within capacity, windows and shifts",
      });
    }
    unassigned.sort((a, b) => a.stop - b.stop);
    const routes = this.routes.map((stops, v) => Array.from(stops.subarray(0, this.lengths[v])));
    return evaluatePlan(problem, routes, unassigned);
  }

  private improvesFeasibleBest(state: SearchState): boolean {
    if (!this.feasibleFound) return true;
    const k1 = this.cp.hierarchical ? state.used : 0;
    return k1 < this.key1 - 1e-9 || (Math.abs(k1 - this.key1) <= 1e-9 && state.realCost() < this.key2 - 1e-9);
  }

  private isExactlyFeasible(state: SearchState): boolean {
    return (
      evaluatePlan(
        this.problem,
        state.routes.map((r) => r.stops()),
      ).violations.length === 0
    );
  }

  /** Copy the routes changed since the previous copy (every accepted move marks its routes). */
  private take(state: SearchState): void {
    for (let k = 0; k < state.dirtyCount; k++) {
      const v = state.dirtyList[k]!;
      const r = state.routes[v]!;
      if (this.routes[v]!.length < r.len) this.routes[v] = new Int32Array(Math.max(r.len, 2 * this.routes[v]!.length));
      const into = this.routes[v]!;
      const nodes = r.nodes;
      for (let i = 0; i < r.len; i++) into[i] = nodes[i + 1]!;
      this.lengths[v] = r.len;
    }
    state.clearDirty();
    for (let i = 0; i < state.poolSize; i++) this.pool[i] = state.pool[i]!;
    this.poolCount = state.poolSize;
  }
}
