/**
 * Waiting for Office (whenOfficeReady), the diagnostics line and the build's manifest writer.
 * Office.onReady resolves with host null outside Office and can take several seconds inside
 * it (OFFICE-NOTES.md); Office.context.diagnostics gives host, platform and version (Office
 * Common API, ContextInformation).
 */
import { afterEach, describe, expect, it, vi } from "vitest";
import { CONNECT_TIMEOUT_MS, whenOfficeReady } from "../../src/taskpane/whenOfficeReady.js";
import { highestExcelApi, officeDiagnostics } from "../../src/taskpane/officeDiagnostics.js";
import { DEV_BASE, manifestForBase, parseBase } from "../../scripts/addinBuild.js";
import { readFileSync } from "node:fs";

function fakeOffice(answerAfterMs: number, host: string | null): void {
  Object.assign(globalThis, {
    Office: {
      HostType: { Excel: "Excel" },
      onReady: () => new Promise((ok) => setTimeout(() => ok({ host, platform: host ? "PC" : null }), answerAfterMs)),
      context: {
        diagnostics: { host: "Excel", platform: "PC", version: "16.0.17928.20114" },
        requirements: { isSetSupported: (name: string, v: string) => name === "ExcelApi" && Number(v.split(".")[1]) <= 17 },
      },
    },
  });
}

afterEach(() => {
  Reflect.deleteProperty(globalThis, "Office");
  vi.useRealTimers();
});

describe("whenOfficeReady", () => {
  it("waits at least 20 s with the host hint, saying so, and takes a late-but-in-time Excel", async () => {
    vi.useFakeTimers();
    fakeOffice(15_000, "Excel");
    const waiting = vi.fn();
    const answer = whenOfficeReady({ hint: { hint: true }, onWaiting: waiting });
    await vi.advanceTimersByTimeAsync(15_000);
    await expect(answer).resolves.toEqual({ mode: "excel" });
    expect(waiting).toHaveBeenCalledTimes(1);
    expect(CONNECT_TIMEOUT_MS).toBeGreaterThanOrEqual(20_000);
  });

  it("falls back to the standalone page after the wait and reports a later Excel answer", async () => {
    vi.useFakeTimers();
    fakeOffice(CONNECT_TIMEOUT_MS + 5_000, "Excel");
    const answer = whenOfficeReady({ hint: { hint: true } });
    await vi.advanceTimersByTimeAsync(CONNECT_TIMEOUT_MS);
    const ready = await answer;
    expect(ready.mode).toBe("file");
    expect(ready.why).toMatch(/did not answer within 20 s/);
    await vi.advanceTimersByTimeAsync(5_000);
    await expect(ready.late).resolves.toBe(true);
  });

  it("without the hint: no Office is the standalone page at once; Office answering host null too", async () => {
    await expect(whenOfficeReady({ hint: { hint: false } })).resolves.toEqual({ mode: "file" });
    fakeOffice(10, null);
    await expect(whenOfficeReady({ hint: { hint: false } })).resolves.toEqual({ mode: "file" });
  });

  it("with the hint but office.js not loaded, says why", async () => {
    const ready = await whenOfficeReady({ hint: { hint: true, failed: true } });
    expect(ready).toEqual({ mode: "file", why: expect.stringMatching(/office\.js could not be loaded/) });
  });
});

describe("diagnostics line", () => {
  it("names host, platform, version and the highest ExcelApi set", () => {
    expect(highestExcelApi((v) => ["1.1", "1.2", "1.3"].includes(v))).toBe("1.3");
    expect(highestExcelApi(() => false)).toBeUndefined();
    expect(officeDiagnostics()).toBe("No Office host (standalone page)");
    fakeOffice(0, "Excel");
    expect(officeDiagnostics()).toBe("Excel · PC · 16.0.17928.20114 · ExcelApi 1.17");
  });
});

describe("manifest per environment", () => {
  it("moves every URL to the base and the AppDomain to its origin; refuses http and queries", () => {
    const template = readFileSync(new URL("../../manifest.xml", import.meta.url), "utf8");
    const out = manifestForBase(template, parseBase("https://example.org/kiln/"));
    expect(out).not.toContain(DEV_BASE);
    expect(out).toContain('<SourceLocation DefaultValue="https://example.org/kiln/taskpane.html?kiln-host=office"/>');
    expect(out).toContain("<AppDomain>https://example.org</AppDomain>");
    expect(manifestForBase(template, parseBase(DEV_BASE))).toBe(template);
    expect(() => parseBase("http://example.org")).toThrow(/https/);
    expect(() => parseBase("https://example.org/?x=1")).toThrow(/query/);
    expect(() => parseBase("example.org")).toThrow(/absolute URL/);
  });
});
