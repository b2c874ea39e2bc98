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

const host = createEngineHost({
  post: (message) => scope.postMessage(message),
  now: () => performance.now(),
  // A macrotask, not a microtask: the stop message must get its turn between slices.
  defer: (callback) => setTimeout(callback, 0),
});

scope.onmessage = (event) => host.handle(event.data);
