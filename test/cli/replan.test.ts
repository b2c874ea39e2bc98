// `kiln plan --from-plan SHEET`: re-plan a published day from a plan sheet of the workbook. The
// expected routes come from the earlier plan sheet itself, read back with exceljs (the outside
// reader) and compared cell by cell; the demo workbook is our own invented data.
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { ROUTE_TABLE_HEADER } from "../../src/sheets/routeTableRows.js";
import { captureIO, demoCopy, loadWithExcelJs } from "../workbook/harness.js";

/** Stop ids per vehicle of a plan sheet, read with exceljs: rows below the route table header, depot and break rows left out. */
async function routesOf(path: string, sheet: string): Promise<Map<string, string[]>> {
  const book = await loadWithExcelJs(await readFile(path));
  const ws = book.getWorksheet(sheet)!;
  const routes = new Map<string, string[]>();
  let inTable = false;
  ws.eachRow({ includeEmpty: true }, (row) => {
    const cells = [1, 2, 3, 4].map((c) => row.getCell(c).value);
    if (!inTable) {
      inTable = cells[0] === "Vehicle" && cells[1] === "Seq" && cells[2] === "Stop";
      return;
    }
    if (cells.every((c) => c === null || c === "")) {
      inTable = false;
      return;
    }
    const [vehicle, seq, stop, name] = cells;
    if (typeof seq !== "number" || seq === 0 || name === "Depot end") return;
    routes.set(String(vehicle), [...(routes.get(String(vehicle)) ?? []), String(stop)]);
  });
  return routes;
}

/** Change the input workbook: remove the Stops rows of `cancel`, copy the row of `copyOf` as a new stop `added`. */
async function editStops(path: string, cancel: readonly string[], copyOf?: string, added?: string): Promise<void> {
  const book = await loadWithExcelJs(await readFile(path));
  const ws = book.getWorksheet("Stops")!;
  const rows: number[] = [];
  let source: unknown[] | undefined;
  ws.eachRow((row, n) => {
    const id = String(row.getCell(1).value);
    if (cancel.includes(id)) rows.push(n);
    if (id === copyOf) source = (row.values as unknown[]).slice(1);
  });
  for (const n of rows.reverse()) ws.spliceRows(n, 1);
  if (source && added) ws.addRow([added, ...source.slice(1)]);
  await writeFile(path, Buffer.from(await book.xlsx.writeBuffer()));
}

describe("kiln plan --from-plan", () => {
  it("keeps every route of the earlier plan sheet when nothing changed and the stability cost is high", async () => {
    const { dir, path } = await demoCopy();
    const first = join(dir, "first.xlsx");
    expect(await main(["plan", path, "--moves", "20000", "--seed", "2", "--out", first], captureIO().io)).toBe(0);
    const second = join(dir, "second.xlsx");
    const cap = captureIO();
    const flags = ["--from-plan", "Plan", "--stability-cost", "100000", "--moves", "20000", "--seed", "5"];
    expect(await main(["plan", first, ...flags, "--scenario", "Again", "--out", second], cap.io)).toBe(0);
    expect(cap.out()).toContain('Re-planned from "Plan": 0 stop(s) changed vehicle');
    expect(await routesOf(second, "Again")).toEqual(await routesOf(first, "Plan"));
    // The Compare sheet: the new column is blank for the plan from scratch and 0 for the re-plan.
    const book = await loadWithExcelJs(await readFile(second));
    const compare = book.getWorksheet("Compare")!;
    const col = (compare.getRow(1).values as unknown[]).indexOf("Changed vehicle");
    expect(col).toBeGreaterThan(0);
    expect(compare.getRow(2).getCell(col).value).toBeNull();
    expect(compare.getRow(3).getCell(col).value).toBe(0);
  });

  it("inserts a stop added since, drops a cancelled one, and changes no other route; a locked route stays exactly as it was", async () => {
    const { dir, path } = await demoCopy();
    const first = join(dir, "first.xlsx");
    expect(await main(["plan", path, "--moves", "20000", "--seed", "2", "--out", first], captureIO().io)).toBe(0);
    const before = await routesOf(first, "Plan");
    const [lockedVan, lockedStops] = [...before].find(([, s]) => s.length >= 3)!;
    const cancelled = lockedStops[1]!;
    const other = [...before].find(([v]) => v !== lockedVan)!;
    await editStops(first, [cancelled], other[1][0], "NEW-1");
    const second = join(dir, "second.xlsx");
    const cap = captureIO();
    const flags = ["--from-plan", "Plan", "--lock", lockedVan, "--stability-cost", "100000", "--moves", "20000"];
    expect(await main(["plan", first, ...flags, "--scenario", "Monday 2", "--out", second], cap.io)).toBe(0);
    expect(cap.err()).toContain(cancelled);
    const after = await routesOf(second, "Monday 2");
    expect(after.get(lockedVan)).toEqual(lockedStops.filter((s) => s !== cancelled));
    const changed = [...new Set([...before.keys(), ...after.keys()])].filter(
      (v) => (after.get(v) ?? []).filter((s) => s !== "NEW-1").join() !== (before.get(v) ?? []).filter((s) => s !== cancelled).join(),
    );
    expect(changed).toEqual([]);
    expect([...after.values()].flat().filter((s) => s === "NEW-1")).toHaveLength(1);
    // The settings block says where the plan started from.
    const book = await loadWithExcelJs(await readFile(second));
    const ws = book.getWorksheet("Monday 2")!;
    const labels = ws.getRow(3).values as unknown[];
    const values = ws.getRow(4).values as unknown[];
    expect(String(values[labels.indexOf("Re-planned from")])).toBe(`Plan, stability cost 100000 per stop moved, locked: ${lockedVan}`);
  });

  it("refuses a sheet that is not a plan, and a plan whose vehicle is no longer in the Fleet, naming the sheet and cell", async () => {
    const { dir, path } = await demoCopy();
    const first = join(dir, "first.xlsx");
    expect(await main(["plan", path, "--moves", "5000", "--out", first], captureIO().io)).toBe(0);
    const notPlan = captureIO();
    expect(await main(["plan", first, "--from-plan", "Stops", "--out", join(dir, "x.xlsx")], notPlan.io)).toBe(2);
    expect(notPlan.err()).toMatch(/^Stops: this sheet is not a Kiln plan sheet/m);

    // Rename the first planned vehicle in the Fleet: the plan sheet's Vehicle cell is named.
    const book = await loadWithExcelJs(await readFile(first));
    const plan = book.getWorksheet("Plan")!;
    let headerRow = 0;
    plan.eachRow((row, n) => {
      if (headerRow === 0 && row.getCell(1).value === ROUTE_TABLE_HEADER[0] && row.getCell(2).value === ROUTE_TABLE_HEADER[1])
        headerRow = n;
    });
    const van = String(plan.getRow(headerRow + 1).getCell(1).value);
    const fleet = book.getWorksheet("Fleet")!;
    fleet.eachRow((row) => {
      const cell = row.getCell(1);
      if (van.startsWith(String(cell.value)) && cell.value !== "Vehicle") cell.value = `${String(cell.value)} renamed`;
    });
    await writeFile(first, Buffer.from(await book.xlsx.writeBuffer()));
    const gone = captureIO();
    expect(await main(["plan", first, "--from-plan", "Plan", "--out", join(dir, "y.xlsx")], gone.io)).toBe(2);
    expect(gone.err()).toContain(`Plan!A${headerRow + 1}: vehicle "${van}" of the earlier plan is no longer in the Fleet`);
    const lockAlone = captureIO();
    expect(await main(["plan", first, "--lock", van, "--out", join(dir, "z.xlsx")], lockAlone.io)).toBe(2);
    expect(lockAlone.err()).toContain("--from-plan SHEET");
  });

  it("locks the route of a vehicle whose Fleet Lock cell says yes, and warns at that cell when no plan sheet is given", async () => {
    const { dir, path } = await demoCopy();
    const first = join(dir, "first.xlsx");
    expect(await main(["plan", path, "--moves", "20000", "--seed", "2", "--out", first], captureIO().io)).toBe(0);
    const before = await routesOf(first, "Plan");
    const [lockedVan, lockedStops] = [...before].find(([, s]) => s.length >= 3)!;
    const cancelled = lockedStops[0]!;
    await editStops(first, [cancelled]);
    // A Lock column at the end of the Fleet: yes for the locked van only.
    const book = await loadWithExcelJs(await readFile(first));
    const fleet = book.getWorksheet("Fleet")!;
    const col = fleet.getRow(1).cellCount + 1;
    let lockCell = "";
    fleet.eachRow((row, n) => {
      if (n === 1) row.getCell(col).value = "Lock";
      else if (String(row.getCell(1).value) === lockedVan) {
        row.getCell(col).value = "yes";
        lockCell = row.getCell(col).address;
      }
    });
    expect(lockCell).not.toBe("");
    await writeFile(first, Buffer.from(await book.xlsx.writeBuffer()));

    // No plan sheet given: a warning at the Lock cell, and the plan is made from scratch.
    const alone = captureIO();
    expect(await main(["plan", first, "--moves", "2000", "--out", join(dir, "alone.xlsx")], alone.io), alone.err()).toBe(0);
    expect(alone.err()).toContain(
      `warning: Fleet!${lockCell}: Lock says yes for "${lockedVan}", but there is nothing to lock: no earlier plan chosen.`,
    );

    // From the plan sheet with a low stability cost (other routes may change): the locked one stays as it was.
    const second = join(dir, "second.xlsx");
    const cap = captureIO();
    const flags = ["--from-plan", "Plan", "--stability-cost", "0", "--moves", "20000", "--seed", "9"];
    expect(await main(["plan", first, ...flags, "--scenario", "Again", "--out", second], cap.io), cap.err()).toBe(0);
    expect((await routesOf(second, "Again")).get(lockedVan)).toEqual(lockedStops.slice(1));
    const ws = (await loadWithExcelJs(await readFile(second))).getWorksheet("Again")!;
    const labels = ws.getRow(3).values as unknown[];
    expect(String((ws.getRow(4).values as unknown[])[labels.indexOf("Re-planned from")])).toBe(
      `Plan, stability cost 0 per stop moved, locked: ${lockedVan}`,
    );
  });
});
