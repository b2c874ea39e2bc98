/**
 * The pane's geocoding section: the user's own service (URL template with {address}, optional
 * headers), a lookup with progress and cancel, a review list with the doubtful matches first,
 * and the explicit "Add coordinates to the sheet". Nothing is preset and nothing is sent until
 * the user gives a service and asks for the lookup. The answers are kept in the workbook's
 * very hidden sheet; the headers (an API key) never are.
 */
import {
  GEOCODE_CACHE_SHEET,
  addressTargets,
  applyGeocodes,
  cacheRows,
  checkGeocoderTemplate,
  coordinateColumns,
  geocodeAddresses,
  matchText,
  parseHeaderLine,
  readCacheSheet,
  type LocatedTables,
  type ReviewItem,
} from "../geocode/index.js";
import type { SheetRead } from "../sheets/grid.js";
import { parseSettingValue } from "../sheets/settingsSchema.js";
import type { PaneSource, PickedTable } from "./PaneSource.js";

/** What the panel needs from the pane. */
export interface GeocodeHost {
  source(): PaneSource;
  tables(): { stops?: PickedTable; fleet?: PickedTable };
  /** Called when located tables appear or go: the pane reads the tables again. */
  changed(): Promise<void>;
  guard<A extends unknown[]>(action: string, fn: (...args: A) => unknown): (...args: A) => void;
}

/** The geocoding section of the pane. */
export class GeocodePanel {
  private readonly el = {
    url: byId<HTMLInputElement>("geocoder-url"),
    headers: byId<HTMLTextAreaElement>("geocoder-headers"),
    rate: byId<HTMLInputElement>("geocoder-rate"),
    country: byId<HTMLInputElement>("geocoder-country"),
    again: byId<HTMLInputElement>("geocoder-again"),
    run: byId<HTMLButtonElement>("geocode"),
    cancel: byId<HTMLButtonElement>("geocode-cancel"),
    write: byId<HTMLButtonElement>("geocode-write"),
    progress: byId("geocode-progress"),
    review: byId<HTMLOListElement>("geocode-review"),
  };
  private located: { stops: SheetRead; fleet?: SheetRead; result: LocatedTables } | undefined;
  private abort: AbortController | undefined;

  constructor(private readonly host: GeocodeHost) {}

  /** Wire the buttons. */
  init(): void {
    this.el.run.addEventListener(
      "click",
      this.host.guard("Look up addresses", () => this.lookUp()),
    );
    this.el.cancel.addEventListener("click", () => this.abort?.abort());
    this.el.write.addEventListener(
      "click",
      this.host.guard("Add coordinates to the sheet", () => this.addToSheet()),
    );
  }

  /**
   * The tables to plan: with geocoded coordinates when the lookup was made on these very reads.
   *
   * @param stops - the stops table as picked
   * @param fleet - the fleet table as picked
   * @returns the reads to give `readProblem`, and the stops not found
   */
  input(stops: SheetRead, fleet: SheetRead): { stops: SheetRead; fleet: SheetRead; unlocated?: ReadonlyMap<number, string> } {
    const l = this.located;
    if (!l || l.stops !== stops || (l.fleet !== undefined && l.fleet !== fleet)) return { stops, fleet };
    return { stops: l.result.stops, fleet: l.result.fleet ?? fleet, unlocated: l.result.unlocated };
  }

  /**
   * Start the Default country from the workbook's Settings sheet (its "Default country" row, the
   * one schema field the CLI reads too); a workbook without one leaves the field empty.
   *
   * @param country - the Settings sheet's default country, if it has one
   */
  startFrom(country: string | undefined): void {
    this.el.country.value = country ?? "";
  }

  /**
   * The review of the lookup made on these very reads (empty when none was), for the map.
   *
   * @param stops - the stops table as picked
   * @returns the review list, the most doubtful first
   */
  review(stops: SheetRead): readonly ReviewItem[] {
    return this.located?.stops === stops ? this.located.result.review : [];
  }

  /** Forget the lookup (a new workbook was opened). */
  reset(): void {
    this.abort?.abort();
    this.located = undefined;
    this.el.review.replaceChildren();
    this.el.progress.textContent = "";
    this.el.write.disabled = true;
  }

  private async lookUp(): Promise<void> {
    const { stops, fleet } = this.host.tables();
    const el = this.el;
    if (!stops) return void (el.progress.textContent = "Choose the stops table first.");
    const setup = this.setup();
    if ("message" in setup) return void (el.progress.textContent = setup.message);
    const port = this.host.source().port;
    const tables = { stops: stops.read, ...(fleet ? { fleet: fleet.read } : {}) };
    const { targets, typed } = addressTargets(tables, setup.country);
    if (targets.length === 0) {
      el.progress.textContent = "Every row with an address already has coordinates; nothing to look up.";
      return;
    }
    const cache = readCacheSheet(
      (await port.listSheets()).includes(GEOCODE_CACHE_SHEET) ? await port.readSheet(GEOCODE_CACHE_SHEET) : undefined,
    );
    this.abort = new AbortController();
    el.run.disabled = true;
    el.cancel.disabled = false;
    el.write.disabled = true;
    try {
      const run = await geocodeAddresses(
        targets.map((t) => t.address),
        {
          template: setup.template,
          headers: setup.headers,
          ratePerSecond: setup.rate,
          again: el.again.checked,
          cache,
          signal: this.abort.signal,
          onProgress: (p) => {
            el.progress.textContent = `Looked up ${p.done} of ${p.total} addresses · about ${Math.ceil(p.secondsLeft)} s left`;
          },
        },
      );
      if (cache.size > 0) await port.writeVeryHiddenSheet(GEOCODE_CACHE_SHEET, cacheRows(cache));
      const result = applyGeocodes(tables, targets, typed, run.answers);
      this.located = { stops: stops.read, ...(fleet ? { fleet: fleet.read } : {}), result };
      const done = result.review.length;
      el.progress.textContent = run.error
        ? `Stopped: ${run.error} ${done} of ${targets.length} addresses were found before.`
        : `${run.cancelled ? "Cancelled: " : ""}${done} of ${targets.length} addresses looked up (${run.requests} requests to the service, the rest from the answers kept in the workbook).`;
      this.render(result);
      el.write.disabled = result.filled === 0;
      await this.host.changed();
    } finally {
      el.run.disabled = false;
      el.cancel.disabled = true;
      this.abort = undefined;
    }
  }

  /** "Add coordinates to the sheet": only into empty cells, only on this click. */
  private async addToSheet(): Promise<void> {
    const l = this.located;
    const { stops, fleet } = this.host.tables();
    if (!l || !stops || l.stops !== stops.read) return void (this.el.progress.textContent = "Look the addresses up first.");
    const port = this.host.source().port;
    let written = 0;
    for (const [original, filled, kind] of [
      [l.stops, l.result.stops, "stops"],
      ...(l.fleet && l.result.fleet && fleet ? [[l.fleet, l.result.fleet, "fleet"] as const] : []),
    ] as const) {
      const block = coordinateColumns(original, filled, l.result.review, kind);
      if (block) written += await port.fillEmptyCells(original.sheet, block.row, block.col, block.values);
    }
    this.el.progress.textContent = `Added ${written} cells (coordinates, start and end depot coordinates beside address text, and the Geocode match) to the sheets; no cell that held a value was changed.`;
    this.el.write.disabled = true;
  }

  private setup(): { template: string; headers: Record<string, string>; rate: number; country?: string } | { message: string } {
    const el = this.el;
    const template = el.url.value.trim();
    if (template === "")
      return { message: "Give the URL of a geocoding service of your choice first (with {address} where the address goes)." };
    const problem = checkGeocoderTemplate(template);
    if (problem) return { message: `Geocoder URL: ${problem}` };
    const headers: Record<string, string> = {};
    for (const line of el.headers.value
      .split("\n")
      .map((l) => l.trim())
      .filter((l) => l !== "")) {
      const h = parseHeaderLine(line);
      if ("message" in h) return { message: `Headers: ${h.message}` };
      headers[h.name] = h.value;
    }
    const rate = Number(el.rate.value || "1");
    if (!(rate > 0 && rate <= 50))
      return { message: "Requests / s: type a number above 0 and up to 50, such as 1 (check the service's usage policy)." };
    let country: string | undefined;
    if (el.country.value.trim() !== "") {
      const c = parseSettingValue("country", el.country.value);
      if (!c.ok) return { message: c.message };
      country = String(c.value);
    }
    return { template, headers, rate, ...(country !== undefined ? { country } : {}) };
  }

  private render(result: LocatedTables): void {
    const select = this.host.source().selectCell;
    const items = result.review.map((r) => {
      const li = document.createElement("li");
      li.dataset.quality = r.quality;
      if (r.quality !== "found") li.className = r.quality === "not-found" ? "" : "warning";
      else li.className = "found";
      const cell = document.createElement(select ? "button" : "span");
      cell.className = "cell";
      cell.textContent = r.cell;
      if (select && cell instanceof HTMLButtonElement) {
        cell.type = "button";
        const [sheet, at] = r.cell.split("!") as [string, string];
        cell.addEventListener(
          "click",
          this.host.guard("Select cell", () => select.call(this.host.source(), sheet, at)),
        );
      }
      li.append(cell, `${r.address} → ${matchText(r)}`);
      return li;
    });
    for (const i of result.issues) {
      const li = document.createElement("li");
      li.textContent = i.message;
      items.unshift(li);
    }
    this.el.review.replaceChildren(...items);
  }
}

function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new TypeError(`taskpane.html has no element #${id}`);
  return el as T;
}
