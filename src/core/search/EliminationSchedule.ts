/**
 * Under the vehicles-first objective, a feasible current plan loses a short route after this
 * many moves; the wait doubles after each elimination that did not lead to fewer vehicles
 * (so a fleet already at its minimum gets time to shorten its routes)...
 */
const ELIMINATE_EVERY = 2000;
/** ... until this fraction of the budget, leaving the rest to shorten the routes. */
const ELIMINATE_UNTIL = 0.85;

/** When the annealer tries to empty a route (vehicles-first objective only). */
export class EliminationSchedule {
  private last = 0;
  private gap = ELIMINATE_EVERY;
  private usedAtLast = Infinity;

  /**
   * Is an elimination due now? When it is, the schedule records it.
   *
   * @param moves - moves drawn so far
   * @param fraction - share of the budget used
   * @param bestUsed - vehicles of the best feasible plan (Infinity while none)
   * @param state - the current plan (only its feasibility is read)
   * @returns true when the caller should eliminate a route now
   */
  due(moves: number, fraction: number, bestUsed: number, state: { isFeasible(): boolean }): boolean {
    if (moves - this.last < this.gap || fraction >= ELIMINATE_UNTIL || !state.isFeasible()) return false;
    if (this.last > 0) this.gap = bestUsed < this.usedAtLast ? ELIMINATE_EVERY : this.gap * 2;
    this.usedAtLast = bestUsed;
    this.last = moves;
    return true;
  }
}
