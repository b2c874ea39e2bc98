/**
 * A dispatcher's real workbook through the CLI, end to end: a title row, a row of merged group
 * headers, the dispatcher's own column words, addresses only (no coordinates anywhere), depots
 * (start and end) as addresses, and a Settings sheet with the default country. Geocoded through
 * the loopback service of test/geocode/geocodeServer.ts; nothing leaves 127.0.0.1.
 */
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { getDistance } from "geolib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { PLAN_SETTINGS_DEFAULTS } from "../../src/sheets/PlanSettings.js";
import {
  DISPATCHER_DEPOTS,
  DISPATCHER_STOPS,
  DROP_TIMES,
  dispatcherAddressWorkbook,
  routeRows,
  serviceMinutes,
} from "../fixtures/dispatcherWorkbook.js";
import { startGeocodeServer, type GeocodeServer } from "../geocode/geocodeServer.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";

let server: GeocodeServer;
let dir: string;
beforeAll(async () => {
  server = await startGeocodeServer();
  dir = await mkdtemp(join(tmpdir(), "kiln-dispatcher-cli-"));
});
afterAll(async () => {
  await server.close();
  await rm(dir, { recursive: true, force: true });
});

/** Minutes of driving between two points: geolib's great-circle metres x detour / speed. */
function driveMin(a: { lat: number; lon: number }, b: { lat: number; lon: number }): number {
  const km =
    (getDistance({ latitude: a.lat, longitude: a.lon }, { latitude: b.lat, longitude: b.lon }, 0.01) / 1000) *
    PLAN_SETTINGS_DEFAULTS.detourFactor;
  return (km / PLAN_SETTINGS_DEFAULTS.speedKmh) * 60;
}

describe("a dispatcher's address-only workbook through kiln plan --geocoder", () => {
  it("geocodes stops and both depots, plans every stop feasibly with the sheet's drop minutes, and ignores no column", async () => {
    const input = join(dir, "round.xlsx");
    await writeFile(
      input,
      await dispatcherAddressWorkbook([
        ["Seed", 3],
        ["Move budget", 6000],
      ]),
    );
    const out = join(dir, "round.plan.xlsx");
    const before = server.seen.length;
    const cap = captureIO();
    const code = await main(["plan", input, "--geocoder", server.template, "--rate", "50", "--out", out], cap.io);
    expect(code, cap.err()).toBe(0);
    // Nothing looked meaningful and went unused: no column warning at all.
    expect(cap.err()).not.toMatch(/is not used|carried through|ignored/);
    // 10 stops, the shared start depot once and Van 1's end depot: 12 requests, each with the
    // Settings sheet's Default country.
    const asked = server.seen.slice(before).map((s) => s.query);
    expect(asked).toHaveLength(12);
    expect(asked.every((q) => q.endsWith(" kilnland"))).toBe(true);
    expect(asked).toContain("8 flour quay crustwick kilnland");

    const plan = sheetValues(await loadWithExcelJs(await readFile(out)), "Plan");
    const rows = routeRows(plan);
    // Every stop planned once, none late (Late min 0), none unassigned.
    const served = rows.filter((r) => /^K\d+$/.test(String(r.Stop)));
    expect(served.map((r) => String(r.Stop)).sort()).toEqual(DISPATCHER_STOPS.map((s) => s.ref).sort());
    expect(served.every((r) => r["Late min"] === 0)).toBe(true);
    expect(plan.flat().some((v) => typeof v === "string" && /was not found/.test(v))).toBe(false);
    // Service minutes are the sheet's drop minutes.
    expect(serviceMinutes(plan)).toEqual(DROP_TIMES);
    // Arrival times reflect them: each arrival is the previous departure plus the drive between the
    // two points (geolib distance, detour and speed defaults), to the minute the sheet shows.
    const at = (r: Record<string, unknown>) => ({ lat: Number(r.Latitude), lon: Number(r.Longitude) });
    let legs = 0;
    for (let i = 1; i < rows.length; i++) {
      const prev = rows[i - 1]!;
      const row = rows[i]!;
      if (row.Vehicle !== prev.Vehicle || !/^K\d+$/.test(String(row.Stop))) continue;
      const gapMin = ((row.Arrival as number) - (prev.Departure as number)) / 60000;
      expect(Math.abs(gapMin - driveMin(at(prev), at(row))), `${String(prev.Stop)} -> ${String(row.Stop)}`).toBeLessThanOrEqual(1);
      legs++;
    }
    expect(legs).toBeGreaterThan(0);
    // The geocoded stop points are the service's answers, and Van 1 ends at its own end depot.
    const k05 = served.find((r) => r.Stop === "K05")!;
    expect(at(k05)).toEqual({ lat: 51.998, lon: 4.381 });
    const van1 = rows.filter((r) => String(r.Vehicle) === "Van 1");
    const van2 = rows.filter((r) => String(r.Vehicle) === "Van 2");
    expect(at(van1[0]!)).toEqual({ lat: DISPATCHER_DEPOTS.start.lat, lon: DISPATCHER_DEPOTS.start.lon });
    expect(at(van1.at(-1)!)).toEqual({ lat: DISPATCHER_DEPOTS.end.lat, lon: DISPATCHER_DEPOTS.end.lon });
    expect(at(van2.at(-1)!)).toEqual({ lat: DISPATCHER_DEPOTS.start.lat, lon: DISPATCHER_DEPOTS.start.lon });

    // The answers travel with the output: planning it again asks the service nothing.
    const seen = server.seen.length;
    const again = captureIO();
    expect(await main(["plan", out, "--geocoder", server.template, "--out", join(dir, "round.again.xlsx")], again.io), again.err()).toBe(0);
    expect(server.seen.length).toBe(seen);
  }, 120_000);

  it("kiln geocode writes the depots' points beside their address text (start and end), never over it, and the copy plans from them", async () => {
    const input = join(dir, "depots.xlsx");
    await writeFile(input, await dispatcherAddressWorkbook());
    const out = join(dir, "depots.geo.xlsx");
    const cap = captureIO();
    expect(await main(["geocode", input, "--geocoder", server.template, "--rate", "50", "--out", out], cap.io), cap.err()).toBe(0);
    const vans = sheetValues(await loadWithExcelJs(await readFile(out)), "Vans");
    // The address text in Depot and End depot stays; the points go into new columns to the right,
    // start then end, before the match label (the service's answers, [lon, lat] in RFC 7946 order).
    expect(vans[0]).toEqual([
      "Vehicle",
      "Capacity",
      "Depot",
      "End depot",
      "Shift start",
      "Shift end",
      "Start latitude",
      "Start longitude",
      "End latitude",
      "End longitude",
      "Geocode match",
    ]);
    const { start, end } = DISPATCHER_DEPOTS;
    expect(vans[1]).toEqual([
      "Van 1",
      30,
      start.address,
      end.address,
      "05:00",
      "13:00",
      start.lat,
      start.lon,
      end.lat,
      end.lon,
      `found: ${start.address}; end depot found: ${end.address}`,
    ]);
    // Van 2 has no end depot address: its end columns stay empty, and its label names only the start.
    expect(vans[2]!.slice(2, 8)).toEqual([start.address, "", "05:00", "13:00", start.lat, start.lon]);
    expect(vans[2]!.slice(8, 10).every((v) => v === undefined || v === null || v === "")).toBe(true);
    expect(vans[2]![10]).toBe(`found: ${start.address}`);

    // The copy plans with no geocoder at all: the written points are read as typed coordinates.
    const planned = join(dir, "depots.plan.xlsx");
    const run = captureIO();
    expect(await main(["plan", out, "--moves", "3000", "--seed", "2", "--out", planned], run.io), run.err()).toBe(0);
    const rows = routeRows(sheetValues(await loadWithExcelJs(await readFile(planned)), "Plan"));
    const at = (r: Record<string, unknown>) => ({ lat: Number(r.Latitude), lon: Number(r.Longitude) });
    const van1 = rows.filter((r) => String(r.Vehicle) === "Van 1");
    expect(at(van1[0]!)).toEqual({ lat: start.lat, lon: start.lon });
    expect(at(van1.at(-1)!)).toEqual({ lat: end.lat, lon: end.lon });
  }, 120_000);
});
