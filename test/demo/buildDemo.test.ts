import { readFile } from "node:fs/promises";
import { getDistance } from "geolib";
import { describe, expect, it } from "vitest";
import { buildDemoWorkbook, FLEET_HEADERS, STOP_HEADERS } from "../../demo/buildDemo.js";
import { BAKERY_DEPOT, TADCASTER_DEPOT, ovenbirdScenario } from "../../demo/ovenbirdScenario.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";

const committed = new URL("../../demo/kiln-demo.xlsx", import.meta.url);
/** York city centre, approximately (from memory). */
const YORK = { latitude: 53.9596, longitude: -1.0815 };

describe("demo workbook", () => {
  it("rebuilds byte for byte equal to the committed demo/kiln-demo.xlsx (seeded, fixed dates)", async () => {
    const built = await buildDemoWorkbook();
    const file = new Uint8Array(await readFile(committed));
    expect(Buffer.from(built).equals(Buffer.from(file))).toBe(true);
  });

  it("has 60..120 stops, all within 25 km of York by geolib's great-circle distance", () => {
    const { stops } = ovenbirdScenario();
    expect(stops.length).toBeGreaterThanOrEqual(60);
    expect(stops.length).toBeLessThanOrEqual(120);
    for (const s of stops) {
      expect(getDistance(YORK, { latitude: s.lat, longitude: s.lon })).toBeLessThan(25_000);
    }
    expect(new Set(stops.map((s) => s.name)).size).toBe(stops.length);
    expect(new Set(stops.map((s) => s.phone)).size).toBe(stops.length);
  });

  it("has early (06:00-08:00) and later (07:00-10:30) windows and a few stops with two windows", () => {
    const { stops } = ovenbirdScenario();
    const has = (from: number, to: number): boolean => stops.some((s) => s.windows[0]![0] <= from && s.windows[0]![1] === to);
    expect(has(360, 480)).toBe(true);
    expect(has(420, 630)).toBe(true);
    expect(stops.filter((s) => s.windows.length === 2).length).toBeGreaterThanOrEqual(3);
    for (const s of stops) for (const [a, b] of s.windows) expect(b).toBeGreaterThan(a);
  });

  it("has five vans with different capacities, one based at a second depot within 25 km", () => {
    const { fleet } = ovenbirdScenario();
    expect(fleet).toHaveLength(5);
    expect(new Set(fleet.map((v) => v.capacityKg)).size).toBe(5);
    expect(fleet.filter((v) => v.start === TADCASTER_DEPOT)).toHaveLength(1);
    expect(fleet.filter((v) => v.start === BAKERY_DEPOT)).toHaveLength(4);
    const depot = { latitude: TADCASTER_DEPOT[0], longitude: TADCASTER_DEPOT[1] };
    expect(getDistance(YORK, depot)).toBeLessThan(25_000);
  });

  it("holds Stops, Fleet, Settings and README sheets with the documented headers", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(await readFile(committed));
    expect(await book.listSheets()).toEqual(["Stops", "Fleet", "Settings", "README"]);
    const stops = (await book.readSheet("Stops"))!;
    expect(stops.values[0]).toEqual([...STOP_HEADERS]);
    expect(stops.values.length - 1).toBe(ovenbirdScenario().stops.length);
    expect((await book.readSheet("Fleet"))!.values[0]).toEqual([...FLEET_HEADERS]);
    const readme = (await book.readSheet("README"))!.values.flat().join(" ");
    expect(readme).toMatch(/straight-line/);
    expect(readme).toMatch(/rest/);
  });
});
