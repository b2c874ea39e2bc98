/**
 * A plain textbook simulated annealer for the ablation bench (never used by the product): a
 * random neighbour among all stops (relocate a random stop to a random place in a random
 * route, swap two random stops, or reverse a random segment of a route), full re-evaluation of
 * the routes a move changes, Metropolis acceptance (Metropolis et al. 1953) and geometric
 * cooling (Kirkpatrick, Gelatt & Vecchi 1983) over a time budget. Capacity and lateness are
 * penalised with fixed weights; under the hierarchical objective each used vehicle adds a fixed
 * weight. None of the engine's parts: no granular neighbours, no O(1) evaluation, no route
 * minimisation, no adaptive penalties, no construction heuristic.
 */
import { createRandom } from "../src/core/anneal/createRandom.js";
import { evaluatePlan, type Plan, type Problem } from "../src/core/index.js";

/** Geometric levels over the run; the temperature falls from t0 to tEnd by the same factor at each. */
const LEVELS = 100;
/** Start and end acceptance of the mean uphill change (common practice). */
const P0 = 0.5;
const P_END = 0.001;

/** One route's penalised cost and its penalty part, recomputed from scratch. */
function routeCost(problem: Problem, vehicle: number, stops: readonly number[], penalty: number, vehicleWeight: number): [number, number] {
  if (stops.length === 0) return [0, 0];
  const veh = problem.vehicles[vehicle]!;
  const m = problem.matrix;
  const L = m.size;
  const factor = m.userSupplied ? 1 : problem.referenceSpeedKmh / veh.speedKmh;
  let km = 0;
  let t = veh.shiftStartMin;
  let late = 0;
  let at = veh.startLocation;
  const load = new Array<number>(problem.loadDimensions.length).fill(0);
  for (const s of stops) {
    const stop = problem.stops[s]!;
    km += m.distanceKm[at * L + stop.location]!;
    const arrive = t + m.travelMin[at * L + stop.location]! * factor;
    const w = stop.windows.find((x) => x.latestMin >= arrive);
    if (w) t = Math.max(arrive, w.earliestMin);
    else {
      const last = stop.windows[stop.windows.length - 1];
      late += last ? arrive - last.latestMin : 0;
      t = arrive;
    }
    t += stop.serviceMin;
    stop.demand.forEach((d, k) => (load[k]! += d));
    at = stop.location;
  }
  km += m.distanceKm[at * L + veh.endLocation]!;
  t += m.travelMin[at * L + veh.endLocation]! * factor;
  late += Math.max(0, t - veh.shiftEndMin);
  const over = load.reduce((sum, x, k) => sum + Math.max(0, x - (veh.capacity[k] ?? 0)), 0);
  const duty = t - veh.shiftStartMin;
  const pen = penalty * (over + late);
  return [veh.fixedCost + veh.costPerKm * km + (veh.costPerHour * duty) / 60 + pen + vehicleWeight, pen];
}

/**
 * Anneal a problem for `seconds` and return the best plan seen (penalty-free plans first, by
 * vehicles then cost under the hierarchical objective), re-evaluated by the core's `evaluatePlan`.
 *
 * @param problem - a problem (every stop servable)
 * @param options - seed, seconds, clock
 * @returns the plan, moves drawn and milliseconds spent
 * @example textbookAnneal(problem, { seed: 1, seconds: 10, now: () => performance.now() }).plan.totals.distanceKm
 */
export function textbookAnneal(
  problem: Problem,
  options: { seed: number; seconds: number; now: () => number },
): { plan: Plan; moves: number; elapsedMs: number } {
  const started = options.now();
  const rng = createRandom(options.seed);
  const V = problem.vehicles.length;
  const n = problem.stops.length;
  const m = problem.matrix;
  // Fixed weights: a unit of overload or a late minute costs the longest depot round trip; so does a vehicle.
  let roundTrip = 0;
  for (const s of problem.stops) {
    const d = problem.vehicles[0]!.startLocation;
    roundTrip = Math.max(roundTrip, m.distanceKm[d * m.size + s.location]! + m.distanceKm[s.location * m.size + d]!);
  }
  const penalty = roundTrip;
  const vehicleWeight = problem.objective === "hierarchical" ? roundTrip : 0;
  // First plan: the stops dealt round the vehicles in file order.
  const routes: number[][] = Array.from({ length: V }, () => []);
  for (let s = 0; s < n; s++) routes[s % V]!.push(s);
  const first = routes.map((r, v) => routeCost(problem, v, r, penalty, vehicleWeight));
  const cost = first.map((c) => c[0]);
  const pen = first.map((c) => c[1]);
  let total = cost.reduce((a, b) => a + b, 0);
  let totalPen = pen.reduce((a, b) => a + b, 0);
  let used = routes.filter((r) => r.length > 0).length;
  const where = new Int32Array(n);
  routes.forEach((r, v) => r.forEach((s) => (where[s] = v)));

  let best = routes.map((r) => [...r]);
  let bestKey = key();
  function key(): [number, number, number] {
    const broken = totalPen > 1e-9;
    return [
      broken ? 1 : 0,
      problem.objective === "hierarchical" && !broken ? used : 0,
      broken ? total : total - totalPen - used * vehicleWeight,
    ];
  }
  const better = (a: readonly number[], b: readonly number[]): boolean =>
    a[0]! < b[0]! || (a[0] === b[0] && (a[1]! < b[1]! || (a[1] === b[1] && a[2]! < b[2]! - 1e-9)));

  /** Draw a neighbour: the changed routes and their new stop lists (nothing changed yet). */
  function neighbour(): { v: number[]; r: number[][] } | undefined {
    const kind = rng.int(3);
    if (kind === 0) {
      const s = rng.int(n);
      const from = where[s]!;
      const to = rng.int(V);
      const a = routes[from]!.filter((x) => x !== s);
      const b = from === to ? a : [...routes[to]!];
      b.splice(rng.int(b.length + 1), 0, s);
      return from === to ? { v: [from], r: [b] } : { v: [from, to], r: [a, b] };
    }
    if (kind === 1) {
      const s1 = rng.int(n);
      const s2 = rng.int(n);
      if (s1 === s2) return undefined;
      const v1 = where[s1]!;
      const v2 = where[s2]!;
      const a = [...routes[v1]!];
      const b = v1 === v2 ? a : [...routes[v2]!];
      const i = a.indexOf(s1);
      const j = b.indexOf(s2);
      a[i] = s2;
      b[j] = s1;
      return v1 === v2 ? { v: [v1], r: [a] } : { v: [v1, v2], r: [a, b] };
    }
    const v = where[rng.int(n)]!;
    const r = routes[v]!;
    if (r.length < 2) return undefined;
    let i = rng.int(r.length);
    let j = rng.int(r.length);
    if (i === j) return undefined;
    if (i > j) [i, j] = [j, i];
    return { v: [v], r: [[...r.slice(0, i), ...r.slice(i, j + 1).reverse(), ...r.slice(j + 1)]] };
  }
  const deltaOf = (nb: { v: number[]; r: number[][] }): { d: number; costs: [number, number][] } => {
    const costs = nb.v.map((v, k) => routeCost(problem, v, nb.r[k]!, penalty, vehicleWeight));
    return { d: costs.reduce((s, c, k) => s + c[0] - cost[nb.v[k]!]!, 0), costs };
  };

  // Calibration: the mean uphill change of random neighbours of the first plan.
  let uphill = 0;
  let count = 0;
  for (let k = 0; k < 300; k++) {
    const nb = neighbour();
    if (!nb) continue;
    const { d } = deltaOf(nb);
    if (d > 0) {
      uphill += d;
      count++;
    }
  }
  const mean = count > 0 ? uphill / count : 1;
  const t0 = -mean / Math.log(P0);
  const tEnd = -mean / Math.log(P_END);
  const alpha = Math.pow(tEnd / t0, 1 / (LEVELS - 1));

  let moves = 0;
  let temperature = t0;
  const budgetMs = options.seconds * 1000;
  for (;;) {
    moves++;
    if ((moves & 255) === 0) {
      const f = (options.now() - started) / budgetMs;
      if (f >= 1) break;
      temperature = t0 * Math.pow(alpha, Math.min(LEVELS - 1, Math.floor(f * LEVELS)));
    }
    const nb = neighbour();
    if (!nb) continue;
    const { d, costs } = deltaOf(nb);
    if (d <= 0 || rng.next() < Math.exp(-d / temperature)) {
      nb.v.forEach((v, k) => {
        if (routes[v]!.length === 0) used++;
        if (nb.r[k]!.length === 0) used--;
        routes[v] = nb.r[k]!;
        totalPen += costs[k]![1] - pen[v]!;
        cost[v] = costs[k]![0];
        pen[v] = costs[k]![1];
        routes[v]!.forEach((s) => (where[s] = v));
      });
      total += d;
      if (d < 0 || bestKey[0] === 1) {
        const k = key();
        if (better(k, bestKey)) {
          bestKey = k;
          best = routes.map((r) => [...r]);
        }
      }
    }
  }
  return { plan: evaluatePlan(problem, best), moves, elapsedMs: options.now() - started };
}
