import { mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import type { CliIO } from "../../src/cli/CliIO.js";
import { main } from "../../src/cli/main.js";
import { COMPARE_HEADER, COMPARE_SHEET } from "../../src/sheets/layoutCompare.js";
import { TOTALS_LABELS } from "../../src/sheets/layoutPlan.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";

const runSolve = (args: string[], io: CliIO): Promise<number> => main(["plan", ...args], io);

/**
 * Invented scenario: 12 stops of 100 kg around a depot (1 200 kg) and two 300 kg vans (600 kg),
 * Priority blank (every stop must be served). By hand: at most 6 stops fit, 6 are left out.
 */
async function overDemandWorkbook(): Promise<{ dir: string; path: string }> {
  const book = new ExcelJS.Workbook();
  const stops = book.addWorksheet("Stops");
  stops.addRow(["Stop", "Name", "Latitude", "Longitude", "Demand kg", "Service min"]);
  for (let i = 0; i < 12; i++)
    stops.addRow([`S${i + 1}`, `Shop ${i + 1}`, 53.96 + 0.01 * (i % 4), -1.08 + 0.01 * Math.floor(i / 4), 100, 5]);
  const fleet = book.addWorksheet("Fleet");
  fleet.addRow(["Vehicle", "Capacity kg", "Start latitude", "Start longitude", "Shift start", "Shift end"]);
  fleet.addRow(["Van A", 300, 53.95, -1.09, "06:00", "14:00"]);
  fleet.addRow(["Van B", 300, 53.95, -1.09, "06:00", "14:00"]);
  const dir = await mkdtemp(join(tmpdir(), "kiln-over-"));
  const path = join(dir, "over.xlsx");
  await writeFile(path, new Uint8Array((await book.xlsx.writeBuffer()) as ArrayBuffer));
  return { dir, path };
}

describe("kiln solve with more demand than the fleet carries (issue: a plan never looks better than it is)", () => {
  it("exits 0, keeps every van within capacity, and the terminal, plan totals and Compare row all say 6 must-serve stops were left out", async () => {
    const { dir, path } = await overDemandWorkbook();
    const cap = captureIO();
    const out = join(dir, "out.xlsx");
    expect(await runSolve([path, "--moves", "20000", "--out", out], cap.io)).toBe(0);
    expect(cap.out()).toMatch(/MUST-SERVE STOPS LEFT OUT: 6/);
    expect(cap.out()).toContain("total demand 1 200 kg is more than the fleet's 600 kg; not served: 6 stops, 600 kg");
    expect(cap.out()).toMatch(/Feasible: no: 6 must-serve stop\(s\) left out, every route keeps the rules/);

    const book = await loadWithExcelJs(await readFile(out));
    const plan = sheetValues(book, "Plan");
    expect(String(plan[0]![0])).toMatch(/6 stops that must be served are NOT served/);
    const labels = plan[4]!;
    const totals = plan[5]!;
    expect(totals[labels.indexOf("Must-serve left out")]).toBe(6);
    expect(totals[labels.indexOf("Unassigned")]).toBe(6);
    expect(labels.slice(0, TOTALS_LABELS.length)).toEqual([...TOTALS_LABELS]);
    // Independent check of the written route table: load leaving the depot never above 300 kg.
    const header = plan[6]!;
    const loadCol = header.indexOf("Load kg"); // one numeric Load column per load dimension
    const seqCol = header.indexOf("Seq");
    const starts = plan.slice(7).filter((r) => r[seqCol] === 0);
    expect(starts.length).toBeGreaterThan(0);
    for (const r of starts) expect(r[loadCol] as number).toBeLessThanOrEqual(300);

    const compare = sheetValues(book, COMPARE_SHEET);
    expect(compare[1]![COMPARE_HEADER.indexOf("Must-serve left out")]).toBe(6);
  });
});
