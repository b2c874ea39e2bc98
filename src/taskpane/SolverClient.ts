/**
 * The pane's side of the solver worker: starts runs, forwards stop and the shared plans of a
 * pool's rounds, and turns sample requests into promises. Only plain data crosses (the
 * Problem's typed arrays are structured-cloned).
 */
import type { Issue, Plan, Problem, Progress, ShareMark, SolveResult } from "../core/index.js";
import type { FromWorker, ToWorker, WorkerSolveOptions } from "./workerProtocol.js";

/** Figures of one run besides the solver's own. */
export interface RunFigures {
  /** Largest JS heap the worker reported (bytes); undefined when the browser reports none in a worker. */
  readonly peakHeapBytes?: number | undefined;
}

/** Callbacks of one run. */
export interface RunHandlers {
  onProgress(progress: Progress): void;
  /** The run reached a mark (a run started with marks) with this best plan; answer with `share`. */
  onMark?(plan: Plan): void;
  onResult(result: SolveResult, stopped: boolean, figures?: RunFigures): void;
  onError(message: string, issues: readonly Issue[]): void;
}

/** A failure reported by the worker, with the problem defects it found. */
export class WorkerError extends Error {
  constructor(
    message: string,
    readonly issues: readonly Issue[],
  ) {
    super(message);
    this.name = "WorkerError";
  }
}

/** What a pool of chains needs from one worker's client (`SolverClient`, or a stand-in in tests). */
export interface ChainClient {
  readonly running: boolean;
  start(problem: Problem, options: WorkerSolveOptions, handlers: RunHandlers, marks?: readonly ShareMark[]): number;
  /** The plan of the round the run waits for at its mark (none: go on as it was). */
  share(plan: Plan | undefined): void;
  stop(): void;
}

/**
 * What the client needs of a worker: a Web Worker, or in tests an in-process stand-in that
 * passes messages to the same engine host (`createEngineHost`).
 */
export interface WorkerPort {
  postMessage(message: ToWorker): void;
  onmessage: ((event: { data: FromWorker }) => void) | null;
  onerror: ((event: { message?: string }) => void) | null;
}

/** Talks to one solver worker. */
export class SolverClient implements ChainClient {
  private readonly worker: WorkerPort;
  private nextId = 1;
  private run: { runId: number; handlers: RunHandlers } | undefined;
  private readonly requests = new Map<number, { resolve: (m: FromWorker) => void; reject: (e: Error) => void }>();

  /**
   * @param port - the worker to talk to; by default a new solver Web Worker (webpack finds the
   *   worker script by the literal `new Worker(new URL(...))` below, so it stays in that form)
   */
  constructor(port?: WorkerPort) {
    this.worker = port ?? (new Worker(new URL("./solverWorker.ts", import.meta.url)) as unknown as WorkerPort);
    this.worker.onmessage = (e) => this.receive(e.data);
    this.worker.onerror = (e) => {
      const message = `The solver worker failed: ${e.message || "unknown error"}`;
      this.run?.handlers.onError(message, []);
      this.run = undefined;
      for (const r of this.requests.values()) r.reject(new Error(message));
      this.requests.clear();
    };
  }

  /** True while a run goes. */
  get running(): boolean {
    return this.run !== undefined;
  }

  /**
   * Start a run (a run already going is stopped first; its result still arrives).
   *
   * @param problem - the problem to solve
   * @param options - serialisable solve options (seed, budget, rule, cooling, p0, pEnd)
   * @param handlers - progress, result and error callbacks
   * @returns the run id
   */
  start(problem: Problem, options: WorkerSolveOptions, handlers: RunHandlers, marks?: readonly ShareMark[]): number {
    const runId = this.nextId++;
    this.run = { runId, handlers };
    this.post({ type: "start", runId, problem, options, ...(marks && marks.length > 0 ? { marks } : {}) });
    return runId;
  }

  /** Send the round's plan to the run waiting at its mark. */
  share(plan: Plan | undefined): void {
    if (this.run) this.post({ type: "share", runId: this.run.runId, plan });
  }

  /** Ask the running run to stop after its current slice; the best plan so far comes back as its result. */
  stop(): void {
    if (this.run) this.post({ type: "stop", runId: this.run.runId });
  }

  /**
   * Sample the mean uphill cost change of random moves from the first plan (for calibration and the preview).
   *
   * @param problem - the problem
   * @param seed - seed of the sampling
   * @returns the mean uphill change (cost units), the number of samples and the moves per second
   *   measured on this problem
   * @throws WorkerError (as a rejected promise) when the problem has defects
   */
  sample(
    problem: Problem,
    seed: number | string,
  ): Promise<{ meanUphill: number; samples: number; uphill: readonly number[]; movesPerSecond?: number }> {
    const requestId = this.nextId++;
    return new Promise<FromWorker>((resolve, reject) => {
      this.requests.set(requestId, { resolve, reject });
      this.post({ type: "sample", requestId, problem, seed });
    }).then((m) => {
      if (m.type === "sampled") {
        const { meanUphill, samples, uphill, movesPerSecond } = m;
        return movesPerSecond === undefined ? { meanUphill, samples, uphill } : { meanUphill, samples, uphill, movesPerSecond };
      }
      if (m.type === "error") throw new WorkerError(m.message, m.issues);
      throw new Error(`Unexpected reply ${m.type} to a sample request`);
    });
  }

  private post(message: ToWorker): void {
    this.worker.postMessage(message);
  }

  private receive(m: FromWorker): void {
    if (m.type === "sampled" || (m.type === "error" && m.requestId !== undefined)) {
      const id = m.requestId;
      const pending = id !== undefined ? this.requests.get(id) : undefined;
      if (pending && id !== undefined) {
        this.requests.delete(id);
        pending.resolve(m);
      }
      return;
    }
    const run = this.run;
    if (!run || !("runId" in m) || m.runId !== run.runId) return;
    if (m.type === "progress") run.handlers.onProgress(m.progress);
    else if (m.type === "mark") run.handlers.onMark?.(m.plan);
    else if (m.type === "result") {
      this.run = undefined;
      run.handlers.onResult(m.result, m.stopped, { peakHeapBytes: m.peakHeapBytes });
    } else if (m.type === "error") {
      this.run = undefined;
      run.handlers.onError(m.message, m.issues);
    }
  }
}
