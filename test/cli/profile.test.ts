import { describe, expect, it } from "vitest";
import { acceptanceProbability } from "../../src/core/anneal/acceptanceProbability.js";
import { main } from "../../src/cli/main.js";
import type { CliIO } from "../../src/cli/CliIO.js";

const runProfile = (args: string[], io: CliIO): Promise<number> => main(["profile", ...args], io);
import { captureIO, demoCopy, withCell } from "../workbook/harness.js";
import { join } from "node:path";

/** Parse the printed table: rows of fraction, moves, T, P. */
function table(out: string): { fraction: number; moves: number; t: number; p: number }[] {
  return out
    .split("\n")
    .filter((l) => /^\s*\d\.\d{3}\s/.test(l))
    .map((l) => {
      const [fraction, moves, t, p] = l.trim().split(/\s+/).map(Number);
      return { fraction: fraction!, moves: moves!, t: t!, p: p! };
    });
}

describe("kiln profile", () => {
  it("prints the mean uphill change and a 10-20 row table whose P values follow acceptanceProbability (Metropolis 1953)", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runProfile([path, "--schedule", "geometric", "--alpha", "0.9", "--level", "1000", "--moves", "50000"], cap.io)).toBe(0);
    const out = cap.out();
    const mean = Number(/Mean uphill change: ([\d.e+-]+)/.exec(out)?.[1]);
    expect(mean).toBeGreaterThan(0);
    const rows = table(out);
    expect(rows.length).toBeGreaterThanOrEqual(10);
    expect(rows.length).toBeLessThanOrEqual(20);
    expect(rows[0]!.fraction).toBe(0);
    expect(rows[rows.length - 1]!.moves).toBe(50000);
    for (const r of [rows[0]!, rows[5]!, rows[rows.length - 1]!]) {
      // Recompute P from the printed T and mean (4 significant digits each).
      expect(r.p).toBeCloseTo(acceptanceProbability("metropolis", mean, r.t), 3);
    }
    // Geometric: T falls by alpha per 1000 moves (Kirkpatrick et al. 1983).
    const r1 = rows[1]!;
    expect(r1.t / rows[0]!.t).toBeCloseTo(Math.pow(0.9, Math.floor(r1.moves / 1000)), 3);
    expect(out.trim().split("\n").pop()).toMatch(/^Starts at P = /);
  });

  it("uses the logistic (Barker 1965) rule when asked", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runProfile([path, "--rule", "logistic", "--moves", "20000"], cap.io)).toBe(0);
    const mean = Number(/Mean uphill change: ([\d.e+-]+)/.exec(cap.out())?.[1]);
    const rows = table(cap.out());
    for (const r of rows.slice(0, 3)) expect(r.p).toBeCloseTo(acceptanceProbability("logistic", mean, r.t), 3);
    expect(rows[0]!.p).toBeLessThanOrEqual(0.5);
  });

  it("expects the move count of a seconds run from the speed measured on the problem", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runProfile([path, "--seconds", "5"], cap.io)).toBe(0);
    const m = /Moves: about (\d+) expected in 5 s \(([\d.]+) M moves\/s measured on this problem/.exec(cap.out());
    expect(m).not.toBeNull();
    // The count is the measured rate times the seconds (the rate is printed to 3 digits).
    expect(Number(m![1]) / 5 / 1e6).toBeCloseTo(Number(m![2]), 1);
  });

  it("exits 2 and names the cell on bad input", async () => {
    const { dir, path } = await demoCopy();
    const bad = join(dir, "bad.xlsx");
    await withCell(path, "Stops", "D7", 123.4, bad);
    const cap = captureIO();
    expect(await runProfile([bad], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/Stops!D7/);
  });
});
