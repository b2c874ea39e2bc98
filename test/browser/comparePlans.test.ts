/**
 * "Compare plans…" in the standalone page (Debian's Chromium through playwright-core, never a
 * downloaded one): two temperature plans with two seeds each on the demo with one-second runs, the
 * table's rows and the overlaid curves, Stop in the middle, a bad plan refused with how to write it;
 * and, with a move budget, the page's costs equal to `kiln compare-schedules --json` on the same
 * file. Skips with a printed reason when Chromium is absent, fails under CI.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { dispatcherWorkbook } from "../fixtures/dispatcherWorkbook.js";
import { captureIO } from "../workbook/harness.js";
import { openPageSession, type PageSession } from "./pageSession.js";

const CHROMIUM = existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the compare-plans browser test: /usr/bin/chromium is missing.");
}
const ROOT = resolve(fileURLToPath(new URL("../..", import.meta.url)));
const DEMO = join(ROOT, "demo", "kiln-demo.xlsx");
const ARTIFACTS = join(ROOT, "test-artifacts");

/** The table's rows as the page shows them and as it keeps them in data attributes. */
interface Row {
  cells: string[];
  median: number;
  best: number;
  worst: number;
  feasible: number;
  costs: number[];
}

describe.skipIf(!CHROMIUM)("Compare plans… in the standalone page", () => {
  let session: PageSession | undefined;
  let page: Page;
  let baseUrl = "";
  let dir = "";

  beforeAll(async () => {
    session = await openPageSession(CHROMIUM!, "kiln-compare-", { viewport: { width: 350, height: 900 }, acceptDownloads: false });
    ({ page, baseUrl, dir } = session);
  }, 600_000);

  afterAll(async () => {
    await session?.close();
  });

  async function open(path: string): Promise<void> {
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    await page.setInputFiles("#file-input", path);
    await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows?/);
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    await page.click("#compare-plans summary");
  }

  async function rows(): Promise<Row[]> {
    return page.locator("#compare-table-body tr").evaluateAll((trs) =>
      trs.map((tr) => {
        const d = (tr as HTMLElement).dataset;
        return {
          cells: [...tr.children].map((c) => c.textContent ?? ""),
          median: Number(d.median),
          best: Number(d.best),
          worst: Number(d.worst),
          feasible: Number(d.feasible),
          costs: JSON.parse(d.costs ?? "[]") as number[],
        };
      }),
    );
  }

  it("compares the form's plan and the geometric defaults with two seeds each on the demo: one row per plan, curves overlaid, fits at 350 px", async () => {
    await open(DEMO);
    await expect(page.locator("#compare-current-text").textContent()).resolves.toMatch(
      /^time-based, acceptance 0\.50 → 0\.001, Metropolis \(time-based:/,
    );
    // A bad plan is refused with how to write it, and nothing runs.
    await page.fill("#compare-other", "geometric:alfa=0.9");
    await page.click("#compare-run");
    await expect
      .poll(() => page.locator("#compare-status").textContent())
      .toMatch(/Another plan "geometric:alfa=0.9": "alfa" is not a setting of a temperature plan: use alpha, level/);
    await expect(page.locator("#compare-plot").getAttribute("data-runs")).resolves.toBeNull();
    await page.fill("#compare-other", "");
    await page.fill("#compare-seeds", "2");
    await page.fill("#compare-seconds", "1");
    await page.click("#compare-run");
    // While it runs, Plan routes waits.
    await expect.poll(() => page.locator("#compare-stop").isEnabled()).toBe(true);
    await expect(page.locator("#optimize").isEnabled()).resolves.toBe(false);
    await expect
      .poll(() => page.locator("#compare-status").textContent(), { timeout: 120_000 })
      .toMatch(/^Done: 4 runs, 2 seed\(s\) from 7 for each of 2 plans, 1 s each\.$/);
    const table = await rows();
    expect(table).toHaveLength(2);
    for (const [i, r] of table.entries()) {
      // Two seeds: the median is the mean of the two costs (the usual definition), between best and worst.
      expect(r.costs).toHaveLength(2);
      expect(r.feasible).toBe(2);
      expect(r.best).toBe(Math.min(...r.costs));
      expect(r.worst).toBe(Math.max(...r.costs));
      expect(r.median).toBeCloseTo((r.costs[0]! + r.costs[1]!) / 2, 9);
      expect(r.cells[0]).toBe(String(i + 1));
      expect(r.cells[5]).toBe("2 of 2");
      expect(r.cells[2]).toBe(r.best.toLocaleString("en", { minimumFractionDigits: 2, maximumFractionDigits: 2 }));
    }
    const list = await page.locator("#compare-plan-list li").allTextContents();
    expect(list[0]).toMatch(/^time-based, acceptance 0\.50 → 0\.001, Metropolis — time-based:/);
    expect(list[1]).toBe("geometric ×0.94 levels spread over the run, acceptance 0.50 → 0.001, Metropolis — geometric");
    await expect(page.locator("#compare-plot").getAttribute("data-runs")).resolves.toBe("4");
    await expect(page.locator("#compare-plot canvas").count()).resolves.toBe(1);
    await expect(page.locator("#optimize").isEnabled()).resolves.toBe(true);
    mkdirSync(ARTIFACTS, { recursive: true });
    await page.locator("#compare-section").screenshot({ path: join(ARTIFACTS, "compare-plans.png") });
    // Nothing in the section is cut off or wider than the pane.
    const overflow = await page
      .locator("#compare-section")
      .evaluate((section) =>
        [...section.querySelectorAll<HTMLElement>("input, button, select, table, summary, label, canvas")]
          .filter(
            (el) =>
              el.offsetParent !== null &&
              (el.scrollWidth > el.clientWidth + 1 || el.getBoundingClientRect().right > document.documentElement.clientWidth),
          )
          .map((el) => el.id || el.tagName),
      );
    expect(overflow).toEqual([]);
    // Every control has an accessible name (a label, a legend's label or its text).
    const unnamed = await page
      .locator("#compare-section")
      .evaluate((section) =>
        [...section.querySelectorAll<HTMLInputElement | HTMLButtonElement>("input, button")]
          .filter((el) => !(el.labels && el.labels.length > 0) && !(el.textContent ?? "").trim() && !el.getAttribute("aria-label"))
          .map((el) => el.id || el.outerHTML),
      );
    expect(unnamed).toEqual([]);
    // axe-core (Deque's accessibility engine, from the npm registry) finds nothing in the open section with its table.
    // Evaluated, not added as a script tag: the page's Content-Security-Policy allows no inline script.
    await page.evaluate(readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8"));
    const violations = await page.evaluate(async () => {
      type Result = { id: string; help: string; nodes: { target: string[] }[] };
      const axe = (window as unknown as { axe: { run(c: Element, o: object): Promise<{ violations: Result[] }> } }).axe;
      const { violations } = await axe.run(document.getElementById("compare-section")!, { resultTypes: ["violations"] });
      return violations.map((v) => `${v.id}: ${v.help} at ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
    });
    expect(violations).toEqual([]);

    // Stop in the middle: the table counts the finished runs only.
    await page.fill("#compare-seeds", "5");
    await page.fill("#compare-seconds", "3");
    await page.click("#compare-run");
    await expect.poll(() => page.locator("#compare-plot").getAttribute("data-runs"), { timeout: 60_000 }).toBe("2");
    await page.click("#compare-stop");
    await expect
      .poll(() => page.locator("#compare-status").textContent(), { timeout: 60_000 })
      .toMatch(/^Stopped after 1 of 10 runs; the table counts the finished runs only\.$/);
    const stopped = await rows();
    expect(stopped[0]!.costs).toHaveLength(1);
    expect(stopped[0]!.cells[5]).toBe(`${stopped[0]!.feasible} of 1`);
    expect(stopped[1]!.cells.slice(1)).toEqual(["–", "–", "–", "–", "–"]);
    await expect(page.locator("#compare-run").isEnabled()).resolves.toBe(true);
  }, 600_000);

  it("with the workbook's move budget, gives exactly the costs `kiln compare-schedules --json` gives for the same file", async () => {
    const path = join(dir, "budget.xlsx");
    writeFileSync(
      path,
      await dispatcherWorkbook({
        settings: [
          ["Seed", 4],
          ["Move budget", 3000],
        ],
      }),
    );
    await open(path);
    await page.check("input[name='compare-plan'][value='lundy-mees']");
    await page.uncheck("#compare-current");
    await page.fill("#compare-seeds", "3");
    await page.click("#compare-run");
    await expect
      .poll(() => page.locator("#compare-status").textContent(), { timeout: 120_000 })
      .toMatch(/^Done: 6 runs, 3 seed\(s\) from 4 for each of 2 plans, 3000 moves/);
    const table = await rows();

    const cap = captureIO();
    const code = await main(
      ["compare-schedules", path, "--try", "geometric", "--try", "lundy-mees", "--seeds", "3", "--moves", "3000", "--json"],
      cap.io,
    );
    expect(code, cap.err()).toBe(0);
    const cli = JSON.parse(cap.out()) as {
      costs: number[];
      median: number;
      best: number;
      worst: number;
      feasible: number;
      seeds: number[];
    }[];
    expect(cli.map((c) => c.seeds)).toEqual([
      [4, 5, 6],
      [4, 5, 6],
    ]);
    expect(table.map((r) => r.costs)).toEqual(cli.map((c) => c.costs));
    expect(table.map((r) => [r.median, r.best, r.worst, r.feasible])).toEqual(cli.map((c) => [c.median, c.best, c.worst, c.feasible]));
  }, 600_000);
});
