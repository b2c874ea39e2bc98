import { beforeAll, describe, expect, it } from "vitest";
import { detectFormat } from "../../src/core/formats/detectFormat.js";
import { parseTsplib } from "../../src/core/formats/parseTsplib.js";
import { tsplibEdge } from "../../src/core/formats/tsplibEdge.js";
import { tsplibToProblem } from "../../src/core/formats/tsplibToProblem.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import { tsplibDistance, tsplibGeoDegrees } from "../../src/core/geo/tsplibDistance.js";
import { benchmarkCsv, benchmarksAvailable, benchmarkText, fixtureCsv, fixtureText } from "./benchmarksDir.js";

// Optimal tours, from memory; their lengths are checked against TSPLIB95's optimal.csv.
const OPTIMAL_TOURS: Record<string, number[]> = {
  burma14: [1, 2, 14, 3, 4, 5, 6, 12, 7, 13, 8, 11, 9, 10],
  ulysses16: [1, 14, 13, 12, 7, 6, 15, 5, 11, 9, 10, 16, 3, 2, 4, 8],
  ulysses22: [1, 14, 13, 12, 7, 6, 15, 5, 11, 9, 10, 19, 20, 21, 16, 3, 2, 17, 22, 4, 18, 8],
};
// The published optimal lengths (TSPLIB95 optimal.csv), also stated here so a changed file is noticed.
const PUBLISHED: Record<string, number> = { burma14: 3323, ulysses16: 6859, ulysses22: 7013 };

// The three instances and optimal.csv are committed fixtures (test/fixtures/reference): always run.
describe("TSPLIB95 GEO distance on published optima (fixtures)", () => {
  let optimal = new Map<string, number>();
  beforeAll(() => {
    optimal = new Map(
      fixtureCsv("optimal.csv")
        .slice(1)
        .map(([name, len]) => [name!, Number(len)]),
    );
  });

  for (const [name, tour] of Object.entries(OPTIMAL_TOURS)) {
    it(`${name}: the optimal tour has the length of TSPLIB95 optimal.csv (${PUBLISHED[name]})`, () => {
      const inst = parseTsplib(fixtureText(`${name}.tsp`));
      expect(inst.issues).toEqual([]);
      expect(inst.edgeWeightType).toBe("GEO");
      expect(optimal.get(name)).toBe(PUBLISHED[name]);
      expect(tsplibTourLength(inst, tour)).toBe(PUBLISHED[name]);
    });
  }

  it("a tour length does not depend on the starting node or the direction (TSPLIB95: closed tour)", () => {
    const inst = parseTsplib(fixtureText("burma14.tsp"));
    const tour = OPTIMAL_TOURS["burma14"]!;
    const rotated = [...tour.slice(5), ...tour.slice(0, 5)];
    expect(tsplibTourLength(inst, rotated)).toBe(3323);
    expect(tsplibTourLength(inst, [...tour].reverse())).toBe(3323);
  });
});

describe.skipIf(!benchmarksAvailable("TSPLIB suite files"))("TSPLIB95 suite in the benchmark folder", () => {
  it("every TSPLIB file of optimal.csv parses without issues and with DIMENSION nodes", () => {
    const rows = benchmarkCsv("tsplib/optimal.csv").slice(1);
    expect(rows.length).toBeGreaterThan(3);
    for (const [name] of rows) {
      const text = benchmarkText(`tsplib/${name}.tsp`);
      expect(detectFormat(text), name).toBe("tsplib");
      const inst = parseTsplib(text);
      expect(inst.issues, name).toEqual([]);
      expect(inst.nodes.length, name).toBe(inst.dimension);
    }
  });

  it("the committed fixtures are the suite's files, byte for byte", () => {
    for (const name of Object.keys(OPTIMAL_TOURS)) expect(fixtureText(`${name}.tsp`), name).toBe(benchmarkText(`tsplib/${name}.tsp`));
  });
});

describe("TSPLIB95 distance definitions (Reinelt 1995, section 2)", () => {
  it("EUC_2D rounds to the nearest integer: sqrt(2) -> 1, sqrt(2.5^2 + 0) = 2.5 -> 3", () => {
    expect(tsplibDistance("EUC_2D", { x: 0, y: 0 }, { x: 1, y: 1 })).toBe(1);
    expect(tsplibDistance("EUC_2D", { x: 0, y: 0 }, { x: 2.5, y: 0 })).toBe(3);
  });
  it("CEIL_2D rounds up: sqrt(2) -> 2, 5 stays 5", () => {
    expect(tsplibDistance("CEIL_2D", { x: 0, y: 0 }, { x: 1, y: 1 })).toBe(2);
    expect(tsplibDistance("CEIL_2D", { x: 0, y: 0 }, { x: 3, y: 4 })).toBe(5);
  });
  it("ATT is pseudo-Euclidean: r = sqrt(d^2/10), nint(r) raised by one when below r", () => {
    // d = 10: r = 3.162, nint = 3 < r -> 4.
    expect(tsplibDistance("ATT", { x: 0, y: 0 }, { x: 10, y: 0 })).toBe(4);
    // d = sqrt(10 * 3.6^2): r = 3.6, nint = 4 >= r -> 4.
    expect(tsplibDistance("ATT", { x: 0, y: 0 }, { x: Math.sqrt(10) * 3.6, y: 0 })).toBe(4);
    // d^2 = 1000: r = 10 exactly -> 10.
    expect(tsplibDistance("ATT", { x: 0, y: 0 }, { x: 30, y: 10 })).toBe(10);
  });
  it("GEO reads DDD.MM as degrees and minutes: 16.30 is 16 deg 30 min = 16.5 deg", () => {
    expect(tsplibGeoDegrees(16.3)).toBeCloseTo(16.5, 12);
    expect(tsplibGeoDegrees(-27.07)).toBeCloseTo(-(27 + 7 / 60), 12);
  });
  it("GEO is symmetric", () => {
    const a = { x: 16.47, y: 96.1 };
    const b = { x: 20.09, y: 92.54 };
    expect(tsplibDistance("GEO", a, b)).toBe(tsplibDistance("GEO", b, a));
  });
  // TSPLIB95 (Reinelt 1995, section 2.4, GEO): dij = (int)(RRR * acos(...) + 1.0); for two
  // distinct nodes at the same coordinates acos(1) = 0, so the distance is 1, not 0.
  it("GEO of two distinct nodes at identical coordinates is int(RRR * acos(1) + 1) = 1", () => {
    const a = { x: 16.47, y: 96.1 };
    expect(tsplibDistance("GEO", a, { ...a })).toBe(1);
  });
  it("GEO instance: 0 only on the diagonal; coincident cities are 1 apart in the edge, the tour and the matrix", () => {
    // An invented three-city file: cities 1 and 2 share their coordinates.
    const text = [
      "NAME: coincident3",
      "TYPE: TSP",
      "DIMENSION: 3",
      "EDGE_WEIGHT_TYPE: GEO",
      "NODE_COORD_SECTION",
      "1 16.47 96.10",
      "2 16.47 96.10",
      "3 20.09 92.54",
      "EOF",
    ].join("\n");
    const inst = parseTsplib(text);
    expect(inst.issues).toEqual([]);
    expect(tsplibEdge(inst, 0, 0)).toBe(0);
    expect(tsplibEdge(inst, 0, 1)).toBe(1);
    const d13 = tsplibEdge(inst, 0, 2);
    expect(tsplibEdge(inst, 1, 2)).toBe(d13);
    expect(tsplibTourLength(inst, [1, 2, 3])).toBe(1 + 2 * d13);
    const problem = tsplibToProblem(inst);
    expect(problem.matrix.distanceKm[0 * 3 + 1]).toBe(1);
    expect(problem.matrix.distanceKm[1 * 3 + 1]).toBe(0);
  });
});
