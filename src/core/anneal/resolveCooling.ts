import { GEOMETRIC_ALPHA, type CoolingSpec } from "../options.js";

/** A cooling schedule with every number fixed, ready for `temperatureAt`. */
export type ResolvedCooling =
  /** With `movesPerLevel` the level changes every so many moves; else `levels` spread over the run. */
  | { readonly kind: "geometric"; readonly t0: number; readonly alpha: number; readonly movesPerLevel?: number; readonly levels: number }
  | { readonly kind: "linear"; readonly t0: number; readonly tEnd: number; readonly steps: number }
  | { readonly kind: "lundyMees"; readonly t0: number; readonly beta: number }
  | { readonly kind: "timeFraction"; readonly t0: number; readonly tEnd: number };

/**
 * Fix the numbers of a cooling schedule: a `t0`/`tEnd` given in the spec wins over the
 * calibrated ones passed in `t`.
 *
 * @param spec - the user's schedule
 * @param t - calibrated start and end temperatures (cost units) and the move budget
 * @returns the resolved schedule
 * @throws RangeError on a parameter outside its range (alpha in (0,1), movesPerLevel >= 1,
 *   steps >= 1, beta > 0, temperatures > 0)
 * @example resolveCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 100 }, { t0: 50, tEnd: 1, budgetMoves: 1e4 })
 * // => { kind: "geometric", t0: 50, alpha: 0.94, movesPerLevel: 100, levels: 64 }
 */
export function resolveCooling(
  spec: CoolingSpec,
  t: { readonly t0: number; readonly tEnd: number; readonly budgetMoves: number },
): ResolvedCooling {
  const t0 = spec.t0 ?? t.t0;
  if (!(t0 > 0)) throw new RangeError(`t0 must be > 0, got ${t0}`);
  switch (spec.kind) {
    case "geometric": {
      const tEnd = positive(spec.tEnd ?? t.tEnd, "tEnd");
      if (spec.movesPerLevel !== undefined && !(spec.movesPerLevel >= 1))
        throw new RangeError(`movesPerLevel must be >= 1, got ${spec.movesPerLevel}`);
      const movesPerLevel = spec.movesPerLevel === undefined ? undefined : Math.floor(spec.movesPerLevel);
      const alpha =
        spec.alpha ?? (movesPerLevel === undefined ? GEOMETRIC_ALPHA : alphaToReach(t0, Math.min(t0, tEnd), movesPerLevel, budget(t)));
      if (!(alpha > 0 && alpha <= 1) || (spec.alpha !== undefined && alpha === 1))
        throw new RangeError(`alpha must be in (0, 1), got ${alpha}`);
      // Levels needed to fall from t0 to tEnd; at least one so that a hot tEnd still cools a little.
      const levels = alpha === 1 ? 1 : Math.max(1, Math.ceil(Math.log(Math.min(1, tEnd / t0)) / Math.log(alpha)));
      if (movesPerLevel === undefined) return { kind: "geometric", t0, alpha, levels };
      return { kind: "geometric", t0, alpha, movesPerLevel, levels };
    }
    case "linear": {
      const tEnd = positive(spec.tEnd ?? t.tEnd, "tEnd");
      if (!(spec.steps >= 1)) throw new RangeError(`steps must be >= 1, got ${spec.steps}`);
      return { kind: "linear", t0, tEnd, steps: Math.floor(spec.steps) };
    }
    case "lundyMees": {
      const beta = spec.beta ?? betaToReach(t0, Math.min(t0, positive(spec.tEnd ?? t.tEnd, "tEnd")), budget(t));
      if (!(beta >= 0) || (spec.beta !== undefined && !(beta > 0))) throw new RangeError(`beta must be > 0, got ${beta}`);
      return { kind: "lundyMees", t0, beta };
    }
    case "timeFraction":
      return { kind: "timeFraction", t0, tEnd: positive(spec.tEnd ?? t.tEnd, "tEnd") };
  }
}

/**
 * Temperature after `moves` moves, a fraction `fraction` (0..1) of the way through the run.
 * Every schedule is a closed form, so a run, a preview and a test agree exactly:
 * - geometric: T = t0 * alpha^floor(moves / L) (Kirkpatrick et al. 1983); without L, the run is
 *   cut into the `levels` needed to reach tEnd: T = t0 * alpha^min(levels, floor(f * levels));
 * - linear steps: T falls from t0 to tEnd in `steps` equal levels over the run (level = floor(f * steps));
 * - Lundy-Mees: T_k = T_{k-1} / (1 + beta T_{k-1}), i.e. T = t0 / (1 + beta t0 moves)
 *   (Lundy & Mees 1986, "Convergence of an annealing algorithm", Math. Programming 34:111);
 * - time fraction: T = t0 (tEnd / t0)^f.
 *
 * @param cooling - a resolved schedule
 * @param moves - moves made so far (>= 0)
 * @param fraction - share of the budget used, clipped to 0..1
 * @returns the temperature (cost units, > 0)
 * @example temperatureAt({ kind: "timeFraction", t0: 100, tEnd: 1 }, 0, 0.5) // => 10
 */
export function temperatureAt(cooling: ResolvedCooling, moves: number, fraction: number): number {
  const f = fraction <= 0 ? 0 : fraction >= 1 ? 1 : fraction;
  switch (cooling.kind) {
    case "geometric": {
      const level =
        cooling.movesPerLevel === undefined
          ? Math.min(cooling.levels, Math.floor(f * cooling.levels))
          : Math.floor(moves / cooling.movesPerLevel);
      return cooling.t0 * Math.pow(cooling.alpha, level);
    }
    case "linear": {
      if (cooling.steps === 1) return cooling.t0;
      const level = Math.min(cooling.steps - 1, Math.floor(f * cooling.steps));
      return cooling.t0 + ((cooling.tEnd - cooling.t0) * level) / (cooling.steps - 1);
    }
    case "lundyMees":
      return cooling.t0 / (1 + cooling.beta * cooling.t0 * moves);
    case "timeFraction":
      return cooling.t0 * Math.pow(cooling.tEnd / cooling.t0, f);
  }
}

/**
 * The geometric factor that takes t0 to tEnd in `budgetMoves` moves at `movesPerLevel` per level,
 * for the "calibrate" choice of a geometric schedule.
 *
 * @example alphaToReach(100, 1, 100, 10_000) // => 0.9550 (100 levels)
 */
export function alphaToReach(t0: number, tEnd: number, movesPerLevel: number, budgetMoves: number): number {
  const levels = Math.max(1, Math.floor(budgetMoves / movesPerLevel));
  return Math.pow(tEnd / t0, 1 / levels);
}

/**
 * The Lundy-Mees beta that takes t0 to tEnd in `budgetMoves` moves: beta = (t0 - tEnd) / (n t0 tEnd).
 *
 * @example betaToReach(100, 1, 99) // => 0.01
 */
export function betaToReach(t0: number, tEnd: number, budgetMoves: number): number {
  return (t0 - tEnd) / (Math.max(1, budgetMoves) * t0 * tEnd);
}

/** The move budget a fitted parameter is fitted to (a seconds budget passes its expected moves). */
function budget(t: { readonly budgetMoves: number }): number {
  if (!(t.budgetMoves >= 1)) throw new RangeError(`a fitted schedule parameter needs a move budget >= 1, got ${t.budgetMoves}`);
  return t.budgetMoves;
}

function positive(value: number, name: string): number {
  if (!(value > 0)) throw new RangeError(`${name} must be > 0, got ${value}`);
  return value;
}
