/**
 * The solver Web Worker: a thin shell around `createEngineHost` (all logic is in
 * `workerProtocol.ts`, tested in Node). Started by `SolverClient` with
 * `new Worker(new URL("./solverWorker.ts", import.meta.url))`.
 */
import { createEngineHost } from "./workerProtocol.js";

const scope = self as unknown as {
  postMessage(message: unknown): void;
  onmessage: ((event: { data: unknown }) => void) | null;
};

/** Chromium's non-standard `performance.memory`, where a browser offers it in a worker. */
const memory = (performance as Performance & { memory?: { usedJSHeapSize?: number } }).memory;

const host = createEngineHost({
  post: (message) => scope.postMessage(message),
  // Milliseconds since the epoch: the same scale in every worker and the page, so several chains
  // can share one start (`SolveOptions.startedAt`) and a seconds budget ends at one moment.
  now: () => performance.timeOrigin + performance.now(),
  heapUsedBytes: () => memory?.usedJSHeapSize,
  // A macrotask, not a microtask: the stop message must get its turn between slices.
  defer: (callback) => setTimeout(callback, 0),
});

scope.onmessage = (event) => host.handle(event.data);
