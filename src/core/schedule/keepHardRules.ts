import { PLAIN_DIMENSION } from "../constants.js";
import type { Plan, Problem, Route, Unassigned } from "../model.js";
import { evaluatePlan, evaluateRoute } from "./evaluatePlan.js";

/** Above this many stops on one route, only the stops shortly before the first late one are tried for removal. */
const TIME_CANDIDATES = 60;

/**
 * Turn a plan that breaks a hard rule into one that keeps every rule, serving as many stops
 * as it can: capacity (at every point), hard windows, shift ends, required features, max
 * stops, pins, working-time limits and breaks are never broken in the plan returned. A plan that already keeps them is returned as it is.
 * A locked route of a re-plan (`Problem.earlier.locked`) is the exception: it is kept exactly,
 * and whatever rule it breaks stays in `violations`.
 *
 * Stops are taken off a broken route greedily (a stop without the vehicle's features; for
 * load, an optional stop first, then the smallest stop that clears the excess, else the
 * largest; for time, the stop whose removal leaves the least lateness and overtime), then
 * each stop taken off is put back at its cheapest position on any route that stays within
 * every rule (optional stops only when serving them costs less than leaving them). The stops
 * still out are unassigned with a reason a dispatcher can act on, e.g. "total demand 1 640 kg
 * is more than the fleet's 900 kg; not served: 12 stops, 740 kg".
 *
 * @param problem - the problem the plan belongs to
 * @param plan - an evaluated plan (from `evaluatePlan`)
 * @returns a plan whose `violations` is empty (but for locked routes); stops that could not be kept are in `unassigned`
 * @throws RangeError when the plan does not fit the problem (as `evaluatePlan`)
 * @example keepHardRules(problem, overloaded).violations // => []
 */
export function keepHardRules(problem: Problem, plan: Plan): Plan {
  if (plan.violations.length === 0) return plan;
  const routes = plan.routes.map((r) => r.visits.map((v) => v.stop));
  const removed: number[] = [];
  const locked = new Set(problem.earlier?.locked ?? []);
  routes.forEach((stops, v) => {
    // A locked route is the user's own: kept as it is, its broken rules stay listed in the plan.
    if (!locked.has(v) && routeBreaksRule(problem, v, stops)) removed.push(...repairRoute(problem, v, stops));
  });
  // Must-serve stops first, each in its original order, then optional ones.
  removed.sort((a, b) => Number(isOptional(problem, a)) - Number(isOptional(problem, b)) || a - b);
  const blocked = new Map<number, Blocked>();
  for (const s of removed) {
    const why = reinsert(problem, routes, s);
    if (why !== undefined) blocked.set(s, why);
  }
  const unassigned: Unassigned[] = [...plan.unassigned];
  const capacityNote = fleetCapacityNote(
    problem,
    [...blocked.keys()].filter((s) => !isOptional(problem, s)),
    plan.unassigned,
  );
  for (const [s, why] of blocked) unassigned.push({ stop: s, reason: reasonFor(problem, s, why, capacityNote) });
  unassigned.sort((a, b) => a.stop - b.stop);
  return evaluatePlan(problem, routes, unassigned);
}

/** Why a stop could not be put back: every route lacked a feature, room, or time. */
type Blocked = "features" | "load" | "time" | "cost";

function isOptional(problem: Problem, s: number): boolean {
  return problem.stops[s]!.unservedCost !== undefined;
}

function routeBreaksRule(problem: Problem, v: number, stops: readonly number[]): boolean {
  const violations: string[] = [];
  evaluateRoute(problem, v, stops, violations);
  return violations.length > 0;
}

function hasFeatures(problem: Problem, v: number, s: number): boolean {
  const have = problem.vehicles[v]!.features ?? [];
  return (problem.stops[s]!.requiredFeatures ?? []).every((f) => have.includes(f));
}

/** Take stops off route `v` (in place) until it keeps every rule; returns the stops taken off. */
function repairRoute(problem: Problem, v: number, stops: number[]): number[] {
  const out: number[] = [];
  const take = (k: number): void => {
    out.push(stops[k]!);
    stops.splice(k, 1);
  };
  for (let k = stops.length - 1; k >= 0; k--) if (!hasFeatures(problem, v, stops[k]!)) take(k);
  const veh = problem.vehicles[v]!;
  const dims = problem.loadDimensions.length;
  for (;;) {
    const load = new Array<number>(dims).fill(0);
    for (const s of stops) for (let d = 0; d < dims; d++) load[d]! += problem.stops[s]!.demand[d] ?? 0;
    let worst = -1;
    let worstShare = 1e-9;
    for (let d = 0; d < dims; d++) {
      const cap = veh.capacity[d] ?? 0;
      const share = (load[d]! - cap) / Math.max(cap, 1e-9);
      if (load[d]! - cap > 1e-9 && share > worstShare) {
        worst = d;
        worstShare = share;
      }
    }
    if (worst < 0) break;
    take(pickForLoad(problem, stops, worst, load[worst]! - (veh.capacity[worst] ?? 0)));
  }
  if (veh.maxStops !== undefined) {
    while (stops.length > veh.maxStops) take(pickCheapestToDrop(problem, v, stops));
  }
  for (;;) {
    const route = evaluateRoute(problem, v, stops, []);
    if (timeExcess(problem, route) <= 1e-9) break;
    take(pickForTime(problem, v, stops, route));
  }
  // Rules the loops above do not measure (load at every point with pickups, pins, working-time
  // limits, breaks): take the stop whose removal leaves the fewest broken rules, until none is.
  for (;;) {
    const violations: string[] = [];
    evaluateRoute(problem, v, stops, violations);
    if (violations.length === 0 || stops.length === 0) break;
    take(pickForRules(problem, v, stops));
  }
  return out;
}

/** The stop whose removal leaves the fewest broken rules (ties: optional first, then the cheaper route). */
function pickForRules(problem: Problem, v: number, stops: readonly number[]): number {
  let best = stops.length - 1;
  let bestKey: [number, number, number] = [Infinity, 1, Infinity];
  for (let k = 0; k < stops.length; k++) {
    const violations: string[] = [];
    const trial = evaluateRoute(problem, v, [...stops.slice(0, k), ...stops.slice(k + 1)], violations);
    const key: [number, number, number] = [violations.length, isOptional(problem, stops[k]!) ? 0 : 1, trial.cost];
    if (lexLess(key, bestKey)) {
      best = k;
      bestKey = key;
    }
  }
  return best;
}

/** An optional stop first; then the smallest demand that clears `excess` alone; else the largest. */
function pickForLoad(problem: Problem, stops: readonly number[], d: number, excess: number): number {
  const q = (k: number): number => problem.stops[stops[k]!]!.demand[d] ?? 0;
  const order = stops.map((_, k) => k).filter((k) => q(k) > 0);
  const optional = order.filter((k) => isOptional(problem, stops[k]!));
  const pool = optional.length > 0 ? optional : order;
  let clears = -1;
  let largest = pool[0]!;
  for (const k of pool) {
    if (q(k) >= excess - 1e-9 && (clears < 0 || q(k) < q(clears))) clears = k;
    if (q(k) > q(largest)) largest = k;
  }
  return clears >= 0 ? clears : largest;
}

function timeExcess(problem: Problem, route: Route): number {
  return route.overtimeMin + (problem.hardWindows ? route.lateMin : 0);
}

/** The stop whose removal leaves the least lateness and overtime (ties: optional first, then the cheaper route). */
function pickForTime(problem: Problem, v: number, stops: readonly number[], route: Route): number {
  const firstLate = problem.hardWindows ? route.visits.findIndex((x) => x.lateMin > 1e-9) : -1;
  const last = firstLate >= 0 ? firstLate : stops.length - 1;
  const from = Math.max(0, last - TIME_CANDIDATES + 1);
  let best = last;
  let bestKey: [number, number, number] = [Infinity, 1, Infinity];
  for (let k = from; k <= last; k++) {
    const trial = evaluateRoute(problem, v, [...stops.slice(0, k), ...stops.slice(k + 1)], []);
    const key: [number, number, number] = [timeExcess(problem, trial), isOptional(problem, stops[k]!) ? 0 : 1, trial.cost];
    if (lexLess(key, bestKey)) {
      best = k;
      bestKey = key;
    }
  }
  return best;
}

/** For max stops: an optional stop first, else the stop whose removal saves the most cost. */
function pickCheapestToDrop(problem: Problem, v: number, stops: readonly number[]): number {
  let best = 0;
  let bestKey: [number, number] = [1, Infinity];
  for (let k = 0; k < stops.length; k++) {
    const trial = evaluateRoute(problem, v, [...stops.slice(0, k), ...stops.slice(k + 1)], []);
    const key: [number, number] = [isOptional(problem, stops[k]!) ? 0 : 1, trial.cost];
    if (lexLess(key, bestKey)) {
      best = k;
      bestKey = key;
    }
  }
  return best;
}

function lexLess(a: readonly number[], b: readonly number[]): boolean {
  for (let i = 0; i < a.length; i++) {
    if (a[i]! < b[i]! - 1e-9) return true;
    if (a[i]! > b[i]! + 1e-9) return false;
  }
  return false;
}

/** Put stop `s` at its cheapest position that keeps every rule; the reason when there is none. */
function reinsert(problem: Problem, routes: number[][], s: number): Blocked | undefined {
  const stop = problem.stops[s]!;
  const dims = problem.loadDimensions.length;
  let bestRoute = -1;
  let bestAt = -1;
  let bestDelta = Infinity;
  let why: Blocked = "features";
  const locked = new Set(problem.earlier?.locked ?? []);
  routes.forEach((stops, v) => {
    if (locked.has(v) || !hasFeatures(problem, v, s)) return;
    const veh = problem.vehicles[v]!;
    let room = veh.maxStops === undefined || stops.length < veh.maxStops;
    for (let d = 0; d < dims && room; d++) {
      let load = stop.demand[d] ?? 0;
      for (const x of stops) load += problem.stops[x]!.demand[d] ?? 0;
      if (load > (veh.capacity[d] ?? 0) + 1e-9) room = false;
    }
    if (!room) {
      if (why === "features") why = "load";
      return;
    }
    why = "time";
    const before = evaluateRoute(problem, v, stops, []).cost;
    for (let at = 0; at <= stops.length; at++) {
      const trial = [...stops.slice(0, at), s, ...stops.slice(at)];
      const violations: string[] = [];
      const after = evaluateRoute(problem, v, trial, violations);
      if (violations.length > 0) continue;
      const delta = after.cost - before;
      if (delta < bestDelta) {
        bestDelta = delta;
        bestRoute = v;
        bestAt = at;
      }
    }
  });
  if (bestRoute < 0) return why;
  if (stop.unservedCost !== undefined && bestDelta >= stop.unservedCost) return "cost";
  routes[bestRoute]!.splice(bestAt, 0, s);
  return undefined;
}

/**
 * When the must-serve demand of a load dimension is more than the whole fleet carries, the
 * sentence that says so ("total demand 1 640 kg is more than the fleet's 900 kg; not served:
 * 12 stops, 740 kg"); undefined when the fleet could carry it all.
 */
function fleetCapacityNote(problem: Problem, leftOut: readonly number[], unservable: readonly Unassigned[]): string | undefined {
  if (leftOut.length === 0) return undefined;
  const skip = new Set(unservable.map((u) => u.stop));
  const dims = problem.loadDimensions;
  for (let d = 0; d < dims.length; d++) {
    let demand = 0;
    problem.stops.forEach((st, i) => {
      if (st.unservedCost === undefined && !skip.has(i)) demand += st.demand[d] ?? 0;
    });
    const fleet = problem.vehicles.reduce((a, v) => a + (v.capacity[d] ?? 0), 0);
    if (demand <= fleet + 1e-9) continue;
    const out = leftOut.reduce((a, s) => a + (problem.stops[s]!.demand[d] ?? 0), 0);
    const unit = dims[d] && dims[d] !== PLAIN_DIMENSION ? ` ${dims[d]}` : "";
    return (
      `total demand ${groupDigits(demand)}${unit} is more than the fleet's ${groupDigits(fleet)}${unit}; ` +
      `not served: ${leftOut.length} stop${leftOut.length === 1 ? "" : "s"}, ${groupDigits(out)}${unit}`
    );
  }
  return undefined;
}

function reasonFor(problem: Problem, s: number, why: Blocked, capacityNote: string | undefined): string {
  const stop = problem.stops[s]!;
  if (stop.unservedCost !== undefined) {
    return why === "cost"
      ? `serving it would cost more than leaving it, ${stop.unservedCost}`
      : "left out (it has a priority cost) to keep the other routes within capacity, windows and shifts";
  }
  if (capacityNote !== undefined) return capacityNote;
  if (why === "features") return `needs ${(stop.requiredFeatures ?? []).join(", ")}; every vehicle with it is full or out of time`;
  if (why === "load") return "no vehicle has room left for it once the other stops are loaded; add capacity or a vehicle";
  return "no route reaches it inside its window and the shifts once the other stops are served; widen the window or add a vehicle";
}

/** 1640 -> "1 640", 740.5 -> "740.5" (a space between thousands, common practice in SI writing). */
function groupDigits(x: number): string {
  const [int, frac] = String(Math.round(x * 100) / 100).split(".");
  const grouped = int!.replace(/\B(?=(\d{3})+(?!\d))/g, " ");
  return frac ? `${grouped}.${frac}` : grouped;
}
