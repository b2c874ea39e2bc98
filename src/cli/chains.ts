/**
 * Several annealing chains on worker threads (`--workers N`). The seeds, the sharing, the plan
 * kept and the combined progress are the core's (`core/chains.ts`, `core/shareRounds.ts`,
 * shared with the pane's Web Workers): chain k solves with `chainSeed(seed, k)` and the full
 * budget; at the marks of the budget (`shareMarks`) every chain reports its best plan and
 * continues from the best of them (`ShareRounds`, `SharingChain`); at the end the best plan by
 * `comparePlans` is kept (ties to the lowest chain). Marks of a move budget are move counts, so
 * the same seed, move budget and N always give the same plan.
 */
import { existsSync, readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { fileURLToPath, pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import {
  chainSeed,
  combineProgress,
  createSolver,
  keptChain,
  SOLVE_DEFAULTS,
  shareMarks,
  ShareRounds,
  type Plan,
  type Problem,
  type ShareDelivery,
  type ShareMark,
  type Progress,
  type SolveOptions,
  type SolveResult,
} from "../core/index.js";
import { parseSettingValue } from "../sheets/settingsSchema.js";
import { SETTING_FIELDS } from "../sheets/settingFields.js";
import { type NumberField } from "../sheets/settingFieldTypes.js";

export { chainSeed, combineProgress };

/** What a chain may be told: everything of `SolveOptions` a thread can receive. */
export type ChainOptions = Omit<Partial<SolveOptions>, "now" | "onProgress" | "signal">;

/** The most chains `--workers` accepts (the Workers setting's range). */
export const MAX_WORKERS = (SETTING_FIELDS.workers as NumberField).max!;

/** Moves per slice of the one-chain run between looks at the event loop (Ctrl-C). */
const SLICE = 4096;

/** What the main thread sends a chain worker (as `workerData`). */
export interface ChainRequest {
  readonly problem: Problem;
  readonly options: ChainOptions;
  readonly chain: number;
  /** Where the chain reports its best plan and waits for the round's (none: an independent chain). */
  readonly marks: readonly ShareMark[];
  /** SharedArrayBuffer of one Int32: non-zero asks the chain to stop. */
  readonly stop: SharedArrayBuffer;
}

/** What a chain worker posts back. */
export type ChainMessage =
  | { readonly type: "progress"; readonly chain: number; readonly progress: Progress }
  | { readonly type: "mark"; readonly chain: number; readonly plan: Plan }
  | { readonly type: "done"; readonly chain: number; readonly result: SolveResult }
  | { readonly type: "error"; readonly chain: number; readonly message: string };

/** What the main thread sends a chain worker at a mark: the plan of the round, or none (stopped). */
export type ChainReply = { readonly type: "share"; readonly plan: Plan | undefined };

/** The outcome of every chain, and which one was kept. */
export interface ChainsResult extends SolveResult {
  /** Index of the chain whose plan is `plan`. */
  readonly chain: number;
  /** Each chain's own result, by index. */
  readonly chains: readonly SolveResult[];
  /** Times the chains shared their best plan (0 for one chain or independent chains). */
  readonly shares: number;
}

/** How a multi-chain run reports and stops. */
export interface ChainsHooks {
  /** Clock of the one-chain run (worker chains use their own). */
  readonly now?: () => number;
  /** Combined progress of all chains: moves summed, best cost the lowest any chain has. */
  readonly onProgress?: (progress: Progress) => void;
  /** Aborting it stops every chain; each keeps its best plan and the best of those is returned. */
  readonly signal?: AbortSignal;
  /**
   * False runs the chains independently (no sharing), for the bench that compares the two;
   * the product always shares (default true).
   */
  readonly share?: boolean;
}

/**
 * Check a `--workers` value with the settings schema (the Workers field the pane shares).
 *
 * @param text - the option text, or undefined when not given
 * @returns the number of chains (1 when not given: the CLI's default), or the error line
 * @example parseWorkers("2") // => { workers: 2 }
 */
export function parseWorkers(text: string | undefined): { workers: number } | { error: string } {
  if (text === undefined) return { workers: 1 };
  const parsed = parseSettingValue("workers", text);
  if (!parsed.ok) return { error: `--${SETTING_FIELDS.workers.flag}: ${parsed.message}` };
  return { workers: parsed.value as number };
}

/**
 * Run `workers` chains that share their best plan at the marks of the budget, and keep the best
 * plan. One chain runs in this thread (the same moves as `solve`), yielding to the event loop
 * between slices so an abort can arrive; more run on worker threads.
 *
 * @param problem - a problem without `validateProblem` issues
 * @param options - the solve options every chain shares (the seed is derived per chain)
 * @param workers - number of chains, >= 1
 * @param hooks - clock, combined progress, abort
 * @returns the best chain's result, its index and every chain's result
 * @throws Error when a chain fails (the message of the first failure)
 * @example (await runChains(problem, { seed: 1, budget: { moves: 100_000 } }, 2)).plan
 */
export async function runChains(problem: Problem, options: ChainOptions, workers: number, hooks: ChainsHooks = {}): Promise<ChainsResult> {
  const { results, shares } =
    workers <= 1 ? { results: [await runHere(problem, options, hooks)], shares: 0 } : await runOnThreads(problem, options, workers, hooks);
  const best = keptChain(
    problem,
    results.map((r) => r.plan),
  );
  return { ...results[best]!, chain: best, chains: results, shares };
}

async function runHere(problem: Problem, options: ChainOptions, hooks: ChainsHooks): Promise<SolveResult> {
  const solver = createSolver(problem, {
    ...options,
    ...(hooks.now ? { now: hooks.now } : {}),
    ...(hooks.onProgress ? { onProgress: hooks.onProgress } : {}),
    ...(hooks.signal ? { signal: hooks.signal } : {}),
  });
  while (!solver.step(SLICE)) await new Promise<void>((resolve) => setImmediate(resolve));
  return solver.result();
}

/**
 * The worker's module: beside this file once compiled (dist/cli/cli/chainWorker.js); when this
 * file runs from source (tsx, the tests), a small script that registers tsx's loader in the
 * worker and then imports chainWorker.ts.
 */
function workerModule(): { url: URL | string; eval: boolean } {
  const js = new URL("./chainWorker.js", import.meta.url);
  if (existsSync(fileURLToPath(js))) return { url: js, eval: false };
  // The ESM entry of tsx's "./esm/api" export (require.resolve would give its CommonJS one).
  const pkgPath = createRequire(import.meta.url).resolve("tsx/package.json");
  const pkg = JSON.parse(readFileSync(pkgPath, "utf8")) as { exports: Record<string, { import: { default: string } }> };
  const api = new URL(pkg.exports["./esm/api"]!.import.default, pathToFileURL(pkgPath)).href;
  const ts = new URL("./chainWorker.ts", import.meta.url).href;
  return { url: `import(${JSON.stringify(api)}).then((m) => m.register()).then(() => import(${JSON.stringify(ts)}));`, eval: true };
}

function runOnThreads(
  problem: Problem,
  options: ChainOptions,
  workers: number,
  hooks: ChainsHooks,
): Promise<{ results: SolveResult[]; shares: number }> {
  const stop = new SharedArrayBuffer(4);
  const flag = new Int32Array(stop);
  const seed = options.seed ?? 1;
  const marks = hooks.share === false ? [] : shareMarks(options.budget ?? SOLVE_DEFAULTS.budget);
  const rounds = new ShareRounds(problem, workers);
  const module = workerModule();
  // One wall-clock start for every chain (milliseconds since the epoch, comparable across
  // threads): a chain whose thread took longer to start does not run on past the others.
  const startedAt = epochMs();
  const latest: (Progress | undefined)[] = new Array<Progress | undefined>(workers).fill(undefined);
  const results: (SolveResult | undefined)[] = new Array<SolveResult | undefined>(workers).fill(undefined);
  const threads: Worker[] = [];
  const deliver = (deliveries: readonly ShareDelivery[]): void => {
    for (const d of deliveries) threads[d.chain]?.postMessage({ type: "share", plan: d.plan } satisfies ChainReply);
  };
  // A stop lets the chains waiting at a mark go on at once (they then see the flag and end).
  const onAbort = (): void => {
    Atomics.store(flag, 0, 1);
    deliver(rounds.release());
  };
  if (hooks.signal?.aborted) onAbort();
  hooks.signal?.addEventListener("abort", onAbort);
  return new Promise<{ results: SolveResult[]; shares: number }>((resolve, reject) => {
    let left = workers;
    let failed = false;
    const fail = (message: string): void => {
      if (failed) return;
      failed = true;
      hooks.signal?.removeEventListener("abort", onAbort);
      for (const t of threads) void t.terminate();
      reject(new Error(message));
    };
    for (let chain = 0; chain < workers; chain++) {
      const request: ChainRequest = { problem, options: { ...options, seed: chainSeed(seed, chain), startedAt }, chain, marks, stop };
      const t = new Worker(module.url, { workerData: request, eval: module.eval });
      threads.push(t);
      t.on("message", (m: ChainMessage) => {
        if (m.type === "progress") {
          latest[m.chain] = m.progress;
          if (hooks.onProgress) hooks.onProgress(combineProgress(latest));
        } else if (m.type === "mark") {
          deliver(rounds.arrive(m.chain, m.plan));
          if (Atomics.load(flag, 0) !== 0) deliver(rounds.release());
        } else if (m.type === "error") {
          fail(`chain ${m.chain}: ${m.message}`);
        } else {
          results[m.chain] = m.result;
          void t.terminate();
          deliver(rounds.leave(m.chain, m.result.plan));
          if (--left === 0 && !failed) {
            hooks.signal?.removeEventListener("abort", onAbort);
            resolve({ results: results as SolveResult[], shares: rounds.rounds });
          }
        }
      });
      t.on("error", (e) => fail(`chain ${chain}: ${e.message}`));
      t.on("exit", () => {
        if (results[chain] === undefined) fail(`chain ${chain} ended without a plan`);
      });
    }
  });
}

/**
 * The wall clock in milliseconds since the epoch at sub-millisecond resolution; the same scale
 * in every thread (each thread's `performance.now()` counts from its own origin).
 *
 * @returns milliseconds since 1970-01-01
 * @example epochMs() // => 1796240000123.456
 */
export function epochMs(): number {
  return performance.timeOrigin + performance.now();
}
