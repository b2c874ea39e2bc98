/**
 * Error objects shaped like `OfficeExtension.Error` (typings of @types/office-js: `code`,
 * `message`, `debugInfo` with `errorLocation`; codes from `Excel.ErrorCodes`, e.g.
 * "ItemNotFound", "InvalidArgument").
 */
import { describe, expect, it } from "vitest";
import { OfficeActionError, isItemNotFound } from "../../src/workbook/excel/OfficeActionError.js";

describe("OfficeActionError", () => {
  it("says what failed, Office's message and code, and keeps debugInfo and the cause for logs", () => {
    const cause = Object.assign(new Error("The requested resource doesn't exist."), {
      code: "ItemNotFound",
      debugInfo: { errorLocation: "WorksheetCollection.getItem" },
    });
    const e = new OfficeActionError('read the sheet "Stops"', cause);
    expect(e.message).toBe('Could not read the sheet "Stops": The requested resource doesn\'t exist. (ItemNotFound)');
    expect(e.code).toBe("ItemNotFound");
    expect(e.debugInfo).toEqual({ errorLocation: "WorksheetCollection.getItem" });
    expect(e.cause).toBe(cause);
    expect(e).toBeInstanceOf(Error);
  });

  it("copes with things thrown that are not errors", () => {
    expect(new OfficeActionError("list the sheets", "offline").message).toBe("Could not list the sheets: offline");
    expect(new OfficeActionError("list the sheets", undefined).code).toBeUndefined();
  });

  it("isItemNotFound recognises only Office's ItemNotFound code", () => {
    expect(isItemNotFound({ code: "ItemNotFound" })).toBe(true);
    expect(isItemNotFound({ code: "InvalidArgument" })).toBe(false);
    expect(isItemNotFound(null)).toBe(false);
  });
});
