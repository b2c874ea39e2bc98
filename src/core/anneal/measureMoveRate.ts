import { Move, proposeMove } from "../moves/proposeMove.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";
import type { AcceptanceRule } from "../options.js";
import { acceptanceProbability } from "./acceptanceProbability.js";
import { createRandom } from "./createRandom.js";

/** Length of the timed burst: long enough for a millisecond clock, short beside any run. */
export const RATE_BURST_MS = 120;
/** Moves between clock reads in the burst. */
const CHUNK = 512;

/**
 * Moves per second this machine makes on this problem: a short timed burst of the run's own
 * move (propose, evaluate, decide by the acceptance rule), on a generator of its own so the run's
 * random draws stay as the seed fixes them. Nothing is applied, so `state` is unchanged. The
 * figure stands in for a seconds budget wherever a schedule counts moves (Lundy-Mees, geometric
 * with moves per level) and for the preview's move count.
 *
 * @param state - the plan to evaluate moves from (unchanged)
 * @param nb - neighbour lists
 * @param active - stops the search may move
 * @param o - seed (the burst draws from `${seed}:rate`), clock, acceptance rule and a temperature
 *   to decide at, and the burst length
 * @returns moves per second, or undefined when there is nothing to move
 * @example measureMoveRate(state, nb, active, { seed: 1, now: () => performance.now(), rule: "metropolis", temperature: 20 })
 * // => 4.1e6
 */
export function measureMoveRate(
  state: SearchState,
  nb: Neighbours,
  active: Int32Array,
  o: { seed: number | string; now: () => number; rule: AcceptanceRule; temperature: number; burstMs?: number },
): number | undefined {
  if (active.length === 0) return undefined;
  const burstMs = o.burstMs ?? RATE_BURST_MS;
  const rng = createRandom(`${o.seed}:rate`);
  const mv = new Move();
  const start = o.now();
  let moves = 0;
  let elapsed: number;
  let accepted = 0;
  do {
    for (let k = 0; k < CHUNK; k++) {
      if (proposeMove(state, nb, rng, mv, active) && rng.next() < acceptanceProbability(o.rule, mv.delta, o.temperature)) accepted++;
    }
    moves += CHUNK;
    elapsed = o.now() - start;
  } while (elapsed < burstMs);
  // `accepted` only keeps the decision from being optimised away.
  return accepted >= 0 ? (moves * 1000) / Math.max(elapsed, 1e-3) : undefined;
}
