/**
 * Finding the tables of a dispatcher's own workbook from the command line: a title row and a row
 * of merged group headers above the header, sheets not named Stops or Fleet, and a clear message
 * listing every sheet when none fits.
 */
import { mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { DISPATCHER_STOPS, dispatcherWorkbook } from "../fixtures/dispatcherWorkbook.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";

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

/** The route table of a written plan sheet: header and rows, by header name. */
function routeRows(plan: unknown[][]): Record<string, unknown>[] {
  const h = plan.findIndex((r) => r[0] === "Vehicle" && r[1] === "Seq");
  const header = plan[h]!.map(String);
  const rows: Record<string, unknown>[] = [];
  for (const r of plan.slice(h + 1)) {
    if (!r || r[0] === undefined || r[0] === null || r[0] === "") break;
    rows.push(Object.fromEntries(header.map((k, i) => [k, r[i]])));
  }
  return rows;
}

describe("kiln plan reads a dispatcher's column words", () => {
  it('every service time in the plan equals the sheet\'s "Drop time" (Departure - Start of each stop row)', async () => {
    const { dir, path } = await saved(await dispatcherWorkbook());
    const out = join(dir, "out.xlsx");
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "3000", "--out", out], cap.io), cap.err()).toBe(0);
    expect(cap.err()).not.toMatch(/is not used/);
    const rows = routeRows(sheetValues(await loadWithExcelJs(await readFile(out)), "Plan")).filter((r) => /^K\d+$/.test(String(r.Stop)));
    expect(rows).toHaveLength(DISPATCHER_STOPS.length);
    for (const r of rows) {
      const drop = DISPATCHER_STOPS.find((s) => s.ref === r.Stop)!.dropMin;
      // Start and Departure are time-formatted cells that exceljs reads as dates (sheetValues gives their ms).
      expect(Math.round(((r.Departure as number) - (r.Start as number)) / 60000), String(r.Stop)).toBe(drop);
    }
  });

  it("warns about a column it does not use that looks like service minutes, naming the cell and the field", async () => {
    const { dir, path } = await saved(await dispatcherWorkbook({ dropHeader: "Handover (mins)" }));
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "2000", "--out", join(dir, "out.xlsx")], cap.io), cap.err()).toBe(0);
    expect(cap.err()).toContain(
      'warning: Thursday round!F4: column "Handover (mins)" is not used; if it holds service minutes, map it to Service min.',
    );
  });
});

describe("kiln plan --map and the Settings sheet's column mapping", () => {
  /** The settings block of the plan sheet: the label row and the value row below it. */
  const settingsBlock = (plan: unknown[][]): Record<string, unknown> => {
    const labels = plan[2]!.map(String);
    return Object.fromEntries(labels.map((l, i) => [l, plan[3]![i]]));
  };
  const serviceMinutes = (plan: unknown[][]) =>
    routeRows(plan)
      .filter((r) => /^K\d+$/.test(String(r.Stop)))
      .map((r) => [r.Stop, Math.round(((r.Departure as number) - (r.Start as number)) / 60000)]);
  const expected = DISPATCHER_STOPS.map((s) => [s.ref, s.dropMin] as const);

  it('maps a column the reader does not know with --map "Handover (mins)=service", and the plan sheet records it', async () => {
    const { dir, path } = await saved(await dispatcherWorkbook({ dropHeader: "Handover (mins)" }));
    const out = join(dir, "out.xlsx");
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "3000", "--map", "Handover (mins)=service", "--out", out], cap.io), cap.err()).toBe(0);
    expect(cap.err()).not.toMatch(/is not used/);
    const plan = sheetValues(await loadWithExcelJs(await readFile(out)), "Plan");
    expect(serviceMinutes(plan).sort()).toEqual([...expected].map((e) => [...e]).sort());
    expect(settingsBlock(plan)["Columns mapped"]).toBe("Handover (mins)=Service min");
  });

  it("takes the mapping from a Map column row of the Settings sheet, and --map wins over it", async () => {
    const settings = [["Map column", "Handover (mins)=Service min"]] as const;
    const { dir, path } = await saved(await dispatcherWorkbook({ dropHeader: "Handover (mins)", settings }));
    const out = join(dir, "out.xlsx");
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "3000", "--out", out], cap.io), cap.err()).toBe(0);
    const plan = sheetValues(await loadWithExcelJs(await readFile(out)), "Plan");
    expect(serviceMinutes(plan).sort()).toEqual([...expected].map((e) => [...e]).sort());
    const out2 = join(dir, "out2.xlsx");
    const cap2 = captureIO();
    expect(await main(["plan", path, "--moves", "3000", "--map", "handover (mins)=ignore", "--out", out2], cap2.io), cap2.err()).toBe(0);
    const plan2 = sheetValues(await loadWithExcelJs(await readFile(out2)), "Plan");
    expect(settingsBlock(plan2)["Columns mapped"]).toBe("handover (mins)=ignore");
    // Ignored: every stop gets the default service minutes (PLAN_SETTINGS_DEFAULTS.serviceMin, 5).
    expect(new Set(serviceMinutes(plan2).map((r) => r[1]))).toEqual(new Set([5]));
    expect(cap2.err()).not.toMatch(/is not used/);
  });

  it("refuses a mapping whose header is in neither table or whose field is unknown, saying how to fix it (exit 2, nothing written)", async () => {
    const { dir, path } = await saved(await dispatcherWorkbook());
    const cap = captureIO();
    expect(await main(["plan", path, "--moves", "1000", "--map", "Drop tmie=service", "--out", join(dir, "o.xlsx")], cap.io)).toBe(2);
    expect(cap.err()).toContain(
      '--map "Drop tmie=service": no column headed "Drop tmie" in the stops table (Thursday round) or the fleet table (Vans)',
    );
    const bad = captureIO();
    expect(await main(["plan", path, "--moves", "1000", "--map", "Drop time=sevrice", "--out", join(dir, "o.xlsx")], bad.io)).toBe(2);
    expect(bad.err()).toContain(
      '--map "Drop time=sevrice": "sevrice" is not a field (mapping the column "Drop time"); use one of the stops fields Stop, Name',
    );
    const shape = captureIO();
    expect(await main(["plan", path, "--map", "Drop time", "--out", join(dir, "o.xlsx")], shape.io)).toBe(2);
    expect(shape.err()).toContain('is not a column mapping; write the column\'s header, "=" and the field, such as "Drop time=service".');
  });
});
