import { describe, expect, it } from "vitest";
import { progressBar, progressLine } from "../../src/cli/progressBar.js";
import type { Progress } from "../../src/core/options.js";
import { captureIO } from "../workbook/harness.js";

const progress: Progress = {
  moves: 500,
  fraction: 0.5,
  temperature: 12.345,
  currentCost: 500,
  bestCost: 456.789,
  acceptanceRate: 0.21,
  elapsedMs: 10,
};

describe("solve progress bar", () => {
  it("draws on stderr only when stderr is a terminal", () => {
    const tty = captureIO(true);
    const bar = progressBar(tty.io, 10);
    bar.update(progress);
    bar.done();
    expect(tty.err()).toContain("\r[#####-----]  50%  T 12.3  best 456.79  acc 21%");
    expect(tty.out()).toBe("");
    const pipe = captureIO(false);
    const quiet = progressBar(pipe.io);
    quiet.update(progress);
    quiet.done();
    expect(pipe.err()).toBe("");
  });

  it("says when no feasible plan has been found yet", () => {
    expect(progressLine({ ...progress, bestCost: Infinity, fraction: 0 }, 4)).toBe("[----]   0%  T 12.3  best none feasible yet  acc 21%");
  });
});
