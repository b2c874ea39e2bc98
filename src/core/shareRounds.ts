/**
 * Sharing the best plan between chains at marks of the budget (the coordinating side): every
 * chain stops at the same mark, reports its best plan, and when all have reported the best of
 * them by the solver's own order (`comparePlans`, ties to the lowest chain) goes back to every
 * chain, which continues from it (`SharingChain.resume`). Marks of a move budget are move
 * counts, so the same seed, move budget and number of chains give the same plan however the
 * threads are timed; marks of a seconds budget are elapsed times.
 */
import { comparePlans } from "./comparePlans.js";
import type { Plan, Problem } from "./model.js";
import type { Budget } from "./options.js";

/**
 * The fractions of the budget at which chains share their best plan: eight epochs, the last
 * mark before the quench (`QUENCH_FROM` = 0.95 in search/endOfRun.ts) so every chain quenches on
 * its own; the kick phase (from `KICK_FROM` = 0.8) starts again from a plan shared at 0.875.
 */
export const SHARE_AT: readonly number[] = [0.125, 0.25, 0.375, 0.5, 0.625, 0.75, 0.875];

/** A point of a run where its chains share: after a number of moves, or after some milliseconds. */
export type ShareMark = { readonly moves: number } | { readonly elapsedMs: number };

/**
 * The marks of a budget (`SHARE_AT` of its moves or of its milliseconds).
 *
 * @param budget - the run's budget (every chain has the same)
 * @returns the marks in order; none for a budget too small to split
 * @example shareMarks({ moves: 80_000 }) // => [{ moves: 10000 }, { moves: 20000 }, ..., { moves: 70000 }]
 */
export function shareMarks(budget: Budget): readonly ShareMark[] {
  if ("moves" in budget) {
    const marks = SHARE_AT.map((f) => Math.floor(budget.moves * f)).filter((m, i, all) => m > 0 && all.indexOf(m) === i);
    return marks.map((moves) => ({ moves }));
  }
  return SHARE_AT.map((f) => ({ elapsedMs: budget.seconds * 1000 * f }));
}

/** The plan a waiting chain continues from: the best reported (by chain `from`), or none after an abort. */
export interface ShareDelivery {
  readonly chain: number;
  readonly plan: Plan | undefined;
  readonly from: number;
}

/**
 * The rounds of one run of several chains: collects the plans chains report at a mark and,
 * once every chain has reported or ended, says what each waiting chain continues from.
 */
export class ShareRounds {
  private readonly plans: (Plan | undefined)[];
  private readonly ended: boolean[];
  private readonly waiting = new Set<number>();
  /** Rounds completed so far (a plan went back to the waiting chains). */
  rounds = 0;

  /**
   * @param problem - the problem every chain solves (its objective orders the plans)
   * @param chains - number of chains, >= 1
   * @throws RangeError when `chains` is not a positive whole number
   */
  constructor(
    private readonly problem: Problem,
    chains: number,
  ) {
    if (!Number.isInteger(chains) || chains < 1) throw new RangeError(`chains must be a positive whole number, got ${chains}`);
    this.plans = new Array<Plan | undefined>(chains).fill(undefined);
    this.ended = new Array<boolean>(chains).fill(false);
  }

  /**
   * Chain `chain` reached its next mark with `plan` (its best so far) and waits.
   *
   * @returns the deliveries to make now: one per waiting chain when this completed the round, else none
   * @throws RangeError when the chain has ended or already waits
   */
  arrive(chain: number, plan: Plan): ShareDelivery[] {
    if (this.ended[chain] || this.waiting.has(chain)) throw new RangeError(`chain ${chain} cannot arrive: it has ended or already waits`);
    this.plans[chain] = plan;
    this.waiting.add(chain);
    return this.settle();
  }

  /**
   * Chain `chain` ended (budget used, stopped or failed): later rounds do not wait for it; its
   * final plan, when given, still takes part in them.
   *
   * @returns the deliveries to make now (the round may have waited only for this chain)
   */
  leave(chain: number, plan?: Plan): ShareDelivery[] {
    this.ended[chain] = true;
    this.waiting.delete(chain);
    if (plan) this.plans[chain] = plan;
    return this.settle();
  }

  /**
   * Let every waiting chain go on without a plan (the run was stopped: they end at once).
   *
   * @returns one delivery without a plan per waiting chain
   */
  release(): ShareDelivery[] {
    const out = [...this.waiting].sort((a, b) => a - b).map((chain) => ({ chain, plan: undefined, from: chain }));
    this.waiting.clear();
    return out;
  }

  private settle(): ShareDelivery[] {
    if (this.waiting.size === 0) return [];
    for (let k = 0; k < this.plans.length; k++) if (!this.ended[k] && !this.waiting.has(k)) return [];
    let from = -1;
    for (let k = 0; k < this.plans.length; k++) {
      const p = this.plans[k];
      if (p && (from < 0 || comparePlans(this.problem, p, this.plans[from]!) < 0)) from = k;
    }
    const plan = from >= 0 ? this.plans[from] : undefined;
    const out = [...this.waiting].sort((a, b) => a - b).map((chain) => ({ chain, plan, from }));
    this.waiting.clear();
    this.rounds++;
    return out;
  }
}
