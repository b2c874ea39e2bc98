/**
 * Print setup through the Office.js adapter (office-addin-mock fake host). API shapes from
 * Microsoft's Office.js reference: `Worksheet.pageLayout` (PageLayout: orientation, paperSize,
 * zoom as PageLayoutZoomOptions, setPrintTitleRows, headersFooters.defaultForAllPages) and
 * `Worksheet.horizontalPageBreaks.add(range)`, all ExcelApi 1.9.
 */
import { afterEach, describe, expect, it } from "vitest";
import type { SheetGrid } from "../../src/sheets/grid.js";
import { entries, host, install, uninstall } from "./officeMockHost.js";

afterEach(uninstall);

const grid: SheetGrid = {
  values: Array.from({ length: 25 }, (_, r) => [`Row ${r + 1}`, r]),
  print: {
    orientation: "landscape",
    paperSize: "Letter",
    fitToWidth: true,
    printTitleRows: { first: 0, last: 1 },
    rowBreaks: [12],
    footer: { center: "Vans & trucks", pageNumbers: true },
  },
};

describe("print setup (ExcelApi 1.9)", () => {
  it("sets orientation, paper, title rows, footer, page breaks and then fit to one page wide, after the sheet's own sync", async () => {
    const book = install({ excelApi: "1.9" });
    await book.addSheet("Plan 1", grid);
    const kinds = host().log.map((e) => e[0]);
    const firstPrint = kinds.indexOf("orientation");
    expect(kinds.lastIndexOf("values")).toBeLessThan(kinds.indexOf("sync", kinds.indexOf("add")));
    expect(kinds.slice(kinds.indexOf("sync", kinds.indexOf("add")) + 1)).toContain("orientation");
    expect(entries("orientation")).toEqual([["orientation", "Plan 1", "Landscape"]]);
    expect(entries("paperSize")).toEqual([["paperSize", "Plan 1", "Letter"]]);
    expect(entries("printTitleRows")).toEqual([["printTitleRows", "Plan 1", "$1:$2"]]);
    expect(entries("centerFooter")).toEqual([["centerFooter", "Plan 1", "Vans && trucks"]]);
    expect(entries("rightFooter")).toEqual([["rightFooter", "Plan 1", "Page &P of &N"]]);
    expect(entries("pageBreak")).toEqual([["pageBreak", "Plan 1", "A13"]]);
    expect(entries("zoom")).toEqual([["zoom", "Plan 1", { horizontalFitToPages: 1, verticalFitToPages: 0 }]]);
    expect(kinds.indexOf("zoom")).toBeGreaterThan(firstPrint);
    expect(kinds[kinds.length - 1]).toBe("sync");
    expect(host().notices).toEqual([]);
  });

  it("below ExcelApi 1.9 writes the sheet, sets no print setting and says so", async () => {
    const book = install({ excelApi: "1.7" });
    await book.addSheet("Plan 1", grid);
    expect(entries("values").length).toBe(1);
    expect(entries("orientation")).toEqual([]);
    expect(entries("pageBreak")).toEqual([]);
    expect(host().notices.join(" ")).toMatch(/Print settings of "Plan 1".*ExcelApi 1\.9/);
  });

  it("a host that refuses a print setting keeps the written sheet and tells what to check", async () => {
    const book = install({ excelApi: "1.9" });
    host().failSync(3, { code: "InvalidArgument", message: "The argument is invalid." }); // name check, write, print
    await book.addSheet("Plan 1", grid);
    expect(entries("delete")).toEqual([]);
    expect(host().notices.join(" ")).toMatch(
      /Print settings of "Plan 1".*not all set\. Could not set them: The argument is invalid\. \(InvalidArgument\).*Page Layout/,
    );
  });
});
