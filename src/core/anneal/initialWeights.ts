import type { CompiledProblem } from "../schedule/compileProblem.js";

/**
 * Starting penalty weights, in the problem's own cost units: a minute of time warp costs
 * what a minute of an average leg costs, one typical demand over capacity what an average
 * leg costs (Vidal et al. 2013 start from similar data-driven values and let them adapt).
 *
 * @param cp - the compiled problem
 * @returns weights per minute of time warp and per typical demand of excess load
 * @example initialWeights(cp).wTime // => e.g. 1 for Solomon data (cost = distance = time)
 */
export function initialWeights(cp: CompiledProblem): { wTime: number; wLoad: number } {
  const L = cp.locationCount;
  let km = 0;
  let min = 0;
  let count = 0;
  for (let i = 0; i < cp.n; i++) {
    const a = cp.stopLoc[i]!;
    const b = cp.stopLoc[(i * 7919 + 1) % cp.n]!;
    const d = cp.distanceKm[a * L + b]!;
    const t = cp.travelMin[a * L + b]!;
    if (Number.isFinite(d) && Number.isFinite(t)) {
      km += d;
      min += t;
      count++;
    }
  }
  const V = cp.vehicleCount;
  let perKm = 0;
  let perHour = 0;
  for (let v = 0; v < V; v++) {
    perKm += cp.costPerKm[v]! / V;
    perHour += cp.costPerHour[v]! / V;
  }
  const legKm = count > 0 ? km / count : 1;
  const legMin = count > 0 ? min / count : 1;
  const legCost = perKm * legKm + (perHour * legMin) / 60;
  const safeLeg = legCost > 0 ? legCost : 1;
  const perMin = legMin > 0 ? safeLeg / legMin : 1;
  return { wTime: Math.max(perMin, 1e-6), wLoad: Math.max(safeLeg, 1e-6) };
}
