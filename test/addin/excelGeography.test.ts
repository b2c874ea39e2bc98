/**
 * Cell shapes follow the `Excel.LinkedEntityCellValue`, `DoubleCellValue` and
 * `FormattedNumberCellValue` typings of @types/office-js (ExcelApi 1.16). Whether Geography
 * entities carry "Latitude"/"Longitude" properties is unverified (OFFICE-NOTES.md), so
 * the tests pin the behaviour for both answers.
 */
import { describe, expect, it } from "vitest";
import { geographyFromCell } from "../../src/workbook/excel/geographyFromCell.js";

const entity = (properties?: Record<string, unknown>) => ({
  type: "LinkedEntity",
  text: "Bergen",
  id: { entityId: "x" },
  ...(properties ? { properties } : {}),
});

describe("geographyFromCell (valuesAsJson cells)", () => {
  it("reads Double cell values of Latitude and Longitude", () => {
    expect(
      geographyFromCell(entity({ Latitude: { type: "Double", basicValue: 60.39 }, Longitude: { type: "Double", basicValue: 5.32 } })),
    ).toEqual({ kind: "place", label: "Bergen", at: { lat: 60.39, lon: 5.32 } });
  });

  it("reads FormattedNumber values, plain numbers, numeric text, and lower-case names", () => {
    expect(
      geographyFromCell(entity({ latitude: { type: "FormattedNumber", basicValue: -33.87, numberFormat: "0.00" }, lng: "151.21" })),
    ).toEqual({ kind: "place", label: "Bergen", at: { lat: -33.87, lon: 151.21 } });
  });

  it("says an entity without coordinates has none, instead of guessing", () => {
    expect(geographyFromCell(entity())).toEqual({ kind: "entityWithoutCoordinates", label: "Bergen" });
    expect(geographyFromCell(entity({ Latitude: { type: "String", basicValue: "north" }, Longitude: 5 }))).toEqual({
      kind: "entityWithoutCoordinates",
      label: "Bergen",
    });
    expect(geographyFromCell(entity({ Latitude: 123, Longitude: 5 }))).toEqual({ kind: "entityWithoutCoordinates", label: "Bergen" });
  });

  it("treats strings, numbers, errors and empty cells as not an entity", () => {
    for (const cell of [
      { type: "String", basicValue: "Oslo" },
      { type: "Double", basicValue: 3 },
      { type: "Error", errorType: "NotAvailable" },
      { type: "Empty" },
      null,
      "Oslo",
      4,
    ]) {
      expect(geographyFromCell(cell)).toEqual({ kind: "notEntity" });
    }
  });
});
