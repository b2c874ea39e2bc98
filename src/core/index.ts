/** The public surface of the pure core. */
export type * from "./model.js";
export * from "./options.js";
export * from "./constants.js";
export { greatCircleKm } from "./geo/greatCircleKm.js";
export { buildMatrix, userMatrix, type BuildMatrixOptions } from "./geo/buildMatrix.js";
export { solve, createSolver, type Solver, type SolveResult, type RunStats } from "./solve.js";
export { comparePlans } from "./comparePlans.js";
export { summariseRuns, type RunsSummary, type SeededRun } from "./summariseRuns.js";
export { evaluatePlan } from "./schedule/evaluatePlan.js";
export { unservableStops } from "./schedule/unservableStops.js";
export { validateProblem } from "./validateProblem.js";
export { sampleMeanUphill } from "./anneal/sampleMeanUphill.js";
export { acceptanceProbability } from "./anneal/acceptanceProbability.js";
export { calibrateTemperatures } from "./anneal/calibrateTemperatures.js";
export { resolveCooling, temperatureAt, type ResolvedCooling } from "./anneal/resolveCooling.js";
export { profile, type ProfilePoint } from "./anneal/profile.js";
export { describeProfile } from "./anneal/describeProfile.js";
export * from "./formats/index.js";
