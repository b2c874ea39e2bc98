import { readFile } from "node:fs/promises";
import { describe, expect, it } from "vitest";
import { buildSmokeWorkbook, GEOGRAPHY_TOWNS, LARGE_DAY_STOPS, TRICKY_NAMES } from "../../demo/buildSmoke.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";

const committed = new URL("../../demo/kiln-smoke.xlsx", import.meta.url);

describe("smoke-test workbook (docs/excel-smoke-test.md)", () => {
  it("rebuilds byte for byte equal to the committed demo/kiln-smoke.xlsx", async () => {
    const built = await buildSmokeWorkbook();
    expect(Buffer.from(built).equals(Buffer.from(new Uint8Array(await readFile(committed))))).toBe(true);
  });

  it("holds the sheets the steps name, the tricky names exactly as text, 2 000 distinct stops with long notes, towns without coordinates", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(new Uint8Array(await readFile(committed)));
    expect(await book.listSheets()).toEqual(["Stops", "Fleet", "Settings", "Stops 2000", "Fleet 2000", "Towns", "README"]);
    const stops = (await book.readSheet("Stops"))!;
    const nameCol = stops.values[0]!.indexOf("Name");
    // ECMA-376 §18.3.1.4: a shared-string cell is text, never a formula; read back exactly.
    expect(stops.values.slice(1, 1 + TRICKY_NAMES.length).map((r) => r[nameCol])).toEqual([...TRICKY_NAMES]);
    const large = (await book.readSheet("Stops 2000"))!;
    expect(large.values.length - 1).toBe(LARGE_DAY_STOPS);
    expect(new Set(large.values.slice(1).map((r) => r[0])).size).toBe(LARGE_DAY_STOPS);
    const notes = large.values[0]!.indexOf("Notes");
    expect(large.values.slice(1).every((r) => String(r[notes]).length >= 200)).toBe(true);
    const towns = (await book.readSheet("Towns"))!;
    expect(towns.values.slice(1).map((r) => r[2])).toEqual(GEOGRAPHY_TOWNS);
    // The small round reads cleanly, so step 4 checks only the text.
    const read = readProblem({ stops, fleet: (await book.readSheet("Fleet"))! });
    expect(read.ok).toBe(true);
  });
});
