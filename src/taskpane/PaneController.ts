/**
 * The task pane's behaviour, top to bottom: pick stops and fleet, settings, cooling preview,
 * plan routes in the worker, show and write the result, rerun from a plan sheet. Works the same
 * over Excel and over a file (see `PaneSource`); every handler goes through one guard.
 */
import type { SolveResult } from "../core/index.js";
import { CAUTION_TEXT } from "../sheets/caution.js";
import { TERMS } from "../sheets/terms.js";
import { COLUMN_MAP_KEY, mergeColumnMaps, storedColumnMap, type ColumnMapEntry } from "../sheets/columnMap.js";
import type { SheetRead } from "../sheets/grid.js";
import type { TableKind } from "../sheets/matchHeaders.js";
import { parseSettingsSheet } from "../sheets/parseSettingsSheet.js";
import { PLAN_SETTINGS_DEFAULTS, STABILITY_COST_DEFAULT, type PlanSettings } from "../sheets/PlanSettings.js";
import { proposeScenarioName } from "../sheets/proposeScenarioName.js";
import { readProblem } from "../sheets/readProblem.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { sourceOf, withEarlierPlan, writeScenarioResult } from "../workbook/scenario.js";
import { ComparePlansPanel } from "./ComparePlansPanel.js";
import { ConvergencePlot } from "./ConvergencePlot.js";
import { GeocodePanel } from "./GeocodePanel.js";
import { CoolingPreview } from "./CoolingPreview.js";
import { createGuard } from "./guardHandler.js";
import { MapBackgroundControl } from "./MapBackgroundControl.js";
import { MatrixPicker } from "./MatrixPicker.js";
import { PlanSheetPicker } from "./PlanSheetPicker.js";
import type { PaneSource, PickedTable } from "./PaneSource.js";
import { NavigationDownloads } from "./navigationDownloads.js";
import { paneDom, readForm, writeForm, type PaneDom } from "./paneDom.js";
import { renderResult } from "./renderResult.js";
import { excelEmptyTableHint, renderPickedTables } from "./renderTableSummary.js";
import { RouteMap } from "./RouteMap.js";
import { doubtfulPlaces, type DoubtfulPlace } from "./doubtfulPlaces.js";
import { PANE_MAX_LOCATIONS } from "../sheets/sizeWarning.js";
import { PointerHold } from "./pointerHold.js";
import { showFinished, showProgress } from "./runProgress.js";
import { defaultPaneWorkers, formFromSettings, settingsFromForm } from "./settingsFromForm.js";
import { SolverClient } from "./SolverClient.js";
import { SolverPool } from "./SolverPool.js";
import { storedRunRecord } from "./storedRunRecord.js";

/** The pane. Call `init` once. */
export class PaneController {
  protected readonly dom: PaneDom = paneDom();
  protected readonly guard = createGuard((m) => this.showError(m));
  private readonly solver = new SolverClient();
  /** The run's workers: the preview's worker is chain 0, more are started when the Workers field asks. */
  private readonly pool = new SolverPool(this.solver, () => new SolverClient());
  private readonly preview = new CoolingPreview(this.dom, this.solver);
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
  private readonly matrix = new MatrixPicker(
    this.dom,
    () => this.source.port,
    () => this.refreshRead(),
  );
  private readonly planSheet = new PlanSheetPicker(
    this.dom,
    () => this.source.port,
    () => this.refreshRead(),
  );
  private readonly geocode = new GeocodePanel({
    source: () => this.source,
    tables: () => ({ ...(this.stops ? { stops: this.stops } : {}), ...(this.fleet ? { fleet: this.fleet } : {}) }),
    changed: () => this.refreshRead(),
    guard: (name, fn) => this.guard(name, fn),
  });
  private readonly compare = new ComparePlansPanel({
    solver: this.solver,
    formSettings: () => settingsFromForm(readForm(this.dom)).settings,
    prepare: () => this.prepareRun(),
    busyChanged: () => this.setOptimizeEnabled(),
    guard: (name, fn) => this.guard(name, fn),
  });
  protected stops: PickedTable | undefined;
  protected fleet: PickedTable | undefined;
  private read: ReadResult | undefined;
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
  private readToken = 0;
  /** The workbook's Settings sheet, read when the workbook was opened; its values started the form. */
  private settingsSheet: SheetRead | undefined;
  /** Column mappings the user chose in this pane (remembered in the workbook). */
  private columnMap: ColumnMapEntry[] = [];

  /** @param source - where the tables live (Excel or a file) */
  constructor(protected source: PaneSource) {}

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

  /**
   * Offer the workbook's distance matrix sheets and its plan sheets to start from (the picked
   * tables' sheets left out). A failure to read a sheet leaves the pickers at great-circle
   * distances and no plan sheet and says so beside them; it never stands in the way of the tables.
   */
  protected async refreshMatrixList(): Promise<void> {
    await this.matrix.relist(this.matrixSkip());
    await this.refreshPlanSheetList();
  }

  /** Sheets never offered as a distance matrix or a plan to start from: the picked tables' and the Settings sheet. */
  private matrixSkip(): string[] {
    return [this.stops?.read.sheet, this.fleet?.read.sheet, this.settingsSheet?.sheet].filter((n): n is string => !!n);
  }

  /** Offer the workbook's plan sheets to start from; a failure says so beside the control. */
  private async refreshPlanSheetList(): Promise<void> {
    try {
      await this.planSheet.refreshList(this.matrixSkip());
    } catch (err) {
      console.error("Listing the plan sheets failed", err);
      this.planSheet.reset(
        `The workbook's sheets could not be read to find its plan sheets (${String(err)}); try again after picking the tables.`,
      );
    }
  }

  /**
   * Start from what the workbook holds: the column mappings remembered by the pane and, when there
   * is a sheet named Settings, its values in the form (and its other settings and column mappings
   * for the run), saying so. What the user then changes in the form wins for the run.
   */
  protected async loadWorkbookSettings(): Promise<void> {
    const port = this.source.port;
    const d = this.dom;
    this.columnMap = storedColumnMap((await port.readSettings())[COLUMN_MAP_KEY]);
    const name = (await port.listSheets()).find((n) => n.toLowerCase() === "settings");
    const read = name === undefined ? undefined : await port.readSheet(name);
    this.settingsSheet = read;
    if (!read) {
      this.geocode.startFrom(undefined);
      d.settingsSource.hidden = true;
      d.settingsSource.textContent = "";
      return;
    }
    const parsed = parseSettingsSheet(read);
    const settings: PlanSettings = { ...PLAN_SETTINGS_DEFAULTS, ...parsed.settings };
    writeForm(d, formFromSettings(settings, d.scenario.value, readForm(d)));
    this.updateFormVisibility();
    // The geocoding section's Default country is the same schema field as the CLI's --country.
    this.geocode.startFrom(parsed.settings.country);
    const extra = [
      ...(parsed.settings.country !== undefined ? [`default country ${parsed.settings.country}`] : []),
      ...(parsed.settings.moves !== undefined ? [`move budget ${parsed.settings.moves}`] : []),
      ...(parsed.settings.objective !== undefined ? [`objective ${parsed.settings.objective}`] : []),
      ...(parsed.settings.columnMap?.length ? [`${parsed.settings.columnMap.length} column mapping(s)`] : []),
    ];
    d.settingsSource.textContent =
      `Settings from sheet ${read.sheet}${extra.length ? ` (also ${extra.join(", ")})` : ""}. What you change here wins for the run and is recorded on the plan sheet.` +
      (parsed.issues.length ? ` ${parsed.issues.length} row(s) of it could not be read; see the errors under Stops.` : "");
    d.settingsSource.hidden = false;
  }

  /** Read both tables with the current settings, show what was recognised, sample for the preview. */
  protected async refreshRead(): Promise<void> {
    const token = ++this.readToken;
    const d = this.dom;
    const form = settingsFromForm(readForm(d));
    if (!this.stops || !this.fleet) {
      this.read = undefined;
      this.renderTables({ stops: [], fleet: [] }, []);
      this.setOptimizeEnabled();
      return;
    }
    // With a geocoding lookup made on these tables, their coordinates are filled in (in memory).
    const tables = readProblem(
      {
        ...this.geocode.input(this.stops.read, this.fleet.read),
        ...(this.settingsSheet ? { settings: this.settingsSheet } : {}),
        ...(this.matrix.read ? { matrix: this.matrix.read } : {}),
      },
      this.overrides(form.settings),
      { maxLocations: PANE_MAX_LOCATIONS },
    );
    // The earlier plan and locks go through the same step as the CLI's --from-plan and --lock.
    const read = tables.ok ? withEarlierPlan(tables, this.planSheet.start) : tables;
    if (token !== this.readToken) return;
    this.planSheet.setFleetLocked(tables.ok ? tables.lockedVehicles.map((l) => l.vehicle) : []);
    this.read = read;
    const issues = read.ok ? read.warnings.map((w) => ({ ...w, warning: true })) : read.issues;
    this.renderTables({ stops: read.stopColumns, fleet: read.fleetColumns }, issues);
    this.setOptimizeEnabled();
    if (read.ok) await this.preview.sample(read, () => this.read === read);
  }

  /**
   * What the pane sets over the Settings sheet: the fields the form shows (the sheet's values
   * started them, so they differ only where the user changed one) and the pane's column mappings.
   * Settings the form does not show (move budget, objective) stay as the sheet has them.
   */
  private overrides(form: PlanSettings): Partial<PlanSettings> {
    const shown: Partial<PlanSettings> = this.settingsSheet
      ? {
          detourFactor: form.detourFactor,
          speedKmh: form.speedKmh,
          serviceMin: form.serviceMin,
          hardWindows: form.hardWindows,
          lateCostPerMin: form.lateCostPerMin,
          rule: form.rule,
          cooling: form.cooling,
          p0: form.p0,
          pEnd: form.pEnd,
          seed: form.seed,
          seconds: form.seconds,
          stabilityCost: form.stabilityCost,
          ...(form.workers !== undefined ? { workers: form.workers } : {}),
        }
      : form;
    return this.columnMap.length > 0 ? { ...shown, columnMap: this.columnMap } : shown;
  }

  /** The user mapped a column in the pane: remember it in the workbook and read the tables again. */
  private async mapColumn(header: string, field: string): Promise<void> {
    this.columnMap = mergeColumnMaps(this.columnMap, [{ header, field }]);
    await this.source.port.writeSetting(COLUMN_MAP_KEY, JSON.stringify(this.columnMap));
    await this.refreshRead();
  }

  private renderTables(
    columns: { stops: ReadResult["stopColumns"]; fleet: ReadResult["fleetColumns"] },
    issues: Parameters<typeof renderPickedTables>[4],
  ): void {
    const onCell = this.source.selectCell
      ? this.guard("Select cell", (sheet: string, cell: string) => this.source.selectCell?.(sheet, cell))
      : undefined;
    const onMap = this.guard("Map a column", (_kind: TableKind, header: string, field: string) => this.mapColumn(header, field));
    // The matrix sheet's and the earlier plan's problems go beside their pickers, the rest under the tables.
    const rest = this.planSheet.show(this.matrix.show(issues, onCell), onCell);
    renderPickedTables(this.dom, this.stops, this.fleet, columns, rest, onCell, onMap, (kind) => this.emptyTableHint(kind));
  }

  /** What a table's summary says while none is picked: which range to select (Excel) or sheet to choose. */
  protected emptyTableHint(kind: TableKind): string {
    return excelEmptyTableHint(kind);
  }

  private settingsChanged(): void {
    this.updateFormVisibility();
    this.preview.draw();
    this.compare.refresh();
    // Detour, speed, service minutes and windows change the problem itself.
    void this.refreshRead().catch((err: unknown) => this.showError(`Reading the tables failed: ${String(err)}`));
  }

  private updateFormVisibility(): void {
    const form = readForm(this.dom);
    if (form.windows === "soft") document.body.dataset.soft = "";
    else delete document.body.dataset.soft;
    for (const el of this.dom.scheduleParams) el.hidden = el.dataset.for !== form.schedule;
    for (const el of this.dom.temperatureParams) el.hidden = el.dataset.temps !== form.temperatures;
    // Typed temperatures start from the calibrated ones, so switching changes nothing until edited.
    if (form.temperatures === "manual") this.preview.fillCalibratedTemperatures();
  }

  private setOptimizeEnabled(): void {
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

  /**
   * Offer a free scenario name: "Plan N" (the first free N) for a numbered default, a typed name
   * as typed while no sheet has it (see `proposeScenarioName`).
   */
  protected async suggestScenarioName(): Promise<void> {
    const input = this.dom.scenario;
    input.value = proposeScenarioName(input.value, await this.source.port.listSheets());
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
