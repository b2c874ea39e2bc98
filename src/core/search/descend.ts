import type { Random } from "../anneal/createRandom.js";
import { applyMove, Move, proposeMove } from "../moves/proposeMove.js";
import type { SearchState } from "../moves/SearchState.js";
import type { Neighbours } from "../neighbours/buildNeighbours.js";

/**
 * Greedy descent (only improving moves): turns the constructed plan into a local optimum.
 *
 * @param state - current solution, changed in place
 * @param nb - neighbour lists
 * @param rng - the run's generator
 * @param active - the stops that may move
 * @param moves - moves to draw
 * @example descend(state, nb, rng, active, 50 * active.length)
 */
export function descend(state: SearchState, nb: Neighbours, rng: Random, active: Int32Array, moves: number): void {
  if (active.length === 0) return;
  const mv = new Move();
  for (let k = 0; k < moves; k++) {
    if (proposeMove(state, nb, rng, mv, active) && mv.delta < -1e-12) applyMove(state, mv);
  }
}
