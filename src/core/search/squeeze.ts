import type { Random } from "../anneal/createRandom.js";
import { insertionDelta } from "../moves/insertionDelta.js";
import { applyMove, Move, MoveKind, proposeMove } from "../moves/proposeMove.js";
import { R_SIZE, R_VIOL } from "../moves/routeResults.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import { ROLL_PAIR, ScriptedChoices } from "./scriptedChoices.js";

/** Routes up to this length are tried at every position; longer ones next to the stop's neighbours. */
const FULL_SCAN_LEN = 60;
/** Tolerance of "no violation". */
const EPS = 1e-7;
/** Improving steps one squeeze may take before it gives up. */
const SQUEEZE_STEPS = 30;
/** Nearest neighbours of each stop the squeeze pairs it with (the first of the granular lists). */
const SQUEEZE_NEIGHBOURS = 10;

/** Moves between two placed stops the squeeze tries: relocate, swap, 2-opt* both ways, or-opt. */
const SQUEEZE_MOVES: readonly (readonly [number, number, number])[] = [
  [MoveKind.relocateAfter, 0, 0],
  [MoveKind.relocateBefore, 0, 0],
  [MoveKind.swap, 0, 0],
  [MoveKind.twoOpt, 0.25, 0],
  [MoveKind.twoOpt, 0.75, 0],
  [MoveKind.orOpt, 0, 0.75],
];

/**
 * Insertion of one pool stop for the route-minimisation phase: a random position that keeps
 * every hard rule, and the squeeze of Nagata & Bräysy (2009; written from the published
 * description): insert at the position of least violation, then improve the violation by the
 * best relocate, swap, 2-opt* or or-opt move of a stop of a violating route with one of its
 * granular neighbours until no route violates a rule; undo everything when that fails. The
 * violation is the routes' time warp in minutes plus excess load in typical demands
 * (`R_VIOL`); distance only breaks ties.
 */
export class StopInserter {
  /** Evaluations made since constructed (counted as moves by the run). */
  work = 0;
  private readonly pieces = new Int32Array(12);
  private readonly feasibleV: number[] = [];
  private readonly feasibleCut: number[] = [];
  private readonly script = new ScriptedChoices();
  private readonly one = new Int32Array(1);
  private readonly mv = new Move();
  private readonly bestMv = new Move();
  private readonly saved = new Map<number, number[]>();

  constructor(
    private readonly state: SearchState,
    private readonly nb: Neighbours,
  ) {}

  /**
   * Insert pool stop `s` at a random position where its route keeps every hard rule.
   *
   * @returns true when inserted
   */
  insertFeasible(s: number, rng: Random): boolean {
    const state = this.state;
    this.feasibleV.length = 0;
    this.feasibleCut.length = 0;
    this.scan(s, (v, cut) => {
      insertionDelta(state, this.pieces, v, cut, s);
      if (state.out[R_VIOL]! <= EPS) {
        this.feasibleV.push(v);
        this.feasibleCut.push(cut);
      }
    });
    if (this.feasibleV.length === 0) return false;
    const k = rng.int(this.feasibleV.length);
    this.insertAt(s, this.feasibleV[k]!, this.feasibleCut[k]!);
    return true;
  }

  /**
   * The squeeze: insert `s` where the violation grows least, then repair by local search.
   *
   * @returns true when `s` is on a route and no route breaks a rule; false with the plan as before
   */
  squeeze(s: number, rng: Random): boolean {
    const state = this.state;
    let bestPen = Infinity;
    let bestCost = Infinity;
    let bestV = -1;
    let bestCut = 0;
    this.scan(s, (v, cut) => {
      const cost = insertionDelta(state, this.pieces, v, cut, s);
      const pen = state.out[R_VIOL]!;
      if (pen < bestPen - EPS || (pen <= bestPen + EPS && cost < bestCost)) {
        bestPen = pen;
        bestCost = cost;
        bestV = v;
        bestCut = cut;
      }
    });
    if (bestV < 0) return false;
    this.saved.clear();
    this.save(bestV);
    this.insertAt(s, bestV, bestCut);
    const violating: number[] = [];
    for (let step = 0; step < SQUEEZE_STEPS; step++) {
      violating.length = 0;
      for (const v of this.saved.keys()) if (state.rStats[v * R_SIZE + R_VIOL]! > EPS) violating.push(v);
      if (violating.length === 0) return true;
      if (!this.improve(violating[rng.int(violating.length)]!)) break;
    }
    // Undo: every route touched gets its stops back, and s returns to the pool.
    for (const [v, stops] of this.saved) state.setRoute(v, stops);
    state.addToPool(s);
    return false;
  }

  /** Apply the move of a stop of route `r` with a neighbour that lowers the violation most. */
  private improve(r: number): boolean {
    const { state, nb, script, one, mv } = this;
    const route = state.routes[r]!;
    const stops = route.stops();
    const K = Math.min(SQUEEZE_NEIGHBOURS, nb.all ? nb.all.length : nb.k);
    let bestPen = -EPS;
    let bestCost = Infinity;
    let bestU = -1;
    let bestKey = -1;
    for (const u of stops) {
      one[0] = u;
      for (let k = 0; k < K; k++) {
        for (let i = 0; i < SQUEEZE_MOVES.length; i++) {
          const [kind, a, b] = SQUEEZE_MOVES[i]!;
          script.set(k, ROLL_PAIR, kind, a, b, 0.5);
          if (!proposeMove(state, nb, script, mv, one)) continue;
          this.work++;
          if (mv.poolIn >= 0 || mv.poolOut >= 0 || mv.usedDelta > 0) continue;
          const pen = this.penaltyChange(mv);
          if (pen < bestPen - EPS || (pen <= bestPen + EPS && bestU >= 0 && mv.delta < bestCost)) {
            bestPen = pen;
            bestCost = mv.delta;
            bestU = u;
            bestKey = k * SQUEEZE_MOVES.length + i;
          }
        }
      }
    }
    if (bestU < 0) return false;
    one[0] = bestU;
    const [kind, a, b] = SQUEEZE_MOVES[bestKey % SQUEEZE_MOVES.length]!;
    script.set(Math.floor(bestKey / SQUEEZE_MOVES.length), ROLL_PAIR, kind, a, b, 0.5);
    proposeMove(state, nb, script, this.bestMv, one);
    this.work++;
    this.save(this.bestMv.vA);
    if (this.bestMv.vB >= 0) this.save(this.bestMv.vB);
    applyMove(state, this.bestMv);
    return true;
  }

  /** Violation after the evaluated move minus before, over its one or two routes. */
  private penaltyChange(mv: Move): number {
    const state = this.state;
    let pen = state.out[R_VIOL]! - state.rStats[mv.vA * R_SIZE + R_VIOL]!;
    if (mv.vB >= 0) pen += state.out[R_SIZE + R_VIOL]! - state.rStats[mv.vB * R_SIZE + R_VIOL]!;
    return pen;
  }

  private save(v: number): void {
    if (this.saved.has(v)) return;
    this.saved.set(v, this.state.routes[v]!.stops());
  }

  /** Put pool stop `s` on route `v` after `cut` stops. */
  private insertAt(s: number, v: number, cut: number): void {
    const state = this.state;
    const len = state.routes[v]!.len;
    insertionDelta(state, this.pieces, v, cut, s);
    this.work++;
    const m = (cut >= 1 ? 1 : 0) + 1 + (cut < len ? 1 : 0);
    state.removeFromPool(s);
    state.apply(v, this.pieces, m, -1, this.pieces, 0);
  }

  /** Call `visit(v, cut)` for the insertion positions of `s` in the used, unlocked routes that may serve it. */
  private scan(s: number, visit: (v: number, cut: number) => void): void {
    const state = this.state;
    const cp = state.cp;
    const V = cp.vehicleCount;
    const nb = this.nb;
    for (let v = 0; v < V; v++) {
      const route = state.routes[v]!;
      if (route.len === 0 || cp.locked[v] || !cp.compatible[s * V + v]) continue;
      if (route.len <= FULL_SCAN_LEN) {
        for (let cut = 0; cut <= route.len; cut++) {
          this.work++;
          visit(v, cut);
        }
      } else {
        for (let k = 0; k < nb.k; k++) {
          const w = nb.list[s * nb.k + k]!;
          if (w >= 0 && state.routeOf[w] === v) {
            this.work += 2;
            visit(v, state.posOf[w]!);
            visit(v, state.posOf[w]! - 1);
          }
        }
      }
    }
  }
}
