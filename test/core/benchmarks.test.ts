import { describe, expect, it } from "vitest";
import { parseSolomon } from "../../src/core/formats/parseSolomon.js";
import { solomonRoutesDistance } from "../../src/core/formats/solomonRoutesDistance.js";
import { solomonToProblem } from "../../src/core/formats/solomonToProblem.js";
import { parseTsplib } from "../../src/core/formats/parseTsplib.js";
import { tsplibToProblem } from "../../src/core/formats/tsplibToProblem.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import { solve } from "../../src/core/solve.js";
import { fixtureCsv, fixtureText } from "../reference/benchmarksDir.js";

// The instances and their published values are committed fixtures (test/fixtures/reference).
describe("solver on published benchmarks (fixtures)", () => {
  it("finds the optimal tour of burma14, 3323 (TSPLIB95, Reinelt 1991)", () => {
    const inst = parseTsplib(fixtureText("burma14.tsp"));
    const { plan } = solve(tsplibToProblem(inst), { seed: 1, budget: { moves: 300_000 } });
    // Node 1 is the depot; the stops are nodes 2..14, so stop index k is node k + 2.
    const tour = [1, ...plan.routes[0]!.visits.map((v) => v.stop + 2)];
    expect(tsplibTourLength(inst, tour)).toBe(3323);
    const optimal = fixtureCsv("optimal.csv").find((r) => r[0] === "burma14");
    expect(Number(optimal?.[1])).toBe(3323);
  });

  it("serves Solomon C101 feasibly with the best-known 10 vehicles, distance within 5% of 828.94 (SINTEF table)", () => {
    const inst = parseSolomon(fixtureText("C101.txt"));
    const problem = solomonToProblem(inst);
    const { plan } = solve(problem, { seed: 1, budget: { moves: 2_000_000 } });
    expect(plan.feasible).toBe(true);
    expect(plan.unassigned).toEqual([]);
    const routes = plan.routes.filter((r) => r.visits.length > 0).map((r) => r.visits.map((v) => Number(problem.stops[v.stop]!.id)));
    const distance = solomonRoutesDistance(inst, routes);
    expect(distance).toBeCloseTo(plan.totals.distanceKm, 6);
    const best = fixtureCsv("best-known.csv").find((r) => r[0] === "C101");
    expect(best?.slice(1)).toEqual(["10", "828.94"]);
    expect(routes.length).toBe(10);
    expect(distance).toBeLessThanOrEqual(828.94 * 1.05);
  });
});
