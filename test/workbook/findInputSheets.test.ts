import { describe, expect, it } from "vitest";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { findInputSheets } from "../../src/workbook/findInputSheets.js";

describe("findInputSheets", () => {
  it("takes the sheets named Stops, Fleet and Settings, ignoring case", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "notes", values: [["Latitude", "Longitude"]] },
      { name: "STOPS", values: [["x"]] },
      { name: "fleet", values: [["x"]] },
      { name: "Settings", values: [["x"]] },
    ]);
    expect(await findInputSheets(book)).toEqual({ stops: "STOPS", fleet: "fleet", settings: "Settings" });
  });

  it("otherwise takes the first sheets whose headers look like stops and like a fleet", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "Read me", values: [["Hello"]] },
      { name: "Vans", values: [["Vehicle", "Capacity kg", "Start latitude", "Start longitude"]] },
      { name: "Tuesday", values: [["Stop", "Name", "Lat", "Lon"]] },
      { name: "Wednesday", values: [["Stop", "Name", "Latitude", "Longitude"]] },
    ]);
    expect(await findInputSheets(book)).toEqual({ stops: "Tuesday", fleet: "Vans" });
  });

  it("returns nothing for a workbook without input tables", async () => {
    expect(await findInputSheets(ExcelJsWorkbook.fromGrids([{ name: "A", values: [["x"]] }]))).toEqual({});
  });
});
