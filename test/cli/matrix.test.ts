// `kiln plan --matrix SHEET`: a road-distance matrix sheet replaces the great-circle distances.
// The matrix below is invented test data (kilometres chosen to differ from the great-circle ones);
// the check is arithmetic: every route's km is the sum of the sheet's cells along the route.
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { buildMatrix } from "../../src/core/geo/buildMatrix.js";
import type { Plan, Problem } from "../../src/core/model.js";
import { solve } from "../../src/core/solve.js";
import { cellAddress } from "../../src/sheets/cellAddress.js";
import { scenarioSettingsKey } from "../../src/sheets/scenarioSettingsKey.js";
import { parseRunRecord } from "../../src/sheets/settingsSchema.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { readScenarioInput } from "../../src/workbook/scenario.js";
import { captureIO, demoCopy, loadWithExcelJs } from "../workbook/harness.js";

/** Invented road kilometres between locations i and j (asymmetric, whole km). */
const roadKm = (i: number, j: number): number => (i === j ? 0 : 4 + ((i * 7 + j * 3) % 13));

/** The ids a matrix sheet uses for each location of the demo: depots by name, stops by ID. */
async function demoLocationIds(path: string): Promise<string[]> {
  const book = await ExcelJsWorkbook.fromBuffer(await readFile(path));
  const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet" });
  if (!read.ok) throw new Error("the demo must read cleanly");
  const p = read.problem;
  const ids = p.locations.map((l) => l.name ?? "");
  p.stops.forEach((s) => (ids[s.location] = s.id));
  return ids;
}

/** Add a matrix sheet with `roadKm` between the given ids (leaving out `skip`) and save. */
async function withMatrix(path: string, ids: readonly string[], skip?: string): Promise<void> {
  const book = await loadWithExcelJs(await readFile(path));
  const ws = book.addWorksheet("Road km");
  const kept = ids.map((id, i) => [id, i] as const).filter(([id]) => id !== skip);
  ws.addRow(["km", ...kept.map(([id]) => id)]);
  for (const [id, i] of kept) ws.addRow([id, ...kept.map(([, j]) => roadKm(i, j))]);
  await writeFile(path, Buffer.from(await book.xlsx.writeBuffer()));
}

function routeKm(problem: Problem, plan: Plan, km: (i: number, j: number) => number): number[] {
  return plan.routes.map((r) => {
    const v = problem.vehicles[r.vehicle]!;
    const path = [v.startLocation, ...r.visits.map((x) => problem.stops[x.stop]!.location), v.endLocation];
    let sum = 0;
    for (let k = 1; k < path.length; k++) sum += km(path[k - 1]!, path[k]!);
    return sum;
  });
}

describe("kiln plan --matrix", () => {
  it("plans on exactly the sheet's kilometres and records the matrix's source on the plan", async () => {
    const { dir, path } = await demoCopy();
    const ids = await demoLocationIds(path);
    await withMatrix(path, ids);
    const out = join(dir, "road.xlsx");
    const flags = ["--matrix", "Road km", "--moves", "4000", "--seed", "3"];
    const cap = captureIO();
    expect(await main(["plan", path, ...flags, "--scenario", "Road", "--out", out], cap.io)).toBe(0);

    // The same run in process (a move budget and a seed make it reproducible).
    const book = await ExcelJsWorkbook.fromBuffer(await readFile(path));
    const read = await readScenarioInput(book, {
      stopsSheet: "Stops",
      fleetSheet: "Fleet",
      settingsSheet: "Settings",
      matrixSheet: "Road km",
    });
    if (!read.ok) throw new Error(read.issues.map((i) => i.message).join("; "));
    const s = read.settings;
    const { plan } = solve(read.problem, { seed: 3, budget: { moves: 4000 }, rule: s.rule, cooling: s.cooling, p0: s.p0, pEnd: s.pEnd });
    const expected = routeKm(read.problem, plan, roadKm);
    expect(plan.routes.map((r) => r.distanceKm)).toEqual(expected);
    const total = expected.reduce((a, b) => a + b, 0);
    expect(plan.totals.distanceKm).toBe(total);
    expect(cap.out()).toContain(`Distance: ${total.toFixed(1)} km (road distances from 'Road km'!A1:`);
    // The great-circle estimate of the same routes differs, so the sheet's km really were used.
    const gc = buildMatrix(read.problem.locations, { detourFactor: s.detourFactor, speedKmh: s.speedKmh });
    const gcKm = routeKm(read.problem, plan, (i, j) => gc.distanceKm[i * gc.size + j]!);
    expect(gcKm.reduce((a, b) => a + b, 0)).not.toBeCloseTo(total, 1);

    const written = await ExcelJsWorkbook.fromBuffer(await readFile(out));
    const record = parseRunRecord((await written.readSettings())[scenarioSettingsKey("Road")]!);
    if (!record.ok) throw new Error(record.message);
    expect(record.record.matrixSource).toBe(`'Road km'!A1:${cellAddress(ids.length, ids.length)}`);
    const sheet = (await written.readSheet("Road"))!.values.flat().map(String);
    expect(sheet).toContain(`road-distance matrix ${record.record.matrixSource}`);
  });

  it("a matrix missing a location is an input error naming the cell", async () => {
    const { dir, path } = await demoCopy();
    const ids = await demoLocationIds(path);
    const missing = ids[ids.length - 1]!;
    await withMatrix(path, ids, missing);
    const cap = captureIO();
    expect(await main(["plan", path, "--matrix", "Road km", "--moves", "1000", "--out", join(dir, "x.xlsx")], cap.io)).toBe(2);
    expect(cap.err()).toContain(`Road km!A1: location "${missing}" has no row`);
  });

  it("a matrix sheet that does not exist is named with the sheets there are", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await main(["plan", path, "--matrix", "Roads", "--moves", "1000"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/Roads: no sheet of that name holds the distance matrix; sheets in this workbook: .*Stops/);
  });
});
