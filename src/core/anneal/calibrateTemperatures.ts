import { acceptanceProbability } from "./acceptanceProbability.js";
import type { AcceptanceRule } from "../options.js";

/**
 * Start and end temperatures from target acceptance probabilities, the usual calibration of
 * simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983, "Optimization by Simulated Annealing",
 * Science 220:671: start where most moves are accepted; here the target is explicit).
 *
 * - Without samples, t0 solves P(meanUphill, T) = p0 and tEnd solves P(meanUphill, T) = pEnd:
 *   Metropolis T = -dE / ln p; logistic T = dE / ln(1/p - 1).
 * - When the sampled uphill changes are given, both solve instead "the mean acceptance
 *   probability of the sampled changes = p" (the acceptance-ratio form of Ben-Ameur 2004,
 *   "Computing the Initial Temperature of Simulated Annealing", Comput. Optim. Appl. 29:369).
 *   The mean change is dominated by a few large moves (a stop sent across the map), while the
 *   search is decided by the many small ones; the ratio form makes p0 and pEnd mean one thing,
 *   "this share of the worse moves one would sample is accepted", which is also what the preview
 *   plots. By Jensen's inequality it is never hotter than the mean form.
 *
 * @param meanUphill - mean of the sampled positive cost changes (cost units, > 0)
 * @param rule - acceptance rule
 * @param p0 - target acceptance at the start, in (0, 1). The logistic rule never reaches 0.5 for an
 *   uphill change, so a logistic p0 at or above 0.49 is read as 0.49 (the default 0.5 then means
 *   "as high as the rule allows").
 * @param pEnd - target acceptance at the end, 0 < pEnd < p0
 * @param uphill - optional sampled positive changes (the ones `meanUphill` averages)
 * @returns `{ t0, tEnd }` in cost units
 * @throws RangeError when a probability is outside its range or meanUphill is not positive
 * @example calibrateTemperatures(20, "metropolis", 0.5, 0.001) // => { t0: 28.85, tEnd: 2.895 }
 */
export function calibrateTemperatures(
  meanUphill: number,
  rule: AcceptanceRule,
  p0: number,
  pEnd: number,
  uphill?: readonly number[],
): { t0: number; tEnd: number } {
  if (!(meanUphill > 0) || !Number.isFinite(meanUphill)) {
    throw new RangeError(`meanUphill must be a positive number, got ${meanUphill}`);
  }
  if (!(p0 > 0 && p0 < 1)) throw new RangeError(`p0 must be in (0, 1), got ${p0}`);
  const start = Math.min(p0, maxInitialAcceptance(rule) - 0.01);
  if (!(pEnd > 0 && pEnd < start)) throw new RangeError(`pEnd must be in (0, ${start}), got ${pEnd}`);
  const samples = uphill?.filter((d) => d > 0 && Number.isFinite(d)) ?? [];
  const at = (p: number): number => {
    const tMean = temperatureFor(meanUphill, rule, p);
    return samples.length > 0 ? ratioTemperature(samples, rule, p, tMean) : tMean;
  };
  return { t0: at(start), tEnd: at(pEnd) };
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

/** T at which the mean acceptance of `samples` is p, by bisection on log T below `hot`. */
function ratioTemperature(samples: readonly number[], rule: AcceptanceRule, p: number, hot: number): number {
  const rate = (t: number): number => samples.reduce((a, d) => a + acceptanceProbability(rule, d, t), 0) / samples.length;
  if (rate(hot) <= p) return hot;
  // Below the smallest change over ~700 the rate is 0 in double precision: a safe lower bracket.
  let lo = Math.log(Math.min(...samples) / 700);
  let hi = Math.log(hot);
  for (let i = 0; i < 100 && hi - lo > 1e-12; i++) {
    const mid = (lo + hi) / 2;
    if (rate(Math.exp(mid)) > p) hi = mid;
    else lo = mid;
  }
  return Math.exp((lo + hi) / 2);
}
