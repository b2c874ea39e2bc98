import type { Random } from "../anneal/createRandom.js";
import { applyMove, Move, piece, proposeMove } from "../moves/proposeMove.js";
import { MAX_PIECES, type SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import { R_COST, R_REAL, R_SIZE, R_VIOL } from "../moves/routeResults.js";
import { examineStop } from "./finalDescent.js";
import { ROLL_PAIR, ScriptedChoices } from "./scriptedChoices.js";
import { mostEvaluations, TourDescent, tourVehicle } from "./tourDescent.js";

/**
 * Longest of the three stretches a double-bridge kick exchanges (stops). Short stretches keep
 * the kick local, so the descent after it has few stops to look at (10 against 30 tried on TSPLIB
 * gr202 and gr431 at 10 CPU s, seed 1: better on gr202, worse on gr431; 30 kept).
 */
const KICK_STRETCH = 30;
/**
 * Neighbours of a stop the descent looks at (of the run's granular lists): the nearest 8, as
 * neighbour-list 2-opt usually does (common practice; on gr202 and gr431 at 10 CPU s, seed 1:
 * about twice the kicks of all 20 and shorter tours, 0.35% and 0.56% against 0.45% and 0.74%).
 */
const KICK_NEIGHBOURS = 8;
/**
 * Temperature of the acceptance after a kick, as a share of the plan's cost per stop: a kick
 * whose descent ends worse by d is still kept with probability exp(-d / T), a Metropolis rule at
 * a low fixed temperature (as in the "large-step Markov chains" of Martin, Otto & Felten 1991;
 * from memory), so the search drifts between near-equal local optima instead of waiting for a
 * kick that improves at once. 0.03 of the cost per stop is some 3% of a mean leg on a tour:
 * measured against "not worse" from the same starts on TSPLIB gr202, gr431 and a 535-node GEO
 * instance (README, "Kick phase at the end of a tour").
 */
const KICK_TEMPERATURE_SHARE = 0.03;
/** Routes shorter than this get a kick between routes instead of a double bridge. */
const BRIDGE_MIN_STOPS = 8;
/** Moves of a kick between routes (relocate or swap of nearby stops, forced). */
const CROSS_KICK_MOVES = 2;

/**
 * An iterated local search on a plan (Lourenço, Martin & Stützle, "Iterated Local Search",
 * Handbook of Metaheuristics, 2003; from memory): a local optimum is kicked out of its valley
 * and a descent brings it to a nearby local optimum, which is kept when it is not worse than the
 * one before (otherwise the routes the iteration changed are put back).
 *
 * - The kick: within a route of at least `BRIDGE_MIN_STOPS` stops, a double bridge (Martin, Otto
 *   & Felten 1991; from memory) on three consecutive short stretches B C D after a random stop,
 *   so the route P B C D Q becomes P D C B Q (four legs replaced, none of the stretches turned,
 *   which 2-opt and or-opt cannot undo in one move); in a fleet, every other kick is instead
 *   `CROSS_KICK_MOVES` random relocates or swaps between a stop and its neighbours on other
 *   routes, applied whatever they cost.
 * - The descent: steepest moves per stop (`examineStop`: every move the annealer can draw
 *   between the stop and its `KICK_NEIGHBOURS` nearest neighbours) on a queue of stops that starts with the stops at the
 *   kick's ends; a stop whose neighbours on its route change (`collectJunctions`: the stops that
 *   meet at the joins of a move's pieces and did not follow one another before; a stop that
 *   stays first or last keeps its leg to the depot) goes back on the queue, every other
 *   stop keeps its don't-look bit (Bentley 1992, "Fast algorithms for geometric traveling
 *   salesman problems"; from memory). The first descent looks at every stop.
 * - Acceptance: by the run's order of plans, on the plan's own numbers: a feasible plan before
 *   an infeasible one, then (vehicles first) fewer vehicles, then the cost; among infeasible
 *   plans the penalised total. Equal is accepted, so the search can drift along a plateau; a
 *   feasible result with the same vehicles and a higher cost is kept with a small Metropolis
 *   probability (`KICK_TEMPERATURE_SHARE`). The caller's best plan keeps the best.
 *
 * - On a tour (`tourVehicle`: one route whose cost is a sum of symmetric arc costs, whatever the
 *   order: no window that can bind, no order-dependent rule, a shift long enough for any order),
 *   the kicks and descents work on a light copy of the tour (`TourDescent`: an array with each
 *   stop's position, 2-opt and or-opt gains from the arc costs alone, the same queue of stops
 *   whose neighbours changed), some 15 times as many kicks per second as through the generic
 *   evaluation on TSPLIB gr431; each neighbour looked at and each gain computed counts as one
 *   evaluation of the budget. The descent's result is then costed by the generic exact
 *   evaluation (one more evaluation), judged on those numbers as above and written to the plan
 *   when kept, so nothing the run keeps or reports comes from the light costs.
 *
 * The evaluation is the generic exact one (windows, capacity, shifts, breaks, rules), and the
 * caller's best plan sees every plan the search applies (`improved`), so the run never returns a
 * plan worse than the one the search started from. Deterministic: the run's generator draws the
 * kicks, and `run` may be called in any slices, the evaluations are the same.
 */
export class KickSearch {
  /** True when no kick is possible (no route long enough, no neighbour on another route). */
  finished = false;
  /** Kicks made and kicks whose result was kept (for the run's statistics). */
  kicks = 0;
  kept = 0;
  /** Of the kept kicks, those whose result was worse (kept by the Metropolis rule). */
  keptWorse = 0;
  private readonly choices = new ScriptedChoices();
  private readonly one = new Int32Array(1);
  private readonly mv = new Move();
  private readonly bestMv = new Move();
  private readonly queue: Int32Array;
  private readonly queued: Uint8Array;
  private head = 0;
  private size = 0;
  /** Routes changed since the kick, with their stops before it (for the undo). */
  private readonly saved: (number[] | undefined)[];
  private readonly savedList: number[] = [];
  /** Whether a kick is under way (its descent not yet judged), and the plan's numbers before it. */
  private inKick = false;
  private beforeFeasible = false;
  private beforeUsed = 0;
  private beforeCost = 0;
  private failedKicks = 0;
  /** Stops whose neighbours the move being applied changes (two routes of `MAX_PIECES` pieces: two per join and one at the end). */
  private readonly ends = new Int32Array(4 * MAX_PIECES + 2);
  private endCount = 0;
  /**
   * On a plan `tourVehicle` accepts (one route whose cost is a sum of symmetric arc costs), the
   * kicks and descents work on this tour (`TourDescent`) and only their result is costed by the
   * exact evaluation; `accepted` is the tour as the plan holds it (for the undo).
   */
  private readonly tour: TourDescent | undefined;
  private readonly accepted: TourDescent | undefined;
  /** Whether the tour holds a descent's result the plan has not judged yet (after a kick or the first descent). */
  private tourPending = false;
  /** The least gain a tour move must bring (against rounding). */
  private tourEpsilon = 0;
  /** Scratch: the tour's stops, and the same as one-stop pieces for the exact evaluation. */
  private tourStops: Int32Array | undefined;
  private tourPieces: Int32Array | undefined;
  private readonly bridgeScratch = new Int32Array(3 * KICK_STRETCH);

  /**
   * @param state - the solution, changed in place (start it on the plan to improve)
   * @param nb - neighbour lists
   * @param active - the stops that may move
   * @param rng - the run's generator (draws the kicks)
   * @param hierarchical - vehicles first (fewer vehicles before a lower cost)
   * @param improved - called after each applied move (e.g. to keep the best plan)
   * @param temperatureShare - the acceptance's temperature as a share of the plan's cost per
   *   stop (default `KICK_TEMPERATURE_SHARE`; 0: only results that are not worse are kept)
   */
  constructor(
    private readonly state: SearchState,
    private readonly nb: Neighbours,
    private readonly active: Int32Array,
    private readonly rng: Random,
    private readonly hierarchical: boolean,
    private readonly improved: () => void,
    private readonly temperatureShare = KICK_TEMPERATURE_SHARE,
  ) {
    const n = state.cp.n;
    this.queue = new Int32Array(n);
    this.queued = new Uint8Array(n);
    this.saved = new Array<number[] | undefined>(state.routes.length);
    if (active.length === 0) this.finished = true;
    for (let i = 0; i < active.length; i++) this.push(active[i]!);
    const v = active.length > 0 ? tourVehicle(state, active, nb) : -1;
    if (v >= 0) {
      this.tour = new TourDescent(state, v);
      this.accepted = new TourDescent(state, v);
      this.tourStops = new Int32Array(this.tour.size);
      this.tourPieces = new Int32Array(4 * this.tour.size);
      this.tourEpsilon = 1e-9 * Math.max(1, Math.abs(state.realCost()) / this.tour.size);
      // The first descent (every stop queued) is judged like a kick's.
      this.noteBefore();
      this.tourPending = true;
    }
  }

  /** Whether the search works on the tour (`TourDescent`) rather than through the generic evaluation. */
  get onTour(): boolean {
    return this.tour !== undefined;
  }

  /**
   * Kick and descend until `limit` evaluations are used (never more) or at least `quota` are
   * (checked between stops), or no kick is possible.
   *
   * @param limit - evaluations the budget still allows
   * @param quota - evaluations after which to pause
   * @returns the evaluations used
   */
  run(limit: number, quota: number): number {
    if (this.tour) return this.runTour(this.tour, limit, quota);
    const { state, nb, choices, one, mv, bestMv } = this;
    let used = 0;
    while (!this.finished && used < limit && used < quota) {
      if (this.size > 0) {
        const stop = this.pop();
        const found = examineStop(state, nb, stop, limit - used, choices, one, mv, bestMv, this.prepare, KICK_NEIGHBOURS);
        used += found.used;
        if (found.stopped) {
          this.push(stop);
          break;
        }
        if (found.applied) this.settle();
        continue;
      }
      // A local optimum: judge the kick that led here, then kick again.
      if (this.inKick) this.judge();
      used += this.kick();
    }
    return used;
  }

  /**
   * Keep the descent's result when it is not worse than the plan before the kick, or, worse with
   * the same vehicles and feasible, with the Metropolis probability of `temperatureShare`; else undo.
   */
  private judge(): void {
    const state = this.state;
    this.inKick = false;
    if (this.keeps(state.isFeasible(), state.used, state.realCost(), state.total())) this.kept++;
    else this.undo();
    this.forget();
  }

  /**
   * Whether a result with these numbers is kept against the plan before the kick (counts the
   * ones kept by the Metropolis rule in `keptWorse`).
   */
  private keeps(feasible: boolean, used: number, real: number, total: number): boolean {
    let keep: boolean;
    if (this.beforeFeasible) {
      if (!feasible) keep = false;
      else if (this.hierarchical && used !== this.beforeUsed) keep = used < this.beforeUsed;
      else keep = real <= this.beforeCost + 1e-9 * Math.max(1, Math.abs(this.beforeCost));
    } else {
      keep = feasible || total <= this.beforeCost + 1e-9 * Math.max(1, Math.abs(this.beforeCost));
    }
    if (!keep && this.beforeFeasible && feasible && used === this.beforeUsed) {
      // Worse by `delta`, with the same vehicles: kept with the Metropolis probability.
      const delta = real - this.beforeCost;
      const t = (this.temperatureShare * Math.abs(this.beforeCost)) / Math.max(1, this.active.length);
      keep = t > 0 && this.rng.next() < Math.exp(-delta / t);
      if (keep) this.keptWorse++;
    }
    return keep;
  }

  /** The plan's numbers before a kick, for `keeps`. */
  private noteBefore(): void {
    const state = this.state;
    const feasible = state.isFeasible();
    this.beforeFeasible = feasible;
    this.beforeUsed = state.used;
    this.beforeCost = feasible ? state.realCost() : state.total();
  }

  /**
   * `run` on the tour: kicks and descents on `TourDescent`, each move gain and each neighbour
   * looked at counting as one evaluation of the budget, and the result of each descent costed
   * by the exact evaluation (one more): judged on those numbers, written to the plan when kept
   * (and shown to the caller), else the tour goes back to the plan's.
   */
  private runTour(tour: TourDescent, limit: number, quota: number): number {
    const per = mostEvaluations(KICK_NEIGHBOURS);
    let used = 0;
    while (!this.finished && used < limit && used < quota) {
      if (this.size > 0) {
        // Never past the limit: a stop is looked at only when all its moves fit.
        if (limit - used < per) break;
        const stop = this.pop();
        used += tour.improve(this.nb, stop, KICK_NEIGHBOURS, this.tourEpsilon);
        if (tour.applied) for (let i = 0; i < tour.changedCount; i++) this.push(tour.changed[i]!);
        continue;
      }
      if (limit - used < 2) break;
      // A local optimum: judge it (one exact evaluation), then kick again.
      if (this.tourPending) {
        used++;
        this.judgeTour(tour);
      }
      used += this.kickTour(tour);
    }
    return used;
  }

  /** Cost the tour with the exact evaluation; keep it (into the plan) or put back the plan's. */
  private judgeTour(tour: TourDescent): void {
    const state = this.state;
    const v = tour.v;
    const kick = this.inKick;
    this.inKick = false;
    this.tourPending = false;
    const stops = this.tourStops!;
    const pieces = this.tourPieces!;
    const route = state.routes[v]!;
    const count = tour.stops(stops, route.nodes[1]!, route.nodes[route.len]!);
    // The tour as runs of the plan's route, forward or turned: a piece each.
    const posOf = state.posOf;
    let m = 0;
    for (let k = 0; k < count;) {
      const p = posOf[stops[k]!]!;
      let j = k;
      while (j + 1 < count && posOf[stops[j + 1]!] === p + (j + 1 - k)) j++;
      if (j === k) while (j + 1 < count && posOf[stops[j + 1]!] === p - (j + 1 - k)) j++;
      const q = posOf[stops[j]!]!;
      m = piece(pieces, m, v, Math.min(p, q), Math.max(p, q), q < p ? 1 : 0);
      k = j + 1;
    }
    state.evaluate(v, pieces, m, 0);
    const out = state.out;
    const o = v * R_SIZE;
    const real = state.realSum - state.rStats[o + R_REAL]! + out[R_REAL]! + state.poolCost;
    const viol = state.violSum - state.rStats[o + R_VIOL]! + out[R_VIOL]!;
    const total = state.total() - state.rStats[o + R_COST]! + out[R_COST]!;
    const feasible = viol < 1e-7 && state.mustInPool === 0;
    if (this.keeps(feasible, state.used, real, total)) {
      if (kick) this.kept++;
      state.apply(v, pieces, m, -1, pieces, 0);
      this.accepted!.copyFrom(tour);
      this.improved();
    } else {
      tour.copyFrom(this.accepted!);
    }
  }

  /** A double bridge on the tour from a random stop, as `bridge` does on the plan; returns 1. */
  private kickTour(tour: TourDescent): number {
    const rng = this.rng;
    const u = this.active[rng.int(this.active.length)]!;
    this.noteBefore();
    const N = tour.size;
    const len = N - 1;
    if (len < BRIDGE_MIN_STOPS) {
      if (++this.failedKicks > 1000 + 10 * this.active.length) this.finished = true;
      return 1;
    }
    const most = Math.max(1, Math.min(KICK_STRETCH, Math.floor(len / 3)));
    const l1 = 1 + rng.int(most);
    const l2 = 1 + rng.int(most);
    const l3 = 1 + rng.int(most);
    const { order, pos } = tour;
    // Route positions (1..len from the depot in the array's direction) to array indices.
    const d0 = pos[tour.depot]!;
    const at = (p: number): number => (d0 + p) % N;
    const start = Math.max(1, Math.min((pos[u]! - d0 + N) % N, len - (l1 + l2 + l3) + 1));
    const b = start;
    const c = b + l1;
    const d = c + l2;
    const q = d + l3;
    for (const p of [b - 1, b, c - 1, c, d - 1, d, q - 1, q]) if (p >= 1 && p <= len) this.push(order[at(p)]!);
    // P B C D Q -> P D C B Q.
    const tmp = this.bridgeScratch;
    let m = 0;
    for (let p = d; p < q; p++) tmp[m++] = order[at(p)]!;
    for (let p = c; p < d; p++) tmp[m++] = order[at(p)]!;
    for (let p = b; p < c; p++) tmp[m++] = order[at(p)]!;
    for (let k = 0; k < m; k++) {
      const i = at(b + k);
      order[i] = tmp[k]!;
      pos[tmp[k]!] = i;
    }
    this.kicks++;
    this.failedKicks = 0;
    this.inKick = true;
    this.tourPending = true;
    return 1;
  }

  /** Put back the routes the kick and its descent changed. */
  private undo(): void {
    const state = this.state;
    for (const v of this.savedList) if (state.routes[v]!.len > 0) state.emptyRoute(v);
    for (const v of this.savedList) {
      const stops = this.saved[v]!;
      if (stops.length > 0) state.setRoute(v, stops);
    }
  }

  private forget(): void {
    for (const v of this.savedList) this.saved[v] = undefined;
    this.savedList.length = 0;
  }

  /** Remember route `v` as it is before the iteration first changes it. */
  private save(v: number): void {
    if (v < 0 || this.saved[v] !== undefined) return;
    this.saved[v] = this.state.routes[v]!.stops();
    this.savedList.push(v);
  }

  /**
   * Make one kick from a random stop; returns the evaluations used (at least 1, so a run of
   * failed kicks still spends its budget).
   */
  private kick(): number {
    const state = this.state;
    const rng = this.rng;
    const u = this.active[rng.int(this.active.length)]!;
    const ru = state.routeOf[u]!;
    this.noteBefore();
    const multi = state.used > 1;
    let used = 1;
    let done = false;
    if (ru >= 0) {
      const long = state.routes[ru]!.len >= BRIDGE_MIN_STOPS;
      if (long && (!multi || rng.next() < 0.5)) done = this.bridge(ru, u);
      else if (multi) {
        const made = this.crossKick(u);
        used = Math.max(1, made);
        done = made > 0;
      }
    }
    if (done) {
      this.kicks++;
      this.failedKicks = 0;
      this.inKick = true;
    } else if (++this.failedKicks > 1000 + 10 * this.active.length) {
      this.finished = true;
    }
    return used;
  }

  /** Double bridge P B C D Q -> P D C B Q on route `r` from stop `u` (stretches of 1..KICK_STRETCH stops). */
  private bridge(r: number, u: number): boolean {
    const state = this.state;
    const rng = this.rng;
    const len = state.routes[r]!.len;
    const most = Math.max(1, Math.min(KICK_STRETCH, Math.floor(len / 3)));
    const l1 = 1 + rng.int(most);
    const l2 = 1 + rng.int(most);
    const l3 = 1 + rng.int(most);
    const start = Math.max(1, Math.min(state.posOf[u]!, len - (l1 + l2 + l3) + 1));
    const b = start;
    const c = b + l1;
    const d = c + l2;
    const q = d + l3;
    const pieces = this.mv.piecesA;
    let m = 0;
    m = piece(pieces, m, r, 1, b - 1, 0);
    m = piece(pieces, m, r, d, q - 1, 0);
    m = piece(pieces, m, r, c, d - 1, 0);
    m = piece(pieces, m, r, b, c - 1, 0);
    m = piece(pieces, m, r, q, len, 0);
    this.save(r);
    // The ends of the stretches are the stops whose legs change.
    const nodes = state.routes[r]!.nodes;
    const touched = [b - 1, b, c - 1, c, d - 1, d, q - 1, q];
    const stops = touched.filter((p) => p >= 1 && p <= len).map((p) => nodes[p]!);
    state.evaluate(r, pieces, m, 0);
    state.apply(r, pieces, m, -1, pieces, 0);
    for (const s of stops) this.push(s);
    this.improved();
    return true;
  }

  /**
   * `CROSS_KICK_MOVES` relocates or swaps between `u` and random neighbours on other routes,
   * applied whatever they cost; returns the evaluations used (0 when no such move exists).
   */
  private crossKick(u: number): number {
    const { state, nb, rng, choices, one, mv } = this;
    const K = nb.all ? nb.all.length : nb.k;
    let used = 0;
    let made = 0;
    for (let t = 0; t < 4 * CROSS_KICK_MOVES && made < CROSS_KICK_MOVES; t++) {
      const k = rng.int(K);
      const v = nb.all ? nb.all[k]! : nb.list[u * nb.k + k]!;
      const ru = state.routeOf[u]!;
      if (v < 0 || ru < 0 || state.routeOf[v]! < 0 || state.routeOf[v] === ru) continue;
      one[0] = u;
      choices.set(k, ROLL_PAIR, rng.int(3), 0, 0.25, 0.25);
      if (!proposeMove(state, nb, choices, mv, one)) continue;
      used++;
      this.prepare(mv);
      applyMove(state, mv);
      this.settle();
      made++;
    }
    return made > 0 ? used : 0;
  }

  /**
   * Before a move is applied: save the routes it changes (for the undo) and note the stops whose
   * neighbours it changes (they go back on the queue afterwards).
   */
  private readonly prepare = (mv: Move): void => {
    const state = this.state;
    this.save(mv.vA);
    this.save(mv.vB);
    let e = collectJunctions(state, mv.vA, mv.piecesA, mv.mA, this.ends, 0);
    if (mv.vB >= 0) e = collectJunctions(state, mv.vB, mv.piecesB, mv.mB, this.ends, e);
    this.endCount = e;
  };

  /** After a move is applied: queue the stops noted by `prepare` and tell the caller. */
  private settle(): void {
    for (let i = 0; i < this.endCount; i++) this.push(this.ends[i]!);
    this.improved();
  }

  private push(s: number): void {
    if (this.queued[s]) return;
    this.queued[s] = 1;
    const n = this.queue.length;
    this.queue[(this.head + this.size) % n] = s;
    this.size++;
  }

  private pop(): number {
    const s = this.queue[this.head]!;
    this.head = (this.head + 1) % this.queue.length;
    this.size--;
    this.queued[s] = 0;
    return s;
  }
}

/**
 * Write into `out` from `e` the stops of route `v`'s new content (`m` pieces, read while the
 * state is as before the move) whose neighbour on the route changes: at each join of two pieces,
 * and at the depot at either end, the two stops that meet there when they did not follow one
 * another before (a stop from the pool always counts). Inside a reversed piece the neighbours
 * stay the same stops.
 *
 * @returns the new end of `out`
 */
function collectJunctions(state: SearchState, v: number, pieces: Int32Array, m: number, out: Int32Array, e: number): number {
  const { routeOf, posOf } = state;
  let prev = -1;
  for (let k = 0; k < m; k++) {
    const src = pieces[4 * k]!;
    const i = pieces[4 * k + 1]!;
    let first = i;
    let last = i;
    if (src >= 0) {
      const nodes = state.routes[src]!.nodes;
      const j = pieces[4 * k + 2]!;
      const rev = pieces[4 * k + 3]!;
      first = nodes[rev ? j : i]!;
      last = nodes[rev ? i : j]!;
    }
    const followed =
      prev < 0
        ? routeOf[first] === v && posOf[first] === 1
        : routeOf[prev]! >= 0 && routeOf[first] === routeOf[prev] && posOf[first] === posOf[prev]! + 1;
    if (!followed) {
      if (prev >= 0) out[e++] = prev;
      out[e++] = first;
    }
    prev = last;
  }
  if (prev >= 0 && !(routeOf[prev] === v && posOf[prev] === state.routes[v]!.len)) out[e++] = prev;
  return e;
}
