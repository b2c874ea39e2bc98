import { applyMove, Move, proposeMove } from "../moves/proposeMove.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import { ROLL_PAIR, ScriptedChoices } from "./scriptedChoices.js";

/**
 * Variants after the kind: (a, b, c) of the kinds' own draws. Relocate and swap draw nothing;
 * 2-opt* draws which tails meet between routes, 2-opt within a route which of the two
 * reversals that join u and v (a < 0.5 or not); or-opt draws its length (a: 0 = 2 stops,
 * 1 = 3), then between routes whether the chain is reversed (b < 0.5), within a route whether
 * it goes after v (b < 0.5) and whether it starts at u (c < 0.5).
 */
const VARIANTS: readonly (readonly [number, number, number, number])[] = [
  [0, 0, 0.25, 0.25],
  [1, 0, 0.25, 0.25],
  [2, 0, 0.25, 0.25],
  [3, 0.25, 0.25, 0.25],
  [3, 0.75, 0.25, 0.25],
  [4, 0, 0.25, 0.25],
  [4, 0, 0.75, 0.25],
  [4, 1, 0.25, 0.25],
  [4, 1, 0.75, 0.25],
  [4, 0, 0.25, 0.75],
  [4, 0, 0.75, 0.75],
  [4, 1, 0.25, 0.75],
  [4, 1, 0.75, 0.75],
];
/** Variants from here on differ only within a route (between routes they repeat earlier ones). */
const WITHIN_ROUTE_ONLY = 9;

/**
 * Steepest descent over the granular neighbourhood: for each stop in turn, every move
 * `proposeMove` can make between it and one of its neighbours is evaluated and the best one
 * applied when it lowers the penalised cost; sweeps over the stops repeat until a whole sweep
 * improves nothing (a local optimum of the neighbourhood). Deterministic, and resumable
 * between stops: `run` may be called with any quota, the evaluations are the same.
 */
export class FinalDescent {
  /** True once a whole sweep improved nothing. */
  finished = false;
  private readonly choices = new ScriptedChoices();
  private readonly one = new Int32Array(1);
  private readonly mv = new Move();
  private readonly bestMv = new Move();
  /** Next stop (index into `active`) and whether the sweep under way improved anything. */
  private at = 0;
  private improvedInSweep = false;

  /**
   * @param state - the solution, changed in place
   * @param nb - neighbour lists
   * @param active - the stops that may move
   * @param improved - called after each applied move (e.g. to keep the best plan)
   */
  constructor(
    private readonly state: SearchState,
    private readonly nb: Neighbours,
    private readonly active: Int32Array,
    private readonly improved: () => void,
  ) {
    if (active.length === 0) this.finished = true;
  }

  /**
   * Descend stop by stop until finished, `limit` evaluations are used (never more), or at least
   * `quota` are used (checked between stops).
   *
   * @param limit - evaluations the budget still allows
   * @param quota - evaluations after which to pause
   * @returns the evaluations used
   */
  run(limit: number, quota: number): number {
    const { state, nb, choices, one, mv } = this;
    let used = 0;
    while (!this.finished && used < limit && used < quota) {
      const stop = this.active[this.at]!;
      const found = examineStop(state, nb, stop, limit - used, choices, one, mv, this.bestMv);
      used += found.used;
      if (found.stopped) break;
      if (found.applied) {
        this.improved();
        this.improvedInSweep = true;
      }
      if (++this.at === this.active.length) {
        this.at = 0;
        if (!this.improvedInSweep) this.finished = true;
        this.improvedInSweep = false;
      }
    }
    return used;
  }
}

/** What `examineStop` did. */
export interface Examined {
  /** Evaluations used. */
  used: number;
  /** True when the best improving move was applied (it is then in `bestMv`). */
  applied: boolean;
  /** True when the limit ran out before every move of the stop was evaluated (nothing applied). */
  stopped: boolean;
}

/**
 * One step of a steepest descent at one stop: every move `proposeMove` can make between
 * `stop` and one of its neighbours (every kind and variant the annealer draws) is evaluated,
 * and the one that lowers the penalised cost most is applied (`bestMv` then holds it, as
 * evaluated before it was applied). Deterministic: the moves are enumerated in a fixed order.
 *
 * @param state - the solution, changed in place when a move is applied
 * @param nb - neighbour lists (`nb.all` when the granular neighbourhood is off)
 * @param stop - the stop examined (on a route or in the pool)
 * @param limit - evaluations allowed (at least 1 is kept for applying the best move)
 * @param choices - scratch choices; `one`, `mv`, `bestMv` scratch too
 * @param beforeApply - called with the best move just before it is applied (its pieces still
 *   name the positions of the routes as they are)
 * @param neighbours - how many of the stop's nearest neighbours to look at (default: all; with
 *   the granular neighbourhood off, every partner is looked at)
 * @returns the evaluations used and whether a move was applied
 * @example examineStop(state, nb, 7, 1e6, new ScriptedChoices(), new Int32Array(1), new Move(), new Move()).applied
 */
export function examineStop(
  state: SearchState,
  nb: Neighbours,
  stop: number,
  limit: number,
  choices: ScriptedChoices,
  one: Int32Array,
  mv: Move,
  bestMv: Move,
  beforeApply?: (mv: Move) => void,
  neighbours = Infinity,
): Examined {
  let used = 0;
  one[0] = stop;
  const ru = state.routeOf[stop]!;
  const inPool = ru === -1;
  let best = -1e-9;
  let bestKey = -1;
  // With the granular neighbourhood off, every servable stop is a neighbour.
  const K = nb.all ? nb.all.length : Math.min(neighbours, nb.k);
  const count = inPool ? 2 : VARIANTS.length;
  for (let k = 0; k < K; k++) {
    const v = nb.all ? nb.all[k]! : nb.list[stop * nb.k + k]!;
    const n = v >= 0 && state.routeOf[v] === ru ? count : Math.min(count, WITHIN_ROUTE_ONLY);
    for (let i = 0; i < n && used < limit - 1; i++) {
      choose(choices, k, i, inPool);
      if (!proposeMove(state, nb, choices, mv, one)) continue;
      used++;
      if (mv.delta < best) {
        best = mv.delta;
        bestKey = k * VARIANTS.length + i;
      }
    }
  }
  if (used >= limit - 1 && bestKey < 0) return { used, applied: false, stopped: true };
  if (bestKey < 0) return { used, applied: false, stopped: false };
  // Evaluate the best again: its route results must be the last ones in `state.out`.
  choose(choices, Math.floor(bestKey / VARIANTS.length), bestKey % VARIANTS.length, inPool);
  proposeMove(state, nb, choices, bestMv, one);
  used++;
  beforeApply?.(bestMv);
  applyMove(state, bestMv);
  return { used, applied: true, stopped: false };
}

function choose(choices: ScriptedChoices, k: number, i: number, inPool: boolean): void {
  if (inPool) choices.set(k, i === 0 ? 0.25 : 0.75, 0, 0, 0, 0);
  else {
    const [kind, a, b, c] = VARIANTS[i]!;
    choices.set(k, ROLL_PAIR, kind, a, b, c);
  }
}

/**
 * Run a `FinalDescent` to its end or to `maxEvaluations`.
 *
 * @param state - the solution, changed in place
 * @param nb - neighbour lists
 * @param active - the stops that may move
 * @param maxEvaluations - evaluations allowed
 * @param improved - called after each applied move
 * @returns the evaluations used
 * @example finalDescent(state, nb, active, 1e6, () => best.consider(state))
 */
export function finalDescent(state: SearchState, nb: Neighbours, active: Int32Array, maxEvaluations: number, improved: () => void): number {
  return new FinalDescent(state, nb, active, improved).run(maxEvaluations, Number.MAX_SAFE_INTEGER);
}
