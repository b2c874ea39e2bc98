/**
 * One in-run measurement for `bench/instructions.ts` (run under valgrind by it): a `createSolver`
 * run of the `bench/moveEvaluations.ts` day of `n` stops at a budget of `moves` moves, seed 1;
 * prints the evaluations made and the plan's cost.
 *
 * Run: node --import tsx bench/instructionRun.ts 100 300000
 */
import { createSolver } from "../src/core/solve.js";
import { moveEvaluationsDay } from "./moveEvaluationsDay.js";

const n = Number(process.argv[2]);
const moves = Number(process.argv[3]);
const solver = createSolver(moveEvaluationsDay(n), { seed: 1, budget: { moves } });
while (!solver.step(20_000)) {
  // step until the budget is spent
}
const result = solver.result();
console.log(`evaluations=${result.stats.evaluations} cost=${result.plan.totals.cost}`);
