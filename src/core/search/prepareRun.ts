import { calibrateTemperatures } from "../anneal/calibrateTemperatures.js";
import { createRandom, type Random } from "../anneal/createRandom.js";
import { initialWeights } from "../anneal/initialWeights.js";
import { measureMoveRate } from "../anneal/measureMoveRate.js";
import { resolveCooling, temperatureAt, type ResolvedCooling } from "../anneal/resolveCooling.js";
import { sampleUphill } from "../anneal/sampleUphill.js";
import { constructPlan } from "../construct/constructPlan.js";
import type { Problem } from "../model.js";
import { SearchState } from "../moves/SearchState.js";
import { buildNeighbours, everyPartner, type Neighbours } from "../neighbours/buildNeighbours.js";
import type { SolveOptions } from "../options.js";
import { compileProblem, type CompiledProblem } from "../schedule/compileProblem.js";
import { validateProblem } from "../validateProblem.js";
import { descend } from "./descend.js";

/**
 * Re-planning: put the earlier routes back (without the stops no vehicle can serve now, or
 * that their vehicle may no longer serve), so the stops added since are inserted into them.
 */
function startFromEarlier(state: SearchState, routes: readonly (readonly number[])[]): void {
  const cp = state.cp;
  const V = cp.vehicleCount;
  routes.forEach((r, v) => {
    const kept = r.filter((s) => state.routeOf[s] === -1 && cp.compatible[s * V + v] === 1);
    if (kept.length > 0) state.setRoute(v, kept);
  });
}

/** Descent moves per stop that polish the constructed plan before calibration. */
const DESCENT_MOVES_PER_STOP = 50;

/** Everything a run needs before its first annealing move. */
export interface PreparedRun {
  readonly cp: CompiledProblem;
  readonly rng: Random;
  /** Candidate lists of construction and route elimination. */
  readonly nb: Neighbours;
  /** Where moves draw a stop's partner: `nb`, or every servable stop with the granular neighbourhood off. */
  readonly moveNb: Neighbours;
  readonly state: SearchState;
  /** Initial penalty weights (adaptive penalties stay within bounds of these). */
  readonly weights: { readonly wTime: number; readonly wLoad: number };
  /** Stops that some vehicle can serve (the only ones moves draw). */
  readonly active: Int32Array;
  readonly cooling: ResolvedCooling;
  readonly t0: number;
  readonly tEnd: number;
  readonly meanUphill: number;
  /** Budget as moves or seconds (one of them). */
  readonly budgetMoves: number | undefined;
  /**
   * Moves per second measured by a timed burst before a seconds run (undefined for a move
   * budget, where the count is known); the run's move count is expected to be this times the
   * seconds left, and schedules that count moves are fitted to that count.
   */
  readonly movesPerSecond: number | undefined;
  readonly seconds: number | undefined;
}

/**
 * Check the options, compile the problem, construct and polish a first plan and calibrate
 * the cooling schedule on it (the random draws happen in this order, so a seed fixes them).
 *
 * @param problem - a problem without `validateProblem` issues
 * @param o - complete options
 * @param startedAt - when the run started by `o.now` (a seconds budget counts from there)
 * @returns the run's state and schedule
 * @throws RangeError when the problem has issues; TypeError when a seconds budget comes without `now`
 */
export function prepareRun(problem: Problem, o: SolveOptions, startedAt = o.now ? o.now() : 0): PreparedRun {
  const issues = validateProblem(problem);
  if (issues.length > 0) {
    throw new RangeError(`problem has ${issues.length} issue(s); first: ${issues[0]!.sheet}!${issues[0]!.cell}: ${issues[0]!.message}`);
  }
  const seconds = "seconds" in o.budget ? o.budget.seconds : undefined;
  const budgetMoves = "moves" in o.budget ? o.budget.moves : undefined;
  if (seconds !== undefined && !o.now) throw new TypeError("options.now is required for a seconds budget");
  if (!(Number.isInteger(o.neighbours) && o.neighbours >= 1))
    throw new RangeError(`options.neighbours must be a positive integer, got ${o.neighbours}`);
  const cp = compileProblem(problem);
  const rng = createRandom(o.seed);
  const nb = buildNeighbours(cp, o.neighbours);
  const weights = initialWeights(cp);
  const state = new SearchState(cp, weights.wTime, weights.wLoad);
  const moveNb = o.granularNeighbours ? nb : everyPartner(cp, nb);
  const movable = (s: number): boolean => !cp.unservableReason[s] && !(cp.homeVehicle[s]! >= 0 && cp.locked[cp.homeVehicle[s]!]);
  const active = Int32Array.from(Array.from({ length: cp.n }, (_, s) => s).filter(movable));
  if (problem.earlier) startFromEarlier(state, problem.earlier.routes);
  constructPlan(state, nb);
  if (cp.hierarchical) {
    // Worth more than the whole first plan: one vehicle fewer always wins.
    state.vehicleWeight = 2 * (state.realCost() + Math.abs(state.total())) + 1;
  }
  state.fullEvaluation = !o.incrementalEvaluation;
  descend(state, moveNb, rng, active, DESCENT_MOVES_PER_STOP * active.length);
  const cal = sampleUphill(state, moveNb, rng, o.calibrationSamples, active);
  const temps = calibrateTemperatures(cal.meanUphill, o.rule, o.p0, o.pEnd, cal.uphill);
  let movesPerSecond: number | undefined;
  let expectedMoves = budgetMoves ?? 0;
  if (seconds !== undefined) {
    const rateOptions = { seed: o.seed, now: o.now!, rule: o.rule, temperature: temps.t0 };
    movesPerSecond = measureMoveRate(state, moveNb, active, rateOptions);
    const secondsLeft = Math.max(0, seconds - (o.now!() - startedAt) / 1000);
    expectedMoves = Math.max(1, Math.round((movesPerSecond ?? 0) * secondsLeft));
  }
  const cooling = resolveCooling(o.cooling, { ...temps, budgetMoves: expectedMoves });
  const t0 = cooling.t0;
  const tEnd = "tEnd" in cooling ? cooling.tEnd : temperatureAt(cooling, expectedMoves, 1);
  return {
    cp,
    rng,
    nb,
    moveNb,
    state,
    weights,
    active,
    cooling,
    t0,
    tEnd,
    meanUphill: cal.meanUphill,
    budgetMoves,
    seconds,
    movesPerSecond,
  };
}
