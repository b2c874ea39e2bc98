import { constructPlan } from "../construct/constructPlan.js";
import type { Problem } from "../model.js";
import { SearchState } from "../moves/SearchState.js";
import { buildNeighbours } from "../neighbours/buildNeighbours.js";
import { SOLVE_DEFAULTS } from "../options.js";
import { compileProblem } from "../schedule/compileProblem.js";
import { validateProblem } from "../validateProblem.js";
import { createRandom } from "./createRandom.js";
import { initialWeights } from "./initialWeights.js";
import { sampleUphill } from "./sampleUphill.js";

/**
 * The calibration data of a run without the run: build the first plan and average the cost
 * increase of random uphill moves from it (the figure from which `calibrateTemperatures`
 * derives t0 and tEnd). For the CLI `profile` command and the pane's preview. The run itself
 * polishes the first plan by a short descent before sampling, so its figure can differ a little.
 *
 * @param problem - a problem without `validateProblem` issues
 * @param options - seed (default 1) and number of sampled moves (default 300)
 * @returns the mean uphill change in cost units, how many uphill moves it averages, and those
 *   changes (`uphill`, for calibrating the end temperature as a run does)
 * @throws RangeError when the problem has issues or samples is not a positive integer
 * @example sampleMeanUphill(problem, { seed: 1 }) // => { meanUphill: 41.7, samples: 300, uphill: [12.5, ...] }
 */
export function sampleMeanUphill(
  problem: Problem,
  options: { seed?: number | string; samples?: number } = {},
): { meanUphill: number; samples: number; uphill: number[] } {
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
  return sampleUphill(state, nb, createRandom(options.seed ?? SOLVE_DEFAULTS.seed), samples, active);
}
