import { existsSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";

/** `../shared/benchmarks` seen from the repository root (resolved from this file, not the cwd). */
export const BENCHMARKS_DIR = fileURLToPath(new URL("../../../shared/benchmarks/", import.meta.url));

/**
 * Whether the benchmark-based tests of a file should run. When the folder is absent they skip
 * with a printed reason, except under CI, where they run and fail on the missing files.
 */
export function benchmarksAvailable(what: string): boolean {
  if (existsSync(BENCHMARKS_DIR)) return true;
  if (process.env["CI"]) return true;
  console.warn(`${what}: skipped because ../shared/benchmarks is absent (under CI this fails)`);
  return false;
}

/** Reads a file of the benchmark folder, e.g. `benchmarkText("tsplib/burma14.tsp")`. */
export function benchmarkText(relative: string): string {
  return readFileSync(BENCHMARKS_DIR + relative, "utf8");
}

/** Rows of a small CSV of the benchmark folder (no quoting in those files), header first. */
export function benchmarkCsv(relative: string): string[][] {
  return benchmarkText(relative)
    .split(/\r?\n/)
    .filter((l) => l.trim() !== "")
    .map((l) => l.split(",").map((c) => c.trim()));
}
