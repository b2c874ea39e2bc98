/**
 * Print setup of a grid, in files (exceljs) and through the pure format-code helpers.
 * Format codes: Microsoft, "Formatting and VBA codes for headers and footers" (&L, &C, &R
 * sections, &P page, &N pages, && a literal ampersand). Row breaks: ECMA-376 Part 1,
 * 18.3.1.3 brk (zero-based id, the break lies above that row). Paper codes: ECMA-376 Part 1,
 * 18.3.1.63 pageSetup (9 = A4, 1 = Letter).
 */
import { describe, expect, it } from "vitest";
import ExcelJS from "exceljs";
import { checkPrintSetup, headerFooterCode, headerFooterSections } from "../../src/sheets/printSetup.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import type { SheetGrid } from "../../src/sheets/grid.js";
import { zipEntryNames } from "../../src/workbook/exceljs/zipEntryNames.js";
import { zipEntryText } from "./zipEntryText.js";

const grid: SheetGrid = {
  values: Array.from({ length: 30 }, (_, r) => [`Row ${r + 1}`, r]),
  print: {
    orientation: "landscape",
    paperSize: "A4",
    fitToWidth: true,
    printTitleRows: { first: 0, last: 2 },
    rowBreaks: [10, 20],
    header: { center: "Depot & yard" },
    footer: { left: "Plan 1", pageNumbers: true },
  },
};

describe("header and footer format codes", () => {
  it("doubles a literal ampersand and puts page n of m at the right", () => {
    expect(headerFooterSections({ center: "R&D", pageNumbers: true })).toEqual({ left: "", center: "R&&D", right: "Page &P of &N" });
    expect(headerFooterCode({ left: "A&B", right: "x" })).toBe("&LA&&B&Rx");
    expect(headerFooterCode({})).toBe("");
  });

  it("refuses title rows or breaks outside the grid", () => {
    expect(() => checkPrintSetup({ printTitleRows: { first: 2, last: 1 } }, 10)).toThrow(/printTitleRows/);
    expect(() => checkPrintSetup({ rowBreaks: [10] }, 10)).toThrow(/rowBreaks/);
    expect(() => checkPrintSetup({ rowBreaks: [0] }, 10)).toThrow(/rowBreaks/);
    expect(() => checkPrintSetup(grid.print!, 30)).not.toThrow();
  });
});

describe("print setup in a file (exceljs)", () => {
  it("writes orientation, paper, fit to one page wide, title rows, header, footer and row breaks", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(await new ExcelJS.Workbook().xlsx.writeBuffer());
    await book.addSheet("Plan 1", grid);
    const bytes = new Uint8Array(await book.toBuffer());
    const back = new ExcelJS.Workbook();
    await back.xlsx.load(bytes as unknown as ArrayBuffer);
    const ws = back.getWorksheet("Plan 1")!;
    expect(ws.pageSetup).toMatchObject({ orientation: "landscape", paperSize: 9, fitToPage: true, fitToWidth: 1, fitToHeight: 0 });
    expect(ws.pageSetup.printTitlesRow).toBe("1:3");
    expect(ws.headerFooter).toMatchObject({ oddHeader: "&CDepot && yard", oddFooter: "&LPlan 1&RPage &P of &N" });
    const names = zipEntryNames(bytes);
    const sheetXml = names
      .filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n))
      .map((n) => zipEntryText(bytes, n) ?? "")
      .find((x) => x.includes("Row 30") || x.includes("rowBreaks"));
    // Breaks above 0-based rows 10 and 20: <brk id="10">, <brk id="20"> (ECMA-376 18.3.1.3).
    const ids = [...(sheetXml ?? "").matchAll(/<brk id="(\d+)"/g)].map((m) => Number(m[1]));
    expect(ids).toEqual([10, 20]);
  });

  it("refuses a break outside the grid before adding the sheet", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(await new ExcelJS.Workbook().xlsx.writeBuffer());
    await expect(book.addSheet("Bad", { values: [["a"]], print: { rowBreaks: [5] } })).rejects.toThrow(RangeError);
    expect(await book.listSheets()).not.toContain("Bad");
  });
});
