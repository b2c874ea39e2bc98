import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { cellPayloadBytes, isFormulaLike, planGridWrite } from "../../src/workbook/excel/planGridWrite.js";
import { columnWidthPoints } from "../../src/workbook/excel/columnWidthPoints.js";
import type { CellValue } from "../../src/sheets/grid.js";

describe("planGridWrite: what the Office.js adapter assigns", () => {
  it("keeps every text cell as text by the format '@' alone and sends the text unchanged (OFFICE-NOTES.md: no apostrophe)", () => {
    const plan = planGridWrite({ values: [['=HYPERLINK("x")', "+44 20", "-3", "@SUM(A1)", "\tTab", "Mill", "", 7, true, null]] });
    const chunk = plan.chunks[0]!;
    expect(chunk.values[0]).toEqual(['=HYPERLINK("x")', "+44 20", "-3", "@SUM(A1)", "\tTab", "Mill", "", 7, true, ""]);
    expect(chunk.numberFormats[0]).toEqual(["@", "@", "@", "@", "@", "@", "General", "General", "General", "General"]);
    expect(plan.checkCells.map((c) => c.col)).toEqual([0, 1, 2, 3, 4]);
  });

  it("a place name that starts with an apostrophe is sent as is, formatted '@' and listed for the read-back", () => {
    const plan = planGridWrite({ values: [["'s-Hertogenbosch"]], numberFormats: [[null]] }, { startRow: 3 });
    expect(plan.chunks[0]!.values).toEqual([["'s-Hertogenbosch"]]);
    expect(plan.chunks[0]!.numberFormats).toEqual([["@"]]);
    expect(plan.checkCells).toEqual([{ row: 3, col: 0, text: "'s-Hertogenbosch" }]);
    expect(isFormulaLike("'=SUM(A1)")).toBe(false);
  });

  it("uses the layout's number formats for numbers and overrides them for formula-like text", () => {
    const plan = planGridWrite({ values: [[0.354, "=1"]], numberFormats: [["hh:mm", "0.0"]] });
    expect(plan.chunks[0]!.numberFormats).toEqual([["hh:mm", "@"]]);
  });

  it("writes one block of exactly the grid's size below the threshold, at the start row", () => {
    const plan = planGridWrite(
      {
        values: [
          ["a", 1],
          ["b", 2],
        ],
        boldRows: [0],
        freezeRows: 1,
        columnWidths: [10],
      },
      { startRow: 4 },
    );
    expect(plan.chunks.map((c) => c.address)).toEqual(["A5:B6"]);
    expect(plan.boldRanges).toEqual(["A5:B5"]);
    expect(plan.freezeRows).toBe(1);
    expect(plan.columnWidths).toEqual([{ address: "A:A", widthPt: 56.25 }]);
  });

  it("splits into row chunks that cover every row once, in order, each within the byte budget unless one row alone exceeds it (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 3000 }),
        fc.string({ maxLength: 40 }),
        (rows, cols, budget, text) => {
          const values: CellValue[][] = Array.from({ length: rows }, (_, r) =>
            Array.from({ length: cols }, (_, c) => (c % 2 === 0 ? `${text}${r}` : r * 100 + c)),
          );
          const plan = planGridWrite({ values }, { budgetBytes: budget });
          expect(plan.chunks.flatMap((c) => c.values)).toEqual(values.map((r) => r.map((v) => v)));
          let next = 0;
          for (const chunk of plan.chunks) {
            expect(chunk.row).toBe(next);
            next += chunk.values.length;
            expect(chunk.numberFormats.length).toBe(chunk.values.length);
            const bytes = chunk.values.flatMap((row, r) => row.map((v, c) => cellPayloadBytes(v, chunk.numberFormats[r]![c]!)));
            const total = bytes.reduce((a, b) => a + b, 0);
            if (chunk.values.length > 1) expect(total).toBeLessThanOrEqual(budget);
          }
          expect(next).toBe(rows);
        },
      ),
    );
  });

  it("estimates a cell's bytes as its JSON in UTF-8 (RFC 8259 strings; 'ø' is 2 bytes, '€' 3, an emoji 4)", () => {
    expect(cellPayloadBytes("Mill", "@")).toBe(6 + 3 + 2);
    expect(cellPayloadBytes("ø€", "@")).toBe(2 + 2 + 3 + 3 + 2);
    expect(cellPayloadBytes("\u{1F69A}", "@")).toBe(2 + 4 + 3 + 2);
    expect(cellPayloadBytes(12.5, "0.0")).toBe(4 + 5 + 2);
  });

  it("rejects ragged rows, mismatched formats and non-finite numbers, naming the argument", () => {
    expect(() => planGridWrite({ values: [[1, 2], [3]] })).toThrow(/grid\.values\[1\]/);
    expect(() => planGridWrite({ values: [[1, 2]], numberFormats: [["0"]] })).toThrow(/grid\.numberFormats\[0\]/);
    expect(() => planGridWrite({ values: [[Number.NaN]] })).toThrow(RangeError);
    expect(() => planGridWrite({ values: [[1]] }, { budgetBytes: 0 })).toThrow(/budgetBytes/);
  });

  it("writes nothing for an empty grid", () => {
    expect(planGridWrite({ values: [] }).chunks).toEqual([]);
  });
});

describe("columnWidthPoints (ECMA-376 column width in characters of a 7 px digit plus 5 px padding; 0.75 pt per px)", () => {
  it("gives Excel's default column, 8.43 characters, as 64 px = 48 pt (Excel default width, from memory)", () => {
    expect(columnWidthPoints(8.43)).toBe(48);
  });
  it("grows by 7 px = 5.25 pt per character and rejects negatives", () => {
    expect(columnWidthPoints(11) - columnWidthPoints(10)).toBeCloseTo(5.25, 10);
    expect(columnWidthPoints(0)).toBe(0);
    expect(() => columnWidthPoints(-1)).toThrow(RangeError);
  });
});
