import { existsSync } from "node:fs";
import { execFile } from "node:child_process";
import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { promisify } from "node:util";
import { beforeAll, describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { outputPath } from "../../src/cli/outputPath.js";
import type { CliIO } from "../../src/cli/CliIO.js";

const runSolve = (args: string[], io: CliIO): Promise<number> => main(["plan", ...args], io);
import { COMPARE_SHEET } from "../../src/sheets/layoutCompare.js";
import { captureIO, demoCopy, loadWithExcelJs, sheetValues, withCell, exists, sha256 } from "../workbook/harness.js";

const MOVES = ["--moves", "5000"];

describe("kiln solve (in process)", () => {
  it("writes NAME.plan.xlsx beside the input, leaves the input byte for byte unchanged, and keeps every original sheet's values", async () => {
    const { dir, path } = await demoCopy();
    const before = await sha256(path);
    const cap = captureIO();
    const code = await runSolve([path, ...MOVES, "--scenario", "Dawn"], cap.io);
    expect(cap.err()).toBe("");
    expect(code).toBe(0);
    expect(await sha256(path)).toBe(before);
    const outPath = join(dir, "demo.plan.xlsx");
    expect(cap.out()).toContain(`Wrote sheet "Dawn" and a Compare row to ${outPath}`);
    expect(cap.out()).toMatch(/Vehicles used: \d+ of 5/);
    expect(cap.out()).toMatch(/Feasible: (yes|no)/);
    expect(cap.out()).toMatch(/chart: not drawn/);
    expect(cap.out()).toMatch(/straight-line/);
    const input = await loadWithExcelJs(await readFile(path));
    const output = await loadWithExcelJs(await readFile(outPath));
    for (const ws of input.worksheets) expect(sheetValues(output, ws.name)).toEqual(sheetValues(input, ws.name));
    expect(output.worksheets.map((w) => w.name)).toEqual([
      ...input.worksheets.map((w) => w.name),
      "Dawn",
      "Dawn routes",
      COMPARE_SHEET,
      "kiln-settings",
    ]);
    expect(cap.out()).toContain('Route sheets for drivers: "Dawn routes"');
  });

  it("--sheet-per-vehicle writes one route sheet per van used, each holding that van's block alone", async () => {
    const { dir, path } = await demoCopy();
    const cap = captureIO();
    const outPath = join(dir, "vans.xlsx");
    expect(await runSolve([path, ...MOVES, "--scenario", "Dawn", "--sheet-per-vehicle", "--out", outPath], cap.io)).toBe(0);
    const names = [...(/Route sheets for drivers: (.*)/.exec(cap.out())?.[1] ?? "").matchAll(/"([^"]+)"/g)].map((m) => m[1]!);
    const book = await loadWithExcelJs(await readFile(outPath));
    // The plan sheet's route table names each used van on its rows (column A below the header).
    const plan = sheetValues(book, "Dawn");
    const headerAt = plan.findIndex((r) => r?.[0] === "Vehicle" && r?.[1] === "Seq");
    const vans = [...new Set(plan.slice(headerAt + 1).flatMap((r) => (r?.[1] === 0 ? [String(r[0])] : [])))];
    expect(names).toEqual(vans.map((v) => `Dawn ${v}`));
    for (const [i, name] of names.entries()) {
      const blocks = sheetValues(book, name).filter((r) => r?.[0] === "Vehicle");
      expect(blocks.map((r) => r[1])).toEqual([vans[i]]);
    }
  });

  it("a second solve on the output appends a second Compare row and a uniquely named second scenario sheet", async () => {
    const { dir, path } = await demoCopy();
    const first = join(dir, "first.xlsx");
    const second = join(dir, "second.xlsx");
    expect(await runSolve([path, ...MOVES, "--out", first], captureIO().io)).toBe(0);
    expect(await runSolve([first, ...MOVES, "--seed", "2", "--out", second], captureIO().io)).toBe(0);
    const book = await loadWithExcelJs(await readFile(second));
    const compare = sheetValues(book, COMPARE_SHEET);
    expect(compare).toHaveLength(3);
    const names = compare.slice(1).map((r) => r[0]);
    expect(names[0]).toBe("Plan");
    expect(names[1]).not.toBe("Plan");
    expect(book.getWorksheet(String(names[1]))).toBeDefined();
  });

  it("exits 2 on a bad latitude and prints the cell (Stops!D7) on stderr; nothing is written", async () => {
    const { dir, path } = await demoCopy();
    const bad = join(dir, "bad.xlsx");
    await withCell(path, "Stops", "D7", 123.4, bad);
    const cap = captureIO();
    expect(await runSolve([bad, ...MOVES], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/^Stops!D7: .*123\.4/m);
    expect(cap.out()).toBe("");
    expect(await exists(join(dir, "bad.plan.xlsx"))).toBe(false);
  });

  it("refuses --out naming the input itself with exit 2", async () => {
    const { path } = await demoCopy();
    const before = await sha256(path);
    const cap = captureIO();
    expect(await runSolve([path, ...MOVES, "--out", path], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/never writes over its input/);
    expect(await sha256(path)).toBe(before);
  });

  it("exits 2 with one line per flag mistake", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(
      await runSolve([path, "--moves", "5000", "--seconds", "3", "--rule", "greedy", "--schedule", "time", "--alpha", "0.9"], cap.io),
    ).toBe(2);
    const lines = cap.err().trim().split("\n");
    expect(lines).toContain("use --seconds or --moves, not both");
    expect(lines).toContain('--rule: Acceptance rule "greedy" is not valid: enter one of metropolis, logistic.');
  });

  it("rejects a schedule parameter that does not fit the schedule", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runSolve([path, ...MOVES, "--schedule", "linear", "--alpha", "0.9"], cap.io)).toBe(2);
    expect(cap.err()).toContain("--alpha: Alpha does not apply to the Linear schedule; clear it or choose the Geometric schedule.");
  });

  it("same seed and move budget give the same plan sheet (reproducible)", async () => {
    const { dir, path } = await demoCopy();
    const a = join(dir, "a.xlsx");
    const b = join(dir, "b.xlsx");
    const flags = [...MOVES, "--schedule", "geometric", "--alpha", "0.9", "--level", "200", "--seed", "11"];
    expect(await runSolve([path, ...flags, "--out", a], captureIO().io)).toBe(0);
    expect(await runSolve([path, ...flags, "--out", b], captureIO().io)).toBe(0);
    const [x, y] = await Promise.all([a, b].map(async (p) => loadWithExcelJs(await readFile(p))));
    // The settings block holds the creation time; compare from the totals block down.
    const body = (rows: unknown[][]): unknown[][] => rows.slice(4);
    expect(body(sheetValues(y!, "Plan"))).toEqual(body(sheetValues(x!, "Plan")));
  });
});

describe("output path rules", () => {
  it("picks NAME.plan.xlsx, then NAME.plan-2.xlsx, never an existing file", async () => {
    const { dir, path } = await demoCopy("week.xlsx");
    expect(await outputPath(path)).toEqual({ path: join(dir, "week.plan.xlsx"), explicit: false });
    await writeFile(join(dir, "week.plan.xlsx"), "taken");
    expect(await outputPath(path)).toEqual({ path: join(dir, "week.plan-2.xlsx"), explicit: false });
    await writeFile(join(dir, "week.plan-2.xlsx"), "taken");
    expect(await outputPath(path)).toEqual({ path: join(dir, "week.plan-3.xlsx"), explicit: false });
  });

  it("lets --out name an existing file explicitly, but never the input (also through a relative path)", async () => {
    const { dir, path } = await demoCopy("week.xlsx");
    await writeFile(join(dir, "old.xlsx"), "old");
    expect(await outputPath(path, join(dir, "old.xlsx"))).toEqual({ path: join(dir, "old.xlsx"), explicit: true });
    expect(await outputPath(path, join(dir, ".", "week.xlsx"))).toHaveProperty("error");
  });
});

describe("kiln solve as a child process (the compiled dist/cli/cli/kiln.js that `bin` names)", () => {
  const run = promisify(execFile);
  const bin = new URL("../../dist/cli/cli/kiln.js", import.meta.url).pathname;
  beforeAll(() => {
    // `npm test` builds it first (pretest); a lone `npx vitest run` needs `npm run build:cli`.
    if (!existsSync(bin)) throw new Error("dist/cli/cli/kiln.js is missing: run `npm run build:cli` (npm test does it first)");
  });
  const kiln = async (args: string[]): Promise<{ code: number; stdout: string; stderr: string }> => {
    try {
      const { stdout, stderr } = await run(process.execPath, [bin, ...args], { env: { ...process.env, KILN_DEBUG: "" } });
      return { code: 0, stdout, stderr };
    } catch (e) {
      const err = e as { code: number; stdout: string; stderr: string };
      return { code: err.code, stdout: err.stdout, stderr: err.stderr };
    }
  };

  it("exits 0 on success, 2 on input errors and 1 on anything else", async () => {
    const { dir, path } = await demoCopy();
    const ok = await kiln(["solve", path, ...MOVES]);
    expect(ok.stderr).toBe("");
    expect(ok.code).toBe(0);
    expect(ok.stdout).toMatch(/Wrote sheet "Plan"/);
    const bad = join(dir, "bad.xlsx");
    await withCell(path, "Stops", "D7", 123.4, bad);
    const input = await kiln(["solve", bad, ...MOVES]);
    expect(input.code).toBe(2);
    expect(input.stderr).toMatch(/Stops!D7/);
    // Writing into a folder that does not exist is not an input-data error: exit 1, one line, no stack.
    const other = await kiln(["solve", path, ...MOVES, "--out", join(dir, "missing", "x.xlsx")]);
    expect(other.code).toBe(1);
    expect(other.stderr.trim().split("\n")).toHaveLength(1);
    expect(other.stderr).not.toMatch(/\n\s+at /);
  });
});
