import type { SearchState } from "./SearchState.js";
import { R_COST, R_COUNT, R_DIST, R_DUTY, R_ENDTW, R_EXCESS, R_MOVED, R_REAL, R_STOPTW, R_VIOL } from "./routeResults.js";

/**
 * Cost of a route from its evaluated results at `a[o..]`: the unpenalised cost (fixed, per km,
 * per hour of duty, lateness under soft windows, and when re-planning the stability cost of the
 * stops that changed vehicle) goes to `R_REAL`, the violation (time warp
 * under hard windows, overtime, excess load) to `R_VIOL`, and the penalised cost to `R_COST`
 * (written, not returned: a number returned from a call the engine does not inline is boxed).
 *
 * @param state - gives the compiled problem and the current penalty weights
 * @param v - the vehicle
 * @param a - results array (`SearchState.out` or `rStats`)
 * @param o - offset of the route's block in `a`
 */
export function penalisedCost(state: SearchState, v: number, a: Float64Array, o: number): void {
  const cp = state.cp;
  if (a[o + R_COUNT] === 0) {
    a[o + R_REAL] = 0;
    a[o + R_VIOL] = 0;
    a[o + R_COST] = 0;
    return;
  }
  const stopTW = a[o + R_STOPTW]!;
  const endTW = a[o + R_ENDTW]!;
  const excess = a[o + R_EXCESS]!;
  const real =
    cp.fixedCost[v]! +
    cp.costPerKm[v]! * a[o + R_DIST]! +
    (cp.costPerHour[v]! * a[o + R_DUTY]!) / 60 +
    (cp.hardWindows ? 0 : cp.lateCostPerMin * stopTW) +
    cp.stabilityCost * a[o + R_MOVED]!;
  a[o + R_REAL] = real;
  a[o + R_VIOL] = (cp.hardWindows ? stopTW : 0) + endTW + excess;
  a[o + R_COST] = real + (cp.hardWindows ? state.wTime * stopTW : 0) + state.wTime * endTW + state.wLoad * excess;
}
