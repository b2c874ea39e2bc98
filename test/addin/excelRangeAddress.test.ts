import { describe, expect, it } from "vitest";
import ExcelJS from "exceljs";
import fc from "fast-check";
import { blockA1, blockContains, cellA1, parseRangeAddress } from "../../src/workbook/excel/rangeAddress.js";

describe("A1 addresses of the Office.js adapter", () => {
  it("match exceljs (reference library) for the column letters up to XFD and sample rows", () => {
    const sheet = new ExcelJS.Workbook().addWorksheet("ref");
    for (let col = 1; col <= 16_384; col += col < 800 ? 1 : 37) {
      expect(cellA1(0, col - 1)).toBe(`${sheet.getColumn(col).letter}1`);
    }
    for (const row of [1, 2, 99, 100, 1_048_576]) expect(cellA1(row - 1, 2)).toBe(sheet.getCell(row, 3).address);
  });

  it("ends at XFD1048576, Excel's last cell (Excel specifications and limits, from memory)", () => {
    expect(cellA1(1_048_575, 16_383)).toBe("XFD1048576");
    expect(() => cellA1(1_048_576, 0)).toThrow(RangeError);
    expect(() => cellA1(0, 16_384)).toThrow(RangeError);
  });

  it("writes a block as start:end and a single cell alone", () => {
    expect(blockA1({ row: 0, col: 0, rows: 80, cols: 16 })).toBe("A1:P80");
    expect(blockA1({ row: 3, col: 2, rows: 1, cols: 1 })).toBe("C4");
    expect(() => blockA1({ row: 0, col: 0, rows: 0, cols: 3 })).toThrow(RangeError);
    expect(() => cellA1(-1, 0)).toThrow(RangeError);
  });

  it("parses sheet-qualified addresses, unquoting Excel's quoted names ('' is one apostrophe)", () => {
    expect(parseRangeAddress("Stops!A1:J81")).toEqual({ sheet: "Stops", range: "A1:J81" });
    expect(parseRangeAddress("'Run 1 (late)'!$B$3")).toEqual({ sheet: "Run 1 (late)", range: "B3" });
    expect(parseRangeAddress("'Bob''s van'!a1:b2")).toEqual({ sheet: "Bob's van", range: "A1:B2" });
    for (const bad of ["A1:B2", "Stops!", "Stops!A", "Stops!A1:", "!A1", "'Open!A1"]) expect(parseRangeAddress(bad), bad).toBeUndefined();
  });

  it("round-trips every block through blockA1 and parseRangeAddress (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 100_000 }),
        fc.integer({ min: 0, max: 16_000 }),
        fc.integer({ min: 1, max: 300 }),
        fc.integer({ min: 1, max: 300 }),
        (row, col, rows, cols) => {
          const address = blockA1({ row, col, rows, cols });
          expect(parseRangeAddress(`Plan!${address}`)).toEqual({ sheet: "Plan", range: address });
        },
      ),
    );
  });

  it("blockContains is true only for blocks wholly inside", () => {
    const table = { row: 0, col: 0, rows: 10, cols: 5 };
    expect(blockContains(table, { row: 9, col: 4, rows: 1, cols: 1 })).toBe(true);
    expect(blockContains(table, { row: 9, col: 4, rows: 2, cols: 1 })).toBe(false);
    expect(blockContains(table, table)).toBe(true);
  });
});
