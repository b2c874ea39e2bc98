/**
 * What the pane reads for a run: the picked stops and fleet tables, the workbook's Settings sheet
 * and remembered column mappings, the distance matrix and plan-sheet pickers, and the form's
 * visibility and cooling preview. `PaneController` adds the run itself on top.
 */
import { COLUMN_MAP_KEY, mergeColumnMaps, storedColumnMap, type ColumnMapEntry } from "../sheets/columnMap.js";
import type { SheetRead } from "../sheets/grid.js";
import type { TableKind } from "../sheets/matchHeaders.js";
import { parseSettingsSheet } from "../sheets/parseSettingsSheet.js";
import { PLAN_SETTINGS_DEFAULTS, type PlanSettings } from "../sheets/PlanSettings.js";
import { proposeScenarioName } from "../sheets/proposeScenarioName.js";
import { readProblem } from "../sheets/readProblem.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { PANE_MAX_LOCATIONS } from "../sheets/sizeWarning.js";
import { sourceOf, withEarlierPlan } from "../workbook/scenario.js";
import { CoolingPreview } from "./CoolingPreview.js";
import { GeocodePanel } from "./GeocodePanel.js";
import { createGuard } from "./guardHandler.js";
import { MatrixPicker } from "./MatrixPicker.js";
import type { PaneSource, PickedTable } from "./PaneSource.js";
import { paneDom, readForm, writeForm, type PaneDom } from "./paneDom.js";
import { PlanSheetPicker } from "./PlanSheetPicker.js";
import { excelEmptyTableHint, renderPickedTables } from "./renderTableSummary.js";
import { formFromSettings, settingsFromForm } from "./settingsFromForm.js";
import { SolverClient } from "./SolverClient.js";

/** The pane's tables, settings and pickers; `PaneController` (the pane) adds the run. */
export abstract class PaneTables {
  protected readonly dom: PaneDom = paneDom();
  protected readonly guard = createGuard((m) => this.showError(m));
  /** The preview's worker; the run's first chain too. */
  protected readonly solver = new SolverClient();
  protected readonly preview = new CoolingPreview(this.dom, this.solver);
  protected readonly matrix = new MatrixPicker(
    this.dom,
    () => this.source.port,
    () => this.refreshRead(),
  );
  protected readonly planSheet = new PlanSheetPicker(
    this.dom,
    () => this.source.port,
    () => this.refreshRead(),
  );
  protected readonly geocode = new GeocodePanel({
    source: () => this.source,
    tables: () => ({ ...(this.stops ? { stops: this.stops } : {}), ...(this.fleet ? { fleet: this.fleet } : {}) }),
    changed: () => this.refreshRead(),
    guard: (name, fn) => this.guard(name, fn),
  });
  protected stops: PickedTable | undefined;
  protected fleet: PickedTable | undefined;
  protected read: ReadResult | undefined;
  private readToken = 0;
  /** The workbook's Settings sheet, read when the workbook was opened; its values started the form. */
  private settingsSheet: SheetRead | undefined;
  /** Column mappings the user chose in this pane (remembered in the workbook). */
  private columnMap: ColumnMapEntry[] = [];

  /** @param source - where the tables live (Excel or a file) */
  constructor(protected source: PaneSource) {}

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
  protected matrixSkip(): string[] {
    return [this.stops?.read.sheet, this.fleet?.read.sheet, this.settingsSheet?.sheet].filter((n): n is string => !!n);
  }

  /** Offer the workbook's plan sheets to start from; a failure says so beside the control. */
  protected async refreshPlanSheetList(): Promise<void> {
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

  protected updateFormVisibility(): void {
    const form = readForm(this.dom);
    if (form.windows === "soft") document.body.dataset.soft = "";
    else delete document.body.dataset.soft;
    for (const el of this.dom.scheduleParams) el.hidden = el.dataset.for !== form.schedule;
    for (const el of this.dom.temperatureParams) el.hidden = el.dataset.temps !== form.temperatures;
    // Typed temperatures start from the calibrated ones, so switching changes nothing until edited.
    if (form.temperatures === "manual") this.preview.fillCalibratedTemperatures();
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

  /** Enable or disable the run buttons after a read (the run's state is the subclass's). */
  protected abstract setOptimizeEnabled(): void;
}
