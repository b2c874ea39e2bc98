import { execFile } from "node:child_process";
import { existsSync } from "node:fs";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import { chainSeed, combineProgress, parseWorkers, runChains } from "../../src/cli/chains.js";
import { main } from "../../src/cli/main.js";
import { comparePlans, parseSolomon, shareMarks, solomonToProblem, solve, type Problem, type Progress } from "../../src/core/index.js";
import { checkPlan } from "../core/checkPlan.js";
import { fixtureText } from "../reference/benchmarksDir.js";
import { captureIO, demoCopy } from "../workbook/harness.js";

// Solomon R101 (Solomon 1987, committed fixture): 100 customers with tight windows.
const problem: Problem = solomonToProblem(parseSolomon(fixtureText("R101.txt")));
const BUDGET = { moves: 20_000 };

/** The plan's routes and totals, the parts two equal plans share. */
const summary = (plan: { routes: readonly { vehicle: number; visits: readonly { stop: number }[] }[]; totals: unknown }): unknown => ({
  routes: plan.routes.map((r) => [r.vehicle, r.visits.map((v) => v.stop)]),
  totals: plan.totals,
});

describe("chains that share their best plan (--workers)", () => {
  it("two chains give the identical plan twice for the same seed and move budget, chain by chain, and it is the better chain's", async () => {
    const a = await runChains(problem, { seed: 5, budget: BUDGET }, 2);
    const b = await runChains(problem, { seed: 5, budget: BUDGET }, 2);
    expect(summary(b.plan)).toEqual(summary(a.plan));
    expect(b.chain).toBe(a.chain);
    expect(a.chains).toHaveLength(2);
    for (const k of [0, 1]) expect(summary(b.chains[k]!.plan)).toEqual(summary(a.chains[k]!.plan));
    // They shared at every mark of the move budget.
    expect(a.shares).toBe(shareMarks(BUDGET).length);
    expect(a.shares).toBeGreaterThan(0);
    for (const c of a.chains) expect(comparePlans(problem, a.plan, c.plan)).toBeLessThanOrEqual(0);
    // Re-checked by the independent checker written for the tests.
    expect(checkPlan(problem, a.plan)).toEqual([]);
  }, 120_000);

  it("three sharing chains give the identical plan twice too", async () => {
    const a = await runChains(problem, { seed: 8, budget: { moves: 9_000 } }, 3);
    const b = await runChains(problem, { seed: 8, budget: { moves: 9_000 } }, 3);
    expect(summary(b.plan)).toEqual(summary(a.plan));
    expect(b.chains.map((c) => summary(c.plan))).toEqual(a.chains.map((c) => summary(c.plan)));
    expect(checkPlan(problem, a.plan)).toEqual([]);
  }, 120_000);

  it("independent chains (the bench's comparison) are each the one-chain run of their seed", async () => {
    const a = await runChains(problem, { seed: 5, budget: BUDGET }, 2, { share: false });
    expect(a.shares).toBe(0);
    // Chain 0 is exactly the one-chain run of the run's seed, chain 1 that of the derived seed.
    expect(summary(a.chains[0]!.plan)).toEqual(summary(solve(problem, { seed: 5, budget: BUDGET }).plan));
    expect(summary(a.chains[1]!.plan)).toEqual(summary(solve(problem, { seed: chainSeed(5, 1), budget: BUDGET }).plan));
  }, 120_000);

  it("one chain is exactly the plan of solve with the same options", async () => {
    const one = await runChains(problem, { seed: 3, budget: BUDGET }, 1);
    expect(summary(one.plan)).toEqual(summary(solve(problem, { seed: 3, budget: BUDGET }).plan));
    expect(one.chain).toBe(0);
  });

  it("an abort stops every chain early and keeps the best plan any of them had", async () => {
    const stop = new AbortController();
    const huge = { moves: 500_000_000 };
    const r = await runChains(problem, { seed: 2, budget: huge, progressEveryMs: 1 }, 2, {
      onProgress: (p) => {
        if (p.moves > 0) stop.abort();
      },
      signal: stop.signal,
    });
    expect(stop.signal.aborted).toBe(true);
    for (const c of r.chains) expect(c.stats.moves).toBeLessThan(huge.moves);
    for (const c of r.chains) expect(comparePlans(problem, r.plan, c.plan)).toBeLessThanOrEqual(0);
    expect(checkPlan(problem, r.plan)).toEqual([]);
    // One chain in this thread stops too (it yields to the event loop between slices).
    const here = new AbortController();
    setImmediate(() => here.abort());
    const one = await runChains(problem, { seed: 2, budget: huge }, 1, { signal: here.signal, now: () => performance.now() });
    expect(one.stats.moves).toBeLessThan(huge.moves);
    expect(checkPlan(problem, one.plan)).toEqual([]);
  }, 120_000);

  it("combines progress: moves summed, the lowest best cost, the slowest chain's fraction", () => {
    const p = (moves: number, fraction: number, bestCost: number): Progress => ({
      moves,
      fraction,
      temperature: 1,
      currentCost: bestCost + 1,
      bestCost,
      acceptanceRate: 0.5,
      elapsedMs: 10,
    });
    const c = combineProgress([p(100, 0.5, 900), p(80, 0.4, 850)]);
    expect(c).toMatchObject({ moves: 180, fraction: 0.4, bestCost: 850 });
    expect(combineProgress([p(100, 0.5, 900), undefined]).fraction).toBe(0);
  });

  it("accepts 1 to 64 workers and says how to fix anything else", () => {
    expect(parseWorkers(undefined)).toEqual({ workers: 1 });
    expect(parseWorkers("4")).toEqual({ workers: 4 });
    for (const bad of ["0", "1.5", "x", "65"])
      // The Workers field of the settings schema (the pane's field says the same).
      expect(parseWorkers(bad)).toHaveProperty(
        "error",
        expect.stringMatching(/^--workers: Workers .+ is not valid: enter a whole number from 1 to 64, such as 2\.$/),
      );
  });
});

describe("kiln plan --workers", () => {
  const keyLines = (out: string): string[] => out.split("\n").filter((l) => /^(Vehicles used|Distance|Cost|Unassigned|Feasible):/.test(l));

  it("--workers 1 writes the plan of a run without the flag; --workers 2 twice writes the same plan", async () => {
    const { path } = await demoCopy();
    const run = async (extra: string[]): Promise<string> => {
      const cap = captureIO();
      expect(
        await main(
          ["plan", path, "--moves", "8000", "--seed", "4", "--out", `${path}.${extra.join("")}.${Math.random()}.xlsx`, ...extra],
          cap.io,
        ),
      ).toBe(0);
      return cap.out();
    };
    const plain = await run([]);
    expect(keyLines(await run(["--workers", "1"]))).toEqual(keyLines(plain));
    const two = await run(["--workers", "2"]);
    expect(keyLines(await run(["--workers", "2"]))).toEqual(keyLines(two));
    expect(two).toMatch(/Chains: 2 on worker threads, \d+ moves in all, the best plan shared 7 times; the plan is chain [12]'s/);
  }, 120_000);

  it("refuses a bad --workers with exit 2 and one line", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await main(["plan", path, "--workers", "0"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/^--workers: Workers 0 is not valid: enter a whole number from 1 to 64/);
  });

  it("the compiled CLI finds its worker module (dist/cli/cli/chainWorker.js)", async () => {
    const bin = new URL("../../dist/cli/cli/kiln.js", import.meta.url).pathname;
    // `npm test` builds it first (pretest); a lone `npx vitest run` needs `npm run build:cli`.
    if (!existsSync(bin)) throw new Error("dist/cli/cli/kiln.js is missing: run `npm run build:cli` (npm test does it first)");
    const { path } = await demoCopy();
    const { stdout } = await promisify(execFile)(process.execPath, [bin, "plan", path, "--moves", "5000", "--workers", "2"]);
    expect(stdout).toMatch(/Chains: 2 on worker threads/);
    expect(stdout).toMatch(/Feasible: /);
  }, 120_000);
});
