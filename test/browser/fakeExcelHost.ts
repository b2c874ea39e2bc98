/**
 * A stand-in for Excel's side of Office.js, injected into the page before it loads, for the
 * browser test of the pane's Excel mode. It answers only the calls the pane makes for
 * "Use selection", "Plan N", error-cell links and Rerun (selection, sheet names, active sheet,
 * activate/select, settings) and the sheet events (added, deleted, renamed: ExcelApi 1.7 and
 * 1.17, answered only for the `sets` the test names); the Office.js adapter's writing is tested
 * with office-addin-mock elsewhere. It runs inside the page, so it must not close over anything.
 */

/** Sheets of the fake workbook: name -> values as Excel gives them (times as day fractions). */
export type FakeSheets = Record<string, unknown[][]>;

/** What the test reads back from `window.__kilnExcel`. */
export interface FakeExcelLog {
  /** Sheet the next getSelectedRange returns (the whole used block from A1). */
  selectSheet: string;
  /** "Sheet!A1" of every select() call. */
  selected: string[];
  /** Change the workbook's sheets as a user would, firing the registered sheet events. */
  addSheet(name: string, values: unknown[][]): void;
  deleteSheet(name: string): void;
  renameSheet(from: string, to: string): void;
}

/**
 * Install `Office` and `Excel` globals that behave like Excel for the pane's reads. Pass to
 * `page.addInitScript(installFakeExcel, sheets)`.
 *
 * @param input - the workbook's sheets and its add-in settings (key -> text)
 * @example await page.addInitScript(installFakeExcel, { sheets: { Stops: [...], Fleet: [...] }, settings: {} });
 */
export function installFakeExcel(input: { sheets: FakeSheets; settings: Record<string, string>; sets?: string[] }): void {
  const { sheets, settings } = input;
  const w = window as unknown as Record<string, unknown>;
  type Handler = (e: Record<string, unknown>) => unknown;
  const handlers: Record<"added" | "deleted" | "renamed", Handler[]> = { added: [], deleted: [], renamed: [] };
  const events = (kind: keyof typeof handlers) => ({
    add(h: Handler) {
      handlers[kind].push(h);
      return { remove() {} };
    },
  });
  const fire = (kind: keyof typeof handlers, e: Record<string, unknown>): void => {
    for (const h of handlers[kind]) void h({ ...e, source: "Local" });
  };
  const log: FakeExcelLog = {
    selectSheet: Object.keys(sheets)[0] ?? "",
    selected: [],
    addSheet(name, values) {
      sheets[name] = values;
      fire("added", { type: "WorksheetAdded", worksheetId: `{${name}}` });
    },
    deleteSheet(name) {
      delete sheets[name];
      fire("deleted", { type: "WorksheetDeleted", worksheetId: `{${name}}` });
    },
    renameSheet(from, to) {
      // Keep the tab order: rebuild the sheets in order with the new name in place.
      const entries = Object.entries(sheets);
      for (const [k] of entries) delete sheets[k];
      for (const [k, v] of entries) sheets[k === from ? to : k] = v;
      fire("renamed", { type: "WorksheetNameChanged", worksheetId: `{${to}}`, nameBefore: from, nameAfter: to });
    },
  };
  w.__kilnExcel = log;
  const letters = (n: number): string => {
    let s = "";
    for (let x = n + 1; x > 0; x = Math.floor((x - 1) / 26)) s = String.fromCharCode(65 + ((x - 1) % 26)) + s;
    return s;
  };
  const rangeOf = (name: string): Record<string, unknown> => {
    const values = sheets[name] ?? [];
    const cols = values.reduce((m, r) => Math.max(m, r.length), 0);
    const range: Record<string, unknown> = {
      address: `${name}!A1:${letters(Math.max(cols - 1, 0))}${Math.max(values.length, 1)}`,
      values,
      rowIndex: 0,
      columnIndex: 0,
      rowCount: values.length,
      columnCount: cols,
      isNullObject: values.length === 0,
      load() {},
      select() {},
      // The selection is the whole used block, so its intersection with the used range is itself.
      getIntersectionOrNullObject: () => range,
    };
    range.worksheet = { name, load() {}, getUsedRange: () => range, getUsedRangeOrNullObject: () => range };
    return range;
  };
  const worksheet = (name: string) => ({
    name,
    load() {},
    activate() {},
    getRange(address: string) {
      return { select: () => void log.selected.push(`${name}!${address}`), load() {} };
    },
    getUsedRangeOrNullObject() {
      return rangeOf(name);
    },
  });
  const context = {
    sync: async () => undefined,
    workbook: {
      getSelectedRange: () => rangeOf(log.selectSheet),
      worksheets: {
        get items() {
          return Object.keys(sheets).map((name) => worksheet(name));
        },
        load() {},
        getItem: (name: string) => worksheet(name),
        getItemOrNullObject: (name: string) =>
          name in sheets ? { ...worksheet(name), isNullObject: false, id: `{${name}}` } : { isNullObject: true, load() {} },
        getActiveWorksheet: () => worksheet(log.selectSheet),
        onAdded: events("added"),
        onDeleted: events("deleted"),
        onNameChanged: events("renamed"),
      },
      settings: { items: Object.entries(settings).map(([key, value]) => ({ key, value })), load() {} },
    },
  };
  w.Excel = { run: async (batch: (c: typeof context) => Promise<unknown>) => batch(context) };
  w.Office = {
    HostType: { Excel: "Excel" },
    onReady: () => Promise.resolve({ host: "Excel", platform: "OfficeOnline" }),
    context: {
      requirements: { isSetSupported: (set: string, version: string) => set === "ExcelApi" && (input.sets ?? []).includes(version) },
    },
  };
}
