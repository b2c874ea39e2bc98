import type { TsplibInstance } from "./parseTsplib.js";
import { tsplibEdge } from "./tsplibEdge.js";

/**
 * The length of a closed tour by the instance's EDGE_WEIGHT_TYPE (TSPLIB95), including the
 * edge from the last node back to the first: the number TSPLIB's optimal lengths are in.
 *
 * @param inst - a parsed instance without issues
 * @param tour - every node number of the file (1-based) exactly once, in visiting order
 * @returns the integer tour length
 * @throws RangeError when `tour` is not a permutation of 1..dimension
 * @example tsplibTourLength(burma14, [1, 2, 14, 3, 4, 5, 6, 12, 7, 13, 8, 11, 9, 10]) // => 3323
 */
export function tsplibTourLength(inst: TsplibInstance, tour: readonly number[]): number {
  const n = inst.dimension;
  if (tour.length !== n) throw new RangeError(`tour must list all ${n} nodes, got ${tour.length}`);
  const seen = new Uint8Array(n + 1);
  for (const node of tour) {
    if (!Number.isInteger(node) || node < 1 || node > n) throw new RangeError(`tour has node ${node} outside 1..${n}`);
    if (seen[node]) throw new RangeError(`tour lists node ${node} twice`);
    seen[node] = 1;
  }
  let length = 0;
  for (let k = 0; k < n; k++) length += tsplibEdge(inst, tour[k]! - 1, tour[(k + 1) % n]! - 1);
  return length;
}
