/**
 * Several solver Web Workers running the chains of one run (the pane's Workers field): chain k
 * gets `chainSeed(seed, k)` and the whole budget, every chain starts from the same clock moment
 * (`startedAt`), at the marks of the budget (`shareMarks`) every chain reports its best plan and
 * continues from the best of them (`ShareRounds`), progress is combined (`combineProgress`) and
 * the plan kept is the core's choice (`keptChain`), so the same seed, move budget and number of
 * workers give the plan the CLI's `--workers` gives. Stop stops them all; an error in one stops
 * the others and is reported once, after all have ended.
 */
import {
  chainSeed,
  combineProgress,
  keptChain,
  shareMarks,
  ShareRounds,
  SOLVE_DEFAULTS,
  type Issue,
  type Problem,
  type Progress,
  type ShareDelivery,
  type SolveResult,
} from "../core/index.js";
import type { ChainClient, RunFigures } from "./SolverClient.js";
import type { WorkerSolveOptions } from "./workerProtocol.js";

/** The result of a run of several chains: the kept chain's result, which chain, and every chain's. */
export interface PoolResult extends SolveResult {
  /** Index (from 0) of the chain whose plan is `plan`. */
  readonly chain: number;
  /** Each chain's result, by index. */
  readonly chains: readonly SolveResult[];
  /** Largest JS heap any one worker reported (bytes); undefined when the browser reports none in a worker. */
  readonly peakHeapBytes?: number | undefined;
  /** Times the chains shared their best plan (0 for one worker). */
  readonly shares: number;
}

/** Callbacks of one pool run. */
export interface PoolRunHandlers {
  /** Combined progress: moves summed, the best cost of any chain, the slowest chain's fraction. */
  onProgress(progress: Progress): void;
  /** Every chain ended; `stopped` when Stop ended them early. */
  onResult(result: PoolResult, stopped: boolean): void;
  /** A chain failed: the others were stopped and have ended; nothing is kept. */
  onError(message: string, issues: readonly Issue[]): void;
}

/** Runs chains on a growing set of workers; the first is the pane's own (shared with the preview). */
export class SolverPool {
  private readonly clients: ChainClient[];
  private current: { id: number; stopped: boolean } | undefined;
  private nextId = 1;

  /**
   * @param first - the pane's worker client (chain 0)
   * @param create - makes the client of one more worker, when a run needs more than there are
   */
  constructor(
    first: ChainClient,
    private readonly create: () => ChainClient,
  ) {
    this.clients = [first];
  }

  /** True while any chain of a run is going. */
  get running(): boolean {
    return this.current !== undefined;
  }

  /** Workers started so far (they stay for the next run). */
  get size(): number {
    return this.clients.length;
  }

  /**
   * Start `workers` chains of one run.
   *
   * @param problem - the problem (checked by each worker)
   * @param options - the run's options; `seed` is chain 0's, the others' derive from it
   * @param workers - number of chains, 1 to 64
   * @param handlers - combined progress, the kept result, or one error
   * @param startedAt - the run's start in milliseconds since the epoch (the workers' clock):
   *   a seconds budget ends at the same moment in every chain
   * @throws RangeError when `workers` is not a whole number from 1 to 64, or a run is going
   */
  start(problem: Problem, options: WorkerSolveOptions, workers: number, handlers: PoolRunHandlers, startedAt: number): void {
    if (!Number.isInteger(workers) || workers < 1 || workers > 64) throw new RangeError(`workers must be 1 to 64, got ${workers}`);
    if (this.current) throw new RangeError("a run is going: stop it first");
    while (this.clients.length < workers) this.clients.push(this.create());
    const run = { id: this.nextId++, stopped: false };
    this.current = run;
    const latest: (Progress | undefined)[] = new Array<Progress | undefined>(workers).fill(undefined);
    const results: (SolveResult | undefined)[] = new Array<SolveResult | undefined>(workers).fill(undefined);
    const heaps: (number | undefined)[] = [];
    let failure: { message: string; issues: readonly Issue[] } | undefined;
    let left = workers;
    const seed = options.seed ?? 1;
    const marks = workers > 1 ? shareMarks(options.budget ?? SOLVE_DEFAULTS.budget) : [];
    const rounds = new ShareRounds(problem, workers);
    const deliver = (deliveries: readonly ShareDelivery[]): void => {
      for (const d of deliveries) this.clients[d.chain]!.share(d.plan);
    };
    const ended = (): void => {
      if (--left > 0) return;
      this.current = undefined;
      if (failure) return handlers.onError(failure.message, failure.issues);
      const done = results as SolveResult[];
      const kept = keptChain(
        problem,
        done.map((r) => r.plan),
      );
      const known = heaps.filter((h): h is number => h !== undefined);
      handlers.onResult(
        {
          ...done[kept]!,
          chain: kept,
          chains: done,
          peakHeapBytes: known.length > 0 ? Math.max(...known) : undefined,
          shares: rounds.rounds,
        },
        run.stopped,
      );
    };
    for (let k = 0; k < workers; k++) {
      // Every chain, one or several, counts its seconds from `startedAt` (the pane stamps it as it
      // starts the run), so the time the problem takes to reach the worker (a copy of the matrix)
      // is inside the budget.
      const chainOptions: WorkerSolveOptions = { ...options, seed: chainSeed(seed, k), startedAt };
      this.clients[k]!.start(
        problem,
        chainOptions,
        {
          onProgress: (p) => {
            latest[k] = p;
            if (!failure) handlers.onProgress(workers === 1 ? p : combineProgress(latest));
          },
          onMark: (plan) => {
            deliver(rounds.arrive(k, plan));
            // Stopped or failed meanwhile: let it go on at once (it then ends).
            if (run.stopped || failure) deliver(rounds.release());
          },
          onResult: (result, stopped, figures?: RunFigures) => {
            results[k] = result;
            heaps[k] = figures?.peakHeapBytes;
            if (stopped) run.stopped = true;
            deliver(rounds.leave(k, result.plan));
            ended();
          },
          onError: (message, issues) => {
            if (!failure) {
              failure = {
                message: workers === 1 ? message : `Worker ${k + 1} of ${workers} failed, so the run was stopped: ${message}`,
                issues,
              };
              for (let j = 0; j < workers; j++) if (j !== k) this.clients[j]!.stop();
            }
            deliver(rounds.leave(k));
            ended();
          },
        },
        marks,
      );
    }
  }

  /** Stop every chain after its current slice; each returns its best plan and the best of those is kept. */
  stop(): void {
    if (!this.current) return;
    this.current.stopped = true;
    for (const c of this.clients) if (c.running) c.stop();
  }
}
