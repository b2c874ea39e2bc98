import type { AcceptanceRule } from "../options.js";

/**
 * Probability of accepting a change of cost `deltaCost` at `temperature`.
 *
 * - Metropolis (Metropolis, Rosenbluth, Rosenbluth, Teller & Teller 1953, "Equation of State
 *   Calculations by Fast Computing Machines", J. Chem. Phys. 21:1087): 1 when dE <= 0, else exp(-dE / T).
 * - Logistic, or Barker's rule (Barker 1965, "Monte Carlo calculations of the radial distribution
 *   functions for a proton-electron plasma", Aust. J. Phys. 18:119): 1 / (1 + exp(dE / T)) for every dE,
 *   so even an improving move is accepted with probability below 1 and an even change with 1/2.
 *
 * @param rule - "metropolis" or "logistic"
 * @param deltaCost - new cost minus current cost (cost units)
 * @param temperature - T >= 0 in cost units; T = 0 accepts only improvements (Metropolis: also dE = 0)
 * @returns a probability in [0, 1]
 * @throws RangeError when the temperature is negative or NaN
 * @example acceptanceProbability("metropolis", 20, 90) // => 0.8007
 */
export function acceptanceProbability(rule: AcceptanceRule, deltaCost: number, temperature: number): number {
  if (!(temperature >= 0)) throw new RangeError(`temperature must be >= 0, got ${temperature}`);
  if (rule === "metropolis") {
    if (deltaCost <= 0) return 1;
    return temperature === 0 ? 0 : Math.exp(-deltaCost / temperature);
  }
  if (temperature === 0) return deltaCost < 0 ? 1 : deltaCost === 0 ? 0.5 : 0;
  const x = deltaCost / temperature;
  // Written so that neither branch overflows: exp of a large positive x would be Infinity.
  if (x >= 0) {
    const e = Math.exp(-x);
    return e / (1 + e);
  }
  return 1 / (1 + Math.exp(x));
}
