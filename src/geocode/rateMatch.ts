import { greatCircleKm, type LatLon } from "../core/index.js";
import { farFromOthers } from "../sheets/farFromOthers.js";
import type { GeocodeCandidate, GeocodeMatch, MatchQuality } from "./GeocodeTypes.js";

/** Candidates further apart than this (km) make an address ambiguous (our choice, for rounds of one region). */
export const AMBIGUOUS_KM = 5;
/** A candidate counts as a rival of the best when its confidence is at least this share of the best's. */
const RIVAL_SHARE = 0.5;

/**
 * Rate a service's answer for one address:
 * - no candidate: `not-found`;
 * - another candidate of similar confidence (at least half the best's, or either without one)
 *   lies more than 5 km from the best: `ambiguous`;
 * - the best is a street or a town rather than a house (from the service's type or precision
 *   property, where it gives one): `approximate`;
 * - else `found`.
 *
 * @param candidates - the candidates, best first
 * @returns the match with its best candidate and a note for doubtful ones
 * @example rateMatch([]).quality // => "not-found"
 */
export function rateMatch(candidates: readonly GeocodeCandidate[]): GeocodeMatch {
  const best = candidates[0];
  if (best === undefined) return { quality: "not-found", candidates: 0, note: "the service found no match" };
  const rivals = candidates
    .slice(1)
    .filter((c) => best.confidence === undefined || c.confidence === undefined || c.confidence >= RIVAL_SHARE * best.confidence);
  const spreadKm = Math.max(0, ...rivals.map((c) => greatCircleKm(best, c)));
  if (spreadKm > AMBIGUOUS_KM) {
    return {
      quality: "ambiguous",
      best,
      candidates: candidates.length,
      note: `${rivals.length + 1} candidates up to ${Math.round(spreadKm)} km apart`,
    };
  }
  if (best.precision === "street" || best.precision === "town") {
    return { quality: "approximate", best, candidates: candidates.length, note: `matched a ${best.precision}, not a house` };
  }
  return { quality: "found", best, candidates: candidates.length };
}

/**
 * Mark geocoded points that lie far from all the others with the reader's far-from-others rule
 * (`farFromOthers`, the rule of the stop warnings), measured on every point of the round: typed
 * ones and geocoded ones. A doubtful rating (ambiguous, not found) is kept as it is.
 *
 * @param matches - the geocoded matches
 * @param typed - the points typed in the sheets (stops and depots)
 * @returns the matches, with `far` where the point is far from the rest
 * @example markFarAway(matches, typedPoints)[3].quality // => "far"
 */
export function markFarAway<T extends GeocodeMatch>(matches: readonly T[], typed: readonly LatLon[]): T[] {
  const points = [...typed, ...matches.flatMap((m) => (m.best ? [m.best] : []))];
  const rule = farFromOthers(points);
  return matches.map((m) => {
    if (!m.best || !rule.isFar(m.best) || m.quality === "ambiguous") return m;
    const quality: MatchQuality = "far";
    return {
      ...m,
      quality,
      note: `${Math.round(rule.km(m.best))} km from the middle of the others (typically ${Math.round(rule.typicalKm)} km)`,
    };
  });
}

/** Review order of qualities: the most doubtful first. */
export const REVIEW_ORDER: readonly MatchQuality[] = ["not-found", "far", "ambiguous", "approximate", "found"];
