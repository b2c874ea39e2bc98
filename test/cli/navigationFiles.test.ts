// kiln plan --gpx / --geojson / --csv on the demo workbook. The files are checked by outside readers
// (fast-xml-parser's XMLValidator for XML 1.0, @tmcw/togeojson for GPX, @placemarkio/check-geojson for
// RFC 7946, csv-parse for RFC 4180); the writers' own tests go further (test/exports).
import { readFile, readdir, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { check } from "@placemarkio/check-geojson";
import { gpx } from "@tmcw/togeojson";
import { DOMParser } from "@xmldom/xmldom";
import { parse } from "csv-parse/sync";
import { XMLValidator } from "fast-xml-parser";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { captureIO, demoCopy, exists, sha256 } from "../workbook/harness.js";

const MOVES = ["--moves", "3000"];

describe("kiln plan --gpx --geojson --csv", () => {
  it("writes the three kinds of files beside the workbook, says so, and leaves the input byte for byte unchanged", async () => {
    const { dir, path } = await demoCopy();
    const before = await sha256(path);
    const [gpxPath, geoPath, csvDir] = [join(dir, "day.gpx"), join(dir, "day.geojson"), join(dir, "drivers")];
    const cap = captureIO();
    const code = await main(["plan", path, ...MOVES, "--gpx", gpxPath, "--geojson", geoPath, "--csv", csvDir], cap.io);
    expect(cap.err()).toBe("");
    expect(code).toBe(0);
    expect(await sha256(path)).toBe(before);
    const used = Number(/Vehicles used: (\d+)/.exec(cap.out())![1]);
    expect(cap.out()).toContain(`Wrote GPX routes for ${used} vehicle`);
    expect(cap.out()).toContain(gpxPath);
    expect(cap.out()).toContain(geoPath);
    expect(cap.out()).toMatch(new RegExp(`Wrote ${used} CSV files? to ${csvDir.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}`));

    const gpxText = await readFile(gpxPath, "utf8");
    expect(XMLValidator.validate(gpxText)).toBe(true); // XML 1.0 well-formed
    const routes = gpx(new DOMParser().parseFromString(gpxText, "text/xml") as unknown as Document); // GPX 1.1 reader
    expect(routes.features.length).toBe(used);

    const geo = check(await readFile(geoPath, "utf8")) as unknown as { features: { geometry: { type: string } | null }[] }; // RFC 7946 validator
    expect(geo.features.filter((f: { geometry: { type: string } | null }) => f.geometry?.type === "LineString").length).toBe(used);

    const csvFiles = (await readdir(csvDir)).sort();
    expect(csvFiles.length).toBe(used);
    for (const name of csvFiles) {
      const rows = parse(await readFile(join(csvDir, name), "utf8"), { bom: true }) as string[][]; // RFC 4180 reader
      expect(rows[0]).toContain("Seq");
      expect(rows.length).toBeGreaterThanOrEqual(4); // header, depot, at least one stop, depot
    }
  });

  it("writes none of the files, not even the CSV folder, on an input error (exit 2)", async () => {
    const { dir, path } = await demoCopy();
    const [gpxPath, geoPath, csvDir] = [join(dir, "x.gpx"), join(dir, "x.geojson"), join(dir, "csv")];
    const cap = captureIO();
    const code = await main(
      ["plan", path, ...MOVES, "--stops", "NoSuchSheet", "--gpx", gpxPath, "--geojson", geoPath, "--csv", csvDir],
      cap.io,
    );
    expect(code).toBe(2);
    expect(cap.err()).toMatch(/NoSuchSheet/);
    for (const p of [gpxPath, geoPath, csvDir, join(dir, "demo.plan.xlsx")]) expect(await exists(p)).toBe(false);
  });

  it("refuses a file that is the input workbook or a CSV folder that is a file (exit 2), writing nothing and keeping the input", async () => {
    const { dir, path } = await demoCopy();
    const before = await sha256(path);
    const cap = captureIO();
    expect(await main(["plan", path, ...MOVES, "--gpx", path], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/--gpx .*that is the input workbook/);
    expect(await sha256(path)).toBe(before);
    expect(await exists(join(dir, "demo.plan.xlsx"))).toBe(false);

    const notDir = join(dir, "notes.txt");
    await writeFile(notDir, "x");
    const cap2 = captureIO();
    expect(await main(["plan", path, ...MOVES, "--csv", notDir, "--geojson", join(dir, "missing", "a.geojson")], cap2.io)).toBe(2);
    expect(cap2.err()).toMatch(/--csv .*that is a file/);
    expect(cap2.err()).toMatch(/--geojson .*does not exist/);
    expect(await exists(join(dir, "demo.plan.xlsx"))).toBe(false);
  });

  it("lists the options in kiln plan --help", async () => {
    const cap = captureIO();
    await main(["plan", "--help"], cap.io);
    expect(cap.out()).toMatch(/--gpx <FILE\.gpx>/);
    expect(cap.out()).toMatch(/--geojson <FILE\.geojson>/);
    expect(cap.out()).toMatch(/--csv <DIR>/);
  });
});
