/**
 * The pane outside Office (standalone page): open an .xlsx or .csv files, pick the stops and
 * fleet sheets from drop-downs, optimize, write the plan into the in-memory workbook and
 * download it. Nothing leaves the machine.
 */
import { runRecordText } from "./storedRunRecord.js";
import { ExcelJsWorkbook, SETTINGS_SHEET } from "../workbook/exceljs/ExcelJsWorkbook.js";
import { describeMissingTable, findInputSheets, type InputSheets } from "../workbook/findInputSheets.js";
import { GEOCODE_CACHE_SHEET } from "../geocode/index.js";
import { openWorkbookFiles } from "./openWorkbookFiles.js";
import { PaneController } from "./PaneController.js";

/** The standalone page's pane. */
export class FilePaneController extends PaneController {
  private book: ExcelJsWorkbook;
  private downloadName = "kiln.plan.xlsx";
  private downloadUrl: string | undefined;
  /** What the automatic detection found in the open workbook (why a list was left empty). */
  private found: InputSheets | undefined;

  constructor() {
    const book = ExcelJsWorkbook.fromGrids([]);
    super({ mode: "file", port: book });
    this.book = book;
  }

  override init(): void {
    super.init();
    const d = this.dom;
    d.fileSection.hidden = false;
    d.stopsSummary.textContent = "Open a workbook file first.";
    d.fleetSummary.textContent = "Open a workbook file first.";
    d.fileInput.addEventListener(
      "change",
      this.guard("Open file", () => this.open([...(d.fileInput.files ?? [])])),
    );
    d.stopsSheet.addEventListener(
      "change",
      this.guard("Choose the stops sheet", () => this.pickSheets()),
    );
    d.fleetSheet.addEventListener(
      "change",
      this.guard("Choose the fleet sheet", () => this.pickSheets()),
    );
  }

  private async open(files: File[]): Promise<void> {
    const d = this.dom;
    const opened = await openWorkbookFiles(files);
    if ("error" in opened) return this.showError(opened.error);
    d.error.hidden = true;
    this.book = opened.book;
    this.downloadName = opened.downloadName;
    d.fileName.textContent = opened.label;
    await this.setSource({ mode: "file", port: opened.book });
    const found = await findInputSheets(opened.book);
    this.found = found;
    await this.fillSheetLists(found.stops, found.fleet);
    await this.pickSheets();
  }

  /** Fill the drop-downs with the workbook's sheets, keeping or setting the chosen ones. */
  private async fillSheetLists(stops?: string, fleet?: string): Promise<void> {
    const d = this.dom;
    const names = (await this.book.listSheets()).filter((n) => n !== SETTINGS_SHEET && n !== GEOCODE_CACHE_SHEET);
    const settings = await this.book.readSettings();
    const planSheets: string[] = [];
    for (const n of names) if (runRecordText(settings, n, await this.book.sheetId(n)) !== undefined) planSheets.push(n);
    const fill = (select: HTMLSelectElement, options: readonly string[], wanted: string | undefined, empty: string) => {
      const keep = wanted ?? select.value;
      select.replaceChildren(new Option(empty, ""), ...options.map((n) => new Option(n, n)));
      select.value = options.includes(keep) ? keep : "";
    };
    fill(d.stopsSheet, names, stops, "— choose the stops sheet —");
    fill(d.fleetSheet, names, fleet, "— choose the fleet sheet —");
    fill(d.rerunSheet, planSheets, undefined, planSheets.length ? "— choose a plan sheet —" : "no plan sheets yet");
  }

  private async pickSheets(): Promise<void> {
    const d = this.dom;
    const read = async (name: string) => (name ? await this.book.readSheet(name) : undefined);
    const stops = await read(d.stopsSheet.value);
    const fleet = await read(d.fleetSheet.value);
    this.stops = stops && this.picked(stops);
    this.fleet = fleet && this.picked(fleet);
    await this.refreshRead();
    // Say why a list was left empty, so the user knows which sheet to pick.
    if (this.found && !this.stops && !this.found.stops)
      d.stopsSummary.textContent = describeMissingTable(this.found, "stops", "choose the stops sheet in the list above");
    if (this.found && !this.fleet && !this.found.fleet)
      d.fleetSummary.textContent = describeMissingTable(this.found, "fleet", "choose the fleet sheet in the list above");
  }

  protected override async write(): Promise<{ sheetName: string } | undefined> {
    const out = await super.write();
    if (!out) return out;
    const d = this.dom;
    const bytes = await this.book.toBuffer();
    if (this.downloadUrl) URL.revokeObjectURL(this.downloadUrl);
    const blob = new Blob([bytes as BlobPart], { type: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" });
    this.downloadUrl = URL.createObjectURL(blob);
    d.download.href = this.downloadUrl;
    d.download.download = this.downloadName;
    d.download.textContent = `Download ${this.downloadName}`;
    d.download.hidden = false;
    d.writeStatus.textContent += " Download the workbook to keep it.";
    await this.fillSheetLists();
    return out;
  }

  protected override emptyTableHint(kind: "stops" | "fleet"): string {
    return this.dom.fileName.textContent ? `Choose the ${kind} sheet in the list above.` : "Open a workbook file first.";
  }

  protected override async rerunSheet(): Promise<string | undefined> {
    return this.dom.rerunSheet.value || undefined;
  }
}
