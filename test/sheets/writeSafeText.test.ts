import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { layoutCompareRow } from "../../src/sheets/layoutCompare.js";
import { layoutPlan } from "../../src/sheets/layoutPlan.js";
import { needsTextPrefix, safeText } from "../../src/sheets/safeText.js";
import { plan, problem, run, stopRows, extraHeaders } from "../fixtures/writerPlan.js";

// Characters that start a formula in Excel and in spreadsheets reading CSV:
// = + - @ and also tab and carriage return (OWASP, "CSV Injection").
const FORMULA_START = /^[=+\-@\t\r]/;

describe("safeText: user text cannot become a formula", () => {
  it.each(["=SUM(A1)", "+1", "-x", "@cmd", "\t=1", "\r=1"])("%j gets Excel's text prefix '", (text) => {
    expect(safeText(text)).toBe("'" + text);
    expect(FORMULA_START.test(safeText(text))).toBe(false);
  });

  it("leaves ordinary text alone", () => {
    for (const text of ["Bakery", "3-4", "", " =x", "'quoted", "Ünal's Deli"]) expect(safeText(text)).toBe(text);
  });

  it("for any text: the result never starts a formula and ends with the original (property)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 20 }), (text) => {
        const out = safeText(text);
        expect(FORMULA_START.test(out)).toBe(false);
        expect(out.endsWith(text)).toBe(true);
        expect(out === text).toBe(!needsTextPrefix(text));
      }),
      { numRuns: 500, seed: 7 },
    );
  });

  it("throws TypeError on a non-string", () => {
    expect(() => safeText(-1 as never)).toThrow(TypeError);
  });
});

describe("layouts write formula-like text as text", () => {
  const grids = [layoutPlan({ problem, plan, run, stopRows, extraHeaders }).grid, layoutCompareRow(run, plan)];

  it('stop names "=SUM(A1)", "+1", "-x", "@cmd" come out prefixed and formatted @', () => {
    const grid = grids[0]!;
    for (const name of ["=SUM(A1)", "+1", "-x", "@cmd"]) {
      const r = grid.values.findIndex((row) => row[3] === "'" + name);
      expect(r, name).toBeGreaterThan(0);
      expect(grid.numberFormats![r]![3]).toBe("@");
    }
  });

  it("no string cell of any layout starts a formula, and every prefixed cell is marked @", () => {
    for (const grid of grids) {
      grid.values.forEach((row, r) =>
        row.forEach((v, c) => {
          if (typeof v !== "string") return;
          expect(FORMULA_START.test(v), `${r},${c}: ${v}`).toBe(false);
          if (v.startsWith("'")) expect(grid.numberFormats![r]![c]).toBe("@");
        }),
      );
    }
  });

  it("negative numbers stay numbers (only text is neutralised)", () => {
    const grid = grids[0]!;
    const numbers = grid.values.flat().filter((v): v is number => typeof v === "number");
    expect(numbers).toContain(-0.0922);
    expect(numbers).toContain(-5);
  });
});
