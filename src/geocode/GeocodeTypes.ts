/**
 * What a geocoder answers, as Kiln keeps it: candidate points best first, and how good the
 * match is. Shared by the pure part (request, response, rating, cache key) and the fetch part.
 */

/** How precise a candidate is, from the service's own type or precision property. */
export type MatchPrecision = "house" | "street" | "town";

/** One candidate point of an answer. */
export interface GeocodeCandidate {
  /** Decimal degrees (WGS 84); read from GeoJSON's [longitude, latitude] (RFC 7946 §3.1.1). */
  readonly lat: number;
  readonly lon: number;
  /** What the service matched the address to ("12 Kiln Lane, Brickfield"). */
  readonly label: string;
  /** The service's confidence from 0 to 1, when it gives one. */
  readonly confidence?: number;
  /** Precision when the service says (house number, street, or a town or coarser). */
  readonly precision?: MatchPrecision;
}

/**
 * The quality of a geocoded point, best to worst for review order:
 * - `found`: one clear match (a house, or a precision the service does not state);
 * - `approximate`: the best match is a street or a town, not a house;
 * - `ambiguous`: several candidates of similar confidence lie far apart;
 * - `far`: the point lies far from all the others (the reader's far-from-others rule);
 * - `not-found`: the service found nothing.
 */
export type MatchQuality = "found" | "approximate" | "ambiguous" | "far" | "not-found";

/** The rated answer for one address. */
export interface GeocodeMatch {
  readonly quality: MatchQuality;
  /** The best candidate; absent when not found. */
  readonly best?: GeocodeCandidate;
  /** How many candidates the service gave. */
  readonly candidates: number;
  /** Why the match is doubtful, in words ("3 candidates up to 212 km apart"); absent when found. */
  readonly note?: string;
}
