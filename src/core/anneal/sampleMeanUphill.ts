import { constructPlan } from "../construct/constructPlan.js";
import type { Problem } from "../model.js";
import { SearchState } from "../moves/SearchState.js";
import { buildNeighbours } from "../neighbours/buildNeighbours.js";
import { SOLVE_DEFAULTS } from "../options.js";
import { compileProblem } from "../schedule/compileProblem.js";
import { validateProblem } from "../validateProblem.js";
import { createRandom } from "./createRandom.js";
import { calibrateTemperatures } from "./calibrateTemperatures.js";
import { initialWeights } from "./initialWeights.js";
import { measureMoveRate } from "./measureMoveRate.js";
import { sampleUphill } from "./sampleUphill.js";

/**
 * The calibration data of a run without the run: build the first plan and average the cost
 * increase of random uphill moves from it (the figure from which `calibrateTemperatures`
 * derives t0 and tEnd). For the CLI `profile` command and the pane's preview. The run itself
 * polishes the first plan by a short descent before sampling, so its figure can differ a little.
 *
 * @param problem - a problem without `validateProblem` issues
 * @param options - seed (default 1), number of sampled moves (default 300), and a clock: with
 *   `now`, a short timed burst also measures the moves per second a run would make
 * @returns the mean uphill change in cost units, how many uphill moves it averages, those
 *   changes (`uphill`, for calibrating the end temperature as a run does) and, with `now`, the
 *   measured moves per second
 * @throws RangeError when the problem has issues or samples is not a positive integer
 * @example sampleMeanUphill(problem, { seed: 1 }) // => { meanUphill: 41.7, samples: 300, uphill: [12.5, ...] }
 */
export function sampleMeanUphill(
  problem: Problem,
  options: { seed?: number | string; samples?: number; now?: () => number } = {},
): { meanUphill: number; samples: number; uphill: number[]; movesPerSecond?: number } {
  const samples = options.samples ?? SOLVE_DEFAULTS.calibrationSamples;
  if (!(Number.isInteger(samples) && samples >= 1)) throw new RangeError(`samples must be a positive integer, got ${samples}`);
  const issues = validateProblem(problem);
  if (issues.length > 0) throw new RangeError(`problem has ${issues.length} issue(s); first: ${issues[0]!.message}`);
  const cp = compileProblem(problem);
  const w = initialWeights(cp);
  const state = new SearchState(cp, w.wTime, w.wLoad);
  const nb = buildNeighbours(cp, SOLVE_DEFAULTS.neighbours);
  constructPlan(state, nb);
  if (cp.hierarchical) state.vehicleWeight = 2 * (state.realCost() + Math.abs(state.total())) + 1;
  const active = Int32Array.from(Array.from({ length: cp.n }, (_, s) => s).filter((s) => !cp.unservableReason[s]));
  const seed = options.seed ?? SOLVE_DEFAULTS.seed;
  const sampled = sampleUphill(state, nb, createRandom(seed), samples, active);
  if (!options.now) return sampled;
  const { t0 } = calibrateTemperatures(sampled.meanUphill, SOLVE_DEFAULTS.rule, SOLVE_DEFAULTS.p0, SOLVE_DEFAULTS.pEnd, sampled.uphill);
  const movesPerSecond = measureMoveRate(state, nb, active, { seed, now: options.now, rule: SOLVE_DEFAULTS.rule, temperature: t0 });
  return movesPerSecond === undefined ? sampled : { ...sampled, movesPerSecond };
}
