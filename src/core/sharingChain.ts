/**
 * One chain of a run that shares its best plan (the chain's side of `ShareRounds`): it steps
 * its solver up to the next mark, reports its best plan there and waits; `resume` continues it,
 * from the shared plan when that is better than its own best. The chain that found the shared
 * plan (and any chain whose best ranks equal) continues from where it was.
 */
import { comparePlans } from "./comparePlans.js";
import type { Plan, Problem } from "./model.js";
import type { ShareMark } from "./shareRounds.js";
import type { Solver } from "./search/runTypes.js";

/** Where a chain is after `advance`: still going, at a mark (report and wait), or finished. */
export type ChainState = "running" | "mark" | "done";

/** A solver stepped between marks. */
export class SharingChain {
  private next = 0;
  private reported: Plan | undefined;

  /**
   * @param problem - the problem the solver solves
   * @param solver - the chain's solver (its own seed)
   * @param marks - where the chains share (`shareMarks` of the run's budget), in order
   */
  constructor(
    private readonly problem: Problem,
    readonly solver: Solver,
    private readonly marks: readonly ShareMark[],
  ) {}

  /** True while the chain waits at a mark for `resume`. */
  get waiting(): boolean {
    return this.reported !== undefined;
  }

  /**
   * Step up to `maxMoves` moves, stopping at the next mark of moves (the route-minimisation
   * phase ends a slice on a whole pop, so there it may pass the mark by a few moves, the same
   * on every run; a mark of time is seen after the slice that reaches it).
   *
   * @param maxMoves - most moves of this slice, >= 1
   * @returns "done" when the run ended (budget used or aborted), "mark" when it reached a mark
   *   (report `best()`, then `resume`), else "running"
   * @throws RangeError when called while the chain waits at a mark
   */
  advance(maxMoves: number): ChainState {
    if (this.reported) throw new RangeError("the chain waits at a mark: resume it first");
    const mark = this.marks[this.next];
    const n = mark && "moves" in mark ? Math.min(maxMoves, mark.moves - this.solver.progress.moves) : maxMoves;
    if (n > 0 && this.solver.step(n)) return "done";
    if (mark && ("moves" in mark ? this.solver.progress.moves >= mark.moves : this.solver.progress.elapsedMs >= mark.elapsedMs)) {
      this.next++;
      this.reported = this.solver.result().plan;
      return "mark";
    }
    return "running";
  }

  /**
   * The best plan the chain had at the mark it waits at (what it reports).
   *
   * @throws RangeError when the chain is not at a mark
   */
  best(): Plan {
    if (!this.reported) throw new RangeError("the chain is not at a mark");
    return this.reported;
  }

  /**
   * Continue after a mark: from `shared` when it ranks better than the plan this chain reported
   * (and the solver is past its route-minimisation phase, see `Solver.adopt`).
   *
   * @param shared - the best plan of the round, or undefined to continue as it was (e.g. when stopped)
   */
  resume(shared: Plan | undefined): void {
    const own = this.reported;
    this.reported = undefined;
    if (shared && own && comparePlans(this.problem, shared, own) < 0) void this.solver.adopt(shared);
  }
}
