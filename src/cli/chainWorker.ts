/**
 * One annealing chain in a worker thread (started by `runChains`): solves the problem it is
 * sent with the options it is sent, posts its progress and then its result. At each mark of
 * `marks` it posts its best plan and waits for the plan of the round (`SharingChain`). The stop
 * flag is a shared Int32Array the main thread sets on Ctrl-C; the solver reads it between moves
 * and ends with the best plan it has.
 */
import { parentPort, workerData } from "node:worker_threads";
import { createSolver, SharingChain } from "../core/index.js";
import type { ChainRequest, ChainMessage, ChainReply } from "./chains.js";

/** Milliseconds since the epoch, as `epochMs` in chains.ts (inlined: the worker loads only the core). */
const epochMs = (): number => performance.timeOrigin + performance.now();

const port = parentPort;
if (port) {
  const req = workerData as ChainRequest;
  const stop = new Int32Array(req.stop);
  const post = (m: ChainMessage): void => port.postMessage(m);
  const fail = (e: unknown): void => post({ type: "error", chain: req.chain, message: e instanceof Error ? e.message : String(e) });
  try {
    const solver = createSolver(req.problem, {
      ...req.options,
      now: epochMs,
      onProgress: (progress) => post({ type: "progress", chain: req.chain, progress }),
      signal: {
        get aborted() {
          return Atomics.load(stop, 0) !== 0;
        },
      },
    });
    const chain = new SharingChain(req.problem, solver, req.marks);
    // Runs until the next mark (then waits for the round's plan) or the end of the run.
    const run = (): void => {
      try {
        for (;;) {
          const at = chain.advance(4096);
          if (at === "done") return post({ type: "done", chain: req.chain, result: solver.result() });
          if (at === "mark") return post({ type: "mark", chain: req.chain, plan: chain.best() });
        }
      } catch (e) {
        fail(e);
      }
    };
    port.on("message", (m: ChainReply) => {
      if (m.type !== "share") return;
      try {
        chain.resume(m.plan);
      } catch (e) {
        return fail(e);
      }
      run();
    });
    run();
  } catch (e) {
    fail(e);
  }
}
