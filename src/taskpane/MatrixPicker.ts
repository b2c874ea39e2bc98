/**
 * The pane's road-distance matrix picker (the CLI's `--matrix SHEET`): a select listing the
 * workbook's sheets that read as a distance matrix (`looksLikeMatrixSheet`), the chosen sheet's
 * range for the run, and the matrix's problems (sheet and cell, what, how to fix) beside it.
 */
import type { Issue } from "../core/index.js";
import type { SheetRead } from "../sheets/grid.js";
import { looksLikeMatrixSheet } from "../sheets/parseMatrixSheet.js";
import type { WorkbookPort } from "../workbook/WorkbookPort.js";
import { sourceOf } from "../workbook/scenario.js";
import type { createGuard } from "./guardHandler.js";
import type { PaneDom } from "./paneDom.js";
import { renderTableSummary } from "./renderTableSummary.js";

/** The select's first option: no matrix sheet. */
export const NO_MATRIX_TEXT = "Straight line × detour factor";

/** The distance matrix picker of one pane. */
export class MatrixPicker {
  private chosen: SheetRead | undefined;

  /**
   * @param dom - the pane's elements (`matrixSheet`, `matrixSummary`, `matrixIssues`)
   * @param port - the current workbook
   * @param changed - called after the choice changed (the pane reads the tables again)
   */
  constructor(
    private readonly dom: PaneDom,
    private readonly port: () => WorkbookPort,
    private readonly changed: () => Promise<void>,
  ) {}

  /**
   * Wire the select.
   *
   * @param guard - the pane's handler guard
   * @example picker.wire(this.guard)
   */
  wire(guard: ReturnType<typeof createGuard>): void {
    this.dom.matrixSheet.addEventListener(
      "change",
      guard("Choose the distance matrix", () => this.choose(this.dom.matrixSheet.value)),
    );
  }

  /** The chosen matrix sheet's used range, or undefined for great-circle distances. */
  get read(): SheetRead | undefined {
    return this.chosen;
  }

  /** Where the distances come from, as the plan sheet records it ("Km!A1:E5"); undefined without a matrix. */
  get source(): string | undefined {
    return this.chosen && sourceOf(this.chosen);
  }

  /**
   * List the workbook's sheets that read as a distance matrix, keeping the current choice when
   * its sheet is still one (it is read again, so edits to it count).
   *
   * @param skip - sheet names never offered (the picked stops and fleet sheets)
   * @example await picker.refreshList(["Stops", "Fleet"])
   */
  async refreshList(skip: readonly string[]): Promise<void> {
    const port = this.port();
    const left = new Set(skip.map((n) => n.toLowerCase()));
    const offered: string[] = [];
    const reads = new Map<string, SheetRead>();
    for (const name of await port.listSheets()) {
      if (left.has(name.toLowerCase())) continue;
      const read = await port.readSheet(name);
      if (read && looksLikeMatrixSheet(read)) {
        offered.push(name);
        reads.set(name, read);
      }
    }
    const select = this.dom.matrixSheet;
    const keep = select.value;
    select.replaceChildren(new Option(NO_MATRIX_TEXT, ""), ...offered.map((n) => new Option(n, n)));
    select.value = offered.includes(keep) ? keep : "";
    this.chosen = select.value ? reads.get(select.value) : undefined;
    if (!this.chosen) this.show([]);
  }

  /**
   * Forget the choice and the list (another workbook was opened, or listing failed).
   *
   * @param note - shown beside the picker, such as why no sheet is offered
   */
  reset(note?: string): void {
    this.chosen = undefined;
    this.dom.matrixSheet.replaceChildren(new Option(NO_MATRIX_TEXT, ""));
    this.show([]);
    if (note) {
      this.dom.matrixSummary.textContent = note;
      this.dom.matrixSummary.hidden = false;
    }
  }

  /**
   * Show the issues that name the matrix sheet beside the picker, with its range and size.
   *
   * @param issues - every issue of the last read
   * @param onCell - called with (sheet, cell) when an address is clicked (Excel)
   * @returns the issues that are not the matrix's, for the tables' lists
   * @example const rest = picker.show(read.issues)
   */
  show<T extends Issue>(issues: readonly T[], onCell?: (sheet: string, cell: string) => void): T[] {
    const d = this.dom;
    const m = this.chosen;
    const mine = m ? issues.filter((i) => i.sheet === m.sheet) : [];
    d.matrixSummary.hidden = !m;
    if (!m) {
      d.matrixSummary.replaceChildren();
      d.matrixIssues.replaceChildren();
    } else {
      const locations = Math.max(0, m.values.filter((row) => row.some((c) => c !== "" && c !== null && c !== undefined)).length - 1);
      renderTableSummary(d.matrixSummary, d.matrixIssues, { address: sourceOf(m), rows: locations }, [], mine, onCell);
    }
    return issues.filter((i) => !mine.includes(i));
  }

  private async choose(name: string): Promise<void> {
    this.chosen = name ? await this.port().readSheet(name) : undefined;
    if (name && !this.chosen) this.dom.matrixSheet.value = "";
    await this.changed();
  }
}
