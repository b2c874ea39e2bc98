/**
 * A dispatcher's own workbook in the standalone page (Debian's Chromium through playwright-core,
 * never a downloaded one): a title row and merged group headers above the header, sheets not named
 * Stops or Fleet, a "Drop time" column, a column the user maps in the pane, and the workbook's
 * Settings sheet starting the form. The same file plans the same in the page and in the CLI.
 * Skips with a printed reason when Chromium is absent, fails under CI.
 */
import { existsSync, writeFileSync } from "node:fs";
import { readFile } from "node:fs/promises";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { COLUMN_MAP_KEY } from "../../src/sheets/columnMap.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import {
  DISPATCHER_STOPS,
  DROP_TIMES,
  DISPATCHER_DEPOTS,
  dispatcherAddressWorkbook,
  dispatcherWorkbook,
  routeRows,
  serviceMinutes,
  type DispatcherWorkbookOptions,
} from "../fixtures/dispatcherWorkbook.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";
import { openPageSession, type PageSession } from "./pageSession.js";
import { startGeocodeServer } from "../geocode/geocodeServer.js";

const CHROMIUM = existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the dispatcher-workbook browser test: /usr/bin/chromium is missing.");
}

describe.skipIf(!CHROMIUM)("a dispatcher's workbook in the standalone page", () => {
  let session: PageSession | undefined;
  let page: Page;
  let baseUrl = "";
  let dir = "";

  beforeAll(async () => {
    session = await openPageSession(CHROMIUM!, "kiln-dispatcher-");
    ({ page, baseUrl, dir } = session);
  }, 600_000);

  afterAll(async () => {
    await session?.close();
  });

  /** Open a built workbook in a fresh page and wait until both tables are read. */
  async function open(name: string, options: DispatcherWorkbookOptions): Promise<string> {
    const path = join(dir, name);
    writeFileSync(path, await dispatcherWorkbook(options));
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    await page.setInputFiles("#file-input", path);
    await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/10 data rows/);
    return path;
  }

  /** Plan routes, write, download; the downloaded file's path. */
  async function planAndDownload(name: string): Promise<string> {
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    await page.click("#optimize");
    await page.waitForSelector("#result-section:not([hidden])", { timeout: 300_000 });
    await page.click("#write");
    await page.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
    const [download] = await Promise.all([page.waitForEvent("download"), page.click("#download")]);
    const saved = join(dir, name);
    await download.saveAs(saved);
    return saved;
  }

  it("finds the stops under a title row and merged group headers, starts the form from the Settings sheet, and plans as the CLI does", async () => {
    // Seed and move budget from the sheet: a move budget makes the run reproducible (DESIGN.md §4).
    const settings = [
      ["Seed", 7],
      ["Move budget", 4000],
      ["Service time", 12],
    ] as const;
    const input = await open("round.xlsx", { settings });
    await expect(page.locator("#stops-sheet").inputValue()).resolves.toBe("Thursday round");
    await expect(page.locator("#fleet-sheet").inputValue()).resolves.toBe("Vans");
    await expect(page.locator("#settings-source").textContent()).resolves.toMatch(
      /^Settings from sheet Settings \(also move budget 4000\)/,
    );
    await expect(page.locator("#seed").inputValue()).resolves.toBe("7");
    await expect(page.locator("#service").inputValue()).resolves.toBe("12");
    await expect(page.locator("#stops-issues li").count()).resolves.toBe(0);
    // The Drop time column is used as Service min, and says so beside the column.
    await expect(page.locator('#stops-summary .col[data-column="F"] select').inputValue()).resolves.toBe("Service min");
    const saved = await planAndDownload("round.page.xlsx");
    const pagePlan = sheetValues(await loadWithExcelJs(await readFile(saved)), "Plan 1");
    expect(serviceMinutes(pagePlan)).toEqual(DROP_TIMES);

    const cliOut = join(dir, "round.cli.xlsx");
    const cap = captureIO();
    expect(await main(["plan", input, "--scenario", "Plan 1", "--out", cliOut], cap.io), cap.err()).toBe(0);
    const cliPlan = sheetValues(await loadWithExcelJs(await readFile(cliOut)), "Plan 1");
    // Same file, same settings, same seed and move budget: the same routes, stop by stop.
    const routes = (plan: unknown[][]) => routeRows(plan).map((r) => [r.Vehicle, r.Seq, r.Stop, r.Start]);
    expect(routes(pagePlan)).toEqual(routes(cliPlan));
    expect(routes(pagePlan).length).toBeGreaterThan(DISPATCHER_STOPS.length);
  }, 600_000);

  it("warns about an unknown drop-time column, maps it with the column's select, remembers it in the workbook for the CLI too", async () => {
    await open("handover.xlsx", { dropHeader: "Handover (mins)", settings: [["Move budget", 3000]] });
    const warning = page.locator("#stops-issues li.warning", { hasText: "Handover (mins)" });
    await expect(warning.textContent()).resolves.toContain(
      'column "Handover (mins)" is not used; if it holds service minutes, map it to Service min.',
    );
    const select = page.locator('#stops-summary .col[data-column="F"] select');
    await expect(select.inputValue()).resolves.toBe("carry");
    await select.selectOption("Service min");
    await expect.poll(() => page.locator('#stops-summary .col[data-column="F"]').getAttribute("data-field")).toBe("serviceMin");
    await expect(page.locator("#stops-issues li", { hasText: "Handover (mins)" }).count()).resolves.toBe(0);
    const saved = await planAndDownload("handover.page.xlsx");
    const book = await loadWithExcelJs(await readFile(saved));
    const plan = sheetValues(book, "Plan 1");
    expect(serviceMinutes(plan)).toEqual(DROP_TIMES);
    const labels = plan[2]!.map(String);
    expect(plan[3]![labels.indexOf("Columns mapped")]).toBe("Handover (mins)=Service min");
    const stored = await (await ExcelJsWorkbook.fromBuffer(await readFile(saved))).readSettings();
    expect(JSON.parse(stored[COLUMN_MAP_KEY]!)).toEqual([{ header: "Handover (mins)", field: "Service min" }]);

    // The CLI on the downloaded workbook uses the remembered mapping.
    const cap = captureIO();
    const out = join(dir, "handover.cli.xlsx");
    expect(await main(["plan", saved, "--out", out], cap.io), cap.err()).toBe(0);
    expect(serviceMinutes(sheetValues(await loadWithExcelJs(await readFile(out)), "Plan"))).toEqual(DROP_TIMES);
  }, 600_000);

  it("plans an address-only workbook (depots as addresses too) through a loopback geocoder: Default country from the Settings sheet, the doubtful match drawn distinctly on the map, drop minutes used, the same plan as the CLI", async () => {
    const geo = await startGeocodeServer();
    const own = await session!.context.newPage();
    try {
      // Nothing may leave the machine: our own server, the loopback geocoder, blobs and data URLs.
      const outside: string[] = [];
      await own.route("**/*", (route) => {
        const url = route.request().url();
        if (url.startsWith(baseUrl) || url.startsWith(geo.origin) || url.startsWith("blob:") || url.startsWith("data:"))
          return route.continue();
        outside.push(url);
        return route.abort();
      });
      const input = join(dir, "addresses.xlsx");
      writeFileSync(
        input,
        await dispatcherAddressWorkbook([
          ["Seed", 3],
          ["Move budget", 6000],
        ]),
      );
      await own.goto(`${baseUrl}/taskpane.html`);
      await own.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
      await own.setInputFiles("#file-input", input);
      await expect.poll(() => own.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/10 data rows/);
      await expect(own.locator("#stops-sheet").inputValue()).resolves.toBe("Thursday round");
      await expect(own.locator("#fleet-sheet").inputValue()).resolves.toBe("Vans");
      // The pane's Default country comes from the Settings sheet, as the CLI's does.
      await expect(own.locator("#geocoder-country").inputValue()).resolves.toBe("Kilnland");
      await expect(own.locator("#settings-source").textContent()).resolves.toMatch(/default country Kilnland/);
      expect(geo.seen).toHaveLength(0);

      await own.fill("#geocoder-url", geo.template);
      await own.fill("#geocoder-rate", "50");
      await own.click("#geocode");
      // 10 stops, two vans starting at one yard, one end depot: 13 rows, 12 distinct addresses.
      await expect
        .poll(() => own.locator("#geocode-progress").textContent(), { timeout: 60_000 })
        .toMatch(/13 of 13 addresses looked up \(12 requests/);
      expect(geo.seen.every((s) => s.query.endsWith(" kilnland"))).toBe(true);
      const first = own.locator("#geocode-review li").first();
      await expect(first.getAttribute("data-quality")).resolves.toBe("approximate");
      await expect(first.textContent()).resolves.toMatch(/Thursday round!C6.*Mill Street, Crustwick, Kilnland → approximate/);
      await expect(own.locator("#stops-issues li").count()).resolves.toBe(0);
      await expect(own.locator("#fleet-issues li").count()).resolves.toBe(0);
      // "Add coordinates to the sheet" writes the depots' points too (checked in the download below).
      await own.click("#geocode-write");
      await expect.poll(() => own.locator("#geocode-progress").textContent(), { timeout: 30_000 }).toMatch(/^Added \d+ cells/);

      await own.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
      await own.click("#optimize");
      await own.waitForSelector("#result-section:not([hidden])", { timeout: 300_000 });
      // The doubtful stop is drawn distinctly, has a legend entry, and is listed in the map in words.
      await expect
        .poll(async () => JSON.parse((await own.locator("#route-map").getAttribute("data-doubtful")) ?? "[]"), { timeout: 30_000 })
        .toMatchObject([{ name: "Mill Street Deli", cell: "Thursday round!C6" }]);
      await expect(own.locator("#map-legend li.doubtful").textContent()).resolves.toMatch(/doubtful address match \(1\)/);
      await expect(own.locator("#map-text ul.doubtful li").allTextContents()).resolves.toEqual([
        "Mill Street Deli (Thursday round!C6): approximate (matched a street, not a house): Mill Street, Crustwick",
      ]);
      // The ring is on the canvas: pixels differ from a draw without the doubtful place.
      const [x, y] = await own.locator("#route-map").evaluate((c) => {
        const d = JSON.parse((c as HTMLCanvasElement).dataset.doubtful ?? "[]")[0];
        return [d.x, d.y];
      });
      const ringDark = await own.locator("#route-map").evaluate(
        (c, [px, py]) => {
          const canvas = c as HTMLCanvasElement;
          const ratio = canvas.width / canvas.clientWidth;
          const ctx = canvas.getContext("2d")!;
          // Sample the ring (radius 11 px) all round: a dashed dark ring leaves dark pixels on it.
          let dark = 0;
          for (let a = 0; a < 360; a += 10) {
            const sx = Math.round((px! + 11 * Math.cos((a * Math.PI) / 180)) * ratio);
            const sy = Math.round((py! + 11 * Math.sin((a * Math.PI) / 180)) * ratio);
            const [r, g, b] = ctx.getImageData(sx, sy, 1, 1).data;
            if (r! < 80 && g! < 80 && b! < 80) dark++;
          }
          return dark;
        },
        [x, y],
      );
      expect(ringDark).toBeGreaterThan(5);

      await own.click("#write");
      await own.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
      const [download] = await Promise.all([own.waitForEvent("download"), own.click("#download")]);
      const saved = join(dir, "addresses.page.xlsx");
      await download.saveAs(saved);
      const pageBook = await loadWithExcelJs(await readFile(saved));
      const pagePlan = sheetValues(pageBook, "Plan 1");
      // The depots' address text stays; their points (the service's answers) sit in new columns to
      // the right, start then end, before the match label: the same columns as kiln geocode writes.
      const vans = sheetValues(pageBook, "Vans");
      const { start, end } = DISPATCHER_DEPOTS;
      expect(vans[0]!.slice(2)).toEqual([
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
      expect(vans[1]!.slice(2)).toEqual([
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
      expect(vans[2]!.slice(6, 8)).toEqual([start.lat, start.lon]);
      expect(serviceMinutes(pagePlan)).toEqual(DROP_TIMES);
      const served = routeRows(pagePlan).filter((r) => /^K\d+$/.test(String(r.Stop)));
      expect(served.map((r) => String(r.Stop)).sort()).toEqual(DISPATCHER_STOPS.map((s) => s.ref).sort());
      expect(served.every((r) => r["Late min"] === 0)).toBe(true);

      // The CLI on the same file and service gives the same routes, stop by stop.
      const cliOut = join(dir, "addresses.cli.xlsx");
      const cap = captureIO();
      expect(
        await main(["plan", input, "--geocoder", geo.template, "--rate", "50", "--scenario", "Plan 1", "--out", cliOut], cap.io),
        cap.err(),
      ).toBe(0);
      const cliPlan = sheetValues(await loadWithExcelJs(await readFile(cliOut)), "Plan 1");
      const routes = (plan: unknown[][]) => routeRows(plan).map((r) => [r.Vehicle, r.Seq, r.Stop, r.Start]);
      expect(routes(pagePlan)).toEqual(routes(cliPlan));
      expect(outside).toEqual([]);
    } finally {
      await own.close();
      await geo.close();
    }
  }, 600_000);

  it("says why no stops sheet was taken and how to choose one", async () => {
    const path = join(dir, "nostops.xlsx");
    const book = ExcelJsWorkbook.fromGrids([
      {
        name: "Clients",
        values: [
          ["Ref", "Client", "Qty"],
          ["K1", "Mill", 3],
        ],
      },
      {
        name: "Vans",
        values: [
          ["Vehicle", "Capacity"],
          ["V1", 10],
        ],
      },
    ]);
    writeFileSync(path, await book.toBuffer());
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    await page.setInputFiles("#file-input", path);
    await expect
      .poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 })
      .toBe(
        'no sheet named "Stops" and no sheet that looks like a stops table; sheets looked at: "Clients" (its header on row 1 (A1) has no Latitude and Longitude, Coordinates or Address column), "Vans" (taken as the fleet); choose the stops sheet in the list above.',
      );
  }, 120_000);
});
