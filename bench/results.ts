/**
 * What every bench writes besides its table: the machine it ran on, a peak-memory sampler and
 * the results file `bench/results/<name>-<date>.json` (committed when a figure moves, so the
 * history of the figures is in the repository).
 */
import { mkdirSync, writeFileSync } from "node:fs";
import { cpus } from "node:os";
import { fileURLToPath } from "node:url";

const RESULTS_DIR = fileURLToPath(new URL("./results/", import.meta.url));

/** The machine and runtime of a bench run. */
export interface BenchEnvironment {
  node: string;
  cpuModel: string;
  cpuCount: number;
  date: string;
}

/** Node version, CPU model and count (os.cpus), and the time of the run. */
export function benchEnvironment(): BenchEnvironment {
  const cpu = cpus();
  return { node: process.version, cpuModel: cpu[0]?.model ?? "unknown", cpuCount: cpu.length, date: new Date().toISOString() };
}

/**
 * Samples the resident set size (process.memoryUsage().rss, which includes worker threads)
 * every `everyMs` until stopped; the peak is the largest sample, in MB. The solver yields to
 * the event loop between slices (and worker chains leave it free), so the samples keep coming.
 */
export function rssSampler(everyMs = 50): { stop(): number } {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss);
  }, everyMs);
  return {
    stop(): number {
      clearInterval(timer);
      peak = Math.max(peak, process.memoryUsage().rss);
      return Math.round((peak / 2 ** 20) * 10) / 10;
    },
  };
}

/**
 * Write `bench/results/<name>-<YYYY-MM-DD>.json` (an existing file of the same name and day is replaced).
 *
 * @param name - the bench's name, e.g. "suites" or "ablation"
 * @param data - the JSON body
 * @returns the path written, relative to the repository
 * @example writeResults("suites", { environment, rows }) // => "bench/results/suites-2026-12-02.json"
 */
export function writeResults(name: string, data: unknown): string {
  mkdirSync(RESULTS_DIR, { recursive: true });
  const file = `${name}-${new Date().toISOString().slice(0, 10)}.json`;
  writeFileSync(RESULTS_DIR + file, JSON.stringify(data, null, 2) + "\n");
  return `bench/results/${file}`;
}

/**
 * A milliseconds clock of this process's CPU time (user + system, `process.cpuUsage`): on a
 * shared, loaded machine a run given S seconds of it does the same work whatever else runs.
 * Only for runs on the main thread (worker chains keep their own wall clock).
 */
export function cpuClock(): () => number {
  return () => {
    const u = process.cpuUsage();
    return (u.user + u.system) / 1000;
  };
}
