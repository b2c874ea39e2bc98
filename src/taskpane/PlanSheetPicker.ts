/**
 * The pane's "Start from plan sheet" control (the CLI's `--from-plan SHEET` and `--lock`): a
 * select listing the workbook's sheets that read as a Kiln plan (`looksLikePlanSheet`, the test
 * `--from-plan` makes), one checkbox per vehicle of the chosen plan to lock its route, and the
 * plan's problems (sheet and cell, what, how to fix) beside it, as the distance matrix picker does.
 */
import type { Issue } from "../core/index.js";
import type { SheetRead } from "../sheets/grid.js";
import { looksLikePlanSheet, readPlanRoutes } from "../sheets/readPlanRoutes.js";
import type { WorkbookPort } from "../workbook/WorkbookPort.js";
import { LOCKED_ROUTES_SOURCE, sourceOf } from "../workbook/scenario.js";
import type { createGuard } from "./guardHandler.js";
import type { PaneDom } from "./paneDom.js";
import { renderTableSummary } from "./renderTableSummary.js";

/** The select's first option: plan from scratch. */
export const NO_PLAN_TEXT = "none";

/** What a run starts from: the plan sheet as read and the routes ticked to keep. */
export interface StartFromPlan {
  readonly read: SheetRead;
  readonly lock: readonly string[];
  readonly lockSource: string;
}

/** The plan sheet picker of one pane. */
export class PlanSheetPicker {
  private chosen: SheetRead | undefined;
  /** Vehicles the Fleet's Lock column locks: shown ticked and fixed. */
  private fleetLocked: readonly string[] = [];

  /**
   * @param dom - the pane's elements (`fromPlanSheet`, `lockedRoutes`, `lockedRoutesList`, `fromPlanSummary`, `fromPlanIssues`)
   * @param port - the current workbook
   * @param changed - called after the choice or a lock changed (the pane reads the tables again)
   */
  constructor(
    private readonly dom: PaneDom,
    private readonly port: () => WorkbookPort,
    private readonly changed: () => Promise<void>,
  ) {}

  /**
   * Wire the select and the lock checkboxes.
   *
   * @param guard - the pane's handler guard
   * @example picker.wire(this.guard)
   */
  wire(guard: ReturnType<typeof createGuard>): void {
    this.dom.fromPlanSheet.addEventListener(
      "change",
      guard("Choose the plan sheet to start from", () => this.choose(this.dom.fromPlanSheet.value, [])),
    );
    this.dom.lockedRoutesList.addEventListener(
      "change",
      guard("Lock a route", () => this.changed()),
    );
  }

  /** The chosen plan sheet and the ticked routes, or undefined for a plan from scratch. */
  get start(): StartFromPlan | undefined {
    if (!this.chosen) return undefined;
    const lock = this.boxes()
      .filter((b) => b.checked && !b.disabled)
      .map((b) => b.value);
    return { read: this.chosen, lock, lockSource: LOCKED_ROUTES_SOURCE };
  }

  /** The chosen plan sheet's name, as the new plan's settings block records it. */
  get sheetName(): string | undefined {
    return this.chosen?.sheet;
  }

  /**
   * List the workbook's plan sheets, keeping the current choice (read again, so edits count) and
   * its ticks when its sheet is still one.
   *
   * @param skip - sheet names never offered (the picked stops and fleet sheets, the Settings sheet)
   * @example await picker.refreshList(["Stops", "Fleet"])
   */
  async refreshList(skip: readonly string[]): Promise<void> {
    const port = this.port();
    const left = new Set(skip.map((n) => n.toLowerCase()));
    const offered: string[] = [];
    for (const name of await port.listSheets()) {
      if (left.has(name.toLowerCase())) continue;
      const read = await port.readSheet(name);
      if (read && looksLikePlanSheet(read)) offered.push(name);
    }
    const select = this.dom.fromPlanSheet;
    const keep = select.value;
    const ticked = this.start?.lock ?? [];
    select.replaceChildren(new Option(NO_PLAN_TEXT, ""), ...offered.map((n) => new Option(n, n)));
    select.value = offered.includes(keep) ? keep : "";
    await this.load(select.value, ticked);
  }

  /**
   * Choose a plan sheet and ticks again (Rerun of a re-planned run).
   *
   * @param sheet - the plan sheet the run started from
   * @param lock - the vehicles it locked
   * @returns a note when the sheet is no longer offered (renamed, deleted, not a plan any more)
   * @example await picker.restore("Plan 1", ["Van 2"])
   */
  async restore(sheet: string | undefined, lock: readonly string[]): Promise<string | undefined> {
    const select = this.dom.fromPlanSheet;
    if (sheet === undefined) {
      select.value = "";
      await this.load("", []);
      return undefined;
    }
    const offered = [...select.options].map((o) => o.value);
    if (!offered.includes(sheet)) {
      select.value = "";
      await this.load("", []);
      return `The plan sheet it started from, "${sheet}", is not among this workbook's plan sheets any more; choose one under Start from plan sheet.`;
    }
    select.value = sheet;
    await this.load(sheet, lock);
    return undefined;
  }

  /**
   * Forget the choice and the list (another workbook was opened, or listing failed).
   *
   * @param note - shown beside the picker, such as why no sheet is offered
   */
  reset(note?: string): void {
    this.chosen = undefined;
    this.dom.fromPlanSheet.replaceChildren(new Option(NO_PLAN_TEXT, ""));
    this.renderLocks([]);
    this.show([]);
    if (note) {
      this.dom.fromPlanSummary.textContent = note;
      this.dom.fromPlanSummary.hidden = false;
    }
  }

  /**
   * The vehicles the Fleet's Lock column locks (after each read): their boxes show ticked and fixed.
   *
   * @param vehicles - vehicle ids
   */
  setFleetLocked(vehicles: readonly string[]): void {
    this.fleetLocked = vehicles;
    for (const box of this.boxes()) {
      const fixed = vehicles.includes(box.value);
      if (fixed) box.checked = true;
      else if (box.disabled) box.checked = false;
      box.disabled = fixed;
      box.parentElement?.classList.toggle("fleet-locked", fixed);
      box.title = fixed ? "Locked by the Fleet's Lock column" : "";
    }
  }

  /**
   * Show the issues that name the chosen plan sheet or the ticked routes beside the picker.
   *
   * @param issues - every issue of the last read
   * @param onCell - called with (sheet, cell) when an address is clicked (Excel)
   * @returns the issues that are not the plan's, for the tables' lists
   * @example const rest = picker.show(read.issues)
   */
  show<T extends Issue>(issues: readonly T[], onCell?: (sheet: string, cell: string) => void): T[] {
    const d = this.dom;
    const p = this.chosen;
    const mine = p ? issues.filter((i) => i.sheet === p.sheet || i.sheet === LOCKED_ROUTES_SOURCE) : [];
    d.fromPlanSummary.hidden = !p;
    if (!p) {
      d.fromPlanSummary.replaceChildren();
      d.fromPlanIssues.replaceChildren();
    } else {
      const table = readPlanRoutes(p);
      const routes = "routes" in table ? table.routes : [];
      const stops = routes.reduce((n, r) => n + r.stops.length, 0);
      renderTableSummary(d.fromPlanSummary, d.fromPlanIssues, { address: sourceOf(p), rows: stops }, [], mine, onCell);
      const head = document.createElement("div");
      const address = document.createElement("strong");
      address.textContent = sourceOf(p);
      head.append(address, ` · ${routes.length} route${routes.length === 1 ? "" : "s"}, ${stops} stop${stops === 1 ? "" : "s"}`);
      d.fromPlanSummary.replaceChildren(head);
    }
    return issues.filter((i) => !mine.includes(i));
  }

  private async choose(name: string, lock: readonly string[]): Promise<void> {
    await this.load(name, lock);
    await this.changed();
  }

  /** Read the sheet `name` ("" for none) and list its vehicles, ticking `lock`. */
  private async load(name: string, lock: readonly string[]): Promise<void> {
    this.chosen = name ? await this.port().readSheet(name) : undefined;
    if (name && !this.chosen) this.dom.fromPlanSheet.value = "";
    const table = this.chosen ? readPlanRoutes(this.chosen) : undefined;
    const vehicles = table && "routes" in table ? table.routes.map((r) => r.vehicle) : [];
    this.renderLocks(vehicles, lock);
    if (!this.chosen) this.show([]);
  }

  /** One checkbox per vehicle of the chosen plan. */
  private renderLocks(vehicles: readonly string[], ticked: readonly string[] = []): void {
    const list = this.dom.lockedRoutesList;
    list.replaceChildren(
      ...vehicles.map((v) => {
        const label = document.createElement("label");
        const box = document.createElement("input");
        box.type = "checkbox";
        box.name = "locked-route";
        box.value = v;
        box.checked = ticked.includes(v);
        label.append(box, ` ${v}`);
        return label;
      }),
    );
    this.dom.lockedRoutes.hidden = vehicles.length === 0;
    this.setFleetLocked(this.fleetLocked);
  }

  private boxes(): HTMLInputElement[] {
    return [...this.dom.lockedRoutesList.querySelectorAll<HTMLInputElement>("input[type=checkbox]")];
  }
}
