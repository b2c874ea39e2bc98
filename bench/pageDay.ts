/**
 * A whole generated day in the page's solver worker: Debian's Chromium (never a downloaded one)
 * through playwright-core opens the built standalone page (dist/, `npm run build`) on a loopback
 * server, starts the pane's own worker script and sends it the day as the pane would (a `start`
 * message of `workerProtocol.ts`; the matrix's typed arrays reach the page as bytes from a second
 * loopback server and are structured-cloned into the worker, as the pane's are), then waits for
 * the result. Measured: seconds from handing the problem to the worker (the budget counts from
 * there, `startedAt`, as in the pane) to the result, and of the whole exchange with the bench's
 * transfer of the bytes; the worker's own heap figure where the browser gives one (Chromium's
 * `performance.memory` exists in pages only, so none), and the peak resident memory of the
 * browser's renderer processes (`VmHWM` in /proc, the kernel's peak: the page and its worker live
 * in one renderer), feasibility re-checked by `evaluatePlan` here.
 */
import { existsSync, readFileSync, readdirSync } from "node:fs";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { CHROMIUM_FLAGS } from "../scripts/chromiumFlags.js";
import { serveStatic } from "../scripts/serveStatic.js";
import type { Problem } from "../src/core/model.js";
import { evaluatePlan } from "../src/core/schedule/evaluatePlan.js";
import type { SolveResult } from "../src/core/solve.js";

const CHROMIUM = "/usr/bin/chromium";
const DIST = fileURLToPath(new URL("../dist/", import.meta.url));

/** What one page day measured. */
export interface PageDayRow {
  stops: number;
  vehicles: number;
  budgetSeconds: number;
  /** Seconds from handing the problem to the worker (the pane's press of Optimize, `startedAt`) to its result. */
  postToResultSeconds: number;
  /** Seconds of the whole exchange, including the bench's own transfer of the matrix bytes into the page. */
  wallSeconds: number;
  moves: number;
  feasible: boolean;
  unassigned: number;
  vehiclesUsed: number;
  cost: number;
  /** The worker's peak JS heap (MB) as the worker reported it; null when the browser gives none in a worker. */
  workerPeakHeapMB: number | null;
  /** Largest peak resident memory (VmHWM) of the browser's renderer processes, MB. */
  rendererPeakRssMB: number | null;
}

/**
 * Why the page days cannot run here, or undefined when they can.
 *
 * @returns the reason (no Chromium, no built page), or undefined
 */
export function pageDaysUnavailable(): string | undefined {
  if (!existsSync(CHROMIUM)) return `${CHROMIUM} is missing (install Debian's chromium package)`;
  if (!existsSync(join(DIST, "index.html"))) return "dist/index.html is missing: run `npm run build` first";
  if (workerScript() === undefined) return "the solver worker script was not found in dist/";
  if (!existsSync("/proc/self/status")) return "no /proc to read the renderer's peak memory from";
  return undefined;
}

/**
 * Run each day in the page's worker, one fresh browser per day.
 *
 * @param days - the problems with their seconds budgets
 * @returns one row per day
 */
export async function runPageDays(days: readonly { problem: Problem; seconds: number }[]): Promise<PageDayRow[]> {
  const { chromium } = await import("playwright-core");
  const script = workerScript()!;
  const { server, url } = await serveStatic(DIST);
  const rows: PageDayRow[] = [];
  try {
    for (const { problem, seconds } of days) {
      const browser = await chromium.launch({
        executablePath: CHROMIUM,
        headless: true,
        args: [...CHROMIUM_FLAGS],
      });
      let bins: { url: string; close(): Promise<void> } | undefined;
      try {
        const page = await browser.newPage();
        // Nothing may leave the machine: only our own two loopback servers.
        const m = problem.matrix;
        bins = await serveBytes({ "/km": m.distanceKm, "/min": m.travelMin });
        const binsUrl = bins.url;
        await page.route("**/*", (route) => {
          const u = route.request().url();
          return u.startsWith(url) || u.startsWith(binsUrl) ? route.continue() : route.abort();
        });
        page.on("crash", () => console.error("bench/pageDay: the page crashed"));
        await page.goto(`${url}/index.html`);
        const { matrix: _matrix, ...rest } = problem;
        void _matrix;
        const started = performance.now();
        // No named inner functions here: tsx would wrap them in a helper the page does not have.
        const answer = await page.evaluate(
          ({ scriptUrl, base, rest, size, userSupplied, seconds }) =>
            new Promise<{ result?: unknown; peakHeapBytes?: number; error?: string; postToResultMs?: number }>((resolve) => {
              const worker = new Worker(scriptUrl);
              let postedAt = 0;
              worker.addEventListener(
                "message",
                (e: MessageEvent<{ type: string; result?: unknown; peakHeapBytes?: number; message?: string }>) => {
                  if (e.data.type === "result")
                    resolve({
                      result: e.data.result,
                      postToResultMs: performance.timeOrigin + performance.now() - postedAt,
                      ...(e.data.peakHeapBytes !== undefined ? { peakHeapBytes: e.data.peakHeapBytes } : {}),
                    });
                  else if (e.data.type === "error") resolve({ error: e.data.message ?? "error" });
                },
              );
              worker.addEventListener("error", (e) => resolve({ error: e.message || "worker failed" }));
              void Promise.all(["km", "min"].map((n) => fetch(`${base}/${n}`).then((r) => r.arrayBuffer()))).then(
                ([km, min]) => {
                  // As the pane does: the budget counts from the moment the problem is handed over.
                  postedAt = performance.timeOrigin + performance.now();
                  worker.postMessage({
                    type: "start",
                    runId: 1,
                    problem: {
                      ...rest,
                      matrix: { size, distanceKm: new Float64Array(km!), travelMin: new Float64Array(min!), userSupplied },
                    },
                    options: { seed: 1, budget: { seconds }, startedAt: postedAt },
                  });
                },
                (e: unknown) => resolve({ error: String(e) }),
              );
            }),
          { scriptUrl: `${url}/${script}`, base: binsUrl, rest, size: m.size, userSupplied: m.userSupplied, seconds },
        );
        const wallS = (performance.now() - started) / 1000;
        const rendererPeakRssMB = rendererPeakMb();
        if (answer.error !== undefined) throw new Error(`the page's worker failed: ${answer.error}`);
        const result = answer.result as SolveResult;
        const check = evaluatePlan(
          problem,
          result.plan.routes.map((r) => r.visits.map((v) => v.stop)),
        );
        rows.push({
          stops: problem.stops.length,
          vehicles: problem.vehicles.length,
          budgetSeconds: seconds,
          postToResultSeconds: Math.round((answer.postToResultMs ?? NaN) / 100) / 10,
          wallSeconds: Math.round(wallS * 10) / 10,
          moves: result.stats.moves,
          feasible: result.plan.feasible && check.violations.length === 0,
          unassigned: result.plan.unassigned.length,
          vehiclesUsed: result.plan.routes.filter((r) => r.visits.length > 0).length,
          cost: Math.round(result.plan.totals.cost),
          workerPeakHeapMB: answer.peakHeapBytes !== undefined ? Math.round(answer.peakHeapBytes / 2 ** 20) : null,
          rendererPeakRssMB,
        });
      } finally {
        await browser.close();
        await bins?.close();
      }
    }
  } finally {
    await new Promise<void>((ok) => (server as Server).close(() => ok()));
  }
  return rows;
}

/**
 * Serve typed arrays as bytes on 127.0.0.1 (any port), readable from the page (CORS).
 *
 * @param files - path -> array
 * @returns the base URL and a close function
 */
async function serveBytes(files: Record<string, Float64Array>): Promise<{ url: string; close(): Promise<void> }> {
  const server = createServer((req, res) => {
    const a = files[req.url ?? ""];
    if (!a) return void res.writeHead(404).end();
    res.writeHead(200, { "Content-Type": "application/octet-stream", "Access-Control-Allow-Origin": "*" });
    res.end(Buffer.from(a.buffer, a.byteOffset, a.byteLength));
  });
  await new Promise<void>((ok) => server.listen(0, "127.0.0.1", ok));
  const port = (server.address() as AddressInfo).port;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise<void>((ok) => server.close(() => ok())) };
}

/** The built solver worker: the one script in dist/ holding the engine host's own message text. */
function workerScript(): string | undefined {
  if (!existsSync(DIST)) return undefined;
  return readdirSync(DIST).find((f) => f.endsWith(".js") && readFileSync(join(DIST, f), "utf8").includes("kiln worker: could not post"));
}

/** The largest VmHWM (kB in /proc/PID/status) of the renderer processes below this process, in MB. */
function rendererPeakMb(): number | null {
  const parent = new Map<number, number>();
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, "utf8");
      // pid (comm) state ppid ...: comm may hold spaces, so read after the last ")".
      parent.set(Number(entry), Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]));
    } catch {
      // The process ended meanwhile.
    }
  }
  const below = (pid: number): boolean => {
    for (let p = parent.get(pid), hops = 0; p !== undefined && p > 1 && hops < 20; p = parent.get(p), hops++)
      if (p === process.pid) return true;
    return false;
  };
  let peakKb: number | null = null;
  for (const pid of parent.keys()) {
    if (!below(pid)) continue;
    try {
      if (!readFileSync(`/proc/${pid}/cmdline`, "utf8").includes("--type=renderer")) continue;
      const hwm = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
      if (hwm) peakKb = Math.max(peakKb ?? 0, Number(hwm[1]));
    } catch {
      // The process ended meanwhile.
    }
  }
  return peakKb === null ? null : Math.round(peakKb / 1024);
}
