import type { Problem, Unassigned } from "../model.js";
import { compileProblem } from "./compileProblem.js";

/**
 * The stops no vehicle can serve even as its only stop (a missing feature, demand over every
 * capacity, a window no shift reaches), with the reason the solver gives them. Lets a reader
 * warn about them, naming the cell, before a run starts.
 *
 * @param problem - a problem without `validateProblem` issues
 * @returns the stops and reasons, in stop order; empty when every stop can be served alone
 * @throws RangeError when the problem has no vehicle
 * @example unservableStops(problem) // => [{ stop: 4, reason: "needs fridge, which no vehicle has" }]
 */
export function unservableStops(problem: Problem): Unassigned[] {
  const reasons = compileProblem(problem).unservableReason;
  const out: Unassigned[] = [];
  reasons.forEach((reason, stop) => {
    if (reason) out.push({ stop, reason });
  });
  return out;
}
