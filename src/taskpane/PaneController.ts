/**
 * The task pane's behaviour, top to bottom: pick stops and fleet, settings, cooling preview,
 * plan routes in the worker, show and write the result, rerun from a plan sheet. Works the same
 * over Excel and over a file (see `PaneSource`); every handler goes through one guard. The tables,
 * Settings sheet and pickers a run reads are `PaneTables`'s; the run, its result and Rerun are here.
 */
import type { SolveResult } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { TERMS } from "../sheets/terms.js";
import { STABILITY_COST_DEFAULT } from "../sheets/PlanSettings.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { writeScenarioResult } from "../workbook/scenario.js";
import { ComparePlansPanel } from "./ComparePlansPanel.js";
import { ConvergencePlot } from "./ConvergencePlot.js";
import { MapBackgroundControl } from "./MapBackgroundControl.js";
import type { PaneSource } from "./PaneSource.js";
import { PaneTables } from "./PaneTables.js";
import { NavigationDownloads } from "./navigationDownloads.js";
import { readForm, writeForm } from "./paneDom.js";
import { renderResult } from "./renderResult.js";
import { RouteMap } from "./RouteMap.js";
import { doubtfulPlaces, type DoubtfulPlace } from "./doubtfulPlaces.js";
import { PointerHold } from "./pointerHold.js";
import { showFinished, showProgress } from "./runProgress.js";
import { defaultPaneWorkers, formFromSettings, settingsFromForm } from "./settingsFromForm.js";
import { SolverClient } from "./SolverClient.js";
import { SolverPool } from "./SolverPool.js";
import { storedRunRecord } from "./storedRunRecord.js";

/** The pane. Call `init` once. */
export class PaneController extends PaneTables {
  /** The run's workers: the preview's worker is chain 0, more are started when the Workers field asks. */
  private readonly pool = new SolverPool(this.solver, () => new SolverClient());
  private readonly convergence = new ConvergencePlot(this.dom.convergencePlot);
  private readonly map = new RouteMap({
    canvas: this.dom.map,
    tooltip: this.dom.mapTooltip,
    labels: this.dom.mapLabels,
    legend: this.dom.legend,
    text: this.dom.mapText,
  });
  private readonly mapBackground = new MapBackgroundControl(this.dom, this.map, () => this.source.port);
  private readonly downloads = new NavigationDownloads(this.dom.downloadGpx, this.dom.downloadGeoJson);
  private readonly compare = new ComparePlansPanel({
    solver: this.solver,
    formSettings: () => settingsFromForm(readForm(this.dom)).settings,
    prepare: () => this.prepareRun(),
    busyChanged: () => this.setOptimizeEnabled(),
    guard: (name, fn) => this.guard(name, fn),
  });
  private last:
    | {
        read: ReadResult & { ok: true };
        result: SolveResult;
        scenario: string;
        runSeconds: number;
        matrixSource?: string;
        /** The plan sheet the run started from (re-planning a published day). */
        fromPlan?: string;
        written?: string;
        /** Places whose geocoded address is doubtful, for the map. */
        doubtful: readonly DoubtfulPlace[];
      }
    | undefined;

  /** Wire the handlers and show the initial state. */
  init(): void {
    const d = this.dom;
    document.body.dataset.mode = this.source.mode;
    d.modeBadge.dataset.mode = this.source.mode;
    d.modeBadge.textContent = this.source.mode === "excel" ? "in Excel" : "standalone · files";
    d.caution.textContent = CAUTION_TEXT;
    d.stabilityCost.placeholder = `${STABILITY_COST_DEFAULT} (default)`;
    d.workers.value = String(defaultPaneWorkers(navigator.hardwareConcurrency));
    d.errorClose.addEventListener("click", () => (d.error.hidden = true));
    const settingsChanged = this.guard("Reading the settings", () => this.settingsChanged());
    const hold = new PointerHold(document);
    const onSettings = (): void => hold.run(settingsChanged);
    for (const input of d.formInputs) input.addEventListener("change", onSettings);
    for (const input of d.formInputs) if (input instanceof HTMLInputElement) input.addEventListener("input", onSettings);
    d.optimize.addEventListener(
      "click",
      this.guard(TERMS.planAction, () => this.optimize()),
    );
    d.stop.addEventListener(
      "click",
      this.guard("Stop", () => this.pool.stop()),
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
          await this.refreshMatrixList();
          await this.refreshRead();
        }),
      );
      d.fleetUseSelection.addEventListener(
        "click",
        this.guard("Use selection (fleet)", async () => {
          this.fleet = await pick("fleet");
          await this.refreshMatrixList();
          await this.refreshRead();
        }),
      );
    }
    this.mapBackground.wire(this.guard);
    this.matrix.wire(this.guard);
    this.planSheet.wire(this.guard);
    this.matrix.follow(
      this.source.watchSheets?.bind(this.source),
      () => this.matrixSkip(),
      (m) => this.showError(m),
    );
    this.guard("Reading the background map setting", () => this.mapBackground.load())();
    this.geocode.init();
    this.compare.init();
    this.updateFormVisibility();
    this.preview.draw();
  }

  /** Replace the workbook (standalone: a newly opened file). */
  protected async setSource(source: PaneSource): Promise<void> {
    this.source = source;
    this.stops = undefined;
    this.fleet = undefined;
    this.read = undefined;
    this.last = undefined;
    this.geocode.reset();
    this.matrix.reset();
    this.planSheet.reset();
    this.dom.result.hidden = true;
    this.downloads.clear();
    await this.mapBackground.load();
    await this.suggestScenarioName();
    await this.loadWorkbookSettings();
    await this.refreshMatrixList();
  }

  private settingsChanged(): void {
    this.updateFormVisibility();
    this.preview.draw();
    this.compare.refresh();
    // Detour, speed, service minutes and windows change the problem itself.
    void this.refreshRead().catch((err: unknown) => this.showError(`Reading the tables failed: ${String(err)}`));
  }

  protected setOptimizeEnabled(): void {
    const busy = this.pool.running || this.solver.running;
    this.dom.optimize.disabled = busy || this.compare.running || !this.read?.ok;
    this.dom.stop.disabled = !this.pool.running || this.compare.running;
    this.compare.setButtons();
  }

  /**
   * Check the form and read the tables with it, as a run starts.
   *
   * @returns the read tables, or undefined when the form or the tables have errors (shown in the pane)
   */
  private async prepareRun(): Promise<(ReadResult & { ok: true }) | undefined> {
    this.dom.error.hidden = true;
    const form = settingsFromForm(readForm(this.dom));
    if (form.issues.length > 0) return void this.showError(form.issues.map((i) => i.message).join(" "));
    await this.refreshRead();
    const read = this.read;
    if (!read?.ok) return void this.showError("Fix the errors listed under Stops and Fleet first.");
    return read;
  }

  private async optimize(): Promise<void> {
    const d = this.dom;
    // Each run is offered a free name of its own (the sheets may have changed since the last one).
    await this.suggestScenarioName();
    const read = await this.prepareRun();
    if (!read) return;
    const s = read.settings;
    const scenario = settingsFromForm(readForm(d)).scenario;
    const doubtful = this.stops ? doubtfulPlaces(read.problem, read.stopRows, this.geocode.review(this.stops.read)) : [];
    const matrixSource = this.matrix.source;
    const fromPlan = read.problem.earlier ? this.planSheet.sheetName : undefined;
    this.convergence.reset();
    this.preview.clearObserved();
    d.progressBar.style.width = "0%";
    d.optimizeSection.dataset.state = "running";
    const budget = s.moves !== undefined ? { moves: s.moves } : { seconds: s.seconds };
    const workers = s.workers ?? 1;
    d.statMemory.textContent = "–";
    let lastDraw = -Infinity;
    this.pool.start(
      read.problem,
      { seed: s.seed, budget, rule: s.rule, cooling: s.cooling, p0: s.p0, pEnd: s.pEnd },
      workers,
      {
        onProgress: (p) => {
          // The workers already pace themselves; this keeps a busy page at one redraw per 200 ms too.
          if (p.elapsedMs - lastDraw < 200 && p.fraction < 1) return;
          lastDraw = p.elapsedMs;
          showProgress(d, this.convergence, p, s.moves === undefined ? s.seconds : undefined, workers);
          this.preview.observe(p);
        },
        onResult: (result, stopped) => {
          d.optimizeSection.dataset.state = stopped ? "stopped" : "done";
          showFinished(d, result, stopped);
          this.preview.measured(result.stats.moves, result.stats.elapsedMs);
          this.last = {
            read,
            result,
            scenario,
            runSeconds: result.stats.elapsedMs / 1000,
            doubtful,
            ...(matrixSource !== undefined ? { matrixSource } : {}),
            ...(fromPlan !== undefined ? { fromPlan } : {}),
          };
          this.setOptimizeEnabled();
          this.showResult(stopped);
        },
        onError: (message, issues) => {
          d.optimizeSection.dataset.state = "error";
          this.setOptimizeEnabled();
          this.showError([message, ...issues.map((i) => `${i.sheet}${i.cell ? "!" + i.cell : ""}: ${i.message}`)].join(" "));
        },
      },
      // Milliseconds since the epoch, the workers' clock: every chain's seconds budget ends together.
      performance.timeOrigin + performance.now(),
    );
    this.setOptimizeEnabled();
  }

  private showResult(stopped: boolean): void {
    const last = this.last;
    if (!last) return;
    const d = this.dom;
    d.result.hidden = false;
    d.writeStatus.textContent = "";
    d.download.hidden = true;
    renderResult(d, last.read.problem, last.result, stopped);
    this.guard("Drawing the map", () => this.map.draw(last.read.problem, last.result.plan, last.doubtful))();
    const { problem, stopRows, extraHeaders } = last.read;
    this.guard("Preparing the GPX and GeoJSON files", () =>
      this.downloads.show({ problem, plan: last.result.plan, stopRows, extraHeaders, scenario: last.scenario }),
    )();
  }

  /** Write the last result as a new scenario sheet plus its Compare row; the file page then offers the download. */
  protected async write(): Promise<{ sheetName: string } | undefined> {
    const last = this.last;
    if (!last || !this.stops || !this.fleet) return undefined;
    if (last.written) {
      this.dom.writeStatus.textContent = `Already written to sheet "${last.written}". ${TERMS.planAction} again for a new plan.`;
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
        ...(last.matrixSource !== undefined ? { matrixSource: last.matrixSource } : {}),
        ...(last.fromPlan !== undefined ? { fromPlan: last.fromPlan } : {}),
        sheetPerVehicle: this.dom.sheetPerVehicle.checked,
      });
      last.written = out.sheetName;
      const routes = out.routeSheets.map((n) => `"${n}"`).join(", ");
      this.dom.writeStatus.textContent = `Written to sheet "${out.sheetName}"${routes ? `, route sheets ${routes}` : ""} and a row on the Compare sheet.`;
      await this.suggestScenarioName();
      // The new plan sheet can be started from.
      await this.refreshPlanSheetList();
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
    if (!sheet) return void (d.rerunStatus.textContent = "Choose a plan sheet in the list first (plan sheets are the ones Kiln wrote).");
    const stored = await storedRunRecord(this.source.port, sheet);
    if ("message" in stored) return void (d.rerunStatus.textContent = stored.message);
    const record = stored.record;
    writeForm(d, formFromSettings(record.settings, record.scenario, readForm(d)));
    // The run's distances too: its matrix sheet, or straight lines when it used none.
    const matrixNote = await this.matrix.restore(record.matrixSource, this.matrixSkip());
    // The rerun lands in a sheet of its own: offer the next free name, not the plan's own.
    await this.suggestScenarioName();
    // A re-planned run starts from the same plan sheet with the same routes locked (the plan
    // sheets listed afresh: sheets may have been added or renamed since the list was made).
    if (record.fromPlan !== undefined) await this.refreshPlanSheetList();
    const gone = await this.planSheet.restore(record.fromPlan, record.locked ?? []);
    const from = record.fromPlan !== undefined && gone === undefined ? `, starting from plan sheet "${record.fromPlan}"` : "";
    const distances = record.matrixSource !== undefined && matrixNote === undefined ? `, distances from ${record.matrixSource}` : "";
    d.rerunStatus.textContent =
      `Loaded the settings of "${sheet}" (tables were ${record.stopsSource} and ${record.fleetSource}${distances}${from}). ${TERMS.planAction} writes a new sheet, "${d.scenario.value}".` +
      (matrixNote ? ` ${matrixNote}` : "") +
      (gone ? ` ${gone}` : "");
    this.settingsChanged();
  }
}
