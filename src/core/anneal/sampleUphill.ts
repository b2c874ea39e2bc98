import type { Random } from "./createRandom.js";
import { Move, proposeMove } from "../moves/proposeMove.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";

/**
 * Mean cost increase of random uphill moves from the current solution (moves are only
 * evaluated, never applied). Moves that change the number of vehicles under the
 * hierarchical objective, or that drop a stop which must be served, are left out: their
 * size says nothing about the landscape the temperature has to match.
 *
 * @param state - current solution (unchanged)
 * @param nb - neighbour lists
 * @param rng - the run's generator
 * @param samples - moves to draw (valid or not)
 * @param active - the stops the search may move
 * @returns mean uphill change (1 when no uphill move was seen), the number of uphill moves used
 *   and the changes themselves (for `calibrateTemperatures`)
 */
export function sampleUphill(
  state: SearchState,
  nb: Neighbours,
  rng: Random,
  samples: number,
  active: Int32Array,
): { meanUphill: number; samples: number; uphill: number[] } {
  if (active.length === 0) return { meanUphill: 1, samples: 0, uphill: [] };
  const mv = new Move();
  let sum = 0;
  let count = 0;
  const uphill: number[] = [];
  const tries = Math.max(samples, 1) * 20;
  for (let k = 0; k < tries && count < samples; k++) {
    if (!proposeMove(state, nb, rng, mv, active)) continue;
    if (isWorseMove(state, mv)) {
      sum += mv.delta;
      count++;
      uphill.push(mv.delta);
    }
  }
  return { meanUphill: count > 0 ? sum / count : 1, samples: count, uphill };
}

/**
 * True for a worse move of the kind calibration samples and the acceptance targets speak of: it
 * raises the cost, keeps the number of vehicles under the hierarchical objective and drops no
 * stop that must be served. The run counts the same moves when it reports how many worse moves
 * it accepted, so the observed share compares with the previewed one.
 *
 * @param state - the current solution
 * @param mv - an evaluated move
 * @returns whether `mv.delta` is such a change
 */
export function isWorseMove(state: SearchState, mv: Move): boolean {
  if (state.vehicleWeight > 0 && mv.usedDelta !== 0) return false;
  return mv.delta > 1e-12 && mv.delta < state.cp.mustServeCost / 10;
}
