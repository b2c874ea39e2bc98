import { describe, expect, it } from "vitest";
import { detectFormat } from "../../src/core/formats/detectFormat.js";
import { parseTsplib } from "../../src/core/formats/parseTsplib.js";
import { tsplibToProblem } from "../../src/core/formats/tsplibToProblem.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";

// One symmetric 4-node matrix written in the layouts TSPLIB95 defines (Reinelt 1995, section 1.1,
// EDGE_WEIGHT_FORMAT): FULL_MATRIX, UPPER_ROW (row-wise above the diagonal), LOWER_DIAG_ROW
// (row-wise up to and including the diagonal), UPPER_DIAG_COL (column-wise down to the diagonal).
const FULL = [
  [0, 3, 5, 9],
  [3, 0, 4, 7],
  [5, 4, 0, 2],
  [9, 7, 2, 0],
];
const LAYOUTS: Record<string, string> = {
  FULL_MATRIX: FULL.map((r) => r.join(" ")).join("\n"),
  UPPER_ROW: "3 5 9\n4 7\n2",
  LOWER_ROW: "3\n5 4\n9 7 2",
  LOWER_DIAG_ROW: "0\n3 0\n5 4 0\n9 7 2 0",
  UPPER_DIAG_COL: "0 3 0 5 4 0 9 7 2 0",
};

const fileOf = (format: string, body: string): string =>
  `NAME: four\nTYPE: TSP\nDIMENSION: 4\nEDGE_WEIGHT_TYPE: EXPLICIT\nEDGE_WEIGHT_FORMAT: ${format}\nEDGE_WEIGHT_SECTION\n${body}\nEOF\n`;

describe("TSPLIB95 EXPLICIT edge weight formats", () => {
  for (const [format, body] of Object.entries(LAYOUTS)) {
    it(`${format} gives the full symmetric matrix`, () => {
      const inst = parseTsplib(fileOf(format, body));
      expect(inst.issues).toEqual([]);
      expect(Array.from(inst.weights!)).toEqual(FULL.flat());
      expect(tsplibTourLength(inst, [1, 2, 3, 4])).toBe(3 + 4 + 2 + 9);
      expect(detectFormat(fileOf(format, body))).toBe("tsplib");
    });
  }

  it("the problem's matrix holds the same integers as km and minutes, one vehicle from node 1", () => {
    const p = tsplibToProblem(parseTsplib(fileOf("UPPER_ROW", LAYOUTS["UPPER_ROW"]!)));
    expect(Array.from(p.matrix.distanceKm)).toEqual(FULL.flat());
    expect(Array.from(p.matrix.travelMin)).toEqual(FULL.flat());
    expect(p.matrix.userSupplied).toBe(true);
    expect(p.vehicles).toHaveLength(1);
    expect(p.stops.map((s) => s.id)).toEqual(["2", "3", "4"]);
  });

  it("a wrong count of numbers or an asymmetric full matrix is an issue, not an exception", () => {
    expect(parseTsplib(fileOf("UPPER_ROW", "3 5 9\n4 7")).issues[0]!.message).toContain("needs 6 numbers, found 5");
    expect(parseTsplib(fileOf("FULL_MATRIX", "0 1 2 3\n9 0 1 1\n2 1 0 1\n3 1 1 0")).issues[0]!.message).toContain("not symmetric");
    expect(
      parseTsplib("NAME: a\nTYPE: ATSP\nDIMENSION: 2\nEDGE_WEIGHT_TYPE: EUC_2D\nNODE_COORD_SECTION\n1 0 0\n2 1 1\nEOF").issues[0]!.message,
    ).toContain("TYPE ATSP is not supported");
  });
});
