/**
 * Where the end of a run starts and what it does, in one place for the solver and the previews.
 *
 * From `QUENCH_FROM` of the budget on (kick phase off), the run keeps no worse move: it goes back
 * to the best plan, descends steepest from it (`FinalDescent`) and then tries random improving
 * moves. The calibrated end temperature matches the mean uphill change of the first plan, which is
 * far larger than the changes near a good plan, so without this the run would end slightly above
 * its local optimum.
 */
export const QUENCH_FROM = 0.95;

/**
 * With the kick phase on (`SolveOptions.kickPhase`, the default), the share of the budget where
 * it starts when the plan has one route (a tour): from there on the search kicks and descends
 * from the best plan (`KickSearch`) instead of the quench. A plan of several routes anneals on to
 * `QUENCH_FROM` and ends with the quench (the kicks measured mixed on fleets with windows). Chosen by measurement (TSPLIB gr202 and gr431, a Solomon subset;
 * `bench/results/kicks-*`).
 */
export const KICK_FROM = 0.8;

/**
 * The fraction of the budget where the annealing schedule stops governing the run.
 *
 * @param kickPhase - whether the kick phase is on (the run moves the end to `QUENCH_FROM` when
 *   its plan has more than one route there)
 * @returns `KICK_FROM` or `QUENCH_FROM`
 * @example annealingEnds(true) // => 0.8
 */
export function annealingEnds(kickPhase: boolean): number {
  return kickPhase ? KICK_FROM : QUENCH_FROM;
}

/**
 * One sentence for a cooling preview: what the run does after the annealing part, so the preview
 * says that the schedule shown governs only the part before.
 *
 * @param kickPhase - whether the kick phase is on (default: on, as `SOLVE_DEFAULTS`)
 * @returns e.g. "The last 20% of the run, for a plan of one route: kicks and descents from the best plan, ..."
 * @example endOfRunText(false) // => "The last 5% of the run keeps no worse move: a descent from the best plan (quench)."
 */
export function endOfRunText(kickPhase = true): string {
  const share = `${Math.round((1 - annealingEnds(kickPhase)) * 100)}%`;
  const quench = `${Math.round((1 - QUENCH_FROM) * 100)}%`;
  return kickPhase
    ? `The last ${share} of the run, for a plan of one route: kicks and descents from the best plan, keeping a result that is no worse and now and then one slightly worse, while the run keeps the best plan found (kick phase); with several routes the last ${quench} keeps no worse move: a descent from the best plan (quench).`
    : `The last ${quench} of the run keeps no worse move: a descent from the best plan (quench).`;
}
