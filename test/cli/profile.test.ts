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
  it("prints the mean uphill change and a 10-20 row table that starts at the start acceptance (Metropolis 1953)", async () => {
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
    // P is the share of the sampled worse moves accepted (Ben-Ameur 2004's acceptance ratio):
    // calibration puts the start exactly at the default start acceptance 0.5, and it only falls.
    expect(rows[0]!.p).toBeCloseTo(0.5, 3);
    for (let i = 1; i < rows.length; i++) expect(rows[i]!.p).toBeLessThanOrEqual(rows[i - 1]!.p);
    // It is a mean of Metropolis acceptances exp(-d/T) over changes averaging `mean`; by Jensen's
    // inequality it is at least the acceptance of the mean change.
    for (const r of rows) expect(r.p).toBeGreaterThanOrEqual(acceptanceProbability("metropolis", mean, r.t) - 5e-4);
    // Geometric: T falls by alpha per 1000 moves (Kirkpatrick et al. 1983).
    const r1 = rows[1]!;
    expect(r1.t / rows[0]!.t).toBeCloseTo(Math.pow(0.9, Math.floor(r1.moves / 1000)), 3);
    expect(out.trim().split("\n").pop()).toMatch(/^Starts by accepting [0-9.]+ of the worse moves/);
  });

  it("uses the logistic (Barker 1965) rule when asked", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runProfile([path, "--rule", "logistic", "--moves", "20000"], cap.io)).toBe(0);
    const mean = Number(/Mean uphill change: ([\d.e+-]+)/.exec(cap.out())?.[1]);
    const rows = table(cap.out());
    // The logistic rule never accepts half of the worse moves: a start of 0.5 is read as 0.49.
    expect(rows[0]!.p).toBeCloseTo(0.49, 3);
    for (const r of rows) expect(r.p).toBeGreaterThanOrEqual(acceptanceProbability("logistic", mean, r.t) - 5e-4);
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
