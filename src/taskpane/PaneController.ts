/**
 * The task pane's behaviour, top to bottom: pick stops and fleet, settings, cooling preview,
 * optimize in the worker, show and write the result, rerun from a plan sheet. Works the same
 * over Excel and over a file (see `PaneSource`); every handler goes through one guard.
 */
import type { Issue } from "../core/model.js";
import type { Progress } from "../core/options.js";
import type { SolveResult } from "../core/solve.js";
import { profile } from "../core/anneal/profile.js";
import { describeProfile } from "../core/anneal/describeProfile.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { parseRunRecord } from "../sheets/settingsSchema.js";
import { readProblem } from "../sheets/readProblem.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { scenarioSettingsKey } from "../sheets/scenarioSettingsKey.js";
import { sourceOf, writeScenarioResult } from "../workbook/scenario.js";
import { ConvergencePlot } from "./ConvergencePlot.js";
import { CoolingPlot } from "./CoolingPlot.js";
import { formatDuration } from "./formatClock.js";
import { createGuard } from "./guardHandler.js";
import type { PaneSource, PickedTable } from "./PaneSource.js";
import { paneDom, readForm, writeForm, type PaneDom } from "./paneDom.js";
import { renderResult } from "./renderResult.js";
import { renderTableSummary } from "./renderTableSummary.js";
import { RouteMap } from "./RouteMap.js";
import { formFromSettings, settingsFromForm } from "./settingsFromForm.js";
import { SolverClient, WorkerError } from "./SolverClient.js";

/** Moves per second assumed for the preview of a seconds budget until a run has measured it. */
const ASSUMED_MOVES_PER_SECOND = 100_000;

/** The pane. Call `init` once. */
export class PaneController {
  protected readonly dom: PaneDom = paneDom();
  protected readonly guard = createGuard((m) => this.showError(m));
  private readonly solver = new SolverClient();
  private readonly coolingPlot = new CoolingPlot(this.dom.coolingPlot);
  private readonly convergence = new ConvergencePlot(this.dom.convergencePlot);
  private readonly map = new RouteMap(this.dom.map, this.dom.mapTooltip, this.dom.legend);
  protected stops: PickedTable | undefined;
  protected fleet: PickedTable | undefined;
  private read: ReadResult | undefined;
  private meanUphill: number | undefined;
  private uphill: readonly number[] = [];
  private sampledFor: ReadResult | undefined;
  private movesPerSecond = ASSUMED_MOVES_PER_SECOND;
  private last:
    { read: ReadResult & { ok: true }; result: SolveResult; scenario: string; runSeconds: number; written?: string } | undefined;
  private readToken = 0;

  /** @param source - where the tables live (Excel or a file) */
  constructor(protected source: PaneSource) {}

  /** Wire the handlers and show the initial state. */
  init(): void {
    const d = this.dom;
    document.body.dataset.mode = this.source.mode;
    d.modeBadge.dataset.mode = this.source.mode;
    d.modeBadge.textContent = this.source.mode === "excel" ? "in Excel" : "standalone · files";
    d.caution.textContent = CAUTION_TEXT;
    d.errorClose.addEventListener("click", () => (d.error.hidden = true));
    const onSettings = this.guard("Reading the settings", () => this.settingsChanged());
    for (const input of d.formInputs) input.addEventListener("change", onSettings);
    for (const input of d.formInputs) if (input instanceof HTMLInputElement) input.addEventListener("input", onSettings);
    d.optimize.addEventListener(
      "click",
      this.guard("Optimize", () => this.optimize()),
    );
    d.stop.addEventListener(
      "click",
      this.guard("Stop", () => this.solver.stop()),
    );
    d.write.addEventListener(
      "click",
      this.guard("Write to workbook", () => this.write()),
    );
    d.rerun.addEventListener(
      "click",
      this.guard("Rerun", () => this.rerun()),
    );
    if (this.source.pickSelection) {
      const pick = this.source.pickSelection.bind(this.source);
      d.stopsUseSelection.addEventListener(
        "click",
        this.guard("Use selection (stops)", async () => {
          this.stops = await pick("stops");
          await this.refreshRead();
        }),
      );
      d.fleetUseSelection.addEventListener(
        "click",
        this.guard("Use selection (fleet)", async () => {
          this.fleet = await pick("fleet");
          await this.refreshRead();
        }),
      );
    }
    this.updateFormVisibility();
    this.drawPreview();
  }

  /** Replace the workbook (standalone: a newly opened file). */
  protected async setSource(source: PaneSource): Promise<void> {
    this.source = source;
    this.stops = undefined;
    this.fleet = undefined;
    this.read = undefined;
    this.last = undefined;
    this.dom.result.hidden = true;
    await this.suggestScenarioName();
  }

  /** Read both tables with the current settings, show what was recognised, sample for the preview. */
  protected async refreshRead(): Promise<void> {
    const token = ++this.readToken;
    const d = this.dom;
    const form = settingsFromForm(readForm(d));
    if (!this.stops || !this.fleet) {
      this.read = undefined;
      this.renderTables([], [], []);
      this.setOptimizeEnabled();
      return;
    }
    const read = readProblem({ stops: this.stops.read, fleet: this.fleet.read }, form.settings);
    if (token !== this.readToken) return;
    this.read = read;
    const issues = read.ok ? read.warnings.map((w) => ({ ...w, warning: true })) : read.issues;
    this.renderTables(read.stopColumns, read.fleetColumns, issues);
    this.setOptimizeEnabled();
    if (read.ok) await this.sample(read);
  }

  private renderTables(
    stopColumns: ReadResult["stopColumns"],
    fleetColumns: ReadResult["fleetColumns"],
    issues: readonly (Issue & { warning?: boolean })[],
  ): void {
    const d = this.dom;
    const onCell = this.source.selectCell
      ? this.guard("Select cell", (sheet: string, cell: string) => this.source.selectCell?.(sheet, cell))
      : undefined;
    const stopsSheet = this.stops?.read.sheet;
    const fleetSheet = this.fleet?.read.sheet;
    const forFleet = issues.filter((i) => i.sheet === fleetSheet && i.sheet !== stopsSheet);
    const forStops = issues.filter((i) => !forFleet.includes(i));
    const rows = (t: PickedTable | undefined) => t && { address: t.address, rows: Math.max(0, t.read.values.length - 1) };
    renderTableSummary(d.stopsSummary, d.stopsIssues, rows(this.stops), stopColumns, forStops, onCell);
    renderTableSummary(d.fleetSummary, d.fleetIssues, rows(this.fleet), fleetColumns, forFleet, onCell);
  }

  private async sample(read: ReadResult & { ok: true }): Promise<void> {
    if (this.sampledFor === read) return;
    this.dom.coolingReading.textContent = "Sampling cost changes…";
    try {
      const { meanUphill, uphill } = await this.solver.sample(read.problem, read.settings.seed);
      if (this.read !== read) return;
      this.sampledFor = read;
      this.meanUphill = meanUphill;
      this.uphill = uphill;
    } catch (err) {
      if (!(err instanceof WorkerError)) throw err;
      this.meanUphill = undefined;
      this.dom.coolingReading.textContent = `Could not sample: ${err.message}`;
      return;
    }
    this.drawPreview();
  }

  private settingsChanged(): void {
    this.updateFormVisibility();
    this.drawPreview();
    // Detour, speed, service minutes and windows change the problem itself.
    void this.refreshRead().catch((err: unknown) => this.showError(`Reading the tables failed: ${String(err)}`));
  }

  private updateFormVisibility(): void {
    const form = readForm(this.dom);
    if (form.windows === "soft") document.body.dataset.soft = "";
    else delete document.body.dataset.soft;
    for (const el of this.dom.scheduleParams) el.hidden = el.dataset.for !== form.schedule;
    for (const el of this.dom.temperatureParams) el.hidden = el.dataset.temps !== form.temperatures;
  }

  /** Redraw the cooling preview from the form and the sampled mean uphill change. */
  private drawPreview(): void {
    const d = this.dom;
    const form = settingsFromForm(readForm(d));
    const coolingIssues = form.issues.filter((i) => !["Scenario", "Detour factor", "Speed", "Service time", "Seed"].includes(i.cell));
    if (coolingIssues.length > 0) {
      d.coolingReading.textContent = coolingIssues.map((i) => i.message).join(" ");
      d.coolingReading.classList.remove("ok");
      return;
    }
    if (this.meanUphill === undefined || !(this.meanUphill > 0)) return;
    const s = form.settings;
    const budgetMoves = Math.max(1, Math.round(s.moves ?? s.seconds * this.movesPerSecond));
    try {
      const points = profile(s.cooling, s.rule, this.meanUphill, budgetMoves, { p0: s.p0, pEnd: s.pEnd, points: 101, uphill: this.uphill });
      this.coolingPlot.show(points);
      const assumed = s.moves === undefined ? ` (about ${formatCount(budgetMoves)} moves in ${s.seconds} s)` : "";
      d.coolingReading.textContent = `${describeProfile(points, s.rule)}${assumed}`;
      d.coolingReading.classList.add("ok");
      d.coolingReading.dataset.meanUphill = String(this.meanUphill);
    } catch (err) {
      // A parameter outside its range (RangeError from the cooling math) is the user's to fix.
      d.coolingReading.textContent = err instanceof Error ? err.message : String(err);
      d.coolingReading.classList.remove("ok");
    }
  }

  private setOptimizeEnabled(): void {
    this.dom.optimize.disabled = this.solver.running || !this.read?.ok;
    this.dom.stop.disabled = !this.solver.running;
  }

  private async optimize(): Promise<void> {
    const d = this.dom;
    d.error.hidden = true;
    const form = settingsFromForm(readForm(d));
    if (form.issues.length > 0) return this.showError(form.issues.map((i) => i.message).join(" "));
    await this.refreshRead();
    const read = this.read;
    if (!read?.ok) return this.showError("Fix the errors listed under Stops and Fleet first.");
    const s = read.settings;
    const scenario = form.scenario;
    this.convergence.reset();
    d.progressBar.style.width = "0%";
    d.optimizeSection.dataset.state = "running";
    const budget = s.moves !== undefined ? { moves: s.moves } : { seconds: s.seconds };
    let lastDraw = -Infinity;
    this.solver.start(
      read.problem,
      { seed: s.seed, budget, rule: s.rule, cooling: s.cooling, p0: s.p0, pEnd: s.pEnd },
      {
        onProgress: (p) => {
          // The worker already paces itself; this keeps a busy page at one redraw per 200 ms too.
          if (p.elapsedMs - lastDraw < 200 && p.fraction < 1) return;
          lastDraw = p.elapsedMs;
          this.showProgress(p, s.moves === undefined ? s.seconds : undefined);
        },
        onResult: (result, stopped) => {
          d.optimizeSection.dataset.state = stopped ? "stopped" : "done";
          d.progressBar.style.width = "100%";
          if (result.stats.elapsedMs > 500) this.movesPerSecond = result.stats.moves / (result.stats.elapsedMs / 1000);
          this.last = { read, result, scenario, runSeconds: result.stats.elapsedMs / 1000 };
          this.setOptimizeEnabled();
          this.showResult(stopped);
        },
        onError: (message, issues) => {
          d.optimizeSection.dataset.state = "error";
          this.setOptimizeEnabled();
          this.showError([message, ...issues.map((i) => `${i.sheet}${i.cell ? "!" + i.cell : ""}: ${i.message}`)].join(" "));
        },
      },
    );
    this.setOptimizeEnabled();
  }

  private showProgress(p: Progress, seconds: number | undefined): void {
    const d = this.dom;
    d.progressBar.style.width = `${Math.round(p.fraction * 100)}%`;
    d.progressBar.parentElement?.setAttribute("aria-valuenow", String(Math.round(p.fraction * 100)));
    d.statElapsed.textContent = formatDuration(p.elapsedMs / 1000);
    const remaining =
      seconds !== undefined ? seconds - p.elapsedMs / 1000 : p.fraction > 0 ? (p.elapsedMs / 1000) * (1 / p.fraction - 1) : NaN;
    d.statRemaining.textContent = formatDuration(Math.max(0, remaining));
    d.statCurrent.textContent = formatCost(p.currentCost);
    d.statBest.textContent = Number.isFinite(p.bestCost) ? formatCost(p.bestCost) : "none feasible yet";
    d.statAccept.textContent = `${(p.acceptanceRate * 100).toFixed(1)}%`;
    d.statTemp.textContent = p.temperature.toPrecision(3);
    this.convergence.add(p);
  }

  private showResult(stopped: boolean): void {
    const last = this.last;
    if (!last) return;
    const d = this.dom;
    d.result.hidden = false;
    d.writeStatus.textContent = "";
    d.download.hidden = true;
    renderResult(d, last.read.problem, last.result, stopped);
    this.map.draw(last.read.problem, last.result.plan);
  }

  /** Write the last result as a new scenario sheet plus its Compare row; the file page then offers the download. */
  protected async write(): Promise<{ sheetName: string } | undefined> {
    const last = this.last;
    if (!last || !this.stops || !this.fleet) return undefined;
    if (last.written) {
      this.dom.writeStatus.textContent = `Already written to sheet "${last.written}". Optimize again for a new plan.`;
      return undefined;
    }
    this.dom.write.disabled = true;
    try {
      const out = await writeScenarioResult(this.source.port, {
        read: last.read,
        result: last.result,
        scenario: last.scenario,
        createdAt: new Date(),
        runSeconds: last.runSeconds,
        stopsSource: this.stops.address,
        fleetSource: this.fleet.address,
      });
      last.written = out.sheetName;
      this.dom.writeStatus.textContent = `Written to sheet "${out.sheetName}" and a row on the Compare sheet.`;
      await this.suggestScenarioName();
      return out;
    } finally {
      this.dom.write.disabled = false;
    }
  }

  /** The sheet whose stored settings "Rerun" loads; Excel: the active sheet. */
  protected async rerunSheet(): Promise<string | undefined> {
    return this.source.activeSheetName?.();
  }

  private async rerun(): Promise<void> {
    const d = this.dom;
    const sheet = await this.rerunSheet();
    if (!sheet) return void (d.rerunStatus.textContent = "Choose a plan sheet first.");
    const stored = (await this.source.port.readSettings())[scenarioSettingsKey(sheet)];
    if (!stored) {
      d.rerunStatus.textContent = `"${sheet}" is not a plan sheet made by Kiln (no stored settings). Go to a plan sheet and try again.`;
      return;
    }
    const loaded = parseRunRecord(stored);
    if (!loaded.ok) {
      d.rerunStatus.textContent = `The settings stored for "${sheet}" cannot be read (${loaded.message}); optimize with the pane's settings instead.`;
      return;
    }
    const record = loaded.record;
    writeForm(d, formFromSettings(record.settings, record.scenario, readForm(d)));
    d.rerunStatus.textContent = `Loaded the settings of "${sheet}" (tables were ${record.stopsSource} and ${record.fleetSource}). Optimize writes a new sheet.`;
    this.settingsChanged();
  }

  /** Put "Plan N" (the first free N) in the scenario field unless the user typed their own name. */
  protected async suggestScenarioName(): Promise<void> {
    const input = this.dom.scenario;
    if (!/^Plan \d+$/.test(input.value.trim()) && input.value.trim() !== "") return;
    const names = new Set((await this.source.port.listSheets()).map((n) => n.toLowerCase()));
    let n = 1;
    while (names.has(`plan ${n}`)) n++;
    input.value = `Plan ${n}`;
  }

  protected showError(message: string): void {
    this.dom.errorText.textContent = message;
    this.dom.error.hidden = false;
  }

  /** For subclasses: the current table picks' addresses, after a new read. */
  protected picked(read: PickedTable["read"]): PickedTable {
    return { read, address: sourceOf(read) };
  }
}

function formatCost(cost: number): string {
  return Number.isFinite(cost) ? cost.toLocaleString("en", { maximumFractionDigits: 1 }) : "–";
}

function formatCount(n: number): string {
  return n >= 1e6 ? `${(n / 1e6).toPrecision(3)} M` : n >= 1e3 ? `${Math.round(n / 1e3)} k` : String(n);
}
