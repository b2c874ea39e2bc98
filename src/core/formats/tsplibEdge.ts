import { tsplibDistance } from "../geo/tsplibDistance.js";
import type { TsplibInstance } from "./parseTsplib.js";

/**
 * The distance between two nodes of a TSPLIB instance by its EDGE_WEIGHT_TYPE: the
 * explicit matrix for EXPLICIT files, otherwise `tsplibDistance` on the coordinates.
 *
 * @param inst - a parsed instance without issues
 * @param i - first node, 0-based (node number - 1)
 * @param j - second node, 0-based
 * @returns the integer TSPLIB distance; 0 only when `i === j` (distinct GEO nodes at the same
 *   coordinates are 1 apart, TSPLIB95)
 * @throws RangeError when `i` or `j` is outside 0..dimension-1
 * @example tsplibEdge(parseTsplib(burma14Text), 0, 1) // => 153
 */
export function tsplibEdge(inst: TsplibInstance, i: number, j: number): number {
  const n = inst.dimension;
  if (!Number.isInteger(i) || i < 0 || i >= n) throw new RangeError(`i must be in 0..${n - 1}, got ${i}`);
  if (!Number.isInteger(j) || j < 0 || j >= n) throw new RangeError(`j must be in 0..${n - 1}, got ${j}`);
  if (i === j) return 0;
  if (inst.edgeWeightType === "EXPLICIT") {
    if (!inst.weights) throw new RangeError("inst has no weights (EXPLICIT file with issues)");
    return inst.weights[i * n + j]!;
  }
  return tsplibDistance(inst.edgeWeightType, inst.nodes[i]!, inst.nodes[j]!);
}
