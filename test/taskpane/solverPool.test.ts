import { describe, expect, it } from "vitest";
import { runChains } from "../../src/cli/chains.js";
import {
  chainSeed,
  comparePlans,
  keptChain,
  parseSolomon,
  solomonToProblem,
  solve,
  type Issue,
  type Problem,
  type Progress,
} from "../../src/core/index.js";
import type { ChainClient, RunHandlers } from "../../src/taskpane/SolverClient.js";
import { SolverPool, type PoolResult } from "../../src/taskpane/SolverPool.js";
import { defaultPaneWorkers } from "../../src/taskpane/settingsFromForm.js";
import { createEngineHost, type FromWorker, type WorkerSolveOptions } from "../../src/taskpane/workerProtocol.js";
import { checkPlan } from "../core/checkPlan.js";
import { fixtureText } from "../reference/benchmarksDir.js";

// Solomon R101 (Solomon 1987, committed fixture): 100 customers with tight windows.
const problem: Problem = solomonToProblem(parseSolomon(fixtureText("R101.txt")));
const epochMs = (): number => performance.timeOrigin + performance.now();

/**
 * A worker's client over the same engine host the pane's Web Worker runs (`createEngineHost`),
 * with messages passed in this process and slices yielded through setImmediate, as a stand-in for
 * `SolverClient` (which needs a browser's Worker).
 */
class HostClient implements ChainClient {
  private run: { runId: number; handlers: RunHandlers } | undefined;
  private nextId = 1;
  private readonly host = createEngineHost({
    post: (m) => setImmediate(() => this.receive(m)),
    now: epochMs,
    defer: (cb) => setImmediate(cb),
    sliceMoves: 2000,
    progressEveryMs: 0,
    heapUsedBytes: () => process.memoryUsage().heapUsed,
  });
  get running(): boolean {
    return this.run !== undefined;
  }
  start(problem: Problem, options: WorkerSolveOptions, handlers: RunHandlers): number {
    const runId = this.nextId++;
    this.run = { runId, handlers };
    this.host.handle({ type: "start", runId, problem, options });
    return runId;
  }
  stop(): void {
    if (this.run) this.host.handle({ type: "stop", runId: this.run.runId });
  }
  private receive(m: FromWorker): void {
    const run = this.run;
    if (!run || !("runId" in m) || m.runId !== run.runId) return;
    if (m.type === "progress") run.handlers.onProgress(m.progress);
    else if (m.type === "result") {
      this.run = undefined;
      run.handlers.onResult(m.result, m.stopped, { peakHeapBytes: m.peakHeapBytes });
    } else if (m.type === "error") {
      this.run = undefined;
      run.handlers.onError(m.message, m.issues);
    }
  }
}

/** A worker that fails its run after a while (as a worker whose script throws would). */
class FailingClient implements ChainClient {
  private handlers: RunHandlers | undefined;
  get running(): boolean {
    return this.handlers !== undefined;
  }
  start(_problem: Problem, _options: WorkerSolveOptions, handlers: RunHandlers): number {
    this.handlers = handlers;
    setTimeout(() => {
      const h = this.handlers;
      this.handlers = undefined;
      h?.onError("The solver worker failed: out of memory", []);
    }, 50);
    return 1;
  }
  stop(): void {}
}

type Outcome = { result: PoolResult; stopped: boolean; progress: Progress[] } | { error: string; issues: readonly Issue[] };

function runPool(pool: SolverPool, options: WorkerSolveOptions, workers: number, onProgress?: (p: Progress) => void): Promise<Outcome> {
  const progress: Progress[] = [];
  return new Promise((resolve) =>
    pool.start(
      problem,
      options,
      workers,
      {
        onProgress: (p) => {
          progress.push(p);
          onProgress?.(p);
        },
        onResult: (result, stopped) => resolve({ result, stopped, progress }),
        onError: (error, issues) => resolve({ error, issues }),
      },
      epochMs(),
    ),
  );
}

const routesOf = (plan: PoolResult["plan"]): unknown => plan.routes.map((r) => [r.vehicle, r.visits.map((v) => v.stop)]);

describe("the pane's pool of solver workers", () => {
  it("two workers with a move budget give the CLI's --workers 2 plan, chain by chain, and keep the better chain's", async () => {
    const options = { seed: 9, budget: { moves: 12_000 } };
    const pool = new SolverPool(new HostClient(), () => new HostClient());
    const out = await runPool(pool, options, 2);
    if (!("result" in out)) throw new Error(out.error);
    const cli = await runChains(problem, options, 2);
    expect(routesOf(out.result.plan)).toEqual(routesOf(cli.plan));
    expect(out.result.chain).toBe(cli.chain);
    // Each chain is the one-chain run of its seed (chainSeed), and the kept one is the best by comparePlans.
    for (const k of [0, 1]) {
      expect(routesOf(out.result.chains[k]!.plan)).toEqual(
        routesOf(solve(problem, { seed: chainSeed(9, k), budget: options.budget }).plan),
      );
      expect(comparePlans(problem, out.result.plan, out.result.chains[k]!.plan)).toBeLessThanOrEqual(0);
    }
    expect(out.result.chain).toBe(
      keptChain(
        problem,
        out.result.chains.map((c) => c.plan),
      ),
    );
    expect(out.stopped).toBe(false);
    // The combined progress counts the moves of both chains; the shown best never beats the kept plan.
    const last = out.progress.at(-1)!;
    expect(last.moves).toBe(out.result.chains.reduce((s, c) => s + c.stats.moves, 0));
    expect(last.bestCost).toBeGreaterThanOrEqual(Math.min(...out.result.chains.map((c) => c.plan.totals.cost)) - 1e-6);
    expect(out.result.peakHeapBytes).toBeGreaterThan(0);
    // Re-checked by the independent checker written for the tests.
    expect(checkPlan(problem, out.result.plan)).toEqual([]);
    expect(pool.running).toBe(false);
    expect(pool.size).toBe(2);
  }, 120_000);

  it("Stop stops every worker and keeps the exact best plan any of them had", async () => {
    const pool = new SolverPool(new HostClient(), () => new HostClient());
    const huge = { moves: 500_000_000 };
    const out = await runPool(pool, { seed: 4, budget: huge }, 3, (p) => {
      if (p.moves > 20_000) pool.stop();
    });
    if (!("result" in out)) throw new Error(out.error);
    expect(out.stopped).toBe(true);
    expect(out.result.chains).toHaveLength(3);
    for (const c of out.result.chains) {
      expect(c.stats.moves).toBeLessThan(huge.moves);
      expect(comparePlans(problem, out.result.plan, c.plan)).toBeLessThanOrEqual(0);
    }
    expect(checkPlan(problem, out.result.plan)).toEqual([]);
    expect(pool.running).toBe(false);
  }, 120_000);

  it("an error in one worker stops the others and is reported once, naming the worker, after all have ended", async () => {
    const others = [new HostClient(), new HostClient()];
    const made = [new FailingClient(), others[1]!];
    const pool = new SolverPool(others[0]!, () => made.shift()!);
    const out = await runPool(pool, { seed: 2, budget: { moves: 500_000_000 } }, 3);
    expect(out).toMatchObject({ error: "Worker 2 of 3 failed, so the run was stopped: The solver worker failed: out of memory" });
    expect(others.every((c) => !c.running)).toBe(true);
    expect(pool.running).toBe(false);
  }, 120_000);

  it("one worker reports the problem's own defects as the single worker did", async () => {
    const pool = new SolverPool(new HostClient(), () => new HostClient());
    const broken: Problem = { ...problem, vehicles: [] };
    const out = await new Promise<Outcome>((resolve) =>
      pool.start(
        broken,
        { seed: 1, budget: { moves: 100 } },
        1,
        {
          onProgress: () => {},
          onResult: (result, stopped) => resolve({ result, stopped, progress: [] }),
          onError: (error, issues) => resolve({ error, issues }),
        },
        epochMs(),
      ),
    );
    expect(out).toMatchObject({ error: expect.stringMatching(/defect/) });
    expect("issues" in out && out.issues.length).toBeGreaterThan(0);
  });

  it("refuses a worker count outside the Workers field's range", () => {
    const pool = new SolverPool(new HostClient(), () => new HostClient());
    const h = { onProgress: () => {}, onResult: () => {}, onError: () => {} };
    for (const bad of [0, 65, 1.5]) expect(() => pool.start(problem, {}, bad, h, 0)).toThrow(RangeError);
  });

  it("starts the Workers field at the cores the browser reports minus one, at least 1 and at most 64", () => {
    expect(defaultPaneWorkers(8)).toBe(7);
    expect(defaultPaneWorkers(2)).toBe(1);
    expect(defaultPaneWorkers(1)).toBe(1);
    expect(defaultPaneWorkers(0)).toBe(1);
    expect(defaultPaneWorkers(undefined)).toBe(1);
    expect(defaultPaneWorkers(256)).toBe(64);
  });
});

describe("the run figures of several workers", () => {
  it("name the chains, their moves together, the kept chain, and the memory figure or why there is none", async () => {
    const { workersText, memoryText } = await import("../../src/taskpane/runProgress.js");
    const one = solve(problem, { seed: 1, budget: { moves: 500 } });
    expect(workersText(one)).toBe(`1 (${one.stats.moves.toLocaleString("en")} moves)`);
    const two = { ...one, chain: 1, chains: [one, one], peakHeapBytes: 41 * 2 ** 20 };
    expect(workersText(two)).toBe(`2; the plan is chain 2's (${(2 * one.stats.moves).toLocaleString("en")} moves in all)`);
    expect(memoryText(two)).toBe("41 MB JS heap (largest worker)");
    expect(memoryText({ ...two, peakHeapBytes: undefined })).toMatch(/^not available: /);
  });
});
