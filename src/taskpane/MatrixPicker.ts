/**
 * The pane's road-distance matrix picker (the CLI's `--matrix SHEET`): a select listing the
 * workbook's sheets that read as a distance matrix (`looksLikeMatrixSheet`), the chosen sheet's
 * range for the run, and the matrix's problems (sheet and cell, what, how to fix) beside it.
 */
import type { Issue } from "../core/index.js";
import { sheetOfRef } from "../sheets/cellAddress.js";
import type { SheetRead } from "../sheets/grid.js";
import { looksLikeMatrixSheet } from "../sheets/parseMatrixSheet.js";
import type { WorkbookPort } from "../workbook/WorkbookPort.js";
import { sourceOf } from "../workbook/scenario.js";
import type { createGuard } from "./guardHandler.js";
import type { PaneSource } from "./PaneSource.js";
import type { PaneDom } from "./paneDom.js";
import { renderTableSummary } from "./renderTableSummary.js";

/** The select's first option: no matrix sheet. */
export const NO_MATRIX_TEXT = "Straight line × detour factor";

/** The distance matrix picker of one pane. */
export class MatrixPicker {
  private chosen: SheetRead | undefined;
  /** The sheets offered by the last listing, read then. */
  private offered = new Map<string, SheetRead>();
  /** A pending listing after sheet events or focus (several events in a row, one listing). */
  private timer: ReturnType<typeof setTimeout> | undefined;
  private renamed: { from: string; to: string } | undefined;
  private listing: Promise<void> = Promise.resolve();

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

  /**
   * Keep the list in step with the workbook: in Excel, sheets added, deleted (ExcelApi 1.7) or
   * renamed (ExcelApi 1.17; the choice follows the new name) list it again; everywhere, so does
   * focusing the picker (a sheet edited into a matrix, a host without the events). When the
   * chosen matrix changed, the pane reads the tables again.
   *
   * @param watch - the source's sheet events, when it has them
   * @param skip - the sheets never offered, asked at each listing
   * @param failed - told when the workbook cannot be read
   * @example picker.follow(source.watchSheets?.bind(source), () => ["Stops", "Fleet"], showError)
   */
  follow(watch: PaneSource["watchSheets"], skip: () => readonly string[], failed: (message: string) => void): void {
    const later = (renamed?: { from: string; to: string }): void => {
      if (renamed) this.renamed = renamed;
      clearTimeout(this.timer);
      this.timer = setTimeout(() => {
        this.listing = this.listing
          .then(async () => {
            const was = this.renamed;
            this.renamed = undefined;
            if ((await this.relist(skip(), was))?.changed) await this.changed();
          })
          .catch((err: unknown) => failed(`Reading the workbook's sheets failed: ${String(err)}`));
      }, 250);
    };
    this.dom.matrixSheet.addEventListener("focus", () => later());
    watch?.((c) => later(c.from !== undefined && c.to !== undefined ? { from: c.from, to: c.to } : undefined)).catch((err: unknown) =>
      console.error("Watching the workbook's sheets failed; the Distances list is read again when focused", err),
    );
  }

  /**
   * `refreshList`, and on failure straight-line distances with the reason beside the picker: a
   * matrix sheet that cannot be read never stands in the way of the tables.
   *
   * @returns as `refreshList`, or undefined when the sheets could not be read
   */
  async relist(skip: readonly string[], renamed?: { from: string; to: string }): Promise<{ changed: boolean } | undefined> {
    try {
      return await this.refreshList(skip, renamed);
    } catch (err) {
      console.error("Listing the distance matrix sheets failed", err);
      this.reset(`The workbook's sheets could not be read to find a distance matrix (${String(err)}); try again after picking the tables.`);
      return undefined;
    }
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
   * its sheet is still one (it is read again, so edits to it count), or under its new name when
   * it was renamed. The select's options are replaced only when the list changed, so a list the
   * user is opening stays as it is.
   *
   * @param skip - sheet names never offered (the picked stops and fleet sheets)
   * @param renamed - a sheet renamed since the last listing (Excel's rename event)
   * @returns whether the chosen matrix changed: another sheet (or none), a new name, or new values
   * @example await picker.refreshList(["Stops", "Fleet"])
   */
  async refreshList(skip: readonly string[], renamed?: { readonly from: string; readonly to: string }): Promise<{ changed: boolean }> {
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
    const old = this.chosen;
    // The select's value is the user's latest choice (a pick may still be reading its sheet).
    const current = select.value;
    const keep = renamed && current === renamed.from ? renamed.to : current;
    const shown = [...select.options].slice(1).map((o) => o.value);
    if (shown.length !== offered.length || shown.some((n, i) => n !== offered[i])) {
      select.replaceChildren(new Option(NO_MATRIX_TEXT, ""), ...offered.map((n) => new Option(n, n)));
    }
    select.value = offered.includes(keep) ? keep : "";
    this.offered = reads;
    this.chosen = select.value ? reads.get(select.value) : undefined;
    if (!this.chosen) this.show([]);
    const now = this.chosen;
    return {
      changed:
        old?.sheet !== now?.sheet || (old !== undefined && now !== undefined && JSON.stringify(old.values) !== JSON.stringify(now.values)),
    };
  }

  /**
   * Choose the distances a stored run used (Rerun from its plan sheet): the matrix sheet its
   * record names, or straight-line distances when it names none. The list is read afresh first.
   *
   * @param matrixSource - the record's `matrixSource` ("'Road km'!A1:K11"), if any
   * @param skip - sheet names never offered (as for `refreshList`)
   * @returns what to tell the user when the recorded sheet is no longer offered, else undefined
   * @example await picker.restore(record.matrixSource, ["Stops", "Fleet"])
   */
  async restore(matrixSource: string | undefined, skip: readonly string[]): Promise<string | undefined> {
    await this.refreshList(skip);
    const want = matrixSource === undefined ? "" : sheetOfRef(matrixSource);
    const read = want ? this.offered.get(want) : undefined;
    this.dom.matrixSheet.value = read ? want : "";
    this.chosen = read;
    if (!read) this.show([]);
    if (!want || read) return undefined;
    return `The run used the distances of ${matrixSource}, but no sheet "${want}" reads as a distance matrix now; Distances is set to ${NO_MATRIX_TEXT.toLowerCase()}. Choose the matrix sheet under Distances if it was renamed or fixed.`;
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
