/**
 * End to end in a real browser (Debian's Chromium through playwright-core, never a downloaded
 * one) against the built page: the standalone pane opens the demo workbook, previews a schedule
 * change, runs, stops early, reruns, writes and downloads the workbook, and exceljs (the reference
 * reader) checks the downloaded file; bad files and CSV input; the office.js fallback; and the
 * Excel mode against a small fake host. Skips with a printed reason when Chromium is absent,
 * fails under CI.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { check } from "@placemarkio/check-geojson";
import { gpx } from "@tmcw/togeojson";
import { DOMParser } from "@xmldom/xmldom";
import ExcelJS from "exceljs";
import { XMLValidator } from "fast-xml-parser";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { serveStatic } from "../../scripts/serveStatic.js";
import { PLAN_SETTINGS_DEFAULTS } from "../../src/sheets/PlanSettings.js";
import { installFakeExcel, type FakeExcelLog } from "./fakeExcelHost.js";
import { startTileServer } from "./tileServer.js";
import { ensureBuild } from "./ensureBuild.js";
import { CHROMIUM_FLAGS } from "../../scripts/chromiumFlags.js";
import { OFFICE_JS_CDN } from "../../scripts/addinBuild.js";
import { startGeocodeServer } from "../geocode/geocodeServer.js";

const ROOT = resolve(fileURLToPath(new URL("../..", import.meta.url)));
const DIST = join(ROOT, "dist");
const DEMO = join(ROOT, "demo", "kiln-demo.xlsx");
const ARTIFACTS = join(ROOT, "test-artifacts");

function findChromium(): string | undefined {
  try {
    const found = execFileSync("which", ["chromium"], { encoding: "utf8" }).trim();
    if (found) return found;
  } catch {
    // not on PATH: try Debian's usual location below
  }
  return existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
}

const CHROMIUM = findChromium();
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the browser test: no Chromium found (which chromium, /usr/bin/chromium).");
}

/** The demo workbook, or (until the demo exists) a small one built here with invented rows. */
async function inputWorkbook(): Promise<{ path: string; cleanup: () => void }> {
  if (existsSync(DEMO)) return { path: DEMO, cleanup: () => undefined };
  const dir = mkdtempSync(join(tmpdir(), "kiln-input-"));
  const wb = new ExcelJS.Workbook();
  const stops = wb.addWorksheet("Stops");
  stops.addRow(["Stop", "Name", "Latitude", "Longitude", "Demand", "Earliest", "Latest", "Service min"]);
  const spots = [
    [53.96, -1.08],
    [53.97, -1.1],
    [53.95, -1.06],
    [53.98, -1.07],
    [53.94, -1.09],
    [53.965, -1.12],
  ];
  spots.forEach(([lat, lon], i) => stops.addRow([`S${i + 1}`, `Shop ${i + 1}`, lat, lon, 10, "08:00", "12:00", 5]));
  const fleet = wb.addWorksheet("Fleet");
  fleet.addRow(["Vehicle", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"]);
  fleet.addRow(["Van A", 40, 53.959, -1.081, "07:00", "14:00"]);
  fleet.addRow(["Van B", 40, 53.959, -1.081, "07:00", "14:00"]);
  const path = join(dir, "kiln-demo.xlsx");
  await wb.xlsx.writeFile(path);
  return { path, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

async function sheetValues(wb: ExcelJS.Workbook, name: string): Promise<unknown[][]> {
  const ws = wb.getWorksheet(name);
  if (!ws) return [];
  const rows: unknown[][] = [];
  ws.eachRow({ includeEmpty: true }, (row, n) => {
    rows[n - 1] = (row.values as unknown[]).slice(1).map((v) => (v instanceof Date ? v.toISOString() : v));
  });
  return rows;
}

/** A sheet as Excel's `values` gives it: rectangular, "" for empty, dates and times as serials (ECMA-376 1900 system). */
async function excelValues(path: string, sheet: string): Promise<unknown[][]> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(path);
  const rows = await sheetValues(wb, sheet);
  const cols = rows.reduce((m, r) => Math.max(m, r?.length ?? 0), 0);
  const epoch = Date.UTC(1899, 11, 30);
  return rows.map((r) =>
    Array.from({ length: cols }, (_, c) => {
      const v = r?.[c];
      if (v === null || v === undefined) return "";
      if (typeof v === "string" && /^\d{4}-\d\d-\d\dT/.test(v)) return (Date.parse(v) - epoch) / 86_400_000;
      return typeof v === "object" ? String((v as { result?: unknown }).result ?? "") : v;
    }),
  );
}

describe.skipIf(!CHROMIUM)("task pane in Chromium", () => {
  let server: Server | undefined;
  let baseUrl = "";
  let context: BrowserContext | undefined;
  let page: Page;
  let userDataDir = "";

  beforeAll(async () => {
    await ensureBuild();
    ({ server, url: baseUrl } = await serveStatic(DIST));
    userDataDir = mkdtempSync(join(tmpdir(), "kiln-chromium-"));
    context = await chromium.launchPersistentContext(userDataDir, {
      executablePath: CHROMIUM!,
      headless: true,
      args: [...CHROMIUM_FLAGS],
      viewport: { width: 360, height: 900 },
      acceptDownloads: true,
    });
    page = context.pages()[0] ?? (await context.newPage());
    page.on("pageerror", (err) => console.error("page error:", err.message));
    page.on("console", (m) => {
      if (m.type() === "error" && !/favicon/.test(m.text())) console.error("page console:", m.text());
    });
  }, 600_000);

  afterAll(async () => {
    await context?.close();
    await new Promise<void>((ok) => (server ? server.close(() => ok()) : ok()));
    if (userDataDir) rmSync(userDataDir, { recursive: true, force: true });
  });

  it("opens a workbook, previews, optimizes, stops early, reruns into a new sheet and downloads scenario + Compare with inputs unchanged (checked with exceljs)", async () => {
    const input = await inputWorkbook();
    try {
      // Block everything but our own server: nothing may leave the machine.
      const outside: string[] = [];
      await page.route("**/*", (route) => {
        const url = route.request().url();
        if (url.startsWith(baseUrl) || url.startsWith("blob:") || url.startsWith("data:")) return route.continue();
        outside.push(url);
        return route.abort();
      });
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await expect(page.locator("#caution").textContent()).resolves.toMatch(/estimates/i);

      await page.setInputFiles("#file-input", input.path);
      await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows?/);
      await expect.poll(() => page.locator("#fleet-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows?/);
      await expect(page.locator("#stops-issues li:not(.warning)").count()).resolves.toBe(0);
      await page.waitForSelector("#cooling-reading.ok", { timeout: 60_000 });
      // The workbook's Settings sheet (when it has one) starts the form; its seed is the run's.
      const seedOfRun = await page.locator("#seed").inputValue();
      const before = await page.locator("#cooling-plot").getAttribute("data-profile");
      const readingBefore = await page.locator("#cooling-reading").textContent();

      // A geometric schedule that cools fast must draw a different profile.
      await page.selectOption("#schedule", "geometric");
      await page.fill("#alpha", "0.5");
      await page.fill("#moves-per-level", "1000");
      await page.locator("#moves-per-level").dispatchEvent("change");
      await expect.poll(() => page.locator("#cooling-plot").getAttribute("data-profile")).not.toBe(before);
      await expect.poll(() => page.locator("#cooling-reading").textContent()).not.toBe(readingBefore);
      await page.selectOption("#schedule", "timeFraction");

      await page.fill("#seconds", "60");
      await page.locator("#seconds").dispatchEvent("change");
      await expect(page.locator("#optimize").isEnabled()).resolves.toBe(true);
      await page.click("#optimize");
      try {
        await expect
          .poll(async () => Number(await page.locator("#convergence-plot").getAttribute("data-points")), { timeout: 60_000 })
          .toBeGreaterThanOrEqual(3);
      } catch (err) {
        // Say what the pane showed, so a failure here can be told apart from a slow machine.
        console.error(
          "pane state:",
          await page.locator("#optimize-section").getAttribute("data-state"),
          "| error:",
          await page.locator("#pane-error-text").textContent(),
          "| elapsed:",
          await page.locator("#stat-elapsed").textContent(),
        );
        throw err;
      }
      // The page answers while the worker runs: the Stop button is enabled and clickable.
      await expect(page.locator("#stop").isEnabled()).resolves.toBe(true);
      const width = await page.locator("#progress-bar").evaluate((el) => (el as HTMLElement).style.width);
      expect(Number.parseFloat(width)).toBeGreaterThan(0);
      await page.click("#stop");
      await page.waitForSelector("#result-section:not([hidden])", { timeout: 60_000 });
      await expect(page.locator("#optimize-section").getAttribute("data-state")).resolves.toBe("stopped");
      await expect(page.locator("#result-status").textContent()).resolves.toMatch(/Stopped early/);
      const routes = JSON.parse((await page.locator("#route-map").getAttribute("data-routes")) ?? "[]") as { stops: string[] }[];
      expect(routes.length).toBeGreaterThan(0);

      // Hover: sweep the canvas until the tooltip names a stop with its arrival and load.
      const tooltip = await page.evaluate(() => {
        const canvas = document.getElementById("route-map")!;
        const tip = document.getElementById("map-tooltip")!;
        const box = canvas.getBoundingClientRect();
        for (let y = 0; y < box.height; y += 3) {
          for (let x = 0; x < box.width; x += 3) {
            canvas.dispatchEvent(new MouseEvent("mousemove", { clientX: box.left + x, clientY: box.top + y, bubbles: true }));
            if (!tip.hidden && /\narrives /.test(tip.textContent ?? "")) return tip.textContent;
          }
        }
        return null;
      });
      expect(tooltip).toMatch(/\narrives \d\d:\d\d( · window \d\d:\d\d–\d\d:\d\d)?(\n\d+ min late)?\nload after \d/);

      mkdirSync(ARTIFACTS, { recursive: true });
      await page.screenshot({ path: join(ARTIFACTS, "pane-after-run.png"), fullPage: true });

      await page.click("#write");
      await page.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
      await expect(page.locator("#write-status").textContent()).resolves.toMatch(/"Plan 1"/);

      // Rerun: the stored settings of "Plan 1" come back into the form; the rerun lands in a new sheet.
      await page.selectOption("#rerun-sheet", "Plan 1");
      await page.fill("#seed", "9");
      await page.selectOption("#schedule", "lundyMees");
      await page.click("#rerun");
      await expect.poll(() => page.locator("#rerun-status").textContent()).toMatch(/Loaded the settings of "Plan 1"/);
      await expect(page.locator("#seed").inputValue()).resolves.toBe(seedOfRun);
      await expect(page.locator("#schedule").inputValue()).resolves.toBe("timeFraction");
      await expect(page.locator("#seconds").inputValue()).resolves.toBe("60");
      // The rerun is offered the next free name, not the plan's own (which would land as "Plan 1 (2)").
      await expect(page.locator("#scenario").inputValue()).resolves.toBe("Plan 2");
      await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await page.click("#optimize");
      await expect
        .poll(async () => Number(await page.locator("#convergence-plot").getAttribute("data-points")), { timeout: 60_000 })
        .toBeGreaterThanOrEqual(1);
      await page.click("#stop");
      await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await page.click("#write");
      await expect.poll(() => page.locator("#write-status").textContent(), { timeout: 60_000 }).toMatch(/"Plan 2"/);
      const [download] = await Promise.all([page.waitForEvent("download"), page.click("#download")]);
      expect(download.suggestedFilename()).toBe("kiln-demo.plan.xlsx");
      const saved = join(userDataDir, "downloaded.xlsx");
      await download.saveAs(saved);
      await page.setViewportSize({ width: 1000, height: 900 });
      await page.screenshot({ path: join(ARTIFACTS, "pane-wide.png"), fullPage: true });

      const original = new ExcelJS.Workbook();
      await original.xlsx.readFile(input.path);
      const out = new ExcelJS.Workbook();
      await out.xlsx.readFile(saved);
      const names = out.worksheets.map((w) => w.name);
      expect(names).toContain("Plan 1");
      expect(names).toContain("Plan 2");
      // Every run also writes the driver route sheets, on the page as in the add-in and the CLI.
      expect(names).toContain("Plan 1 routes");
      expect(names).toContain("Plan 2 routes");
      // The rerun's sheets land before Compare, which stays after the plans it lists (exceljs reads the tab order).
      const tabs = out.worksheets.filter((w) => w.state === "visible").map((w) => w.name);
      expect(tabs.slice(-5)).toEqual(["Plan 1", "Plan 1 routes", "Plan 2", "Plan 2 routes", "Compare"]);
      for (const sheet of original.worksheets.map((w) => w.name)) {
        expect(await sheetValues(out, sheet)).toEqual(await sheetValues(original, sheet));
      }
      const compare = await sheetValues(out, "Compare");
      expect(compare[0]?.[0]).toBe("Scenario");
      expect(compare[1]?.[0]).toBe("Plan 1");
      expect(compare[2]?.[0]).toBe("Plan 2");
      const plan = await sheetValues(out, "Plan 1");
      expect(plan.flat().some((v) => typeof v === "string" && /estimates/i.test(v))).toBe(true);
      expect(outside).toEqual([]);
    } finally {
      input.cleanup();
    }
  }, 600_000);

  it("offers the GPX and GeoJSON of a run for download: GPX read back by @tmcw/togeojson, GeoJSON by @placemarkio/check-geojson, the same routes in both, every stop once", async () => {
    const input = await inputWorkbook();
    try {
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await page.setInputFiles("#file-input", input.path);
      await page.fill("#seconds", "1");
      await page.locator("#seconds").dispatchEvent("change");
      await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await expect(page.locator("#download-gpx").isHidden()).resolves.toBe(true);
      await page.click("#optimize");
      await page.waitForSelector("#download-gpx:not([hidden])", { timeout: 120_000 });
      const save = async (selector: string, name: string): Promise<{ file: string; text: string }> => {
        const [download] = await Promise.all([page.waitForEvent("download"), page.click(selector)]);
        const path = join(userDataDir, name);
        await download.saveAs(path);
        return { file: download.suggestedFilename(), text: readFileSync(path, "utf8") };
      };
      const gpxFile = await save("#download-gpx", "run.gpx");
      const geoFile = await save("#download-geojson", "run.geojson");
      expect(gpxFile.file).toMatch(/^Plan \d+\.gpx$/);
      expect(geoFile.file).toMatch(/^Plan \d+\.geojson$/);
      expect(XMLValidator.validate(gpxFile.text)).toBe(true); // XML 1.0 well-formed (fast-xml-parser)
      const fromGpx = gpx(new DOMParser().parseFromString(gpxFile.text, "text/xml") as unknown as Document) as {
        features: { properties: Record<string, unknown> | null; geometry: unknown }[];
      }; // GPX 1.1 reader
      const geo = check(geoFile.text) as unknown as {
        features: { geometry: { type: string } | null; properties: Record<string, unknown> | null }[];
      }; // RFC 7946 validator
      type GeoFeature = { geometry: { type: string } | null; properties: Record<string, unknown> | null };
      const lines = (geo.features as GeoFeature[]).filter((f) => f.geometry?.type === "LineString");
      expect(fromGpx.features.length).toBeGreaterThan(0);
      expect(fromGpx.features.map((f) => f.properties?.name)).toEqual(lines.map((f) => f.properties?.vehicle));
      fromGpx.features.forEach((f, i) => {
        const a = (f.geometry as unknown as { coordinates: number[][] }).coordinates;
        const b = (lines[i]!.geometry as unknown as { coordinates: number[][] }).coordinates;
        expect(a.length).toBe(b.length);
        a.forEach((p, k) => {
          expect(Math.abs(p[0]! - b[k]![0]!)).toBeLessThan(1e-6);
          expect(Math.abs(p[1]! - b[k]![1]!)).toBeLessThan(1e-6);
        });
      });
      // Every stop of the workbook once: served (a "stop" Point) or left out (an "unplanned" Point).
      const book = new ExcelJS.Workbook();
      await book.xlsx.readFile(input.path);
      const stopIds = (await sheetValues(book, "Stops"))
        .slice(1)
        .filter((r) => r && r[0] !== undefined && r[0] !== null && r[0] !== "")
        .map((r) => String(r[0]));
      const inFile = geo.features
        .filter((f: { properties: Record<string, unknown> | null }) => f.properties?.kind === "stop" || f.properties?.kind === "unplanned")
        .map((f: { properties: Record<string, unknown> | null }) => String(f.properties?.stop));
      expect([...inFile].sort()).toEqual([...stopIds].sort());
    } finally {
      input.cleanup();
    }
  }, 600_000);

  it("bad input never crashes the page: a broken file and a bad latitude are reported, nothing runs", async () => {
    const dir = mkdtempSync(join(tmpdir(), "kiln-bad-"));
    try {
      await page.setViewportSize({ width: 360, height: 900 });
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });

      const broken = join(dir, "broken.xlsx");
      writeFileSync(broken, "this is not a zip archive");
      await page.setInputFiles("#file-input", broken);
      await page.waitForSelector("#pane-error:not([hidden])", { timeout: 30_000 });
      await expect(page.locator("#pane-error-text").textContent()).resolves.toMatch(/broken\.xlsx is a text file \(CSV or similar\)/);

      const wb = new ExcelJS.Workbook();
      const stops = wb.addWorksheet("Stops");
      stops.addRow(["Stop", "Name", "Latitude", "Longitude", "Demand"]);
      stops.addRow(["S1", "Good", 53.96, -1.08, 5]);
      stops.addRow(["S2", "Bad", 123.4, -1.1, 5]);
      const fleet = wb.addWorksheet("Fleet");
      fleet.addRow(["Vehicle", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"]);
      fleet.addRow(["Van A", 40, 53.959, -1.081, "07:00", "14:00"]);
      const bad = join(dir, "bad-latitude.xlsx");
      await wb.xlsx.writeFile(bad);
      await page.setInputFiles("#file-input", bad);
      // ECMA-376 / Excel A1 addressing: the latitude 123.4 sits in column C of sheet row 3.
      await expect.poll(() => page.locator("#stops-issues").textContent(), { timeout: 30_000 }).toMatch(/Stops!C3/);
      await expect(page.locator("#stops-issues").textContent()).resolves.toMatch(/-90\.\.90|latitude/i);
      await expect(page.locator("#optimize").isDisabled()).resolves.toBe(true);
      await expect(page.locator("body").getAttribute("data-ready")).resolves.toBe("true");
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 300_000);

  it("opens stops.csv + fleet.csv as two sheets and finds them by name (RFC 4180 quoting in a name)", async () => {
    const dir = mkdtempSync(join(tmpdir(), "kiln-csv-"));
    try {
      const stopsCsv = join(dir, "stops.csv");
      const fleetCsv = join(dir, "fleet.csv");
      writeFileSync(stopsCsv, 'Stop,Name,Latitude,Longitude,Demand\r\nS1,"Baker, North",53.96,-1.08,5\r\nS2,Mill,53.97,-1.1,5\r\n');
      writeFileSync(
        fleetCsv,
        "Vehicle,Capacity,Start latitude,Start longitude,Shift start,Shift end\r\nVan A,40,53.959,-1.081,07:00,14:00\r\n",
      );
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await page.setInputFiles("#file-input", [stopsCsv, fleetCsv]);
      await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/stops!A1:E3 · 2 data rows/);
      await expect(page.locator("#fleet-summary").textContent()).resolves.toMatch(/fleet!A1:F2 · 1 data row(?!s)/);
      await expect(page.locator("#file-name").textContent()).resolves.toBe("stops.csv + fleet.csv");
      await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);

  it("with an Office host hint but no host, office.js is requested from Microsoft's CDN only and the page falls back to the standalone pane", async () => {
    const requested: string[] = [];
    const listener = (req: { url(): string }) => void requested.push(req.url());
    page.on("request", listener);
    // The CDN is never contacted: its files are served from the npm copy (tests only), the rest refused.
    const cdnDir = OFFICE_JS_CDN.slice(0, OFFICE_JS_CDN.lastIndexOf("/") + 1);
    await page.route(`${cdnDir}**`, (route) => {
      const file = join(ROOT, "node_modules", "@microsoft", "office-js", "dist", route.request().url().slice(cdnDir.length).split("?")[0]!);
      return existsSync(file) ? route.fulfill({ path: file, contentType: "application/javascript" }) : route.fulfill({ status: 404 });
    });
    try {
      // The query Office appends to a pane's URL (from memory: _host_Info=<app>$<platform>$<version>$<locale>...).
      await page.goto(`${baseUrl}/taskpane.html?_host_Info=Excel$Web$16.01$en-US$$$$0`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 60_000 });
      expect(requested).toContain(OFFICE_JS_CDN);
      expect(requested.filter((u) => !u.startsWith(baseUrl) && !u.startsWith(cdnDir) && !/^(blob|data):/.test(u))).toEqual([]);
      expect(requested.some((u) => u.startsWith(`${baseUrl}/office/`))).toBe(false); // no local office.js any more
      await expect(page.locator("#mode-badge").textContent()).resolves.toMatch(/standalone/);
    } finally {
      page.off("request", listener);
      await page.unroute(`${cdnDir}**`);
    }
  }, 120_000);

  it("with a host hint and office.js unreachable, the page says so and runs standalone at once", async () => {
    const cdnDir = OFFICE_JS_CDN.slice(0, OFFICE_JS_CDN.lastIndexOf("/") + 1);
    await page.route(`${cdnDir}**`, (route) => route.abort());
    try {
      await page.goto(`${baseUrl}/taskpane.html?kiln-host=office`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await expect(page.locator("#pane-error-text").textContent()).resolves.toMatch(/office\.js could not be loaded from Microsoft's CDN/);
      await expect(page.locator("#diagnostics").textContent()).resolves.toMatch(/No Office host/);
    } finally {
      await page.unroute(`${cdnDir}**`);
    }
  }, 120_000);

  it("the built page references the CDN office.js (for its loader, used on a hint only) and nothing else outside its origin; files are content-hashed; no source maps", () => {
    const html = readFileSync(join(DIST, "taskpane.html"), "utf8");
    const urls = [...html.matchAll(/(?:src|href)=["']?([^"' >]+)/g)].map((m) => m[1]!);
    expect(urls.filter((u) => /^[a-z]+:/i.test(u) || u.startsWith("//"))).toEqual([]);
    // The loader is a file of its own (the page's policy allows no inline script); it writes the
    // office.js tag only when a host may be around (minified guard).
    const loader = urls.find((u) => /^officeLoader\.[0-9a-f]{8}\.js$/.test(u));
    expect(loader).toBeDefined();
    expect(html).toContain(`data-office-js=${OFFICE_JS_CDN}`);
    expect(readFileSync(join(DIST, loader!), "utf8")).toMatch(/_host_Info[\s\S]*&&[\s\S]*document\.write\(/);
    const files = readdirSync(DIST);
    expect(files.filter((f) => f.endsWith(".map"))).toEqual([]);
    expect(files.filter((f) => /\.(js|css)$/.test(f) && !/\.[0-9a-f]{8}\.(js|css)$/.test(f))).toEqual([]);
    expect(existsSync(join(DIST, "office"))).toBe(false);
    for (const u of urls.filter((x) => /\.(js|css)$/.test(x) && !/^https:/.test(x))) expect(existsSync(join(DIST, u))).toBe(true);
  });

  it("Excel mode (fake Excel host): Use selection shows address, columns and rows; error cells select their cell; Rerun reads the stored settings", async () => {
    const input = await inputWorkbook();
    const excelPage = await context!.newPage();
    try {
      const stops = await excelValues(input.path, "Stops");
      const fleet = await excelValues(input.path, "Fleet");
      const latCol = (stops[0] ?? []).findIndex((h) => String(h).toLowerCase() === "latitude");
      expect(latCol).toBeGreaterThanOrEqual(0);
      const bad = stops.map((row, r) => (r === 2 ? row.map((v, c) => (c === latCol ? 123.4 : v)) : row));
      const badCell = `Bad!${String.fromCharCode(65 + latCol)}3`;
      const stored = {
        scenario: "Plan 4",
        createdSerial: 46000.5,
        moves: 1000,
        runSeconds: 2,
        stopsSource: "Stops!A1:N85",
        fleetSource: "Fleet!A1:O6",
        settings: { ...PLAN_SETTINGS_DEFAULTS, seed: 77, seconds: 25 },
      };
      await excelPage.addInitScript(installFakeExcel, {
        sheets: { Stops: stops, Fleet: fleet, Bad: bad, "Plan 4": [["Scenario", "Plan 4"]] },
        settings: { "kiln.scenario.Plan 4": JSON.stringify(stored) },
      });
      await excelPage.goto(`${baseUrl}/taskpane.html`);
      await excelPage.waitForSelector("body[data-ready='true'][data-mode='excel']", { timeout: 30_000 });
      await expect(excelPage.locator("#file-section").isHidden()).resolves.toBe(true);
      await expect(excelPage.locator("#scenario").inputValue()).resolves.toBe("Plan 1");
      // The empty states say which range to select and what to press.
      await expect(excelPage.locator("#stops-summary").textContent()).resolves.toMatch(
        /select the stops table .* then press Use selection/,
      );
      await expect(excelPage.locator("#fleet-summary").textContent()).resolves.toMatch(
        /select the fleet table .* then press Use selection/,
      );

      const select = (sheet: string) =>
        excelPage.evaluate((s) => ((window as unknown as { __kilnExcel: { selectSheet: string } }).__kilnExcel.selectSheet = s), sheet);
      await select("Stops");
      await excelPage.click("#stops-use-selection");
      await select("Fleet");
      await excelPage.click("#fleet-use-selection");
      await expect
        .poll(() => excelPage.locator("#stops-summary").textContent(), { timeout: 30_000 })
        .toMatch(new RegExp(`Stops!A1:[A-Z]+${stops.length} · ${stops.length - 1} data rows`));
      await expect(excelPage.locator("#stops-summary .col").first().textContent()).resolves.toMatch(/^A: /);
      await excelPage.waitForSelector("#cooling-reading.ok", { timeout: 60_000 });
      await expect(excelPage.locator("#optimize").isEnabled()).resolves.toBe(true);

      // A bad latitude: the address is a link that selects the cell in Excel.
      await select("Bad");
      await excelPage.click("#stops-use-selection");
      const link = excelPage.locator("#stops-issues button.cell", { hasText: badCell });
      await link.waitFor({ timeout: 30_000 });
      await expect(excelPage.locator("#optimize").isDisabled()).resolves.toBe(true);
      await link.click();
      await expect
        .poll(() => excelPage.evaluate(() => (window as unknown as { __kilnExcel: { selected: string[] } }).__kilnExcel.selected))
        .toEqual([badCell]);

      // Rerun on the plan sheet loads the settings stored under its name.
      await select("Plan 4");
      await excelPage.click("#rerun");
      await expect.poll(() => excelPage.locator("#rerun-status").textContent()).toMatch(/Loaded the settings of "Plan 4"/);
      await expect(excelPage.locator("#seed").inputValue()).resolves.toBe("77");
      await expect(excelPage.locator("#seconds").inputValue()).resolves.toBe("25");
      // "Plan 4" is taken by the plan sheet itself: the rerun is offered the first free "Plan N".
      await expect(excelPage.locator("#scenario").inputValue()).resolves.toBe("Plan 1");
      await expect(excelPage.locator("#pane-error").isHidden()).resolves.toBe(true);
    } finally {
      await excelPage.close();
      input.cleanup();
    }
  }, 300_000);

  it("Excel mode (fake Excel host): the Distances list follows sheets added, renamed and deleted (sheet events), or focus where the host has no events; Rerun restores the run's matrix sheet or says it is gone", async () => {
    const input = await inputWorkbook();
    const stops = await excelValues(input.path, "Stops");
    const fleet = await excelValues(input.path, "Fleet");
    // Small invented matrices: they read as a distance matrix, though they do not name the demo's
    // stops (their problems show beside the picker, which is all this test needs).
    const km = (a: string, b: string) => [
      ["km", a, b],
      [a, 0, 3.5],
      [b, 3.5, 0],
    ];
    const record = {
      scenario: "Plan 4",
      createdSerial: 46000.5,
      moves: 1000,
      runSeconds: 2,
      stopsSource: "Stops!A1:N85",
      fleetSource: "Fleet!A1:O6",
      matrixSource: "'Road km'!A1:C3",
      settings: { ...PLAN_SETTINGS_DEFAULTS, seed: 78 },
    };
    // The picker's first option (MatrixPicker's NO_MATRIX_TEXT, the pane's own words).
    const NO_MATRIX_TEXT = "Straight line × detour factor";
    const open = async (sets: string[]) => {
      const page = await context!.newPage();
      await page.addInitScript(installFakeExcel, {
        sheets: { Stops: stops, Fleet: fleet, "Road km": km("A", "B"), "Plan 4": [["Scenario", "Plan 4"]] },
        settings: { "kiln.scenario.Plan 4": JSON.stringify(record) },
        sets,
      });
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='excel']", { timeout: 30_000 });
      return page;
    };
    type Fake = { __kilnExcel: FakeExcelLog };
    const options = (page: Page) => page.locator("#matrix-sheet option").allTextContents();
    const events = await open(["1.7", "1.17"]);
    try {
      const select = (sheet: string) => events.evaluate((s) => ((window as unknown as Fake).__kilnExcel.selectSheet = s), sheet);
      await select("Stops");
      await events.click("#stops-use-selection");
      await select("Fleet");
      await events.click("#fleet-use-selection");
      await expect.poll(() => options(events), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Road km"]);
      await expect(events.locator("#matrix-sheet").inputValue()).resolves.toBe("");

      // A sheet added in Excel (WorksheetCollection.onAdded, ExcelApi 1.7) is offered without a click.
      await events.evaluate((m) => (window as unknown as Fake).__kilnExcel.addSheet("Ferry km", m), km("A", "B"));
      await expect.poll(() => options(events), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Road km", "Ferry km"]);

      // Rerun from the plan sheet: the run's matrix sheet is chosen again, and the status says so.
      await select("Plan 4");
      await events.click("#rerun");
      await expect.poll(() => events.locator("#rerun-status").textContent()).toMatch(/Loaded the settings of "Plan 4"/);
      await expect(events.locator("#rerun-status").textContent()).resolves.toContain("distances from 'Road km'!A1:C3");
      await expect(events.locator("#matrix-sheet").inputValue()).resolves.toBe("Road km");
      await expect(events.locator("#seed").inputValue()).resolves.toBe("78");
      await expect.poll(() => events.locator("#matrix-summary").textContent(), { timeout: 30_000 }).toContain("'Road km'!A1:C3");

      // Renamed in Excel (onNameChanged, ExcelApi 1.17): the choice follows the new name.
      await events.evaluate(() => (window as unknown as Fake).__kilnExcel.renameSheet("Road km", "Road km May"));
      await expect.poll(() => options(events), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Road km May", "Ferry km"]);
      await expect(events.locator("#matrix-sheet").inputValue()).resolves.toBe("Road km May");
      await expect.poll(() => events.locator("#matrix-summary").textContent(), { timeout: 30_000 }).toContain("'Road km May'!A1:C3");

      // Deleted in Excel (onDeleted): straight-line distances again, and the list without it.
      await events.evaluate(() => (window as unknown as Fake).__kilnExcel.deleteSheet("Road km May"));
      await expect.poll(() => options(events), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Ferry km"]);
      await expect(events.locator("#matrix-sheet").inputValue()).resolves.toBe("");
      await expect(events.locator("#matrix-summary").isHidden()).resolves.toBe(true);

      // A rerun whose matrix sheet is gone says so, and plans on straight lines rather than another sheet.
      await events.click("#rerun");
      await expect.poll(() => events.locator("#rerun-status").textContent()).toContain('no sheet "Road km" reads as a distance matrix now');
      await expect(events.locator("#matrix-sheet").inputValue()).resolves.toBe("");
      await expect(events.locator("#pane-error").isHidden()).resolves.toBe(true);
    } finally {
      await events.close();
    }

    // A host without the sheet events (below ExcelApi 1.7): focusing the picker lists the sheets again.
    const quiet = await open([]);
    try {
      await expect.poll(() => options(quiet), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Road km"]);
      await quiet.evaluate((m) => (window as unknown as Fake).__kilnExcel.addSheet("Ferry km", m), km("A", "B"));
      await quiet.waitForTimeout(1000);
      await expect(options(quiet)).resolves.toEqual([NO_MATRIX_TEXT, "Road km"]);
      await quiet.focus("#matrix-sheet");
      await expect.poll(() => options(quiet), { timeout: 30_000 }).toEqual([NO_MATRIX_TEXT, "Road km", "Ferry km"]);
    } finally {
      await quiet.close();
      input.cleanup();
    }
  }, 300_000);

  it("route map: depots and vehicle labels never overlap each other or a depot, hover text stays inside a 350 px pane, a legend entry highlights its route by click and keyboard, the map in words, screenshots at 350 px and desktop width, no request leaves the page without a background; with a loopback tile server, tiles and the attribution show and the choice is kept in the workbook", async () => {
    const input = await inputWorkbook();
    const mapPage = await context!.newPage();
    let tiles: Awaited<ReturnType<typeof startTileServer>> | undefined;
    const requested: string[] = [];
    mapPage.on("request", (req) => void requested.push(req.url()));
    mapPage.on("pageerror", (err) => console.error("map page error:", err.message));
    mapPage.on("console", (m) => m.type() === "error" && console.error("map page console:", m.text()));
    try {
      await mapPage.setViewportSize({ width: 350, height: 900 });
      await mapPage.goto(`${baseUrl}/taskpane.html`);
      await mapPage.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await mapPage.setInputFiles("#file-input", input.path);
      await mapPage.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await mapPage.fill("#seconds", "3");
      await mapPage.locator("#seconds").dispatchEvent("change");
      await mapPage.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await mapPage.click("#optimize");
      try {
        await mapPage.waitForSelector("#result-section:not([hidden])", { timeout: 300_000 });
      } catch (err) {
        // Say what the pane showed, so a failure here can be told apart from a slow machine.
        console.error(
          "pane state:",
          await mapPage.locator("#optimize-section").getAttribute("data-state"),
          "| error:",
          await mapPage.locator("#pane-error-text").textContent(),
        );
        throw err;
      }
      await expect.poll(() => mapPage.locator("#route-map").getAttribute("data-routes"), { timeout: 30_000 }).toMatch(/vehicle/);
      mkdirSync(ARTIFACTS, { recursive: true });

      for (const width of [350, 1200]) {
        await mapPage.setViewportSize({ width, height: 900 });
        await expect
          .poll(() => mapPage.evaluate(() => (document.getElementById("route-map") as HTMLCanvasElement).width / devicePixelRatio), {
            timeout: 10_000,
          })
          .toBeCloseTo(await mapPage.evaluate(() => document.getElementById("route-map")!.clientWidth), 0);
        const geometry = await mapPage.evaluate(() => {
          const canvas = document.getElementById("route-map")!;
          const c = canvas.getBoundingClientRect();
          const labels = [...document.querySelectorAll<HTMLElement>("#map-labels .map-label")].map((el) => {
            const r = el.getBoundingClientRect();
            return {
              text: el.textContent ?? "",
              kind: el.classList.contains("depot") ? "depot" : "vehicle",
              x: r.left,
              y: r.top,
              w: r.width,
              h: r.height,
            };
          });
          return {
            canvas: { x: c.left, y: c.top, w: c.width, h: c.height },
            labels,
            depots: JSON.parse(canvas.dataset.depots ?? "[]") as { name: string; x: number; y: number }[],
            routes: JSON.parse(canvas.dataset.routes ?? "[]") as { vehicle: string; stops: string[] }[],
            omitted: Number(document.getElementById("map-labels")!.dataset.omitted),
            pageWidth: document.documentElement.clientWidth,
          };
        });
        // Bounding boxes (CSSOM View getBoundingClientRect): no two labels share area, none covers a depot square.
        const shared = (a: { x: number; y: number; w: number; h: number }, b: typeof a) =>
          Math.max(0, Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x)) *
          Math.max(0, Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y));
        const { labels, canvas } = geometry;
        expect(labels.length).toBeGreaterThan(0);
        for (let i = 0; i < labels.length; i++)
          for (let j = i + 1; j < labels.length; j++)
            expect(shared(labels[i]!, labels[j]!), `${labels[i]!.text} / ${labels[j]!.text} at ${width}px`).toBe(0);
        for (const d of geometry.depots) {
          const square = { x: canvas.x + d.x - 6, y: canvas.y + d.y - 6, w: 12, h: 12 };
          for (const l of labels) expect(shared(l, square), `${l.text} over depot ${d.name} at ${width}px`).toBe(0);
        }
        for (const l of labels) {
          expect(l.x).toBeGreaterThanOrEqual(canvas.x - 0.5);
          expect(l.x + l.w).toBeLessThanOrEqual(canvas.x + canvas.w + 0.5);
        }
        // Every used vehicle is labelled unless no free place was left (counted, never drawn over another).
        const vehicleLabels = labels.filter((l) => l.kind === "vehicle").map((l) => l.text);
        expect(vehicleLabels.length + geometry.omitted).toBeGreaterThanOrEqual(geometry.routes.length);
        for (const r of geometry.routes) if (!vehicleLabels.includes(r.vehicle)) expect(geometry.omitted).toBeGreaterThan(0);
        // Every depot is labelled (a long name cut with an ellipsis, so it starts with the name's first characters).
        const depotLabels = labels.filter((l) => l.kind === "depot").map((l) => l.text);
        for (const d of geometry.depots) expect(depotLabels, `label of ${d.name} at ${width}px`).toContain(d.name);

        // Hover every point of the canvas: each tooltip shown lies inside the map and the page width.
        const tips = await mapPage.evaluate(() => {
          const canvas = document.getElementById("route-map")!;
          const tip = document.getElementById("map-tooltip")!;
          const box = canvas.getBoundingClientRect();
          const out: { text: string; left: number; right: number; top: number; bottom: number }[] = [];
          for (let y = 0; y < box.height; y += 4)
            for (let x = 0; x < box.width; x += 4) {
              canvas.dispatchEvent(new MouseEvent("mousemove", { clientX: box.left + x, clientY: box.top + y, bubbles: true }));
              if (tip.hidden) continue;
              const r = tip.getBoundingClientRect();
              out.push({
                text: tip.textContent ?? "",
                left: r.left - box.left,
                right: r.right - box.left,
                top: r.top - box.top,
                bottom: r.bottom - box.top,
              });
            }
          canvas.dispatchEvent(new MouseEvent("mouseleave"));
          return { tips: out, w: box.width, h: box.height };
        });
        expect(tips.tips.some((t) => /stop \d+ of \d+\narrives \d\d:\d\d/.test(t.text))).toBe(true);
        expect(tips.tips.some((t) => /\ndepot$/.test(t.text))).toBe(true);
        for (const t of tips.tips) {
          expect(t.left, t.text).toBeGreaterThanOrEqual(0);
          expect(t.top, t.text).toBeGreaterThanOrEqual(0);
          expect(t.right, t.text).toBeLessThanOrEqual(tips.w);
          expect(t.bottom, t.text).toBeLessThanOrEqual(tips.h);
        }
        await mapPage.locator("#result-section").screenshot({ path: join(ARTIFACTS, `route-map-${width}px.png`) });
      }

      // The legend: Enter on an entry highlights its route, Space again shows all (WAI-ARIA toggle button, aria-pressed).
      const first = mapPage.locator("#map-legend button.legend-entry").first();
      const vehicle = await first.getAttribute("data-vehicle");
      await first.focus();
      await mapPage.keyboard.press("Enter");
      await expect.poll(() => mapPage.locator("#route-map").getAttribute("data-highlight")).toBe(vehicle);
      await expect(mapPage.locator(`#map-legend button[data-vehicle="${vehicle}"]`).getAttribute("aria-pressed")).resolves.toBe("true");
      await mapPage.locator("#result-section").screenshot({ path: join(ARTIFACTS, "route-map-highlight.png") });
      await mapPage.keyboard.press("Space");
      await expect.poll(() => mapPage.locator("#route-map").getAttribute("data-highlight")).toBe("");
      await mapPage.locator("#map-legend button.legend-entry").nth(1).click();
      await expect.poll(() => mapPage.locator("#route-map").getAttribute("data-highlight")).not.toBe("");

      // The map in words lists every served stop once, in route order.
      const routes = JSON.parse((await mapPage.locator("#route-map").getAttribute("data-routes")) ?? "[]") as { stops: string[] }[];
      const spoken = await mapPage.locator("#map-text ol > li").count();
      expect(spoken).toBe(routes.reduce((s, r) => s + r.stops.length, 0));

      // Without a background template nothing is requested from anywhere but the page's own server.
      expect(requested.filter((u) => !u.startsWith(baseUrl) && !/^(blob|data):/.test(u))).toEqual([]);
      await expect(mapPage.locator("#map-tiles").isHidden()).resolves.toBe(true);
      // The map library is not even loaded (its chunk is named "leaflet").
      expect(requested.some((u) => /leaflet/i.test(u))).toBe(false);

      // A background from a loopback tile server: tiles are asked for by {z}/{x}/{y}, load, and the attribution shows.
      tiles = await startTileServer();
      await mapPage.setViewportSize({ width: 350, height: 900 });
      await mapPage.click("#map-background summary");
      await mapPage.fill("#map-tile-template", `${tiles.url}/{z}/{x}/{y}`);
      await mapPage.fill("#map-tile-attribution", "");
      await mapPage.click("#map-background-apply");
      await expect(mapPage.locator("#map-background-status").textContent()).resolves.toMatch(/Attribution: empty/);
      expect(tiles.requests).toEqual([]);
      await mapPage.fill("#map-tile-attribution", "Test tiles <b>made here</b>");
      await mapPage.click("#map-background-apply");
      await expect.poll(() => tiles!.requests.length, { timeout: 30_000 }).toBeGreaterThan(0);
      expect(requested.some((u) => u.startsWith(baseUrl) && /\/leaflet\.[0-9a-f]{8}\.js$/.test(u))).toBe(true);
      await expect
        .poll(async () => Number(await mapPage.locator("#map-tiles").getAttribute("data-loaded")), { timeout: 30_000 })
        .toBeGreaterThan(0);
      await expect(mapPage.locator("#map-tiles").getAttribute("data-failed")).resolves.toBe("0");
      // Slippy-map tile paths (common practice): /z/x/y with 0 <= x, y < 2^z.
      for (const path of tiles.requests) {
        const m = /^\/(\d+)\/(\d+)\/(\d+)$/.exec(path);
        expect(m, path).not.toBeNull();
        const [z, x, y] = m!.slice(1).map(Number) as [number, number, number];
        expect(x).toBeLessThan(2 ** z);
        expect(y).toBeLessThan(2 ** z);
      }
      // The attribution is shown as text, never read as markup.
      await expect(mapPage.locator("#map-attribution").textContent()).resolves.toBe("Background: Test tiles <b>made here</b>");
      await expect(mapPage.locator("#map-attribution").isVisible()).resolves.toBe(true);
      const tiled = await mapPage.evaluate(() =>
        [...document.querySelectorAll<HTMLElement>("#map-labels .map-label")].map((el) => {
          const r = el.getBoundingClientRect();
          return { x: r.left, y: r.top, w: r.width, h: r.height };
        }),
      );
      expect(tiled.length).toBeGreaterThan(0);
      for (let i = 0; i < tiled.length; i++)
        for (let j = i + 1; j < tiled.length; j++) {
          const a = tiled[i]!;
          const b = tiled[j]!;
          expect(
            Math.max(0, Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x)) *
              Math.max(0, Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y)),
          ).toBe(0);
        }
      await mapPage.locator("#result-section").screenshot({ path: join(ARTIFACTS, "route-map-tiles-350px.png") });
      const tilesOrigin = tiles.url;
      expect(requested.filter((u) => !u.startsWith(baseUrl) && !u.startsWith(tilesOrigin) && !/^(blob|data):/.test(u))).toEqual([]);

      // The choice is kept in the workbook's settings store: written into the downloaded file.
      await mapPage.click("#write");
      await mapPage.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
      const [download] = await Promise.all([mapPage.waitForEvent("download"), mapPage.click("#download")]);
      const saved = join(userDataDir, "map-background.xlsx");
      await download.saveAs(saved);
      const book = new ExcelJS.Workbook();
      await book.xlsx.readFile(saved);
      const stored = (await sheetValues(book, "kiln-settings")).find((row) => row[0] === "kiln.pane.mapBackground");
      expect(JSON.parse(String(stored?.[1]))).toEqual({ template: `${tiles.url}/{z}/{x}/{y}`, attribution: "Test tiles <b>made here</b>" });

      // No background again: the tiles go, and no further tile is asked for.
      await mapPage.click("#map-background-clear");
      await expect(mapPage.locator("#map-tiles").isHidden()).resolves.toBe(true);
      await expect(mapPage.locator("#map-attribution").isHidden()).resolves.toBe(true);
      const asked = tiles.requests.length;
      await mapPage.setViewportSize({ width: 1000, height: 900 });
      await mapPage.setViewportSize({ width: 350, height: 900 });
      expect(tiles.requests.length).toBe(asked);
    } finally {
      await mapPage.close();
      await tiles?.close();
      input.cleanup();
    }
  }, 600_000);

  it("geocodes an address-only workbook against a loopback service (CORS), shows progress and the review, plans, and the download keeps the answers", async () => {
    const geo = await startGeocodeServer();
    const dir = mkdtempSync(join(tmpdir(), "kiln-geo-"));
    // A page of its own: earlier tests leave an Office host hint in theirs.
    const page = await context!.newPage();
    try {
      const outside: string[] = [];
      await page.route("**/*", (route) => {
        const url = route.request().url();
        if (url.startsWith(baseUrl) || url.startsWith(geo.origin) || url.startsWith("blob:") || url.startsWith("data:"))
          return route.continue();
        outside.push(url);
        return route.abort();
      });
      // Invented addresses of the loopback service's address book (test/geocode/geocodeServer.ts).
      const wb = new ExcelJS.Workbook();
      const stops = wb.addWorksheet("Stops");
      stops.addRow(["Stop", "Street", "Town", "Demand"]);
      const streets = [
        ["1 Kiln Lane", "Brickfield"],
        ["Clay Street", "Brickfield"],
        ["12 Glaze Street", "Potterton"],
        ["4 Throw Court", "Potterton"],
        ["Nowhere Road 9", "Brickfield"],
      ];
      streets.forEach(([street, town], i) => stops.addRow([`S${i + 1}`, street, town, 1]));
      const fleet = wb.addWorksheet("Fleet");
      fleet.addRow(["Vehicle", "Capacity", "Depot address", "Shift start", "Shift end"]);
      fleet.addRow(["Van A", 40, "1 Depot Yard, Brickfield", "07:00", "17:00"]);
      const input = join(dir, "addresses.xlsx");
      await wb.xlsx.writeFile(input);

      await page.setViewportSize({ width: 360, height: 900 });
      await page.goto(`${baseUrl}/taskpane.html`);
      await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await page.setInputFiles("#file-input", input);
      // Without a geocoder: the clear error, and nothing has been sent anywhere.
      await expect.poll(() => page.locator("#stops-issues").textContent(), { timeout: 30_000 }).toMatch(/set up a geocoding service/);
      await expect(page.locator("#optimize").isDisabled()).resolves.toBe(true);
      expect(geo.seen).toHaveLength(0);

      await page.fill("#geocoder-url", geo.template);
      await page.fill("#geocoder-rate", "2");
      await page.click("#geocode");
      await expect
        .poll(() => page.locator("#geocode-progress").textContent(), { timeout: 30_000 })
        .toMatch(/Looked up [1-5] of 6 addresses · about \d+ s left/);
      await expect
        .poll(() => page.locator("#geocode-progress").textContent(), { timeout: 60_000 })
        .toMatch(/6 of 6 addresses looked up \(6 requests/);
      // The review lists the doubtful first: not found, then approximate (a street), then the found ones.
      const qualities = await page.locator("#geocode-review li").evaluateAll((lis) => lis.map((li) => (li as HTMLElement).dataset.quality));
      expect(qualities).toEqual(["not-found", "approximate", "found", "found", "found", "found"]);
      await expect(page.locator("#geocode-review li").first().textContent()).resolves.toMatch(
        /Stops!B6.*Nowhere Road 9, Brickfield → not found/,
      );

      await page.click("#geocode-write");
      await expect.poll(() => page.locator("#geocode-progress").textContent()).toMatch(/Added \d+ cells/);
      await page.fill("#seconds", "1");
      await page.locator("#seconds").dispatchEvent("change");
      await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await page.click("#optimize");
      await page.waitForSelector("#result-section:not([hidden])", { timeout: 60_000 });
      await page.click("#write");
      await page.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
      const [download] = await Promise.all([page.waitForEvent("download"), page.click("#download")]);
      const saved = join(dir, "downloaded.xlsx");
      await download.saveAs(saved);

      const out = new ExcelJS.Workbook();
      await out.xlsx.readFile(saved);
      // The answers are kept on a very hidden sheet (ECMA-376 Part 1, 18.18.68 ST_SheetState).
      const cache = out.getWorksheet("kiln-geocodes");
      expect(cache?.state).toBe("veryHidden");
      expect(cache?.rowCount).toBe(7);
      // "Add coordinates to the sheet" wrote into empty cells to the right of the table.
      const written = await sheetValues(out, "Stops");
      expect(written[0]?.slice(4, 7)).toEqual(["Latitude", "Longitude", "Geocode match"]);
      expect(written[1]?.slice(4, 7)).toEqual([52.0903, 5.1201, "found: 1 Kiln Lane, Brickfield"]);
      // The plan lists the stop not found as unassigned with that reason.
      const plan = await sheetValues(out, "Plan 1");
      expect(plan.flat().some((v) => typeof v === "string" && /was not found by the geocoding service/.test(v))).toBe(true);
      expect(outside).toEqual([]);
    } finally {
      await page.close();
      await geo.close();
      rmSync(dir, { recursive: true, force: true });
    }
  }, 300_000);
});
