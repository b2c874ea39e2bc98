import type { AcceptanceRule } from "../options.js";
import { maxInitialAcceptance } from "./calibrateTemperatures.js";
import type { ProfilePoint } from "./profile.js";

/**
 * A one-line reading of a cooling profile, so a user can judge a schedule before running it:
 * a profile that stays near the rule's ceiling for most of the run is close to a random walk; one
 * that starts with a low acceptance is close to a greedy descent; one that ends high stops before
 * the search has settled (common practice of annealing practitioners).
 *
 * @param points - a profile from `profile`, fraction 0 first (at least 2 points)
 * @param rule - the rule the profile was made with (sets the ceiling: 1 for Metropolis, 0.5 logistic)
 * @returns one sentence
 * @throws RangeError when fewer than 2 points are given
 * @example describeProfile(profile({ kind: "timeFraction" }, "metropolis", 20, 1e5))
 * // => "Starts by accepting 0.50 of the worse moves, halves by 10% of the run and ends at 0.001: a balanced schedule."
 */
export function describeProfile(points: readonly ProfilePoint[], rule: AcceptanceRule = "metropolis"): string {
  const first = points[0];
  const last = points[points.length - 1];
  if (!first || !last || points.length < 2) throw new RangeError("points must hold at least 2 profile points");
  const ceiling = maxInitialAcceptance(rule);
  const start = first.pAccept;
  const end = last.pAccept;
  const flatUntil = lastFraction(points, (p) => p.pAccept >= 0.8 * start);
  const halfBy = firstFraction(points, (p) => p.pAccept <= start / 2);
  // Worded like the pane's and the Settings sheet's acceptance fields: the same quantity.
  const head = `Starts by accepting ${fmt(start)} of the worse moves`;
  if (start < 0.05) {
    return `${head}: close to a greedy descent from the first move; raise the start temperature or the start acceptance.`;
  }
  if (start >= 0.8 * ceiling && flatUntil >= 0.5) {
    return `${head} and stays flat until ${pct(flatUntil)} of the run: close to a random walk; cool faster or lower the start temperature.`;
  }
  if (end > 0.05) {
    return `${head} and still accepts ${fmt(end)} at the end: the run stops before it settles; lower the end temperature or cool faster.`;
  }
  if (halfBy !== undefined && halfBy < 0.05) {
    return `${head} and halves within ${pct(halfBy)} of the run: most of it is a descent; cool more slowly.`;
  }
  const halves = halfBy === undefined ? "" : `, halves by ${pct(halfBy)} of the run`;
  return `${head}${halves} and ends at ${fmt(end)}: a balanced schedule.`;
}

function firstFraction(points: readonly ProfilePoint[], test: (p: ProfilePoint) => boolean): number | undefined {
  return points.find(test)?.fraction;
}

function lastFraction(points: readonly ProfilePoint[], test: (p: ProfilePoint) => boolean): number {
  let f = 0;
  for (const p of points) if (test(p)) f = p.fraction;
  return f;
}

function fmt(p: number): string {
  return p >= 0.01 ? p.toFixed(2) : p.toPrecision(1);
}

function pct(f: number): string {
  return `${Math.round(f * 100)}%`;
}
