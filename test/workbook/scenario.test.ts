import { readFile } from "node:fs/promises";
import { getDistance } from "geolib";
import { describe, expect, it } from "vitest";
import { solve } from "../../src/core/solve.js";
import { COMPARE_SHEET } from "../../src/sheets/layoutCompare.js";
import { scenarioSettingsKey } from "../../src/sheets/scenarioSettingsKey.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { readScenarioInput, sourceOf, writeScenarioResult } from "../../src/workbook/scenario.js";
import { DEMO_URL, loadWithExcelJs, readDemo } from "./harness.js";
import { zipEntryText } from "./zipEntryText.js";

const MOVES = 20_000;

async function solvedDemo() {
  const { book, read } = await readDemo(MOVES);
  const s = read.settings;
  const result = solve(read.problem, { seed: s.seed, budget: { moves: MOVES }, rule: s.rule, cooling: s.cooling, p0: s.p0, pEnd: s.pEnd });
  return { book, read, result };
}

describe("scenario round trip through an .xlsx file", () => {
  it("every arrival on the written sheet, read back with a fresh exceljs load, follows from the matrix and the service minutes", async () => {
    const { book, read, result } = await solvedDemo();
    const { sheetName } = await writeScenarioResult(book, {
      read,
      result,
      scenario: "Dawn run",
      createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
      runSeconds: 1.5,
      stopsSource: sourceOf((await book.readSheet("Stops"))!),
      fleetSource: sourceOf((await book.readSheet("Fleet"))!),
    });
    expect(sheetName).toBe("Dawn run");
    const fresh = await loadWithExcelJs(await book.toBuffer());
    const ws = fresh.getWorksheet(sheetName)!;
    const rows: unknown[][] = [];
    ws.eachRow((row, r) => void (rows[r - 1] = (row.values as unknown[]).slice(1)));
    const headerAt = rows.findIndex((r) => r?.[0] === "Vehicle" && r?.[1] === "Seq");
    expect(headerAt).toBeGreaterThanOrEqual(0);
    const header = rows[headerAt]! as string[];
    const col = (name: string): number => header.indexOf(name);
    const p = read.problem;
    const n = p.matrix.size;
    const minutes = (v: unknown): number => (v instanceof Date ? v.getTime() / 86_400_000 + 25569 : (v as number)) * 1440;
    let checked = 0;
    let prev: { loc: number; departure: number; vehicle: number } | undefined;
    for (let r = headerAt + 1; r < rows.length; r++) {
      const row = rows[r];
      if (!row || row[col("Seq")] === undefined || typeof row[col("Seq")] !== "number") break;
      const vehicle = p.vehicles.findIndex((v) => v.id === row[col("Vehicle")]);
      expect(vehicle).toBeGreaterThanOrEqual(0);
      const v = p.vehicles[vehicle]!;
      const speedFactor = p.matrix.userSupplied ? 1 : p.referenceSpeedKmh / v.speedKmh;
      const name = row[col("Name")];
      if (name === "Depot start") {
        prev = { loc: v.startLocation, departure: minutes(row[col("Departure")]), vehicle };
        continue;
      }
      expect(prev?.vehicle).toBe(vehicle);
      const loc = name === "Depot end" ? v.endLocation : p.stops.find((s) => s.id === row[col("Stop")])!.location;
      const expected = prev!.departure + p.matrix.travelMin[prev!.loc * n + loc]! * speedFactor;
      expect(minutes(row[col("Arrival")])).toBeCloseTo(expected, 4);
      // Leg km against geolib's great-circle distance times the detour factor (outside reference).
      const a = p.locations[prev!.loc]!,
        b = p.locations[loc]!;
      const geolibKm = getDistance({ latitude: a.lat, longitude: a.lon }, { latitude: b.lat, longitude: b.lon }, 0.01) / 1000;
      expect(Math.abs((row[col("Leg km")] as number) - geolibKm * read.settings.detourFactor)).toBeLessThan(0.1);
      if (name === "Depot end") {
        prev = undefined;
      } else {
        const stop = p.stops.find((s) => s.id === row[col("Stop")])!;
        const start = minutes(row[col("Start")]);
        // exceljs keeps times to the millisecond (1.7e-5 min), hence the 1e-3 min tolerance.
        const late = row[col("Late min")] as number;
        if (start > expected + 1e-3) {
          // Waiting: service starts when one of the stop's windows opens.
          expect(stop.windows.some((w) => Math.abs(w.earliestMin - start) < 1e-3)).toBe(true);
        } else if (start < expected - 1e-3) {
          // Late: time warp (Vidal et al. 2013) starts service at the window's latest start and
          // books the difference as late minutes (sheet rounds them to 0.1).
          expect(stop.windows.some((w) => Math.abs(w.latestMin - start) < 1e-3)).toBe(true);
          expect(late).toBeCloseTo(expected - start, 1);
        } else {
          expect(late).toBe(0);
        }
        expect(minutes(row[col("Departure")])).toBeCloseTo(start + stop.serviceMin, 4);
        prev = { loc, departure: minutes(row[col("Departure")]), vehicle };
      }
      checked++;
    }
    const served =
      result.plan.routes.reduce((s, route) => s + route.visits.length + 1, 0) -
      result.plan.routes.filter((route) => route.visits.length === 0).length;
    expect(checked).toBe(served);
    expect(checked).toBeGreaterThan(60);
  });

  it("appends one Compare row per run and stores the run record under the scenario's settings key", async () => {
    const { book, read, result } = await solvedDemo();
    const common = {
      read,
      result,
      createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
      runSeconds: 1,
      stopsSource: "Stops",
      fleetSource: "Fleet",
    };
    const first = await writeScenarioResult(book, { ...common, scenario: "Plan" });
    const second = await writeScenarioResult(book, { ...common, scenario: "Plan" });
    expect(first.sheetName).toBe("Plan");
    expect(second.sheetName).not.toBe("Plan");
    const again = await ExcelJsWorkbook.fromBuffer(await book.toBuffer());
    const compare = (await again.readSheet(COMPARE_SHEET))!;
    expect(compare.values.map((r) => r[0])).toEqual(["Scenario", first.sheetName, second.sheetName]);
    const settings = await again.readSettings();
    const record = JSON.parse(settings[scenarioSettingsKey(second.sheetName)]!);
    expect(record).toMatchObject({ scenario: second.sheetName, moves: result.stats.moves, settings: { seed: read.settings.seed } });
    // 2026-01-06 04:00 UTC as an ECMA-376 serial: 46028 + 4/24 (46023 = 2026-01-01, from memory).
    expect(record.createdSerial).toBeCloseTo(46028 + 4 / 24, 9);
  });

  it("puts each new plan sheet and its route sheet before the Compare sheet in the file's tab order", async () => {
    const { book, read, result } = await solvedDemo();
    const common = {
      read,
      result,
      createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
      runSeconds: 1,
      stopsSource: "Stops",
      fleetSource: "Fleet",
    };
    const inputs = await book.listSheets();
    await writeScenarioResult(book, { ...common, scenario: "Plan 1" });
    await writeScenarioResult(book, { ...common, scenario: "Plan 2" });
    // ECMA-376 Part 1, 18.2.20 (sheets): the order of the <sheet> elements in xl/workbook.xml is the tab order.
    const workbookXml = zipEntryText(new Uint8Array(await book.toBuffer()), "xl/workbook.xml") ?? "";
    const tabs = [...workbookXml.matchAll(/<sheet\b[^>]*\bname="([^"]*)"[^>]*\/>/g)]
      .filter((m) => !/state="veryHidden"/.test(m[0]))
      .map((m) => m[1]);
    expect(tabs).toEqual([...inputs, "Plan 1", "Plan 1 routes", "Plan 2", "Plan 2 routes", COMPARE_SHEET]);
  });

  it("reports a missing sheet as an issue naming the sheets there are, without throwing", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(await readFile(DEMO_URL));
    const read = await readScenarioInput(book, { stopsSheet: "Drops", fleetSheet: "Fleet" });
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.issues[0]!.message).toMatch(/Drops.*Stops, Fleet, Settings, README/);
  });
});
