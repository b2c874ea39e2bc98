/**
 * The messages between the pane and its solver Web Worker, and the engine host that answers
 * them. Pure: the worker file only wires `createEngineHost` to `postMessage`, a clock and a
 * deferral, so the whole protocol runs (and is tested) in Node without a browser.
 *
 * A run is sliced: the host calls `solver.step(sliceMoves)`, then yields through `defer`, so a
 * `stop` message that arrived meanwhile is seen before the next slice (the worker's event loop
 * delivers it between two deferred callbacks). A run of several chains (`SolverPool`) is sent the
 * marks where chains share: at each the host posts its best plan (`mark`) and waits for the
 * round's plan (`share`), as `SharingChain` says; a `stop` while it waits ends the run at once.
 */
import {
  createSolver,
  sampleMeanUphill,
  SharingChain,
  validateProblem,
  type Issue,
  type Plan,
  type Problem,
  type ShareMark,
  type Progress,
  type SolveOptions,
  type SolveResult,
  type Solver,
} from "../core/index.js";

/** The solve options that cross the worker boundary (plain data: no clock, callback or signal). */
export type WorkerSolveOptions = Partial<Omit<SolveOptions, "now" | "onProgress" | "signal">>;

/** Messages from the pane to the worker. */
export type ToWorker =
  | {
      readonly type: "start";
      readonly runId: number;
      readonly problem: Problem;
      readonly options: WorkerSolveOptions;
      /** Where this chain reports its best plan and waits for the round's (absent: a chain on its own). */
      readonly marks?: readonly ShareMark[];
    }
  | { readonly type: "stop"; readonly runId: number }
  /** The plan of the round to continue from (or none), after the run posted `mark`. */
  | { readonly type: "share"; readonly runId: number; readonly plan: Plan | undefined }
  | {
      readonly type: "sample";
      readonly requestId: number;
      readonly problem: Problem;
      readonly seed?: number | string;
      readonly samples?: number;
    };

/** Messages from the worker to the pane. */
export type FromWorker =
  | { readonly type: "progress"; readonly runId: number; readonly progress: Progress }
  /** The run reached a mark with this best plan and waits for `share`. */
  | { readonly type: "mark"; readonly runId: number; readonly plan: Plan }
  | {
      readonly type: "result";
      readonly runId: number;
      readonly result: SolveResult;
      readonly stopped: boolean;
      /** Largest JS heap the worker reported during the run (bytes); absent when its browser reports none. */
      readonly peakHeapBytes?: number;
    }
  | {
      readonly type: "sampled";
      readonly requestId: number;
      readonly meanUphill: number;
      readonly samples: number;
      readonly uphill: readonly number[];
      /** Moves per second measured by a timed burst on this problem (see `measureMoveRate`). */
      readonly movesPerSecond?: number;
    }
  | {
      readonly type: "error";
      /** The run or request the error belongs to; absent for an unreadable message. */
      readonly runId?: number;
      readonly requestId?: number;
      readonly message: string;
      /** Problem defects found by `validateProblem`; empty for other errors. */
      readonly issues: readonly Issue[];
    };

/** What the engine host needs from its surroundings. */
export interface EngineHostDeps {
  /** Send a message to the pane. */
  readonly post: (message: FromWorker) => void;
  /** Milliseconds clock (the worker passes `performance.now`). */
  readonly now: () => number;
  /** Run `callback` later, after pending messages are handled (the worker passes `setTimeout(cb, 0)`). */
  readonly defer: (callback: () => void) => void;
  /** Moves per slice between two looks at the message queue (default 20 000). */
  readonly sliceMoves?: number;
  /** Least milliseconds between two progress messages (default 200). */
  readonly progressEveryMs?: number;
  /**
   * The worker's JS heap in use now (bytes), or undefined when the browser does not say
   * (Chromium's `performance.memory` exists in pages only, not in workers); sampled every slice.
   */
  readonly heapUsedBytes?: () => number | undefined;
}

/** The engine host: feed it every message the worker receives. */
export interface EngineHost {
  /** Handle one incoming message; never throws (failures come back as `error` messages). */
  handle(message: unknown): void;
  /** True while a run is going. */
  readonly busy: boolean;
}

/**
 * Create the engine host that answers `ToWorker` messages with `FromWorker` messages.
 * One run at a time: a `start` while a run goes stops the old run first (its result is posted).
 *
 * @param deps - messaging, clock and deferral (see `EngineHostDeps`)
 * @returns the host
 * @throws TypeError when `deps.post`, `deps.now` or `deps.defer` is not a function
 * @example
 * const host = createEngineHost({ post: (m) => self.postMessage(m), now: () => performance.now(), defer: (cb) => setTimeout(cb, 0) });
 * self.onmessage = (e) => host.handle(e.data);
 */
export function createEngineHost(deps: EngineHostDeps): EngineHost {
  for (const key of ["post", "now", "defer"] as const) {
    if (typeof deps[key] !== "function") throw new TypeError(`deps.${key} must be a function`);
  }
  const sliceMoves = Math.max(1, Math.floor(deps.sliceMoves ?? 20_000));
  const progressEveryMs = deps.progressEveryMs ?? 200;
  let run:
    | { runId: number; solver: Solver; chain: SharingChain; stopRequested: boolean; lastProgressMs: number; peakHeapBytes?: number }
    | undefined;
  const sampleHeap = (current: NonNullable<typeof run>): void => {
    const used = deps.heapUsedBytes?.();
    if (used !== undefined && Number.isFinite(used)) current.peakHeapBytes = Math.max(current.peakHeapBytes ?? 0, used);
  };

  const post = (message: FromWorker): void => {
    try {
      deps.post(message);
    } catch (err) {
      // A message that cannot be cloned must not kill the worker loop.
      console.error("kiln worker: could not post", message.type, err);
    }
  };
  const fail = (ids: { runId?: number; requestId?: number }, err: unknown, issues: readonly Issue[] = []): void => {
    post({ type: "error", ...ids, message: errorMessage(err), issues });
  };

  const finish = (stopped: boolean): void => {
    const current = run;
    if (!current) return;
    run = undefined;
    try {
      sampleHeap(current);
      const peak = current.peakHeapBytes;
      post({
        type: "result",
        runId: current.runId,
        result: current.solver.result(),
        stopped,
        ...(peak !== undefined ? { peakHeapBytes: peak } : {}),
      });
    } catch (err) {
      fail({ runId: current.runId }, err);
    }
  };

  const slice = (runId: number): void => {
    const current = run;
    if (!current || current.runId !== runId) return;
    if (current.stopRequested) return finish(true);
    try {
      const at = current.chain.advance(sliceMoves);
      const done = at === "done";
      sampleHeap(current);
      const nowMs = deps.now();
      if (done || nowMs - current.lastProgressMs >= progressEveryMs) {
        current.lastProgressMs = nowMs;
        post({ type: "progress", runId, progress: { ...current.solver.progress } });
      }
      if (done) return finish(false);
      // At a mark: report the best plan and wait for the round's (`share` defers the next slice).
      if (at === "mark") return post({ type: "mark", runId, plan: current.chain.best() });
    } catch (err) {
      run = undefined;
      return fail({ runId }, err);
    }
    deps.defer(() => slice(runId));
  };

  const start = (msg: Extract<ToWorker, { type: "start" }>): void => {
    if (run) finish(true);
    const issues = safeValidate(msg.problem);
    if (issues.length > 0) {
      return fail({ runId: msg.runId }, `The problem has ${issues.length} defect(s); nothing was solved.`, issues);
    }
    let solver: Solver;
    try {
      solver = createSolver(msg.problem, { ...msg.options, now: deps.now });
    } catch (err) {
      return fail({ runId: msg.runId }, err);
    }
    const chain = new SharingChain(msg.problem, solver, msg.marks ?? []);
    run = { runId: msg.runId, solver, chain, stopRequested: false, lastProgressMs: -Infinity };
    sampleHeap(run);
    deps.defer(() => slice(msg.runId));
  };

  const handle = (message: unknown): void => {
    const msg = message as ToWorker | undefined;
    const ids = idsOf(message);
    try {
      switch (msg?.type) {
        case "start":
          return start(msg);
        case "stop":
          if (run && run.runId === msg.runId) {
            run.stopRequested = true;
            // Waiting at a mark, no slice is pending to see the stop: end now.
            if (run.chain.waiting) finish(true);
          }
          return;
        case "share": {
          const current = run;
          if (!current || current.runId !== msg.runId || !current.chain.waiting) return;
          try {
            current.chain.resume(msg.plan);
          } catch (err) {
            run = undefined;
            return fail({ runId: msg.runId }, err);
          }
          deps.defer(() => slice(msg.runId));
          return;
        }
        case "sample": {
          const issues = safeValidate(msg.problem);
          if (issues.length > 0) return fail(ids, "The problem has defects; nothing was sampled.", issues);
          const sampled = sampleMeanUphill(msg.problem, {
            now: deps.now,
            ...(msg.seed !== undefined ? { seed: msg.seed } : {}),
            ...(msg.samples !== undefined ? { samples: msg.samples } : {}),
          });
          return post({ type: "sampled", requestId: msg.requestId, ...sampled });
        }
        default:
          return fail(ids, `Unknown message ${JSON.stringify(typeOf(message))}: expected start, stop, share or sample.`);
      }
    } catch (err) {
      fail(ids, err);
    }
  };

  return {
    handle,
    get busy() {
      return run !== undefined;
    },
  };
}

function safeValidate(problem: unknown): Issue[] {
  if (problem === null || typeof problem !== "object") {
    return [{ sheet: "problem", cell: "", message: "No problem was sent: expected a Problem object." }];
  }
  try {
    return validateProblem(problem as Problem);
  } catch (err) {
    return [{ sheet: "problem", cell: "", message: errorMessage(err) }];
  }
}

function typeOf(message: unknown): unknown {
  return message !== null && typeof message === "object" ? ((message as { type?: unknown }).type ?? null) : null;
}

function idsOf(message: unknown): { runId?: number; requestId?: number } {
  if (message === null || typeof message !== "object") return {};
  const m = message as { runId?: unknown; requestId?: unknown };
  return {
    ...(typeof m.runId === "number" ? { runId: m.runId } : {}),
    ...(typeof m.requestId === "number" ? { requestId: m.requestId } : {}),
  };
}

function errorMessage(err: unknown): string {
  if (typeof err === "string") return err;
  if (err instanceof Error) return err.message;
  return String(err);
}
