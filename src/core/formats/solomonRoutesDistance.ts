import type { SolomonInstance } from "./parseSolomon.js";
import { solomonDistance } from "./solomonToProblem.js";

/**
 * Total distance of routes given as customer numbers of the file, each from the depot and
 * back, recomputed from the file's coordinates in double precision.
 *
 * @param inst - a parsed instance without issues
 * @param routes - per used vehicle, the customer numbers in visiting order (depot omitted)
 * @returns the summed Euclidean distance
 * @throws RangeError when a customer number is not in the file
 * @example solomonRoutesDistance(inst, [[1, 2], [3]]) // => d(0,1) + d(1,2) + d(2,0) + 2 d(0,3)
 */
export function solomonRoutesDistance(inst: SolomonInstance, routes: readonly (readonly number[])[]): number {
  const byId = new Map(inst.customers.map((c) => [c.id, c]));
  const depot = inst.customers[0];
  if (!depot) throw new RangeError("inst has no depot");
  let total = 0;
  for (const route of routes) {
    let prev = depot;
    for (const id of route) {
      const c = byId.get(id);
      if (!c || c === depot) throw new RangeError(`routes has customer ${id}, which is not a customer of the file`);
      total += solomonDistance(prev, c);
      prev = c;
    }
    if (route.length > 0) total += solomonDistance(prev, depot);
  }
  return total;
}
