/**
 * Several workers in the standalone page (Debian's Chromium through playwright-core, never a
 * downloaded one): the demo workbook with a move budget in its Settings sheet, planned with two
 * Web Workers, gives the plan `kiln plan --workers 2` gives on the same file; the Workers field
 * starts at the browser's cores minus one; the run figures name the chains and the memory figure;
 * both plan sheets record Workers 2. Skips with a printed reason when Chromium is absent, fails
 * under CI.
 */
import { existsSync } from "node:fs";
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import ExcelJS from "exceljs";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { routeRows } from "../fixtures/dispatcherWorkbook.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";
import { openPageSession, type PageSession } from "./pageSession.js";

const CHROMIUM = existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the workers browser test: /usr/bin/chromium is missing.");
}

const DEMO = new URL("../../demo/kiln-demo.xlsx", import.meta.url);

/** The value under a label of the plan sheet's settings block. */
function settingOf(plan: unknown[][], label: string): unknown {
  const r = plan.findIndex((row) => row?.includes(label));
  if (r < 0) throw new Error(`no "${label}" in the plan sheet`);
  return plan[r + 1]![plan[r]!.indexOf(label)];
}

describe.skipIf(!CHROMIUM)("several workers in the standalone page", () => {
  let session: PageSession | undefined;
  let page: Page;
  let baseUrl = "";
  let dir = "";

  beforeAll(async () => {
    session = await openPageSession(CHROMIUM!, "kiln-workers-");
    ({ page, baseUrl, dir } = session);
  }, 600_000);

  afterAll(async () => {
    await session?.close();
  });

  it("two workers with the demo's seed and a move budget give the CLI's --workers 2 plan, stop by stop, and say so", async () => {
    // The demo with a move budget added to its Settings sheet: a move budget makes a run reproducible (DESIGN.md §4).
    const book = new ExcelJS.Workbook();
    const bytes = await readFile(DEMO);
    await book.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    book.getWorksheet("Settings")!.addRow(["Move budget", 6000, "reproducible run length"]);
    const input = join(dir, "demo-moves.xlsx");
    await writeFile(input, new Uint8Array(await book.xlsx.writeBuffer()));

    await page.goto(`${baseUrl}/index.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    // The field starts at the cores the browser reports minus one, at least 1.
    const cores = await page.evaluate(() => navigator.hardwareConcurrency);
    await expect(page.locator("#workers").inputValue()).resolves.toBe(String(Math.max(1, cores - 1)));
    await page.setInputFiles("#file-input", input);
    await expect.poll(() => page.locator("#settings-source").textContent(), { timeout: 30_000 }).toMatch(/move budget 6000/);
    await page.fill("#workers", "2");
    await page.locator("#workers").dispatchEvent("change");
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 120_000 });
    await page.click("#optimize");
    await page.waitForSelector("#result-section:not([hidden])", { timeout: 300_000 });
    await expect(page.locator("#stat-workers").textContent()).resolves.toMatch(
      /^2, the best plan shared 7 times; the plan is chain [12]'s \([\d,]+ moves in all\)$/,
    );
    // Chromium offers performance.memory in pages, not in workers: the figure then says so.
    await expect(page.locator("#stat-memory").textContent()).resolves.toMatch(/^(\d+ MB JS heap \(largest worker\)|not available: .+)$/);
    const shownBest = Number((await page.locator("#stat-best").textContent())!.replace(/,/g, ""));
    await page.click("#write");
    await page.waitForSelector("#download:not([hidden])", { timeout: 60_000 });
    const [download] = await Promise.all([page.waitForEvent("download"), page.click("#download")]);
    const saved = join(dir, "demo-moves.page.xlsx");
    await download.saveAs(saved);
    const pagePlan = sheetValues(await loadWithExcelJs(await readFile(saved)), "Plan 1");

    const cliOut = join(dir, "demo-moves.cli.xlsx");
    const cap = captureIO();
    expect(await main(["plan", input, "--workers", "2", "--scenario", "Plan 1", "--out", cliOut], cap.io), cap.err()).toBe(0);
    // A budget of 6 000 moves has seven marks where the chains share (shareMarks), in the page as in the CLI.
    expect(cap.out()).toMatch(/Chains: 2 on worker threads, \d+ moves in all, the best plan shared 7 times/);
    const cliPlan = sheetValues(await loadWithExcelJs(await readFile(cliOut)), "Plan 1");
    // Same file, seed, move budget and two chains: the same routes, stop by stop, in page and CLI.
    const routes = (plan: unknown[][]) => routeRows(plan).map((r) => [r.Vehicle, r.Seq, r.Stop, r.Start]);
    expect(routes(pagePlan)).toEqual(routes(cliPlan));
    expect(routes(pagePlan).length).toBeGreaterThan(10);
    // Both plan sheets record the workers used; the cost the pane showed is the kept plan's exact cost.
    expect(settingOf(pagePlan, "Workers")).toBe(2);
    expect(settingOf(cliPlan, "Workers")).toBe(2);
    expect(settingOf(pagePlan, "Moves")).toBe(settingOf(cliPlan, "Moves"));
    expect(shownBest).toBeCloseTo(Number(settingOf(pagePlan, "Cost")), 1);
  }, 900_000);
});
