/**
 * Finding the tables of a dispatcher's own workbook from the command line: a title row and a row
 * of merged group headers above the header, sheets not named Stops or Fleet, and a clear message
 * listing every sheet when none fits.
 */
import { mkdtemp, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { dispatcherWorkbook } from "../fixtures/dispatcherWorkbook.js";
import { captureIO } from "../workbook/harness.js";

async function saved(bytes: Uint8Array, name = "round.xlsx"): Promise<{ dir: string; path: string }> {
  const dir = await mkdtemp(join(tmpdir(), "kiln-tables-"));
  const path = join(dir, name);
  await writeFile(path, bytes);
  return { dir, path };
}

describe("kiln plan finds a dispatcher's tables", () => {
  it("takes the stops under a title row and a merged group-header row, and says which sheets and ranges it read", async () => {
    const { dir, path } = await saved(await dispatcherWorkbook());
    const cap = captureIO();
    const code = await main(["plan", path, "--moves", "3000", "--out", join(dir, "out.xlsx")], cap.io);
    expect(code, cap.err()).toBe(0);
    // Row 1 title, row 2 blank, row 3 the merged groups, row 4 the header, 10 stops below.
    expect(cap.out()).toContain("Read stops from 'Thursday round'!A1:H14 (header on row 4), fleet from Vans!A1:F3.");
  });

  it("lists every sheet and why it was not taken when no stops table is found, and says how to choose one", async () => {
    const book = new ExcelJS.Workbook();
    book.addWorksheet("Notes").addRow(["Remember the Monday order"]);
    book.addWorksheet("Vans").addRow(["Vehicle", "Capacity"]);
    book.addWorksheet("Clients").addRow(["Ref", "Client", "Qty"]);
    const { path } = await saved(new Uint8Array(await book.xlsx.writeBuffer()));
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "1000"], cap.io)).toBe(2);
    expect(cap.err()).toContain(
      'no sheet named "Stops" and no sheet that looks like a stops table; sheets looked at: "Notes" (none of its first 30 rows has two known column names',
    );
    expect(cap.err()).toContain('"Vans" (taken as the fleet)');
    expect(cap.err()).toContain('"Clients" (its header on row 1 (A1) has no Latitude and Longitude, Coordinates or Address column)');
    expect(cap.err()).toContain("name the stops sheet with --stops SHEET.");
    expect(cap.out()).toBe("");
  });
});
