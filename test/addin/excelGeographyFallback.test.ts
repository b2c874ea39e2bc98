/**
 * The Geography read's fallbacks (office-addin-mock fake host). Range.valuesAsJson is
 * ExcelApi 1.16 in Microsoft's Office.js reference, yet office.js builds exist whose Range
 * proxy lacks the member while the host answers isSetSupported("ExcelApi", "1.16") = true:
 * the adapter must check the member too and fall back to the plain values.
 */
import { afterEach, describe, expect, it } from "vitest";
import { placeColumns } from "../../src/sheets/placeColumns.js";
import { GEOGRAPHY_ROWS_PER_READ } from "../../src/workbook/excel/readGeographyIn.js";
import { host, install, uninstall } from "./officeMockHost.js";

afterEach(uninstall);

const oslo = {
  type: "LinkedEntity",
  text: "Oslo",
  properties: { Latitude: { type: "Double", basicValue: 59.91 }, Longitude: { type: "Double", basicValue: 10.75 } },
};

describe("readGeography fallbacks", () => {
  it("a Range proxy without valuesAsJson (ExcelApi 1.16 reported) gives available: false and syncs nothing", async () => {
    const book = install({ excelApi: "1.16", sheets: { Stops: "empty" }, ranges: { "Stops!C2:C3": { values: [["Oslo"], ["Bergen"]] } } });
    const got = await book.readGeography("Stops!C2:C3");
    expect(got).toEqual({ available: false, reason: expect.stringMatching(/valuesAsJson/) });
    expect(host().syncs()).toBe(0);
  });

  it("a failing sync gives available: false with Office's message instead of throwing", async () => {
    const book = install({ excelApi: "1.16", sheets: { Stops: "empty" }, ranges: { "Stops!C2:C3": { valuesAsJson: [[oslo], [oslo]] } } });
    host().failSync(1, { code: "GeneralException", message: "An internal error has occurred." });
    const got = await book.readGeography("Stops!C2:C3");
    expect(got).toEqual({ available: false, reason: expect.stringMatching(/An internal error has occurred\. \(GeneralException\)/) });
  });

  it("reads a long column in row blocks, one sync each, and keeps rows in order", async () => {
    const rows = 2 * GEOGRAPHY_ROWS_PER_READ + 50;
    const ranges: Record<string, Record<string, unknown>> = {};
    for (let r = 0; r < rows; r += GEOGRAPHY_ROWS_PER_READ) {
      const n = Math.min(GEOGRAPHY_ROWS_PER_READ, rows - r);
      ranges[`Stops!C${r + 1}:C${r + n}`] = {
        valuesAsJson: Array.from({ length: n }, (_, i) => [r + i === rows - 1 ? oslo : { type: "String", basicValue: `x${r + i}` }]),
      };
    }
    const book = install({ excelApi: "1.16", sheets: { Stops: "empty" }, ranges });
    const got = await book.readGeography(`Stops!C1:C${rows}`);
    expect(host().syncs()).toBe(3);
    if (!got.available) throw new Error(got.reason);
    expect(got.cells.length).toBe(rows);
    expect(got.cells[rows - 1]).toEqual([{ kind: "place", label: "Oslo", at: { lat: 59.91, lon: 10.75 } }]);
    expect(got.cells[0]).toEqual([{ kind: "notEntity" }]);
  });
});

describe("placeColumns (which columns are read as linked entities)", () => {
  it("takes the address column when the header names one", () => {
    const read = {
      sheet: "Stops",
      row: 0,
      col: 0,
      values: [
        ["Stop", "Name", "Address", "Demand"],
        ["S1", "Mill", "Oslo", 4],
      ],
    };
    expect(placeColumns(read)).toEqual([2]);
  });

  it("otherwise every all-text column except the id, never numbers or coordinates", () => {
    const read = {
      sheet: "Stops",
      row: 0,
      col: 0,
      values: [
        ["Stop", "Town", "Demand", "Latitude"],
        ["S1", "Oslo", 4, 59.9],
        ["S2", "Bergen", "5", 60.4],
      ],
    };
    expect(placeColumns(read)).toEqual([1]);
  });
});
