/**
 * The routing model shared by every layer: stops, vehicles, the problem they form,
 * and the plan (solved routes) the solver returns. Pure data, no behaviour.
 *
 * Times are minutes from the planning day's midnight; distances are kilometres;
 * loads are numbers per load dimension (for example kg and crates).
 */

/** A point on the Earth in decimal degrees (WGS 84). */
export interface LatLon {
  readonly lat: number;
  readonly lon: number;
}

/** A window for the start of service, minutes from midnight; `latestMin >= earliestMin`. */
export interface TimeWindow {
  readonly earliestMin: number;
  readonly latestMin: number;
}

/** One customer visit to plan. */
export interface Stop {
  /** The user's id, unique in the problem. */
  readonly id: string;
  readonly name: string;
  /** Index into `Problem.locations`. */
  readonly location: number;
  /** Demand per load dimension; same length as `Problem.loadDimensions`. */
  readonly demand: readonly number[];
  /**
   * Allowed windows for the start of service, sorted, not overlapping; at least one.
   * A stop without a window has one window `[0, +Infinity]`.
   */
  readonly windows: readonly TimeWindow[];
  readonly serviceMin: number;
  /**
   * Cost of leaving this stop unserved. `undefined` means the stop must be served:
   * the solver then uses a cost far above any route cost.
   */
  readonly unservedCost?: number;
  /** Features a vehicle must have to serve this stop (e.g. "fridge"). */
  readonly requiredFeatures?: readonly string[];
  /**
   * Amount collected here per load dimension (returned crates, empties); same length as
   * `Problem.loadDimensions`. Absent means nothing to collect. It rides on board to the end depot.
   */
  readonly pickup?: readonly number[];
  /** Ids of the only vehicles that may serve this stop (a pin); absent means any. */
  readonly allowedVehicles?: readonly string[];
  /** Ids of vehicles that must not serve this stop. */
  readonly excludedVehicles?: readonly string[];
  /**
   * Why the stop cannot be planned at all (its address was not found, so its location is only a
   * placeholder). Absent for a normal stop. The plan lists such a stop unassigned with this reason.
   */
  readonly unplannedReason?: string;
}

/**
 * A break after at most `driveMin` minutes of driving: `breakMin` minutes, taken at a stop
 * (on arrival, overlapping any waiting, or after service). Any break at least this long
 * resets the driving count. The values are the user's; none is a legal default.
 */
export interface DrivingBreakRule {
  readonly driveMin: number;
  readonly breakMin: number;
}

/**
 * A break of `breakMin` minutes lying entirely inside [`earliestMin`, `latestMin`] (a lunch
 * window), taken at a stop. Due only when the duty overlaps the window so that the break can
 * neither end by the departure nor start after the return.
 */
export interface WindowBreakRule {
  readonly earliestMin: number;
  readonly latestMin: number;
  readonly breakMin: number;
}

/** One vehicle (one driver shift). */
export interface Vehicle {
  readonly id: string;
  /** Who drives it, from the fleet's Driver column; shown on route sheets only. */
  readonly driver?: string;
  /** Capacity per load dimension; same length as `Problem.loadDimensions`. */
  readonly capacity: readonly number[];
  /** Index into `Problem.locations` where the shift starts and ends. */
  readonly startLocation: number;
  readonly endLocation: number;
  /** Shift bounds, minutes from midnight; `shiftEndMin > shiftStartMin` (rolled over midnight). */
  readonly shiftStartMin: number;
  readonly shiftEndMin: number;
  /** Cost when the vehicle is used at all. */
  readonly fixedCost: number;
  readonly costPerKm: number;
  /** Cost per hour of duty (from leaving the start depot to returning). */
  readonly costPerHour: number;
  /**
   * Travel speed; travel minutes = `Matrix.travelMin * (Problem.referenceSpeedKmh / speedKmh)`.
   * Ignored (treated as the reference speed) when the matrix came from the user.
   */
  readonly speedKmh: number;
  readonly features?: readonly string[];
  /** Maximum number of stops on the route; `undefined` means no limit. */
  readonly maxStops?: number;
  /** Hard limits on the route's driving minutes, duty minutes and kilometres; `undefined`: none. */
  readonly maxDrivingMin?: number;
  readonly maxDutyMin?: number;
  readonly maxKm?: number;
  readonly drivingBreak?: DrivingBreakRule;
  readonly windowBreak?: WindowBreakRule;
}

/**
 * Travel between locations, row-major `L x L` (`from * size + to`).
 * `travelMin` is at `Problem.referenceSpeedKmh`.
 */
export interface Matrix {
  readonly size: number;
  readonly distanceKm: Float64Array;
  readonly travelMin: Float64Array;
  /** True when the user supplied the matrix: vehicle speeds then do not rescale it. */
  readonly userSupplied: boolean;
  /**
   * Set by `buildMatrix`: every km entry is the great-circle km between `Problem.locations`
   * times this detour factor (`placeKm`), so the search may compute an entry instead of reading
   * it from a table too large for the processor's caches. Leave it out of a matrix whose km
   * were changed afterwards (the search also checks a sample of entries).
   */
  readonly greatCircle?: { readonly detourFactor: number };
}

/** How the cost of a plan is compared. */
export type Objective =
  /** Fixed + per-km + per-hour costs + unserved costs, one number. */
  | "weighted"
  /** Fewest vehicles first, then the weighted cost (Solomon's benchmark convention). */
  | "hierarchical";

/**
 * A plan published earlier for the same day, to re-plan from (re-planning a published day).
 * Its stops keep their vehicle unless moving one to another vehicle saves more than
 * `stabilityCost`, and the stops each vehicle keeps stay in their earlier order; stops added
 * since are inserted; stops no longer in the problem are simply absent from `routes`.
 */
export interface EarlierPlan {
  /** One entry per vehicle (index into `Problem.vehicles`): the stops it served, in order (indices into `Problem.stops`). */
  readonly routes: readonly (readonly number[])[];
  /**
   * Cost counted once per stop of `routes` served by another vehicle or left unserved (same units
   * as the plan cost). It steers the search only: a plan's reported cost never includes it.
   */
  readonly stabilityCost: number;
  /** Vehicles whose earlier route is kept exactly as it is (no stop leaves, none joins, same order). */
  readonly locked: readonly number[];
}

/** A complete routing problem, ready for the solver. */
export interface Problem {
  /** Every location: depots and stops share one index space. Names are for messages. */
  readonly locations: readonly (LatLon & { readonly name?: string })[];
  readonly stops: readonly Stop[];
  readonly vehicles: readonly Vehicle[];
  /** Names of the load dimensions, e.g. ["kg"] or ["kg", "crates"]. */
  readonly loadDimensions: readonly string[];
  readonly matrix: Matrix;
  /** The speed `matrix.travelMin` was computed at (km/h). */
  readonly referenceSpeedKmh: number;
  /**
   * Hard windows: arriving after `latestMin` is infeasible.
   * Soft windows: allowed, at `lateCostPerMin` per minute late.
   */
  readonly hardWindows: boolean;
  readonly lateCostPerMin: number;
  readonly objective: Objective;
  /** When re-planning a published day: the earlier plan to start from. */
  readonly earlier?: EarlierPlan;
}

/** A defect of a problem or of user data, as data (never thrown). */
export interface Issue {
  /** Where: a sheet name, or a model path such as "stops[3]". */
  readonly sheet: string;
  /** A cell address ("E7") or a field name; "" when it concerns the whole table. */
  readonly cell: string;
  /** What is wrong and how to fix it. */
  readonly message: string;
}

/** One served stop in a route, with its timing. */
export interface Visit {
  /** Index into `Problem.stops`. */
  readonly stop: number;
  readonly arrivalMin: number;
  readonly waitMin: number;
  readonly startMin: number;
  readonly departureMin: number;
  /** Load on board after this stop, per dimension (falls with deliveries, rises with pickups). */
  readonly loadAfter: readonly number[];
  readonly legKm: number;
  /** Cumulative distance from the start depot to this stop. */
  readonly totalKm: number;
  /** Minutes after the latest start of the window used (0 when on time). */
  readonly lateMin: number;
}

/** A break in a route, taken at a visit (before or after its service). */
export interface BreakVisit {
  /** Index into `Route.visits` of the visit where the break is taken. */
  readonly at: number;
  /** True when taken on arrival (before service), false when after service. */
  readonly beforeService: boolean;
  /** "driving": after the driving limit; "window": inside the break window (it also resets the driving count when long enough). */
  readonly kind: "driving" | "window";
  readonly startMin: number;
  readonly endMin: number;
}

/** The route of one vehicle. Every vehicle has one, possibly empty. */
export interface Route {
  /** Index into `Problem.vehicles`. */
  readonly vehicle: number;
  readonly visits: readonly Visit[];
  /** Departure from the start depot and arrival at the end depot. */
  readonly departureMin: number;
  readonly returnMin: number;
  /** Load leaving the depot per dimension (sum of the route's demands). */
  readonly load: readonly number[];
  /** Highest load on board at any point of the route, per dimension. */
  readonly maxLoad: readonly number[];
  /** Breaks in time order (empty when the vehicle has no break rule or needs none). */
  readonly breaks: readonly BreakVisit[];
  /** Minutes by which a break rule is broken (driving past the limit, a break window missed); 0 when kept. */
  readonly breakViolationMin: number;
  readonly distanceKm: number;
  readonly drivingMin: number;
  /** From departure to return. */
  readonly dutyMin: number;
  readonly waitMin: number;
  readonly lateMin: number;
  /** Return after the shift end, in minutes (0 when back in time). */
  readonly overtimeMin: number;
  /** Highest load over capacity at any point, summed over dimensions (0 when within capacity). */
  readonly excessLoad: number;
  /** Fixed + distance + duty cost (+ late cost under soft windows); 0 for an empty route. */
  readonly cost: number;
}

/** A stop the plan does not serve, and why. */
export interface Unassigned {
  readonly stop: number;
  readonly reason: string;
}

/** Totals of a plan. */
export interface PlanTotals {
  readonly vehiclesUsed: number;
  readonly distanceKm: number;
  readonly drivingMin: number;
  readonly dutyMin: number;
  readonly waitMin: number;
  readonly lateMin: number;
  /** Route costs + unserved costs. */
  readonly cost: number;
  /** Stops not served, optional or not. */
  readonly unassigned: number;
  /** Of those, the stops that must be served (no priority cost): a dispatcher must act on them. */
  readonly mustServeUnassigned: number;
  /**
   * Re-planning only (`Problem.earlier` given): stops of the earlier plan now served by another
   * vehicle. Stops the earlier plan served that are now unassigned are counted in `unassigned`.
   */
  readonly vehicleChanges?: number;
}

/** The solved routes. */
export interface Plan {
  readonly routes: readonly Route[];
  readonly unassigned: readonly Unassigned[];
  readonly totals: PlanTotals;
  /**
   * True when no capacity (at any point), window (hard), shift, feature, max-stops, working-time,
   * break or pin rule is broken and every must-serve stop is served.
   */
  readonly feasible: boolean;
  /**
   * Every rule a route breaks, in words, e.g. "Van 2: 14 kg over capacity". Empty in a plan
   * returned by `solve` (it leaves stops out instead, see `keepHardRules`).
   */
  readonly violations: readonly string[];
}
