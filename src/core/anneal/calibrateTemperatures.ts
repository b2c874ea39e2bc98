import type { AcceptanceRule } from "../options.js";

/**
 * Start and end temperatures from target acceptance probabilities of the mean uphill change:
 * the usual calibration of simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983, "Optimization by
 * Simulated Annealing", Science 220:671, choose T0 so that most moves are accepted at first; here
 * the target is explicit). Solves P(meanUphill, T) = p for T under the given rule:
 * Metropolis T = -dE / ln p; logistic T = dE / ln(1/p - 1).
 *
 * @param meanUphill - mean of the sampled positive cost changes (cost units, > 0)
 * @param rule - acceptance rule
 * @param p0 - target acceptance at the start, in (0, 1). The logistic rule never reaches 0.5 for an
 *   uphill change, so a logistic p0 at or above `maxInitialAcceptance("logistic") - 0.01` is read as 0.49
 *   (the default p0 of 0.5 then means "as high as the rule allows").
 * @param pEnd - target acceptance at the end, 0 < pEnd < p0
 * @returns `{ t0, tEnd }` in cost units
 * @throws RangeError when a probability is outside its range or meanUphill is not positive
 * @example calibrateTemperatures(20, "metropolis", 0.5, 0.001) // => { t0: 28.85, tEnd: 2.895 }
 */
export function calibrateTemperatures(
  meanUphill: number,
  rule: AcceptanceRule,
  p0: number,
  pEnd: number,
): { t0: number; tEnd: number } {
  if (!(meanUphill > 0) || !Number.isFinite(meanUphill)) {
    throw new RangeError(`meanUphill must be a positive number, got ${meanUphill}`);
  }
  if (!(p0 > 0 && p0 < 1)) throw new RangeError(`p0 must be in (0, 1), got ${p0}`);
  const start = Math.min(p0, maxInitialAcceptance(rule) - 0.01);
  if (!(pEnd > 0 && pEnd < start)) throw new RangeError(`pEnd must be in (0, ${start}), got ${pEnd}`);
  return { t0: temperatureFor(meanUphill, rule, start), tEnd: temperatureFor(meanUphill, rule, pEnd) };
}

/**
 * The highest p0 a rule can reach for an uphill change: Metropolis approaches 1, the logistic
 * rule approaches 1/2 as T grows (common practice). Pane and CLI use it to clamp user targets.
 *
 * @example maxInitialAcceptance("logistic") // => 0.5
 */
export function maxInitialAcceptance(rule: AcceptanceRule): number {
  return rule === "logistic" ? 0.5 : 1;
}

function temperatureFor(deltaCost: number, rule: AcceptanceRule, p: number): number {
  return rule === "metropolis" ? -deltaCost / Math.log(p) : deltaCost / Math.log(1 / p - 1);
}
