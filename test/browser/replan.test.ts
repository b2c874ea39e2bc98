/**
 * Re-planning a published day in the standalone page (Debian's Chromium through playwright-core,
 * never a downloaded one): the page plans the demo and the workbook is downloaded; a stop row is
 * added to it (as a dispatcher would in Excel); the page opens it again, starts from the first
 * plan sheet with a high stability cost and one route locked, and plans. Expected values come
 * from the two plan sheets themselves, read back with exceljs (the reference reader): the locked
 * route is identical, at most the route that takes the new stop changes, the Compare row counts
 * the stops that changed vehicle, and the CLI gives the same routes from the same file, plan
 * sheet and lock. Skips with a printed reason when Chromium is absent, fails under CI.
 */
import { existsSync } from "node:fs";
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { captureIO, DEMO_URL, loadWithExcelJs, sheetValues } from "../workbook/harness.js";
import { openPageSession, type PageSession } from "./pageSession.js";

const CHROMIUM = existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the re-planning browser test: /usr/bin/chromium is missing.");
}

/** Stop ids per vehicle of a plan sheet's route table (depot, depot-end and break rows left out). */
function routesOf(plan: unknown[][]): Map<string, string[]> {
  const routes = new Map<string, string[]>();
  const header = plan.findIndex((r) => r?.[0] === "Vehicle" && r?.[1] === "Seq" && r?.[2] === "Stop");
  expect(header).toBeGreaterThan(0);
  for (let r = header + 1; r < plan.length; r++) {
    const row = plan[r] ?? [];
    if (row.every((c) => c === null || c === undefined || c === "")) break;
    const [vehicle, seq, stop, name] = row;
    if (typeof seq !== "number" || seq === 0 || name === "Depot end") continue;
    routes.set(String(vehicle), [...(routes.get(String(vehicle)) ?? []), String(stop)]);
  }
  return routes;
}

describe.skipIf(!CHROMIUM)("re-planning a published day in the standalone page", () => {
  let session: PageSession | undefined;
  let page: Page;
  let baseUrl = "";
  let dir = "";

  beforeAll(async () => {
    session = await openPageSession(CHROMIUM!, "kiln-replan-");
    ({ page, baseUrl, dir } = session);
  }, 600_000);

  afterAll(async () => {
    await session?.close();
  });

  /** Open a workbook file in a fresh page and wait until the stops are read. */
  async function open(path: string, stopRows: number): Promise<void> {
    await page.goto(`${baseUrl}/index.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    await page.setInputFiles("#file-input", path);
    await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 60_000 }).toMatch(new RegExp(`${stopRows} data rows`));
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

  it("starts from the first plan with one route locked: the locked route is identical, only the route taking the new stop changes, Compare counts the changes, the CLI agrees, and Rerun restores the choice", async () => {
    // The demo with a move budget in its Settings sheet, so page and CLI make the same moves.
    const demo = await loadWithExcelJs(await readFile(DEMO_URL));
    demo.getWorksheet("Settings")!.addRow(["Move budget", 20000, "same seed and move budget give the same plan"]);
    const input = join(dir, "day.xlsx");
    await writeFile(input, Buffer.from(await demo.xlsx.writeBuffer()));
    await open(input, 84);
    await expect(page.locator("#from-plan-sheet option").allTextContents()).resolves.toEqual(["none"]);
    const first = await planAndDownload("day.published.xlsx");
    const before = routesOf(sheetValues(await loadWithExcelJs(await readFile(first)), "Plan 1"));
    expect(before.size).toBeGreaterThan(1);

    // A stop added since the plan was published: a copy of a stop of another route, a little aside.
    const [lockedVan, lockedStops] = [...before].sort((a, b) => b[1].length - a[1].length)[0]!;
    const donorStop = [...before].find(([v]) => v !== lockedVan)![1][0]!;
    const book = await loadWithExcelJs(await readFile(first));
    const stops = book.getWorksheet("Stops")!;
    let donor: unknown[] | undefined;
    stops.eachRow((row) => {
      if (String(row.getCell(1).value) === donorStop) donor = (row.values as unknown[]).slice(1);
    });
    const latCol = (stops.getRow(1).values as unknown[]).slice(1).indexOf("Latitude");
    const added = [...donor!];
    added[0] = "NEW-1";
    added[1] = "Added after publishing";
    added[latCol] = Number(added[latCol]) + 0.002;
    stops.addRow(added);
    const edited = join(dir, "day.edited.xlsx");
    await writeFile(edited, Buffer.from(await book.xlsx.writeBuffer()));

    await open(edited, 85);
    // Plan sheets are offered (the route sheet is not one); none is chosen until the user does.
    await expect(page.locator("#from-plan-sheet option").allTextContents()).resolves.toEqual(["none", "Plan 1"]);
    await expect(page.locator("#from-plan-sheet").inputValue()).resolves.toBe("");
    await expect(page.locator("#locked-routes").isHidden()).resolves.toBe(true);
    await page.selectOption("#from-plan-sheet", "Plan 1");
    await page.waitForSelector("#locked-routes:not([hidden])");
    const boxes = page.locator("#locked-routes-list input[type=checkbox]");
    await expect(boxes.evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value).sort())).resolves.toEqual(
      [...before.keys()].sort(),
    );
    await expect(page.locator("#from-plan-summary").textContent()).resolves.toMatch(
      new RegExp(`'Plan 1'!A1:\\w+ · ${before.size} routes, ${[...before.values()].flat().length} stops`),
    );
    await page.fill("#stability-cost", "100000");
    await page.check(`#locked-routes-list input[value="${lockedVan}"]`);
    await expect(page.locator("#from-plan-issues li").count()).resolves.toBe(0);
    const second = await planAndDownload("day.replanned.xlsx");

    const out = await loadWithExcelJs(await readFile(second));
    const after = routesOf(sheetValues(out, "Plan 2"));
    expect(after.get(lockedVan)).toEqual(lockedStops);
    const takesNew = [...after].filter(([, s]) => s.includes("NEW-1")).map(([v]) => v);
    expect(takesNew).toHaveLength(1);
    const changed = [...new Set([...before.keys(), ...after.keys()])].filter(
      (v) => (after.get(v) ?? []).join() !== (before.get(v) ?? []).join(),
    );
    expect(changed.every((v) => takesNew.includes(v))).toBe(true);
    expect(changed.length).toBeLessThanOrEqual(1);
    // Compare: the count of Plan 1's stops served by another vehicle in Plan 2, from the two sheets.
    const vehicleOf = (routes: Map<string, string[]>) => new Map([...routes].flatMap(([v, s]) => s.map((id) => [id, v] as const)));
    const was = vehicleOf(before);
    const now = vehicleOf(after);
    const moved = [...was].filter(([id, v]) => now.has(id) && now.get(id) !== v).length;
    const compare = sheetValues(out, "Compare");
    const col = compare[0]!.indexOf("Changed vehicle");
    expect(col).toBeGreaterThan(0);
    const rowOf = (scenario: string) => compare.find((r) => r?.[0] === scenario)!;
    expect(rowOf("Plan 1")[col] ?? null).toBeNull();
    expect(rowOf("Plan 2")[col]).toBe(moved);
    // The settings block says where it started.
    const plan = sheetValues(out, "Plan 2");
    expect(plan[3]![plan[2]!.indexOf("Re-planned from")]).toBe(`Plan 1, stability cost 100000 per stop moved, locked: ${lockedVan}`);

    // The CLI on the same file, plan sheet, lock and stability cost gives the same routes, stop by stop.
    const cliOut = join(dir, "day.cli.xlsx");
    const cap = captureIO();
    const flags = ["--from-plan", "Plan 1", "--lock", lockedVan, "--stability-cost", "100000", "--scenario", "Plan 2"];
    expect(await main(["plan", edited, ...flags, "--out", cliOut], cap.io), cap.err()).toBe(0);
    const cliPlan = sheetValues(await loadWithExcelJs(await readFile(cliOut)), "Plan 2");
    const rows = (p: unknown[][]) => p.slice(p.findIndex((r) => r?.[0] === "Vehicle" && r?.[1] === "Seq")).map((r) => r?.slice(0, 5));
    expect(rows(plan)).toEqual(rows(cliPlan));

    // Rerun of the re-planned run: the plan sheet, the lock and the stability cost come back.
    await page.selectOption("#from-plan-sheet", "");
    await page.fill("#stability-cost", "");
    await expect(page.locator("#locked-routes").isHidden()).resolves.toBe(true);
    await page.selectOption("#rerun-sheet", "Plan 2");
    await page.click("#rerun");
    await expect.poll(() => page.locator("#from-plan-sheet").inputValue()).toBe("Plan 1");
    await expect(page.locator("#stability-cost").inputValue()).resolves.toBe("100000");
    await expect(page.locator(`#locked-routes-list input[value="${lockedVan}"]`).isChecked()).resolves.toBe(true);
    await expect(page.locator("#locked-routes-list input:checked").count()).resolves.toBe(1);
    await expect(page.locator("#rerun-status").textContent()).resolves.toContain('starting from plan sheet "Plan 1"');
  }, 900_000);
});
