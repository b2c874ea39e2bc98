/**
 * Re-planning in the Excel mode reads the plan sheet through the Office.js adapter
 * (`ExcelWorkbook.readSheet`), not exceljs: the plan grid the adapter wrote is handed back as
 * Excel's `values` give it ("" for empty cells, booleans for TRUE/FALSE cells, per the
 * `Range.values` contract of @types/office-js), under office-addin-mock. Expected routes are the
 * solver's own plan that the sheet was written from; the demo workbook is read with exceljs, the
 * reference reader.
 */
import { readFileSync } from "node:fs";
import { afterEach, describe, expect, it } from "vitest";
import { solve } from "../../src/core/solve.js";
import { looksLikePlanSheet } from "../../src/sheets/readPlanRoutes.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { LOCKED_ROUTES_SOURCE, readScenarioInput, writeScenarioResult } from "../../src/workbook/scenario.js";
import { entries, install, uninstall } from "./officeMockHost.js";

afterEach(uninstall);

async function demoSheets(): Promise<Record<string, { values: unknown[][] }>> {
  const demo = await ExcelJsWorkbook.fromBuffer(readFileSync(new URL("../../demo/kiln-demo.xlsx", import.meta.url)));
  const sheets: Record<string, { values: unknown[][] }> = {};
  for (const name of ["Stops", "Fleet", "Settings"]) sheets[name] = { values: (await demo.readSheet(name))!.values.map((r) => [...r]) };
  return sheets;
}

describe("re-planning from a plan sheet in Excel (office-addin-mock)", () => {
  it("reads back the plan sheet the adapter wrote: the same routes, the Fleet's TRUE Lock cell and the pane's ticked route locked", async () => {
    const sheets = await demoSheets();
    const book = install({ sheets });
    const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet", settingsSheet: "Settings" });
    if (!read.ok) throw new Error(read.issues.map((i) => i.message).join("; "));
    const result = solve(read.problem, { seed: 7, budget: { moves: 3000 } });
    const { sheetName } = await writeScenarioResult(book, {
      read,
      result,
      scenario: "Monday",
      createdAt: new Date(Date.UTC(2026, 0, 5, 18)),
      runSeconds: 1,
      stopsSource: "Stops!A1:N85",
      fleetSource: "Fleet!A1:O6",
      locale: "en-GB",
    });
    const grid = entries("values").find((e) => e[1] === sheetName)![3] as unknown[][];
    // Excel gives "" for an empty cell.
    const planValues = grid.map((r) => r.map((v) => (v === null || v === undefined ? "" : v)));
    uninstall();

    // The same workbook later: the plan sheet present, and a Lock column (Excel TRUE) on the first van's row.
    const used = result.plan.routes.map((r, k) => ({ k, ids: r.visits.map((v) => read.problem.stops[v.stop]!.id) }));
    const [a, b] = used.filter((r) => r.ids.length > 0);
    expect(a && b).toBeTruthy();
    const vanA = read.problem.vehicles[a!.k]!.id;
    const vanB = read.problem.vehicles[b!.k]!.id;
    const fleet = sheets.Fleet!.values.map((r, i) => [...r, i === 0 ? "Lock" : String(r[0]) === vanA ? true : ""]);
    const later = install({ sheets: { ...sheets, Fleet: { values: fleet }, [sheetName]: { values: planValues } } });
    const planRead = await later.readSheet(sheetName);
    expect(planRead && looksLikePlanSheet(planRead)).toBe(true);
    expect(looksLikePlanSheet((await later.readSheet("Stops"))!)).toBe(false);
    const again = await readScenarioInput(later, {
      stopsSheet: "Stops",
      fleetSheet: "Fleet",
      settingsSheet: "Settings",
      fromPlan: { sheet: sheetName, lock: [vanB], lockSource: LOCKED_ROUTES_SOURCE },
    });
    if (!again.ok) throw new Error(again.issues.map((i) => i.message).join("; "));
    const earlier = again.problem.earlier!;
    expect(earlier.routes).toEqual(result.plan.routes.map((r) => r.visits.map((v) => v.stop)));
    expect(earlier.locked.map((v) => again.problem.vehicles[v]!.id).sort()).toEqual([vanA, vanB].sort());
  });

  it("a vehicle of the plan that is gone from the Fleet is named at its cell on the plan sheet", async () => {
    const sheets = await demoSheets();
    const book = install({ sheets });
    const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet", settingsSheet: "Settings" });
    if (!read.ok) throw new Error(read.issues.map((i) => i.message).join("; "));
    const result = solve(read.problem, { seed: 3, budget: { moves: 2000 } });
    const { sheetName } = await writeScenarioResult(book, {
      read,
      result,
      scenario: "Tue",
      createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
      runSeconds: 1,
      stopsSource: "Stops!A1:N85",
      fleetSource: "Fleet!A1:O6",
    });
    const grid = (entries("values").find((e) => e[1] === sheetName)![3] as unknown[][]).map((r) => r.map((v) => v ?? ""));
    uninstall();
    const header = grid.findIndex((r) => r[0] === "Vehicle" && r[1] === "Seq");
    const firstVan = String(grid[header + 1]![0]);
    const fleet = sheets.Fleet!.values.filter((r) => String(r[0]) !== firstVan);
    const later = install({ sheets: { ...sheets, Fleet: { values: fleet }, [sheetName]: { values: grid } } });
    const again = await readScenarioInput(later, {
      stopsSheet: "Stops",
      fleetSheet: "Fleet",
      fromPlan: { sheet: sheetName, lock: [], lockSource: LOCKED_ROUTES_SOURCE },
    });
    expect(again.ok).toBe(false);
    if (again.ok) return;
    expect(again.issues).toEqual([
      expect.objectContaining({
        sheet: sheetName,
        cell: `A${header + 2}`,
        message: expect.stringContaining(`vehicle "${firstVan}" of the earlier plan is no longer in the Fleet`),
      }),
    ]);
  });
});
