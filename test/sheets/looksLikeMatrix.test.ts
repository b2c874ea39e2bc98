// Which sheets the pane's Distances picker offers: tables that parseMatrixSheet reads as a square
// km matrix headed by location ids (layout as documented in parseMatrixSheet.ts). Invented grids.
import { describe, expect, it } from "vitest";
import { looksLikeMatrixSheet } from "../../src/sheets/parseMatrixSheet.js";

const at = (values: unknown[][]) => ({ sheet: "S", row: 0, col: 0, values });

describe("looksLikeMatrixSheet", () => {
  it("offers a square table of km headed by ids, in any row order, below blank rows", () => {
    expect(
      looksLikeMatrixSheet(
        at([
          ["km", "D", "a"],
          ["D", 0, 5],
          ["a", 6, 0],
        ]),
      ),
    ).toBe(true);
    expect(looksLikeMatrixSheet(at([[], ["", "D", "a", "b"], ["b", 2, 3, 0], ["D", 0, 5, 2], ["a", 6, 0, 1]]))).toBe(true);
  });

  it("does not offer a stops table, a one-location table, a table with text or a missing row", () => {
    expect(
      looksLikeMatrixSheet(
        at([
          ["Stop", "Name", "Latitude", "Longitude"],
          ["S1", "Shop", 53.9, -1.1],
        ]),
      ),
    ).toBe(false);
    expect(
      looksLikeMatrixSheet(
        at([
          ["km", "D"],
          ["D", 0],
        ]),
      ),
    ).toBe(false);
    expect(
      looksLikeMatrixSheet(
        at([
          ["km", "D", "a"],
          ["D", 0, "far"],
          ["a", 6, 0],
        ]),
      ),
    ).toBe(false);
    expect(
      looksLikeMatrixSheet(
        at([
          ["km", "D", "a"],
          ["D", 0, 5],
        ]),
      ),
    ).toBe(false);
    expect(looksLikeMatrixSheet(at([]))).toBe(false);
  });
});
