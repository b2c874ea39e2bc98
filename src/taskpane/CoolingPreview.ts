/**
 * The cooling-schedule preview under the settings: samples the mean uphill change of the read
 * problem in the worker, then draws temperature and acceptance over the run from the form's
 * schedule (computed here: a profile is a closed form of about a hundred points).
 */
import { calibrateTemperatures, describeProfile, endOfRunText, profile, type Progress } from "../core/index.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { CoolingPlot } from "./CoolingPlot.js";
import { readForm, type PaneDom } from "./paneDom.js";
import { settingsFromForm } from "./settingsFromForm.js";
import { SolverClient, WorkerError } from "./SolverClient.js";

/** The form cells that do not affect the cooling preview (their issues are shown elsewhere). */
const NOT_COOLING = ["Scenario", "Detour factor", "Speed", "Service time", "Seed"];

/** The preview: the plot, the one-line reading and the sampled changes it is drawn from. */
export class CoolingPreview {
  private readonly plot: CoolingPlot;
  private meanUphill: number | undefined;
  private uphill: readonly number[] = [];
  private sampledFor: ReadResult | undefined;
  /** Measured: by the worker's timed burst on the sampled problem, then by each finished run. */
  private movesPerSecond: number | undefined;

  /**
   * @param dom - the pane's elements (plot canvas and reading line)
   * @param solver - the worker client that samples
   */
  constructor(
    private readonly dom: PaneDom,
    private readonly solver: SolverClient,
  ) {
    this.plot = new CoolingPlot(dom.coolingPlot);
  }

  /**
   * Sample the uphill changes of `read`'s problem (once per read), then redraw.
   *
   * @param read - a successful read
   * @param isCurrent - false when a newer read replaced `read` while sampling (the answer is dropped)
   */
  async sample(read: ReadResult & { ok: true }, isCurrent: () => boolean): Promise<void> {
    if (this.sampledFor === read) return;
    this.dom.coolingReading.textContent = "Sampling cost changes…";
    try {
      const { meanUphill, uphill, movesPerSecond } = await this.solver.sample(read.problem, read.settings.seed);
      if (!isCurrent()) return;
      this.sampledFor = read;
      this.meanUphill = meanUphill;
      this.uphill = uphill;
      if (movesPerSecond !== undefined) this.movesPerSecond = movesPerSecond;
    } catch (err) {
      if (!(err instanceof WorkerError)) throw err;
      this.meanUphill = undefined;
      this.dom.coolingReading.textContent = `Could not sample: ${err.message}`;
      return;
    }
    this.draw();
  }

  /** Remember the speed of a finished run, so a seconds budget previews as that many moves. */
  measured(moves: number, elapsedMs: number): void {
    if (elapsedMs > 500) this.movesPerSecond = moves / (elapsedMs / 1000);
  }

  /** Put the calibrated start and end temperatures into blank T₀ and T_end fields. */
  fillCalibratedTemperatures(): void {
    const d = this.dom;
    if (this.meanUphill === undefined || !(this.meanUphill > 0)) return;
    if (d.t0.value.trim() !== "" && d.tEnd.value.trim() !== "") return;
    const s = settingsFromForm(readForm(d)).settings;
    const t = calibrateTemperatures(this.meanUphill, s.rule, s.p0, s.pEnd, this.uphill);
    if (d.t0.value.trim() === "") d.t0.value = String(Number(t.t0.toPrecision(4)));
    if (d.tEnd.value.trim() === "") d.tEnd.value = String(Number(t.tEnd.toPrecision(4)));
  }

  /** Plot the share of worse moves a running optimization accepts beside the planned profile. */
  observe(p: Progress): void {
    if (p.worseAccepted !== undefined) this.plot.observe(p.fraction, p.worseAccepted);
  }

  /** Forget the observed shares (a new run starts). */
  clearObserved(): void {
    this.plot.clearObserved();
  }

  /** Redraw from the form's settings and the sampled mean uphill change. */
  draw(): void {
    const d = this.dom;
    const form = settingsFromForm(readForm(d));
    const coolingIssues = form.issues.filter((i) => !NOT_COOLING.includes(i.cell));
    if (coolingIssues.length > 0) {
      d.coolingReading.textContent = coolingIssues.map((i) => i.message).join(" ");
      d.coolingReading.classList.remove("ok");
      return;
    }
    if (this.meanUphill === undefined || !(this.meanUphill > 0)) return;
    const s = form.settings;
    if (s.moves === undefined && this.movesPerSecond === undefined) {
      d.coolingReading.textContent = "Set a move budget to preview: the speed of this computer could not be measured.";
      return;
    }
    const budgetMoves = Math.max(1, Math.round(s.moves ?? s.seconds * this.movesPerSecond!));
    try {
      const points = profile(s.cooling, s.rule, this.meanUphill, budgetMoves, { p0: s.p0, pEnd: s.pEnd, points: 101, uphill: this.uphill });
      this.plot.show(points);
      const assumed =
        s.moves === undefined ? ` (about ${formatCount(budgetMoves)} moves in ${s.seconds} s at the speed measured on this computer)` : "";
      d.coolingReading.textContent = `${describeProfile(points, s.rule)}${assumed} ${endOfRunText()}`;
      d.coolingReading.classList.add("ok");
      d.coolingReading.dataset.meanUphill = String(this.meanUphill);
    } catch (err) {
      // A parameter outside its range (RangeError from the cooling math) is the user's to fix.
      d.coolingReading.textContent = err instanceof Error ? err.message : String(err);
      d.coolingReading.classList.remove("ok");
    }
  }
}

function formatCount(n: number): string {
  return n >= 1e6 ? `${(n / 1e6).toPrecision(3)} M` : n >= 1e3 ? `${Math.round(n / 1e3)} k` : String(n);
}
