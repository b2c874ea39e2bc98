import { access, mkdtemp, readFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { GEOCODE_CACHE_SHEET } from "../../src/geocode/index.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { startGeocodeServer, type GeocodeServer } from "../geocode/geocodeServer.js";
import { captureIO, sheetValues } from "../workbook/harness.js";

// The loopback service of test/geocode/geocodeServer.ts answers from an invented address book.
let server: GeocodeServer;
let dir: string;
beforeAll(async () => {
  server = await startGeocodeServer();
  dir = await mkdtemp(join(tmpdir(), "kiln-geocode-"));
});
afterAll(async () => {
  await server.close();
});

/** An address-only workbook: a title row above the stops, depots as addresses, a default country. */
async function addressBook(name: string): Promise<string> {
  const book = ExcelJsWorkbook.fromGrids([
    {
      name: "Stops",
      values: [
        ["Deliveries, Tuesday"],
        ["Stop", "Customer", "Street", "Town", "Demand", "Latitude", "Longitude"],
        ["S1", "Ash & Co", "1 Kiln Lane", "Brickfield", 2, "", ""],
        ["S2", "Birch Ltd", "7 Kiln Lane", "Brickfield", 1, "", ""],
        ["S3", "Cedar", "3 Slip Road", "Brickfield", 3, "", ""],
        ["S4", "Dogwood", "12 Glaze Street", "Potterton", 1, "", ""],
        ["S5", "Elm", "4 Throw Court", "Potterton", 2, "", ""],
        ["S6", "Fir", "9 Saggar Row", "Glazebury", 1, "", ""],
        ["S7", "Gum", "2 Bisque Way", "Glazebury", 2, "", ""],
        ["S8", "Hazel", "Nowhere Road 9", "Brickfield", 1, "", ""],
        // Typed coordinates win: this address is in the book elsewhere, and is never asked.
        ["S9", "Ivy", "5 Pug Mill Lane", "Brickfield", 1, 52.1, 5.13],
      ],
    },
    {
      name: "Fleet",
      values: [
        ["Vehicle", "Count", "Capacity", "Depot address", "Shift start", "Shift end"],
        ["Van", 2, 10, "1 Depot Yard, Brickfield", "08:00", "17:00"],
      ],
    },
    {
      name: "Settings",
      values: [
        ["Setting", "Value"],
        ["Default country", "Kilnland"],
      ],
    },
  ]);
  const path = join(dir, name);
  await (await import("node:fs/promises")).writeFile(path, await book.toBuffer());
  return path;
}

const exists = (p: string) =>
  access(p).then(
    () => true,
    () => false,
  );

describe("kiln geocode and kiln plan --geocoder", () => {
  it("geocode writes Latitude, Longitude and the match label into empty cells only, with the answers kept", async () => {
    const input = await addressBook("geo-in.xlsx");
    const out = join(dir, "geo-out.xlsx");
    const before = server.seen.length;
    const cap = captureIO();
    const code = await main(["geocode", input, "--geocoder", server.template, "--rate", "50", "--out", out], cap.io);
    expect(cap.err()).toContain(
      'warning: Stops!C10: "Nowhere Road 9, Brickfield, Kilnland" not found; correct the address or type its coordinates.',
    );
    expect(code).toBe(0);
    // 8 stop addresses without coordinates and 1 depot; S9's typed point is never asked.
    expect(server.seen.length - before).toBe(9);
    expect(server.seen.slice(before).map((s) => s.query)).not.toContain("5 pug mill lane brickfield kilnland");
    expect(server.seen[before]!.query).toBe("1 kiln lane brickfield kilnland");
    expect(cap.out()).toMatch(/9 addresses geocoded \(9 requests/);

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load((await readFile(out)) as unknown as ArrayBuffer);
    const stops = sheetValues(wb, "Stops");
    expect(stops[1]!.slice(5, 8)).toEqual(["Latitude", "Longitude", "Geocode match"]);
    expect(stops[2]!.slice(5, 8)).toEqual([52.0903, 5.1201, "found: 1 Kiln Lane, Brickfield"]);
    // Not found: no coordinates, the label says so.
    expect(stops[9]!.slice(5, 8)).toEqual([null, null, "not found"].map((v) => v ?? undefined));
    // The typed point stays as typed.
    expect(stops[10]!.slice(5, 7)).toEqual([52.1, 5.13]);
    const fleet = sheetValues(wb, "Fleet");
    expect(fleet[0]!.slice(6, 9)).toEqual(["Start latitude", "Start longitude", "Geocode match"]);
    expect(fleet[1]!.slice(6, 8)).toEqual([52.08, 5.11]);
    // The answers are kept on a very hidden sheet (ECMA-376 Part 1, 18.18.68 ST_SheetState "veryHidden").
    expect(wb.getWorksheet(GEOCODE_CACHE_SHEET)?.state).toBe("veryHidden");

    // Geocoding the copy again asks nothing: coordinates are typed now, the one not found is kept.
    const again = captureIO();
    const seen = server.seen.length;
    expect(await main(["geocode", out, "--geocoder", server.template, "--out", join(dir, "geo-again.xlsx")], again.io)).toBe(0);
    expect(server.seen.length).toBe(seen);
  });

  it("plan --geocoder plans an address-only workbook, lists the stop not found as unassigned, and its output asks nothing again", async () => {
    const input = await addressBook("plan-in.xlsx");
    const out = join(dir, "plan-out.xlsx");
    const before = server.seen.length;
    const cap = captureIO();
    const code = await main(["plan", input, "--geocoder", server.template, "--rate", "50", "--moves", "3000", "--out", out], cap.io);
    expect(cap.err()).toContain(
      'Stops!C10: stop "S8" will be left unassigned: its address "Nowhere Road 9, Brickfield, Kilnland" was not found by the geocoding service',
    );
    expect(code).toBe(0);
    expect(server.seen.length - before).toBe(9);
    expect(cap.out()).toMatch(/Unassigned: 1 \(S8\)/);
    // The input sheets are unchanged in the output; the answers travel with it.
    const book = await ExcelJsWorkbook.fromBuffer(await readFile(out));
    expect((await book.readSheet("Stops"))!.values[2]!.slice(5)).toEqual(
      ["", ""].slice(0, (await book.readSheet("Stops"))!.values[2]!.length - 5),
    );
    expect(await book.listSheets()).toContain(GEOCODE_CACHE_SHEET);

    const seen = server.seen.length;
    const again = captureIO();
    expect(
      await main(["plan", out, "--geocoder", server.template, "--moves", "3000", "--out", join(dir, "plan-again.xlsx")], again.io),
    ).toBe(0);
    expect(server.seen.length).toBe(seen);
    expect(again.out()).toMatch(/Unassigned: 1 \(S8\)/);
  });

  it("a service answering something that is not GeoJSON: exit 2, the service and its answer named, nothing written", async () => {
    const input = await addressBook("bad-in.xlsx");
    const out = join(dir, "bad-out.xlsx");
    const cap = captureIO();
    const template = server.template.replace("{address}", "notgeo%20{address}");
    expect(await main(["plan", input, "--geocoder", template, "--rate", "50", "--out", out], cap.io)).toBe(2);
    expect(cap.err()).toMatch(
      new RegExp(
        `--geocoder: the geocoding service ${server.origin}/search\\?format=geojson answered a JSON object with no "type", not a GeoJSON FeatureCollection`,
      ),
    );
    expect(cap.err()).toContain('{\\"results\\":[{\\"lat\\":1,\\"lng\\":2}]}');
    expect(cap.err()).toContain("Nothing was written.");
    expect(await exists(out)).toBe(false);
  });

  it("without a geocoder, an address without coordinates is an error that names --geocoder; geocode options need --geocoder", async () => {
    const input = await addressBook("none-in.xlsx");
    const cap = captureIO();
    expect(await main(["plan", input, "--moves", "1000"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/Stops!F3: stop "S1" has an address but no coordinates;.*set up a geocoding service \(--geocoder/);
    const rate = captureIO();
    expect(await main(["plan", input, "--rate", "2"], rate.io)).toBe(2);
    expect(rate.err()).toMatch(/--rate: applies only with --geocoder/);
    const bad = captureIO();
    expect(await main(["geocode", input, "--geocoder", "https://geocoder.example/search"], bad.io)).toBe(2);
    expect(bad.err()).toMatch(/--geocoder: the geocoder URL "https:\/\/geocoder.example\/search" has no \{address\}/);
  });
});
