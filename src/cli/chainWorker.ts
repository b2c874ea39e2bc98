/**
 * One annealing chain in a worker thread (started by `runChains`): solves the problem it is
 * sent with the options it is sent, posts its progress and then its result. The stop flag is
 * a shared Int32Array the main thread sets on Ctrl-C; the solver reads it between moves and
 * ends with the best plan it has.
 */
import { parentPort, workerData } from "node:worker_threads";
import { createSolver } from "../core/index.js";
import type { ChainRequest, ChainMessage } from "./chains.js";

/** Milliseconds since the epoch, as `epochMs` in chains.ts (inlined: the worker loads only the core). */
const epochMs = (): number => performance.timeOrigin + performance.now();

const port = parentPort;
if (port) {
  const req = workerData as ChainRequest;
  const stop = new Int32Array(req.stop);
  const post = (m: ChainMessage): void => port.postMessage(m);
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
    while (!solver.step(4096)) {
      // step checks the stop flag and the clock itself.
    }
    post({ type: "done", chain: req.chain, result: solver.result() });
  } catch (e) {
    post({ type: "error", chain: req.chain, message: e instanceof Error ? e.message : String(e) });
  }
}
