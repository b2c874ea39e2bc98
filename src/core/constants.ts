/** Physical constants and product defaults, each with its source. */

/**
 * Mean Earth radius R1 = (2a + b) / 3 of WGS 84 in km (Moritz, "Geodetic Reference
 * System 1980", Bulletin Géodésique 54, 1980; IUGG mean radius 6371.0088 km).
 */
export const EARTH_MEAN_RADIUS_KM = 6371.0088;

/** Road circuity over the great circle: 1.3 is a common rule of thumb (common practice). */
export const DEFAULT_DETOUR_FACTOR = 1.3;

/** Average urban/regional van speed used when a vehicle gives none (common practice). */
export const DEFAULT_SPEED_KMH = 40;

/** Minutes in a day. */
export const DAY_MIN = 1440;

/**
 * Name of the one load dimension when the user's tables give no unit (a plain Demand and a
 * plain Capacity). Messages then print amounts without a unit word.
 */
export const PLAIN_DIMENSION = "load";

/**
 * Under the vehicles-first (hierarchical) objective, the share of a run's budget that the
 * route-minimisation phase may use before the annealing starts (it stops earlier when the
 * lower bound on vehicles is reached); the annealing schedule runs over the rest. Chosen by
 * measurement on the Solomon instances (`bench/results/route-minimisation-*.json`).
 */
export const ROUTE_MINIMISATION_SHARE = 0.5;
/**
 * ... and it ends once this share of the budget has passed without a vehicle saved, so a fleet
 * already at its minimum leaves the time to the annealing (measured as the share above).
 */
export const ROUTE_MINIMISATION_STALL = 0.2;
