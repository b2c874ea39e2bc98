/**
 * A fake Office host over office-addin-mock (Microsoft's mock of the Office.js object
 * model: `load`, `sync`, and "Error, property was not loaded" for what was not loaded).
 * The mock has no collections and does not reach objects created at run time
 * (OFFICE-NOTES.md), so sheets added by the adapter are plain recorders: every assignment
 * and call lands in `log`, and each range checks, like Excel, that a 2-D array assigned to
 * it has exactly its size (Office.js `Range.values` contract).
 */
import { expect } from "vitest";
import { OfficeMockObject } from "office-addin-mock";
import { ExcelWorkbook, type ExcelWorkbookOptions } from "../../src/workbook/excel/ExcelWorkbook.js";

export type Entry = [string, ...unknown[]];
const NOT_LOADED = /property was not loaded|context\.sync\(\) was not called/;

export interface Fake {
  log: Entry[];
  syncs: () => number;
  /** Make the n-th sync from now (1 = the next) reject with this error. */
  failSync: (n: number, error: unknown) => void;
  notices: string[];
}

let fake: Fake;

/** The host installed last. */
export function host(): Fake {
  return fake;
}

function a1Size(address: string): { rows: number; cols: number } {
  const parts = address.split(":").map((p) => /^([A-Z]+)(\d+)$/.exec(p)!);
  const col = (s: string) => [...s].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
  const [a, b] = [parts[0]!, parts[1] ?? parts[0]!];
  return { rows: Number(b[2]) - Number(a[2]) + 1, cols: col(b[1]!) - col(a[1]!) + 1 };
}

/**
 * What the fake workbook holds in each written cell ("Sheet!B7" -> value), so a read-back of
 * `values` sees what Excel would store. `textStored` models how Excel stores a text cell
 * (identity by default; a test may make it drop a leading apostrophe, as typing does).
 */
const cells = new Map<string, unknown>();
let textStored: (text: string) => unknown = (text) => text;

function columnNumber(letters: string): number {
  return [...letters].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
}

function columnLetters(n: number): string {
  let s = "";
  for (let x = n; x > 0; x = Math.floor((x - 1) / 26)) s = String.fromCharCode(65 + ((x - 1) % 26)) + s;
  return s;
}

function recordingRange(log: Entry[], sheet: string, address: string): unknown {
  const [start] = address.split(":");
  const m = /^([A-Z]+)(\d+)$/.exec(start ?? "");
  const sized = (what: string, v: unknown[][]) => {
    if (/^[A-Z]+:[A-Z]+$/.test(address)) return;
    const { rows, cols } = a1Size(address);
    if (v.length !== rows || v.some((r) => r.length !== cols))
      throw new Error(`InvalidArgument: ${what} of ${address} is not ${rows}x${cols}`);
  };
  return {
    set numberFormat(v: unknown[][]) {
      sized("numberFormat", v);
      log.push(["numberFormat", sheet, address, v]);
    },
    set values(v: unknown[][]) {
      sized("values", v);
      log.push(["values", sheet, address, v]);
      if (!m) return;
      v.forEach((row, r) =>
        row.forEach((value, c) => {
          const key = `${sheet}!${columnLetters(columnNumber(m[1]!) + c)}${Number(m[2]) + r}`;
          cells.set(key, typeof value === "string" ? textStored(value) : value);
        }),
      );
    },
    get values(): unknown[][] {
      return [[cells.get(`${sheet}!${address}`) ?? ""]];
    },
    load(what: unknown) {
      log.push(["range.load", sheet, address, what]);
    },
    format: {
      set columnWidth(v: number) {
        log.push(["columnWidth", sheet, address, v]);
      },
      font: {
        set bold(v: boolean) {
          log.push(["bold", sheet, address, v]);
        },
      },
    },
    select() {
      log.push(["select", sheet, address]);
    },
  };
}

function recordingSeries(log: Entry[], name: string | undefined): unknown {
  return {
    set name(v: string) {
      log.push(["series.name", v]);
    },
    setXAxisValues(r: unknown) {
      log.push(["series.x", name, r]);
    },
    setValues(r: unknown) {
      log.push(["series.y", name, r]);
    },
  };
}

function recordingPageLayout(log: Entry[], sheet: string): unknown {
  const setter = (kind: string) => ({
    set(v: unknown) {
      log.push([kind, sheet, v]);
    },
  });
  const sections: Record<string, unknown> = {};
  for (const side of ["left", "center", "right"])
    for (const part of ["Header", "Footer"]) Object.defineProperty(sections, `${side}${part}`, setter(`${side}${part}`));
  const layout = {
    setPrintTitleRows: (rows: string) => log.push(["printTitleRows", sheet, rows]),
    headersFooters: { defaultForAllPages: sections },
  };
  for (const kind of ["orientation", "paperSize", "zoom"]) Object.defineProperty(layout, kind, setter(kind));
  return layout;
}

function recordingSheet(log: Entry[], name: string): unknown {
  return {
    // Excel's worksheet.id is a GUID in braces that stays when the sheet is renamed (ExcelApi 1.1).
    id: `{id-${name}}`,
    load: (what: unknown) => log.push(["sheet.load", name, what]),
    getRange: (address: string) => recordingRange(log, name, address),
    freezePanes: { freezeRows: (n: number) => log.push(["freezeRows", name, n]) },
    activate: () => log.push(["activate", name]),
    set position(v: number) {
      log.push(["position", name, v]);
    },
    pageLayout: recordingPageLayout(log, name),
    horizontalPageBreaks: { add: (at: string) => log.push(["pageBreak", name, at]) },
    charts: {
      add: (type: string, source: unknown, by: string) => {
        log.push(["charts.add", type, source, by]);
        return {
          title: {
            set text(v: string) {
              log.push(["chart.title", v]);
            },
          },
          setPosition: (cell: string) => log.push(["chart.position", cell]),
          set width(v: number) {
            log.push(["chart.width", v]);
          },
          set height(v: number) {
            log.push(["chart.height", v]);
          },
          series: {
            getItemAt: (i: number) => {
              log.push(["series.getItemAt", i]);
              return recordingSeries(log, "#0");
            },
            add: (n: string) => {
              log.push(["series.add", n]);
              return recordingSeries(log, n);
            },
          },
        };
      },
    },
  };
}

export interface Setup {
  sheets?: Record<string, { values: unknown[][]; rowIndex?: number; columnIndex?: number } | "empty">;
  excelApi?: string;
  /** How Excel stores written text (default: exactly as sent). */
  textStored?: (text: string) => unknown;
  /** `address` and `values` are the filled part; `selected` what the user selected (default: the same). */
  selection?: {
    sheet: string;
    address: string;
    selected?: string;
    values: unknown[][];
    rowIndex: number;
    columnIndex: number;
    /** Merged areas Excel reports for the filled part (sheet coordinates); absent: the range has no getMergedAreasOrNullObject. */
    merges?: { rowIndex: number; columnIndex: number; rowCount: number; columnCount: number }[];
  };
  table?: { name: string; address: string; values: unknown[][]; rowIndex: number; columnIndex: number };
  settings?: { key: string; value: unknown }[];
  /** Ranges readable through getItem(sheet).getRange(address), keyed "Sheet!A1:B2". */
  ranges?: Record<string, Record<string, unknown>>;
}

export function install(setup: Setup, options: ExcelWorkbookOptions = {}): ExcelWorkbook {
  const log: Entry[] = [];
  cells.clear();
  textStored = setup.textStored ?? ((text) => text);
  const present = new Set(Object.keys(setup.sheets ?? {}));
  let syncCount = 0;
  const failures = new Map<number, unknown>();
  const used: Record<string, unknown> = {};
  for (const [name, s] of Object.entries(setup.sheets ?? {})) {
    used[name] =
      s === "empty"
        ? { isNullObject: true, values: [], rowIndex: 0, columnIndex: 0, rowCount: 0, columnCount: 0 }
        : {
            isNullObject: false,
            values: s.values,
            rowIndex: s.rowIndex ?? 0,
            columnIndex: s.columnIndex ?? 0,
            rowCount: s.values.length,
            columnCount: s.values[0]?.length ?? 0,
          };
  }
  const sel = setup.selection ?? {
    sheet: "Stops",
    address: "Stops!A1:B2",
    values: [
      ["Stop", "Name"],
      ["S1", "Bakery"],
    ],
    rowIndex: 0,
    columnIndex: 0,
  };
  const seed = {
    context: {
      workbook: {
        worksheets: {
          used,
          nullSheet: { isNullObject: true },
          liveSheet: {
            isNullObject: false,
            delete: function () {
              log.push(["delete", this.lastName]);
            },
            lastName: "",
            id: "{id-live}",
          },
          active: { name: "Fleet" },
          ranges: setup.ranges ?? {},
          missingRange: { isNullObject: false, values: [], valuesAsJson: [], rowIndex: 0, columnIndex: 0, rowCount: 0, columnCount: 0 },
          items: [...present].map((name, position) => ({ name, position })),
          load: function (this: OfficeMockObject, arg: unknown) {
            log.push(["worksheets.load", arg]);
            return OfficeMockObject.prototype.load.call(this, "items");
          },
          getItemOrNullObject: function (this: Record<string, Record<string, unknown>>, name: string) {
            log.push(["getItemOrNullObject", name]);
            if (!present.has(name)) return this.nullSheet;
            (this.liveSheet as { lastName?: string }).lastName = name;
            return this.liveSheet;
          },
          getItem: function (this: Record<string, Record<string, unknown>>, name: string) {
            log.push(["getItem", name]);
            if (!present.has(name))
              failures.set(syncCount + 1, {
                code: "ItemNotFound",
                message: "The requested resource doesn't exist.",
                debugInfo: { errorLocation: "WorksheetCollection.getItem" },
              });
            // eslint-disable-next-line @typescript-eslint/no-this-alias -- the mock's seed object is the book the arrow functions below read
            const book = this;
            return {
              ...(recordingSheet(log, name) as object),
              getUsedRangeOrNullObject: (valuesOnly: boolean) => {
                log.push(["getUsedRangeOrNullObject", name, valuesOnly]);
                return present.has(name) ? book.used![name] : book.missingRange;
              },
              getRange: (address: string) => {
                if (!present.has(name)) return book.missingRange;
                return book.ranges![`${name}!${address}`] ?? recordingRange(log, name, address);
              },
            };
          },
          add: function (name: string) {
            log.push(["add", name]);
            present.add(name);
            return recordingSheet(log, name);
          },
          getActiveWorksheet: function (this: Record<string, unknown>) {
            return this.active;
          },
        },
        settings: {
          items: setup.settings ?? [],
          add: function (key: string, value: unknown) {
            log.push(["settings.add", key, value]);
          },
        },
        tableRange: {
          address: setup.table?.address ?? "",
          values: setup.table?.values ?? [],
          rowIndex: setup.table?.rowIndex ?? 0,
          columnIndex: setup.table?.columnIndex ?? 0,
          rowCount: setup.table?.values.length ?? 0,
          columnCount: setup.table?.values[0]?.length ?? 0,
        },
        tables: {
          // Collection items are plain data in the mock; their getRange hands back the pre-seeded range.
          items: setup.table ? [{ name: setup.table.name, getRange: () => seedRoot.context.workbook.tableRange }] : [],
          load: function (this: OfficeMockObject, arg: unknown) {
            log.push(["tables.load", arg]);
            return OfficeMockObject.prototype.load.call(this, "items");
          },
        },
        selection: {
          address: sel.selected ?? sel.address,
          rowIndex: sel.rowIndex,
          columnIndex: sel.columnIndex,
          worksheet: {
            name: sel.sheet,
            getUsedRange: (valuesOnly: boolean) => {
              log.push(["getUsedRange", valuesOnly]);
              return "used range";
            },
          },
          // Excel's intersection of the selection with the used range: what the test says is filled.
          filled: {
            isNullObject: sel.values.length === 0,
            address: sel.address,
            values: sel.values,
            rowIndex: sel.rowIndex,
            columnIndex: sel.columnIndex,
            rowCount: sel.values.length,
            columnCount: sel.values[0]?.length ?? 0,
            ...(sel.merges
              ? {
                  // Range.getMergedAreasOrNullObject (ExcelApi 1.13): a RangeAreas whose `areas` are ranges.
                  mergedAreas: {
                    isNullObject: sel.merges.length === 0,
                    areas: {
                      items: sel.merges,
                      load: function (this: OfficeMockObject, arg: unknown) {
                        log.push(["areas.load", arg]);
                        return OfficeMockObject.prototype.load.call(this, "items");
                      },
                    },
                  },
                  getMergedAreasOrNullObject: function (this: Record<string, unknown>) {
                    log.push(["getMergedAreasOrNullObject"]);
                    return this.mergedAreas;
                  },
                }
              : {}),
          },
          getIntersectionOrNullObject: function (this: Record<string, unknown>, other: unknown) {
            log.push(["getIntersectionOrNullObject", other]);
            return this.filled;
          },
          getTables: function (fullyContained: boolean) {
            log.push(["getTables", fullyContained]);
            return seedRoot.context.workbook.tables;
          },
        },
        getSelectedRange: function (this: Record<string, unknown>) {
          log.push(["getSelectedRange"]);
          return this.selection;
        },
      },
    },
    run: async function (this: { context: unknown }, cb: (c: unknown) => unknown) {
      return cb(this.context);
    },
  };
  const mock = new OfficeMockObject(seed) as unknown as typeof seed & { context: { sync: () => Promise<void> } };
  const seedRoot = mock;
  const original = mock.context.sync.bind(mock.context);
  mock.context.sync = async () => {
    syncCount++;
    log.push(["sync"]);
    const failure = failures.get(syncCount);
    if (failure !== undefined) {
      failures.delete(syncCount);
      throw failure;
    }
    await original();
  };
  Object.assign(mock, { ChartType: { xyscatterLines: "XYScatterLines" }, ChartSeriesBy: { columns: "Columns" } });
  const max = setup.excelApi ?? "1.16";
  const num = (v: string) => v.split(".").map(Number) as [number, number];
  const atLeast = (v: string) => {
    const [a, b] = num(max);
    const [c, d] = num(v);
    return a > c || (a === c && b >= d);
  };
  Object.assign(globalThis, {
    Excel: mock,
    Office: { context: { requirements: { isSetSupported: (name: string, v: string) => name === "ExcelApi" && atLeast(v) } } },
  });
  const notices: string[] = [];
  fake = { log, syncs: () => syncCount, failSync: (n, e) => failures.set(syncCount + n, e), notices };
  return new ExcelWorkbook({ ...options, onNotice: (m) => notices.push(m) });
}

export function neverNotLoaded(value: unknown): void {
  expect(JSON.stringify(value)).not.toMatch(NOT_LOADED);
  for (const entry of fake.log) expect(JSON.stringify(entry) ?? "").not.toMatch(NOT_LOADED);
}

export const entries = (kind: string): Entry[] => fake.log.filter((e) => e[0] === kind);

/** Removes the fake `Excel` and `Office` globals (call in `afterEach`). */
export function uninstall(): void {
  Reflect.deleteProperty(globalThis, "Excel");
  Reflect.deleteProperty(globalThis, "Office");
}
