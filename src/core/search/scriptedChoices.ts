import type { Random } from "../anneal/createRandom.js";

/**
 * A roll past the pool and open-route draws of `proposeMove` (0.07): a move between two placed
 * stops.
 */
export const ROLL_PAIR = 0.5;

/**
 * The choices `proposeMove` draws, given in turn instead of at random: a stop (index 0 of a
 * one-stop list), one of its neighbours, the roll that picks pool and open-route moves or a move
 * between two stops, then the move kind and its variant (a, b, c). Feeding every combination
 * enumerates the moves of a stop with its neighbours, the very moves the annealer draws; draws
 * past the script read 0.5 (`next`) and 0 (`int`). Used by the final descent and the squeeze.
 */
export class ScriptedChoices implements Random {
  private readonly values = new Float64Array(7);
  private at = 0;

  set(neighbour: number, roll: number, kind: number, a: number, b: number, c: number): void {
    const v = this.values;
    v[0] = 0;
    v[1] = neighbour;
    v[2] = roll;
    v[3] = kind;
    v[4] = a;
    v[5] = b;
    v[6] = c;
    this.at = 0;
  }

  next(): number {
    return this.values[this.at++] ?? 0.5;
  }

  int(): number {
    return this.values[this.at++] ?? 0;
  }
}
