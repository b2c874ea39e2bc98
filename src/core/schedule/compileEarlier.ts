/** The re-planning part of `compileProblem`: home vehicles, ranks, stability cost and locked routes. */
import type { Problem } from "../model.js";
import type { CompiledProblem } from "./compileProblem.js";

/**
 * The re-planning arrays. A locked vehicle may serve only the stops of its earlier route, and
 * those stops only it (whatever else the rules say: the user asked to keep the route as it is).
 * An optional stop of the earlier plan costs the stability cost more when left unserved, so
 * dropping it is never a cheap way round the stability cost.
 */
export function compileEarlier(
  problem: Problem,
  compatible: Uint8Array,
  unservableReason: string[],
  unservedCost: Float64Array,
  optional: Uint8Array,
): Pick<CompiledProblem, "replanning" | "homeVehicle" | "homeRank" | "stabilityCost" | "locked"> {
  const n = problem.stops.length;
  const V = problem.vehicles.length;
  const homeVehicle = new Int32Array(n).fill(-1);
  const homeRank = new Int32Array(n);
  const locked = new Uint8Array(V);
  const e = problem.earlier;
  if (!e) return { replanning: false, homeVehicle, homeRank, stabilityCost: 0, locked };
  e.routes.forEach((r, v) =>
    r.forEach((s, k) => {
      homeVehicle[s] = v;
      homeRank[s] = k;
    }),
  );
  for (let s = 0; s < n; s++) if (homeVehicle[s]! >= 0 && optional[s]) unservedCost[s] = unservedCost[s]! + e.stabilityCost;
  for (const v of e.locked) locked[v] = 1;
  for (let s = 0; s < n; s++) {
    const h = homeVehicle[s]!;
    const mine = h >= 0 && locked[h] === 1;
    if (mine && problem.stops[s]!.unplannedReason !== undefined) continue;
    for (let k = 0; k < V; k++) {
      if (mine) compatible[s * V + k] = k === h ? 1 : 0;
      else if (locked[k]) compatible[s * V + k] = 0;
    }
    if (mine) unservableReason[s] = "";
    else if (!unservableReason[s] && !compatible.subarray(s * V, s * V + V).some((x) => x === 1))
      unservableReason[s] = "every vehicle that could serve it has a locked route";
  }
  return { replanning: true, homeVehicle, homeRank, stabilityCost: e.stabilityCost, locked };
}
