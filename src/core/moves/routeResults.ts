/**
 * Route-level results of one evaluation, by slot (0: route A, 1: route B), as offsets into
 * `SearchState.out` and `SearchState.rStats` (one block of `R_SIZE` numbers per slot or route).
 */
export const R_COST = 0;
export const R_REAL = 1;
export const R_VIOL = 2;
export const R_COUNT = 3;
export const R_STOPTW = 4;
export const R_ENDTW = 5;
export const R_EXCESS = 6;
export const R_DIST = 7;
export const R_DUTY = 8;
/** Re-planning: stops on the route whose earlier vehicle was another one. */
export const R_MOVED = 9;
export const R_SIZE = 10;

/** Index of the stop count in the route results (for callers that read `out`). */
export const RESULT_COUNT = R_COUNT;
/** Index of the violation measure in the route results. */
export const RESULT_VIOL = R_VIOL;
/** Index of the unpenalised cost in the route results. */
export const RESULT_REAL = R_REAL;
/** Stride of one slot in `SearchState.out`. */
export const RESULT_SIZE = R_SIZE;
