import { SOLVE_DEFAULTS, type AcceptanceRule, type CoolingSpec } from "../options.js";
import { acceptanceProbability } from "./acceptanceProbability.js";
import { calibrateTemperatures } from "./calibrateTemperatures.js";
import { resolveCooling, temperatureAt } from "./resolveCooling.js";

/** One point of a cooling profile. */
export interface ProfilePoint {
  /** Share of the run, 0..1. */
  readonly fraction: number;
  readonly moves: number;
  readonly temperature: number;
  /**
   * Share of the sampled worse moves accepted at this temperature (the mean acceptance of the
   * `uphill` samples when given, else the acceptance of the mean uphill change): the quantity
   * p0 and pEnd set.
   */
  readonly pAccept: number;
}

/** Options of `profile`. */
export interface ProfileOptions {
  /** Target acceptance of the mean uphill change at the start (default 0.5). */
  readonly p0: number;
  /** ... and at the end (default 0.001, as `SOLVE_DEFAULTS`). */
  readonly pEnd: number;
  /** Points from fraction 0 to 1 inclusive (default 101). */
  readonly points: number;
  /** The sampled uphill changes behind `meanUphill`: when given, tEnd is calibrated on them as the run does. */
  readonly uphill?: readonly number[];
}

const DEFAULTS: ProfileOptions = { p0: SOLVE_DEFAULTS.p0, pEnd: SOLVE_DEFAULTS.pEnd, points: 101 };

/**
 * Preview a cooling schedule before a run: the temperature and the probability of accepting the
 * mean uphill change at evenly spaced points of the run. The run itself uses the same
 * `calibrateTemperatures`, `resolveCooling` and `temperatureAt`, so the preview is exact for a
 * move budget (for a seconds budget, pass the expected number of moves).
 *
 * @param spec - the cooling schedule (its own t0/tEnd win over the calibrated ones)
 * @param rule - acceptance rule
 * @param meanUphill - mean sampled uphill cost change (> 0)
 * @param budgetMoves - moves in the run (>= 1)
 * @param options - targets and number of points
 * @returns `points` profile points, fraction 0 first
 * @throws RangeError on parameters outside their ranges
 * @example profile({ kind: "timeFraction" }, "metropolis", 20, 1000, { points: 3 })[2].pAccept // => 0.001
 */
export function profile(
  spec: CoolingSpec,
  rule: AcceptanceRule,
  meanUphill: number,
  budgetMoves: number,
  options: Partial<ProfileOptions> = {},
): ProfilePoint[] {
  const o = { ...DEFAULTS, ...options };
  if (!(budgetMoves >= 1)) throw new RangeError(`budgetMoves must be >= 1, got ${budgetMoves}`);
  if (!(o.points >= 2)) throw new RangeError(`points must be >= 2, got ${o.points}`);
  const { t0, tEnd } = calibrateTemperatures(meanUphill, rule, o.p0, o.pEnd, o.uphill);
  const cooling = resolveCooling(spec, { t0, tEnd, budgetMoves });
  const samples = o.uphill?.filter((d) => d > 0 && Number.isFinite(d)) ?? [];
  const out: ProfilePoint[] = [];
  const n = Math.floor(o.points);
  for (let i = 0; i < n; i++) {
    const fraction = i / (n - 1);
    // The last point is the state after the final move, so it reaches the end temperature.
    const moves = Math.round(fraction * budgetMoves);
    const temperature = temperatureAt(cooling, moves, fraction);
    out.push({ fraction, moves, temperature, pAccept: acceptanceShare(rule, meanUphill, temperature, samples) });
  }
  return out;
}

/**
 * Share of worse moves accepted at temperature `t`: the mean acceptance of the samples, or the
 * acceptance of the mean change when there are none (as `calibrateTemperatures` reads p0 and pEnd).
 *
 * @example acceptanceShare("metropolis", 10, 10, []) // => 0.3679
 */
export function acceptanceShare(rule: AcceptanceRule, meanUphill: number, t: number, samples: readonly number[]): number {
  if (samples.length === 0) return acceptanceProbability(rule, meanUphill, t);
  let sum = 0;
  for (const d of samples) sum += acceptanceProbability(rule, d, t);
  return sum / samples.length;
}
