import { describe, expect, it } from "vitest";
import { runChains } from "../../src/cli/chains.js";
import {
  comparePlans,
  keptChain,
  parseSolomon,
  shareMarks,
  solomonToProblem,
  solve,
  type Issue,
  type Problem,
  type Progress,
} from "../../src/core/index.js";
import { SolverClient, type ChainClient, type RunHandlers, type WorkerPort } from "../../src/taskpane/SolverClient.js";
import { SolverPool, type PoolResult } from "../../src/taskpane/SolverPool.js";
import { defaultPaneWorkers } from "../../src/taskpane/settingsFromForm.js";
import { createEngineHost, type FromWorker, type WorkerSolveOptions } from "../../src/taskpane/workerProtocol.js";
import { checkPlan } from "../core/checkPlan.js";
import { fixtureText } from "../reference/benchmarksDir.js";

// Solomon R101 (Solomon 1987, committed fixture): 100 customers with tight windows.
const problem: Problem = solomonToProblem(parseSolomon(fixtureText("R101.txt")));
const epochMs = (): number => performance.timeOrigin + performance.now();

/**
 * A worker in this process for the real `SolverClient`: the same engine host the pane's Web
 * Worker runs (`createEngineHost`), messages structured-cloned both ways as a Worker's are and
 * delivered on later turns of the event loop, slices yielded through setImmediate.
 */
function inProcessWorker(): WorkerPort {
  const port: WorkerPort = {
    postMessage: (m) => {
      const copy = structuredClone(m);
      setImmediate(() => host.handle(copy));
    },
    onmessage: null,
    onerror: null,
  };
  const host = createEngineHost({
    post: (m) => {
      const copy = structuredClone(m);
      setImmediate(() => port.onmessage?.({ data: copy }));
    },
    now: epochMs,
    defer: (cb) => setImmediate(cb),
    sliceMoves: 2000,
    progressEveryMs: 0,
    heapUsedBytes: () => process.memoryUsage().heapUsed,
  });
  return port;
}

/** The pane's own client class over a worker in this process. */
const inProcessClient = (): SolverClient => new SolverClient(inProcessWorker());

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
  share(): void {}
  stop(): void {}
}

type Outcome = { result: PoolResult; stopped: boolean; progress: Progress[] } | { error: string; issues: readonly Issue[] };

function runPool(
  pool: SolverPool,
  options: WorkerSolveOptions,
  workers: number,
  onProgress?: (p: Progress) => void,
  startedAt = epochMs(),
  of: Problem = problem,
): Promise<Outcome> {
  const progress: Progress[] = [];
  return new Promise((resolve) =>
    pool.start(
      of,
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
      startedAt,
    ),
  );
}

const routesOf = (plan: PoolResult["plan"]): unknown => plan.routes.map((r) => [r.vehicle, r.visits.map((v) => v.stop)]);

describe("the pane's pool of solver workers", () => {
  it("two workers with a move budget give the CLI's --workers 2 plan, chain by chain, and keep the better chain's", async () => {
    const options = { seed: 9, budget: { moves: 12_000 } };
    const pool = new SolverPool(inProcessClient(), () => inProcessClient());
    const out = await runPool(pool, options, 2);
    if (!("result" in out)) throw new Error(out.error);
    const cli = await runChains(problem, options, 2);
    expect(routesOf(out.result.plan)).toEqual(routesOf(cli.plan));
    expect(out.result.chain).toBe(cli.chain);
    // The chains shared at every mark of the budget, as the CLI's did, and each chain ended on the CLI's chain's plan.
    expect(out.result.shares).toBe(shareMarks(options.budget).length);
    expect(cli.shares).toBe(out.result.shares);
    for (const k of [0, 1]) {
      expect(routesOf(out.result.chains[k]!.plan)).toEqual(routesOf(cli.chains[k]!.plan));
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
    const pool = new SolverPool(inProcessClient(), () => inProcessClient());
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

  it("Stop while a worker waits at a mark ends it at once with the exact plan it reported there", async () => {
    const sent: FromWorker[] = [];
    let wake: () => void = () => {};
    const host = createEngineHost({
      post: (m) => {
        sent.push(m);
        wake();
      },
      now: epochMs,
      defer: (cb) => setImmediate(cb),
      sliceMoves: 2000,
    });
    const until = (type: FromWorker["type"]): Promise<FromWorker> =>
      new Promise((resolve) => {
        const look = (): void => {
          const m = sent.find((x) => x.type === type);
          if (m) resolve(m);
          else wake = look;
        };
        look();
      });
    host.handle({ type: "start", runId: 1, problem, options: { seed: 3, budget: { moves: 500_000_000 } }, marks: [{ moves: 5_000 }] });
    const mark = await until("mark");
    expect(host.busy).toBe(true);
    host.handle({ type: "stop", runId: 1 });
    const result = sent.find((m) => m.type === "result");
    if (mark.type !== "mark" || result?.type !== "result") throw new Error("expected a mark, then a result at once");
    expect(result.stopped).toBe(true);
    // At the mark (the route-minimisation phase ends a slice on a whole pop, so it may pass the mark a little).
    expect(result.result.stats.moves).toBeGreaterThanOrEqual(5_000);
    expect(result.result.stats.moves).toBeLessThan(500_000_000);
    expect(routesOf(result.result.plan)).toEqual(routesOf(mark.plan));
    // Re-checked by the independent checker written for the tests.
    expect(checkPlan(problem, result.result.plan)).toEqual([]);
    expect(host.busy).toBe(false);
  }, 120_000);

  it("an error in one worker stops the others and is reported once, naming the worker, after all have ended", async () => {
    const others = [inProcessClient(), inProcessClient()];
    const made = [new FailingClient(), others[1]!];
    const pool = new SolverPool(others[0]!, () => made.shift()!);
    const out = await runPool(pool, { seed: 2, budget: { moves: 500_000_000 } }, 3);
    expect(out).toMatchObject({ error: "Worker 2 of 3 failed, so the run was stopped: The solver worker failed: out of memory" });
    expect(others.every((c) => !c.running)).toBe(true);
    expect(pool.running).toBe(false);
  }, 120_000);

  it("one worker reports the problem's own defects as the single worker did", async () => {
    const pool = new SolverPool(inProcessClient(), () => inProcessClient());
    const broken: Problem = { ...problem, vehicles: [] };
    const out = await runPool(pool, { seed: 1, budget: { moves: 100 } }, 1, undefined, epochMs(), broken);
    expect(out).toMatchObject({ error: expect.stringMatching(/defect/) });
    expect("issues" in out && out.issues.length).toBeGreaterThan(0);
  });

  it("one worker counts a seconds budget from the press of Optimize: the time the problem takes to reach it is inside the budget", async () => {
    const pool = new SolverPool(inProcessClient(), () => inProcessClient());
    // Pressed 1.5 s ago (as if copying a large matrix into the worker had taken that long).
    const pressedAt = epochMs() - 1_500;
    const handedOver = epochMs();
    const out = await runPool(pool, { seed: 1, budget: { seconds: 2 } }, 1, undefined, pressedAt);
    const arrived = epochMs();
    if (!("result" in out)) throw new Error(out.error);
    // The run's clock started at the press, so it reports at least the 2 s budget ...
    expect(out.result.stats.elapsedMs).toBeGreaterThanOrEqual(2_000);
    // ... and searched for well under 2 s after the hand-over (about 0.5 s; slack for a busy machine).
    expect(arrived - handedOver).toBeLessThan(1_900);
  }, 30_000);

  it("refuses a worker count outside the Workers field's range", () => {
    const pool = new SolverPool(inProcessClient(), () => inProcessClient());
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
    const two = { ...one, chain: 1, chains: [one, one], peakHeapBytes: 41 * 2 ** 20, shares: 7 };
    expect(workersText(two)).toBe(
      `2, the best plan shared 7 times; the plan is chain 2's (${(2 * one.stats.moves).toLocaleString("en")} moves in all)`,
    );
    expect(memoryText(two)).toBe("41 MB JS heap (largest worker)");
    expect(memoryText({ ...two, peakHeapBytes: undefined })).toMatch(/^not available: /);
  });
});
