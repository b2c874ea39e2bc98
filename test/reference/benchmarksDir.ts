/**
 * Where the reference tests find their published instances:
 * - the six small ones (TSPLIB burma14, ulysses16, ulysses22; Solomon C101, R101, RC201) are
 *   committed fixtures in `test/fixtures/reference/` (sources in its README) and always run;
 * - the full suites live in the benchmark folder: `KILN_BENCHMARKS_DIR` when set, otherwise
 *   `../shared/benchmarks` beside the checkout. Tests that need it skip with a printed reason
 *   when it is absent, except under CI, where they run and fail on the missing files.
 * Files are read only inside `it`/`beforeAll` (the helpers below), never while vitest collects.
 */
import { existsSync, readFileSync } from "node:fs";
import { resolve } from "node:path";
import { fileURLToPath } from "node:url";

/** The committed reference fixtures, with a trailing slash. */
export const FIXTURES_DIR = fileURLToPath(new URL("../fixtures/reference/", import.meta.url));

/** The benchmark folder with a trailing slash: `KILN_BENCHMARKS_DIR`, or `../shared/benchmarks` from the repository root. */
export const BENCHMARKS_DIR = process.env["KILN_BENCHMARKS_DIR"]
  ? resolve(process.env["KILN_BENCHMARKS_DIR"]) + "/"
  : fileURLToPath(new URL("../../../shared/benchmarks/", import.meta.url));

/**
 * Whether the suite-based tests of a file should run: true when the benchmark folder exists or
 * CI is set; otherwise prints why they are skipped and returns false. Only checks existence.
 */
export function benchmarksAvailable(what: string): boolean {
  if (existsSync(BENCHMARKS_DIR)) return true;
  if (process.env["CI"]) return true;
  console.warn(`${what}: skipped because the benchmark folder ${BENCHMARKS_DIR} is absent (set KILN_BENCHMARKS_DIR; under CI this fails)`);
  return false;
}

/** Reads a file of the benchmark folder, e.g. `benchmarkText("tsplib/gr96.tsp")`. */
export function benchmarkText(relative: string): string {
  return readFileSync(BENCHMARKS_DIR + relative, "utf8");
}

/** Rows of a small CSV of the benchmark folder (no quoting in those files), header first. */
export function benchmarkCsv(relative: string): string[][] {
  return csvRows(benchmarkText(relative));
}

/** Reads a committed fixture, e.g. `fixtureText("burma14.tsp")`. */
export function fixtureText(name: string): string {
  return readFileSync(FIXTURES_DIR + name, "utf8");
}

/** Rows of a fixture CSV (`optimal.csv`, `best-known.csv`), header first. */
export function fixtureCsv(name: string): string[][] {
  return csvRows(fixtureText(name));
}

function csvRows(text: string): string[][] {
  return text
    .split(/\r?\n/)
    .filter((l) => l.trim() !== "")
    .map((l) => l.split(",").map((c) => c.trim()));
}
