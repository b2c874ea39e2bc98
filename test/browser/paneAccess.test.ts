/**
 * The standalone pane at a task pane's width (350 px) for everyone who dispatches, in Debian's
 * Chromium through playwright-core (never a downloaded browser):
 * - axe-core (Deque's accessibility engine, from the npm registry; its WCAG 2 A/AA and
 *   best-practice rules) reports no violation after opening the demo, during a run, after it,
 *   after a rerun is loaded and during the rerun;
 * - every control is reachable by Tab in the order of the steps, and Enter and Space operate the
 *   buttons (WAI-ARIA Authoring Practices, "Button pattern": Enter and Space activate a button);
 * - no control is cut off at 350 px; the first run after a Rerun gets a fresh scenario name;
 * - the production build's text and number inputs and selects share one computed style.
 * Skips with a printed reason when Chromium is absent, fails under CI.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import type { Server } from "node:http";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { serveStatic } from "../../scripts/serveStatic.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { DIST, ensureBuild } from "./ensureBuild.js";
import { CHROMIUM_FLAGS } from "../../scripts/chromiumFlags.js";
import { installFakeExcel } from "./fakeExcelHost.js";

const ROOT = resolve(fileURLToPath(new URL("../..", import.meta.url)));
const DEMO = join(ROOT, "demo", "kiln-demo.xlsx");
const PANE_WIDTH = 350;

const CHROMIUM = existsSync("/usr/bin/chromium") ? "/usr/bin/chromium" : undefined;
if (!CHROMIUM) {
  if (process.env.CI) throw new Error("Chromium is required under CI: install Debian's chromium package (/usr/bin/chromium).");
  console.warn("Skipping the pane accessibility test: /usr/bin/chromium is missing.");
}

/** The main controls in the order a dispatcher goes through the steps (file mode, before a run). */
const STEP_ORDER = [
  "file-input",
  "stops-sheet",
  "fleet-sheet",
  "scenario",
  "detour",
  "speed",
  "service",
  "windows",
  "seconds",
  "seed",
  "workers",
  "rule",
  "schedule",
  "temperatures",
  "p0",
  "p-end",
  "optimize",
  "rerun-sheet",
  "rerun",
];

describe.skipIf(!CHROMIUM)("the pane at 350 px: axe-core, keyboard, nothing cut off", () => {
  let server: Server | undefined;
  let baseUrl = "";
  let context: BrowserContext | undefined;
  let page: Page;
  let dir = "";
  let axeSource = "";

  beforeAll(async () => {
    await ensureBuild();
    axeSource = readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");
    ({ server, url: baseUrl } = await serveStatic(DIST));
    dir = mkdtempSync(join(tmpdir(), "kiln-access-"));
    context = await chromium.launchPersistentContext(join(dir, "profile"), {
      executablePath: CHROMIUM!,
      headless: true,
      args: [...CHROMIUM_FLAGS],
      viewport: { width: PANE_WIDTH, height: 900 },
    });
    page = context.pages()[0] ?? (await context.newPage());
    page.on("pageerror", (err) => console.error("page error:", err.message));
    // Nothing may leave the machine: only our own server, blobs and data URLs.
    await page.route("**/*", (route) => {
      const url = route.request().url();
      if (url.startsWith(baseUrl) || url.startsWith("blob:") || url.startsWith("data:")) return route.continue();
      return route.abort();
    });
  }, 600_000);

  afterAll(async () => {
    await context?.close();
    await new Promise<void>((ok) => (server ? server.close(() => ok()) : ok()));
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  /** axe-core's violations on the page as it is now, one line each (rule, impact, help, elements). */
  async function axeViolations(): Promise<string[]> {
    // Evaluated through the DevTools protocol: an inline script tag would be refused by the page's
    // Content-Security-Policy (script-src 'self'; docs/content-security-policy.md).
    if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(axeSource);
    return page.evaluate(async () => {
      type Result = { id: string; impact: string; help: string; nodes: { target: string[] }[] };
      const axe = (window as unknown as { axe: { run(c: Document, o: object): Promise<{ violations: Result[] }> } }).axe;
      const { violations } = await axe.run(document, { resultTypes: ["violations"] });
      return violations.map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
    });
  }

  /** Controls that stick out of the pane or cut their own text off, described for the failure message. */
  async function cutOffControls(): Promise<string[]> {
    return page.evaluate(() => {
      const width = document.documentElement.clientWidth;
      const found: string[] = [];
      if (document.documentElement.scrollWidth > width) {
        // Name the elements that stick out (the innermost ones), so the failure says what to fix.
        // An element past the edge, or one whose text runs out of its box.
        const out = [...document.querySelectorAll<HTMLElement>("body *")].filter(
          (el) =>
            el.getBoundingClientRect().right > width + 0.5 ||
            (el.scrollWidth > el.clientWidth + 1 && getComputedStyle(el).overflowX === "visible" && el.clientWidth > 0),
        );
        const innermost = out.filter((el) => !out.some((o) => o !== el && el.contains(o)));
        const names = innermost.slice(0, 5).map((el) => `${el.tagName.toLowerCase()}${el.id ? "#" + el.id : ""}.${String(el.className)}`);
        found.push(`page scrolls sideways: ${document.documentElement.scrollWidth} > ${width} (${names.join(", ")})`);
      }
      const canvas = document.createElement("canvas").getContext("2d")!;
      const controls = document.querySelectorAll<HTMLElement>("input, select, textarea, button, a.button, summary, .file-button span");
      for (const el of controls) {
        if (el.getClientRects().length === 0 || (el instanceof HTMLInputElement && el.type === "file")) continue;
        const name = el.id
          ? `#${el.id}`
          : `${el.tagName.toLowerCase()} "${(el.textContent ?? el.getAttribute("aria-label") ?? "").trim().slice(0, 40)}"`;
        const box = el.getBoundingClientRect();
        if (box.left < -0.5 || box.right > width + 0.5)
          found.push(`${name} spans ${box.left.toFixed(0)}..${box.right.toFixed(0)} of ${width}`);
        if (el.scrollWidth > el.clientWidth + 1) found.push(`${name} scrolls its content: ${el.scrollWidth} > ${el.clientWidth}`);
        if (el instanceof HTMLSelectElement && el.selectedOptions[0]) {
          // The chosen option's text must fit beside the drop-down arrow (16 px in Chromium's menu list).
          const style = getComputedStyle(el);
          canvas.font = `${style.fontStyle} ${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
          const text = canvas.measureText(el.selectedOptions[0].text).width;
          const room = el.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight) - 16;
          if (text > room + 0.5)
            found.push(`${name} shows "${el.selectedOptions[0].text}" in ${room.toFixed(0)} px, needs ${text.toFixed(0)}`);
        }
      }
      return found;
    });
  }

  /**
   * Press Tab from the top until focus comes back round; the ids (or a marker) of the elements
   * focused, and the visible, enabled controls never reached.
   */
  async function tabWalk(): Promise<{ order: string[]; missed: string[] }> {
    const keys = await page.evaluate(() => {
      const all = document.querySelectorAll<HTMLElement>("a[href], button, input, select, textarea, summary, [tabindex]");
      const keys: string[] = [];
      all.forEach((el, i) => {
        // A closed <details> shows only its summary; what it holds is reached once it is opened.
        const folded = el.tagName !== "SUMMARY" && el.closest("details:not([open])") !== null;
        const disabled = (el as HTMLButtonElement).disabled === true || el.closest("[hidden]") !== null || folded;
        const skipped = el.tabIndex < 0 || disabled || el.getClientRects().length === 0;
        el.dataset.tabKey = el.id || `${el.tagName.toLowerCase()}-${i}`;
        if (!skipped) keys.push(el.dataset.tabKey);
      });
      (document.activeElement as HTMLElement | null)?.blur();
      return keys;
    });
    const order: string[] = [];
    for (let i = 0; i < keys.length + 20; i++) {
      await page.keyboard.press("Tab");
      const key = await page.evaluate(() => (document.activeElement as HTMLElement | null)?.dataset.tabKey ?? "");
      if (key !== "" && key === order[0]) break;
      if (key !== "") order.push(key);
    }
    // Focus starts after the element last focused and wraps round: read the cycle from the first control.
    const start = Math.max(0, order.indexOf(keys[0] ?? ""));
    const cycle = [...order.slice(start), ...order.slice(0, start)];
    return { order: cycle, missed: keys.filter((k) => !order.includes(k)) };
  }

  /** Keys of `order` in `wanted`, in the order focus reached them. */
  const subsequence = (order: readonly string[], wanted: readonly string[]) => order.filter((k) => wanted.includes(k));

  it("opens the demo, runs, reruns: axe-core finds nothing at each step, Tab reaches every control in step order, Enter and Space press the buttons, nothing is cut off", async () => {
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    await expect(page.locator("#stops-summary").textContent()).resolves.toBe("Open a workbook file first.");
    await page.setInputFiles("#file-input", DEMO);
    await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows?/);
    await page.waitForSelector("#cooling-reading.ok", { timeout: 60_000 });

    // Step 1: the demo is open.
    expect.soft(await axeViolations(), "after opening the demo").toEqual([]);
    expect.soft(await cutOffControls(), "after opening the demo").toEqual([]);
    const opened = await tabWalk();
    expect.soft(opened.missed, "controls Tab never reaches").toEqual([]);
    expect.soft(subsequence(opened.order, STEP_ORDER)).toEqual(STEP_ORDER);

    // Choosing "no stops sheet" says what to choose instead of a bare "nothing chosen".
    await page.selectOption("#stops-sheet", "");
    await expect.poll(() => page.locator("#stops-summary").textContent()).toBe("Choose the stops sheet in the list above.");
    await page.selectOption("#stops-sheet", "Stops");
    await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows?/);

    // Step 2: a run, started with Enter on the focused Plan routes button (a long one, stopped below).
    await page.fill("#seconds", "120");
    await page.locator("#seconds").dispatchEvent("change");
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    await page.focus("#optimize");
    await page.keyboard.press("Enter");
    await expect
      .poll(async () => Number(await page.locator("#convergence-plot").getAttribute("data-points")), { timeout: 60_000 })
      .toBeGreaterThanOrEqual(2);
    await expect(page.locator("#optimize-section").getAttribute("data-state")).resolves.toBe("running");
    expect.soft(await axeViolations(), "during the run").toEqual([]);
    expect.soft(await cutOffControls(), "during the run").toEqual([]);

    // Space on the focused Stop button stops it.
    await page.focus("#stop");
    await page.keyboard.press("Space");
    await page.waitForSelector("#result-section:not([hidden])", { timeout: 60_000 });
    await expect(page.locator("#optimize-section").getAttribute("data-state")).resolves.toBe("stopped");

    // Step 3: after the run: the result with its map, legend and downloads.
    expect.soft(await axeViolations(), "after the run").toEqual([]);
    expect.soft(await cutOffControls(), "after the run").toEqual([]);
    const after = await tabWalk();
    expect.soft(after.missed, "controls Tab never reaches after the run").toEqual([]);
    expect
      .soft(subsequence(after.order, ["optimize", "write", "rerun-sheet", "rerun"]))
      .toEqual(["optimize", "write", "rerun-sheet", "rerun"]);
    // The background-map section opens with Enter on its summary, and what it holds is then reachable.
    await page.focus("#map-background summary");
    await page.keyboard.press("Enter");
    await expect(page.locator("#map-background").getAttribute("open")).resolves.toBe("");
    expect.soft(await axeViolations(), "with the background-map section open").toEqual([]);
    expect.soft(await cutOffControls(), "with the background-map section open").toEqual([]);
    const unfolded = await tabWalk();
    expect.soft(unfolded.missed, "controls Tab never reaches in the open section").toEqual([]);
    expect
      .soft(subsequence(unfolded.order, ["map-tile-template", "map-tile-attribution", "map-background-apply", "write"]))
      .toEqual(["map-tile-template", "map-tile-attribution", "map-background-apply", "write"]);
    await page.focus("#map-background summary");
    await page.keyboard.press("Space");
    await expect(page.locator("#map-background").getAttribute("open")).resolves.toBeNull();

    await expect(page.locator("#scenario").inputValue()).resolves.toBe("Plan 1");
    await page.focus("#write");
    await page.keyboard.press("Enter");
    await expect.poll(() => page.locator("#write-status").textContent(), { timeout: 60_000 }).toMatch(/"Plan 1"/);
    // Written: the next run is offered the next free name.
    await expect(page.locator("#scenario").inputValue()).resolves.toBe("Plan 2");

    // Step 4: Rerun "Plan 1" by keyboard only: choose it in the list with the arrow keys, press Space on Rerun.
    await page.fill("#scenario", "Plan 1");
    await page.focus("#rerun-sheet");
    await page.keyboard.press("ArrowDown");
    await expect(page.locator("#rerun-sheet").inputValue()).resolves.toBe("Plan 1");
    await page.keyboard.press("Tab");
    await expect(page.evaluate(() => document.activeElement?.id)).resolves.toBe("rerun");
    await page.keyboard.press("Space");
    await expect.poll(() => page.locator("#rerun-status").textContent()).toMatch(/Loaded the settings of "Plan 1"/);
    // The rerun gets a fresh name of its own, not the plan's ("Plan 1" would land as "Plan 1 (2)").
    await expect(page.locator("#scenario").inputValue()).resolves.toBe("Plan 2");
    await expect(page.locator("#rerun-status").textContent()).resolves.toMatch(/"Plan 2"/);
    expect.soft(await axeViolations(), "after loading a rerun").toEqual([]);
    expect.soft(await cutOffControls(), "after loading a rerun").toEqual([]);

    // Step 5: the rerun itself: the first run after a Rerun writes under the fresh name.
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    await page.focus("#optimize");
    await page.keyboard.press("Space");
    await expect
      .poll(async () => Number(await page.locator("#convergence-plot").getAttribute("data-points")), { timeout: 60_000 })
      .toBeGreaterThanOrEqual(2);
    expect.soft(await axeViolations(), "during the rerun").toEqual([]);
    await page.focus("#stop");
    await page.keyboard.press("Enter");
    await page.waitForSelector("#optimize:not([disabled])", { timeout: 60_000 });
    await page.click("#write");
    await expect.poll(() => page.locator("#write-status").textContent(), { timeout: 60_000 }).toMatch(/Written to sheet "Plan 2"/);
    expect.soft(await axeViolations(), "after the rerun").toEqual([]);
    expect.soft(await cutOffControls(), "after the rerun").toEqual([]);
  }, 600_000);

  it("in Excel (a fake host): axe-core finds nothing, Tab goes Use selection, Use selection, then the settings; Enter and Space press Use selection; nothing is cut off", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(readFileSync(DEMO));
    const values = async (name: string): Promise<unknown[][]> => ((await book.readSheet(name))?.values ?? []).map((r) => [...r]);
    const excelPage = await context!.newPage();
    await excelPage.route("**/*", (route) => (route.request().url().startsWith(baseUrl) ? route.continue() : route.abort()));
    try {
      await excelPage.addInitScript(installFakeExcel, {
        sheets: { Stops: await values("Stops"), Fleet: await values("Fleet") },
        settings: {},
      });
      await excelPage.goto(`${baseUrl}/taskpane.html`);
      await excelPage.waitForSelector("body[data-ready='true'][data-mode='excel']", { timeout: 30_000 });
      page = excelPage;
      await expect(page.locator("#stops-summary").textContent()).resolves.toMatch(/select the stops table .* then press Use selection/);
      expect.soft(await axeViolations(), "Excel, nothing selected yet").toEqual([]);
      const empty = await tabWalk();
      expect.soft(empty.missed, "controls Tab never reaches in Excel").toEqual([]);
      const excelOrder = ["stops-use-selection", "fleet-use-selection", ...STEP_ORDER.filter((k) => !/-sheet$|^file-input$/.test(k))];
      // Plan routes is disabled (so skipped by Tab) until both tables are chosen.
      const beforeTables = excelOrder.filter((k) => k !== "optimize");
      expect.soft(subsequence(empty.order, beforeTables)).toEqual(beforeTables);

      const select = (sheet: string) =>
        page.evaluate((s) => ((window as unknown as { __kilnExcel: { selectSheet: string } }).__kilnExcel.selectSheet = s), sheet);
      await select("Stops");
      await page.focus("#stops-use-selection");
      await page.keyboard.press("Enter");
      await expect.poll(() => page.locator("#stops-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows/);
      await select("Fleet");
      await page.focus("#fleet-use-selection");
      await page.keyboard.press("Space");
      await expect.poll(() => page.locator("#fleet-summary").textContent(), { timeout: 30_000 }).toMatch(/data rows/);
      await page.waitForSelector("#cooling-reading.ok", { timeout: 60_000 });
      await expect(page.locator("#optimize").isEnabled()).resolves.toBe(true);
      expect.soft(await axeViolations(), "Excel, both tables chosen").toEqual([]);
      expect.soft(await cutOffControls(), "Excel, both tables chosen").toEqual([]);
      const chosen = await tabWalk();
      expect.soft(chosen.missed, "controls Tab never reaches in Excel with both tables").toEqual([]);
      expect.soft(subsequence(chosen.order, excelOrder)).toEqual(excelOrder);
    } finally {
      await excelPage.close();
      page = context!.pages()[0]!;
    }
  }, 300_000);

  it("the production build's text and number inputs and selects all carry the same computed style", async () => {
    // The HTML minifier drops type="text" (the default type); the stylesheet must style those inputs too.
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready='true'][data-mode='file']", { timeout: 30_000 });
    const styles = await page.evaluate(() => {
      const props = [
        "font-family",
        "font-size",
        "height",
        "border-top-width",
        "border-top-color",
        "border-bottom-color",
        "border-top-left-radius",
        "background-color",
        "padding-left",
      ];
      const fields = document.querySelectorAll<HTMLElement>(
        "main input:not([type=checkbox]):not([type=file]):not([type=radio]), main select:not(.table-summary select)",
      );
      return [...fields].map((el) => ({
        id: el.id,
        type: el.getAttribute("type"),
        style: props.map((p) => `${p}: ${getComputedStyle(el).getPropertyValue(p)}`).join("; "),
      }));
    });
    const textInputs = styles.filter((s) => s.type === null || s.type === "text");
    expect(textInputs.map((s) => s.id)).toContain("scenario");
    expect(styles.length).toBeGreaterThan(15);
    const first = styles[0]!.style;
    expect(first).toMatch(/height: 28px/);
    expect(styles.filter((s) => s.style !== first)).toEqual([]);
  }, 120_000);
});
