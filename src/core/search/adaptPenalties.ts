import type { SearchState } from "../moves/SearchState.js";

/** Moves between penalty-weight updates, and the factors (adaptive penalties, common practice). */
export const ADAPT_EVERY = 500;
const PENALTY_UP = 1.3;
const PENALTY_DOWN = 1.1;

/**
 * Adaptive penalties: a weight rises while its violation is present in the current plan and
 * falls back otherwise, kept between 1% and a million times its initial value.
 *
 * @param state - current solution; its weights (and stored route costs) change
 * @param initial - the initial weights
 * @example if (moves % ADAPT_EVERY === 0) adaptPenalties(state, initialWeights(cp))
 */
export function adaptPenalties(state: SearchState, initial: { readonly wTime: number; readonly wLoad: number }): void {
  const parts = state.violationParts();
  const wTime = parts.time > 1e-9 ? state.wTime * PENALTY_UP : Math.max(initial.wTime * 0.01, state.wTime / PENALTY_DOWN);
  const wLoad = parts.load > 1e-9 ? state.wLoad * PENALTY_UP : Math.max(initial.wLoad * 0.01, state.wLoad / PENALTY_DOWN);
  state.setWeights(Math.min(wTime, initial.wTime * 1e6), Math.min(wLoad, initial.wLoad * 1e6));
}
