import type { Random } from "../anneal/createRandom.js";
import { applyMove, Move, proposeMove } from "../moves/proposeMove.js";
import { R_SIZE, R_VIOL } from "../moves/routeResults.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import type { CompiledProblem } from "../schedule/compileProblem.js";
import type { BestPlan } from "./BestPlan.js";
import { EjectionSearch } from "./ejectionSearch.js";
import { StopInserter } from "./squeeze.js";

/** Random moves of one perturbation (Nagata & Bräysy 2009 use about 1 000; from memory). */
const PERTURB_MOVES = 1000;
/** Stops taken from the ejection pool before one route removal gives up, per stop of the problem. */
const POPS_PER_STOP = 30;
/** Tolerance of "no violation". */
const EPS = 1e-7;

/**
 * The route-minimisation phase of the vehicles-first objective, written from the published
 * method of Nagata & Bräysy (2009, "A powerful route minimization heuristic for the vehicle
 * routing problem with time windows", Operations Research Letters 37(5)). On a feasible plan:
 *
 * 1. remove a random route; its stops go to the ejection pool (EP, last in first out) and every
 *    stop's failure counter p is set to 1;
 * 2. take the last stop of the EP and insert it at a random position that keeps every hard
 *    rule; when there is none, squeeze it in (`StopInserter.squeeze`); when that fails, add 1
 *    to its counter, insert it while ejecting up to five stops of least counter sum
 *    (`EjectionSearch`), put those into the EP, and perturb the plan by random moves that keep
 *    every rule;
 * 3. when the EP is empty the plan serves everything with one vehicle fewer: it becomes the best
 *    plan and the next route is removed. A removal that has not emptied its EP after
 *    `POPS_PER_STOP` pops per stop goes back to the best plan and tries another route.
 *
 * The phase ends when the lower bound on vehicles (`vehicleLowerBound`) is reached, after
 * `stallWork` evaluations without a vehicle saved, or when the caller stops calling `run`; between pops every route keeps every hard rule, the EP stops wait in the
 * pool. Its work (insertion positions, squeeze and ejection evaluations, perturbation moves)
 * counts as moves of the run; everything it draws comes from the run's generator.
 */
export class RouteMinimiser {
  /** True when nothing is left to try (lower bound reached or no route may be removed). */
  finished = false;
  /** Routes removed to start an attempt, and attempts that ended with one vehicle fewer. */
  attempts = 0;
  removed = 0;
  /** Stops placed by a plain feasible insertion, by the squeeze, and by an insertion with ejections. */
  inserted = 0;
  squeezed = 0;
  ejections = 0;
  /** Vehicles of the first feasible plan the phase had (after any repair); -1 while none. */
  firstFeasibleUsed = -1;
  private readonly ep: number[] = [];
  private readonly p: Int32Array;
  private readonly inserter: StopInserter;
  private readonly ejection: EjectionSearch;
  private readonly mv = new Move();
  private pops = 0;
  /** Evaluations used in all, and when the last vehicle was saved (or the phase started). */
  private work = 0;
  private workAtSave = 0;
  /** True while the EP holds the stops of the first plan's repair (a new route may open). */
  private repairing = false;
  private repaired = false;
  private chain: Int32Array;
  private readonly lowerBound: number;

  /**
   * @param state - a feasible plan, changed in place
   * @param nb - neighbour lists (squeeze and insertion candidates)
   * @param moveNb - where perturbation moves draw partners
   * @param rng - the run's generator
   * @param active - stops that may move
   * @param best - the run's best plan: takes every plan with one vehicle fewer, and is restored after a failed removal
   * @param stallWork - the phase finishes after this many evaluations without a vehicle saved
   */
  constructor(
    private readonly state: SearchState,
    nb: Neighbours,
    private readonly moveNb: Neighbours,
    private readonly rng: Random,
    private readonly active: Int32Array,
    private readonly best: BestPlan,
    private readonly stallWork = Infinity,
  ) {
    this.p = new Int32Array(state.cp.n);
    this.inserter = new StopInserter(state, nb);
    this.ejection = new EjectionSearch(state);
    this.lowerBound = vehicleLowerBound(state.cp);
    this.chain = new Int32Array(4 * (state.cp.n + 1));
  }

  /**
   * Work until `limit` evaluations are used (checked between pops, so the same limit gives the
   * same plan however the calls are sliced), at least `quota` are used, or the phase finishes.
   *
   * @param limit - evaluations the phase may still use
   * @param quota - evaluations after which to pause
   * @returns evaluations used
   */
  run(limit: number, quota: number): number {
    let used = 0;
    while (!this.finished && used < limit && used < quota) {
      if (this.work - this.workAtSave >= this.stallWork || (this.ep.length === 0 && !this.start())) {
        this.finished = true;
        break;
      }
      const w = this.pop();
      used += w;
      this.work += w;
      if (this.ep.length === 0) {
        this.workAtSave = this.work;
        if (this.repairing) this.repairing = false;
        else this.removed++;
        if (this.firstFeasibleUsed < 0) this.firstFeasibleUsed = this.state.used + this.removed;
        this.best.consider(this.state);
      } else if (this.pops >= POPS_PER_STOP * this.active.length) {
        this.abandon();
      }
    }
    return used;
  }

  /** Stop mid-removal: the state goes back to the best plan (fewest vehicles). */
  abandon(): void {
    if (this.ep.length === 0) return;
    this.ep.length = 0;
    this.best.restore(this.state);
  }

  /**
   * Remove a random route into the EP; false when the bound is reached or no route may go. The
   * first time, a plan that breaks a rule is repaired instead: each violating route keeps the
   * stops that fit in order, the others go to the EP (with every must-serve stop of the pool),
   * and while they are placed a stop that fits nowhere may open an unused vehicle.
   */
  private start(): boolean {
    const state = this.state;
    const cp = state.cp;
    if (!this.repaired) {
      this.repaired = true;
      if (!state.isFeasible()) return this.repair();
      this.firstFeasibleUsed = state.used;
    }
    if (!state.isFeasible() || state.used <= this.lowerBound) return false;
    const candidates: number[] = [];
    for (let v = 0; v < cp.vehicleCount; v++) if (state.routes[v]!.len > 0 && !cp.locked[v]) candidates.push(v);
    if (candidates.length === 0 || state.used < 2) return false;
    const v = candidates[this.rng.int(candidates.length)]!;
    const stops = state.emptyRoute(v);
    // Last in, first out: the route's first stop is inserted first.
    for (let k = stops.length - 1; k >= 0; k--) this.ep.push(stops[k]!);
    this.p.fill(1);
    this.pops = 0;
    this.attempts++;
    return true;
  }

  /** Put the stops that break the first plan's rules into the EP; false when there are none. */
  private repair(): boolean {
    const state = this.state;
    const cp = state.cp;
    const chain = this.chain;
    for (let v = 0; v < cp.vehicleCount; v++) {
      const r = state.routes[v]!;
      if (r.len === 0 || cp.locked[v] || state.rStats[v * R_SIZE + R_VIOL]! <= EPS) continue;
      const kept: number[] = [];
      const out: number[] = [];
      for (let pos = 1; pos <= r.len; pos++) {
        const s = r.nodes[pos]!;
        const m = kept.length;
        for (let i = 0; i < m; i++) chain.set([-1, kept[i]!, kept[i]!, 0], 4 * i);
        chain.set([-1, s, s, 0], 4 * m);
        state.evaluate(v, chain, m + 1, 0);
        if (state.out[R_VIOL]! <= EPS) kept.push(s);
        else out.push(s);
      }
      state.setRoute(v, kept);
      for (const s of out) state.addToPool(s);
    }
    for (let k = 0; k < state.poolSize; k++) {
      const s = state.pool[k]!;
      if (!cp.optional[s]) this.ep.push(s);
    }
    this.p.fill(1);
    this.pops = 0;
    this.repairing = this.ep.length > 0;
    return this.repairing;
  }

  /** Open an unused vehicle for pool stop `s` alone, when that route keeps every rule. */
  private openRoute(s: number): boolean {
    const state = this.state;
    const cp = state.cp;
    const V = cp.vehicleCount;
    const chain = this.chain;
    chain.set([-1, s, s, 0], 0);
    for (let v = 0; v < V; v++) {
      if (state.routes[v]!.len > 0 || cp.locked[v] || !cp.compatible[s * V + v]) continue;
      state.evaluate(v, chain, 1, 0);
      if (state.out[R_VIOL]! > EPS) continue;
      state.setRoute(v, [s]);
      return true;
    }
    return false;
  }

  /** Place the EP's last stop (insert, squeeze, or insert with ejections and perturb); returns the evaluations. */
  private pop(): number {
    const { inserter, ejection, rng } = this;
    const s = this.ep.pop()!;
    this.pops++;
    const before = inserter.work;
    if (inserter.insertFeasible(s, rng)) {
      this.inserted++;
      return inserter.work - before;
    }
    if (this.repairing && this.openRoute(s)) {
      this.inserted++;
      return inserter.work - before + 1;
    }
    if (inserter.squeeze(s, rng)) {
      this.squeezed++;
      return inserter.work - before;
    }
    let used = inserter.work - before;
    this.p[s] = this.p[s]! + 1;
    if (ejection.search(s, this.p, rng)) {
      this.ejections++;
      for (const x of ejection.apply()) this.ep.push(x);
    } else {
      // Nothing fits even with ejections: try it again after the others.
      this.ep.unshift(s);
    }
    used += ejection.work;
    return used + this.perturb();
  }

  /** Random moves accepted when every route they change keeps every hard rule. */
  private perturb(): number {
    const { state, moveNb, rng, mv, active } = this;
    let used = 0;
    for (let k = 0; k < PERTURB_MOVES; k++) {
      used++;
      if (!proposeMove(state, moveNb, rng, mv, active)) continue;
      if (mv.poolIn >= 0 || mv.poolOut >= 0 || mv.usedDelta > 0) continue;
      if (state.out[R_VIOL]! > EPS || (mv.vB >= 0 && state.out[R_SIZE + R_VIOL]! > EPS)) continue;
      applyMove(state, mv);
    }
    return used;
  }
}

/**
 * A lower bound on the vehicles a plan needs: in each load dimension, the fewest vehicles
 * whose largest capacities together hold the demand of the stops that must be served (the
 * bin-packing bound, common practice), at least 1 when anything must be served.
 *
 * @param cp - the compiled problem
 * @returns the bound (0 when no stop must be served)
 * @example vehicleLowerBound(cp) // Solomon R101: ceil(1458 / 200) = 8
 */
export function vehicleLowerBound(cp: CompiledProblem): number {
  const dims = cp.dims;
  const V = cp.vehicleCount;
  let bound = 0;
  let any = false;
  for (let d = 0; d < dims; d++) {
    let total = 0;
    for (let s = 0; s < cp.n; s++) {
      if (cp.optional[s] || cp.unservableReason[s]) continue;
      any = true;
      total += cp.demand[s * dims + d]!;
    }
    const caps = Array.from({ length: V }, (_, v) => cp.capacity[v * dims + d]!).sort((a, b) => b - a);
    let k = 0;
    let held = 0;
    while (k < V && held < total - EPS) held += caps[k++]!;
    bound = Math.max(bound, k);
  }
  return any ? Math.max(1, bound) : 0;
}
