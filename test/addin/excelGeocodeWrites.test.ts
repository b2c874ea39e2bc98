/**
 * The Office.js adapter's two geocoding writes against a small recording host: the very hidden
 * cache sheet (`Excel.SheetVisibility.veryHidden`, ExcelApi 1.1) and "Add coordinates to the
 * sheet" into empty cells only. The host applies Office.js's documented rule for a 2-D array:
 * a `null` entry leaves that cell unchanged ("Blank and null values in Excel add-ins").
 */
import { afterEach, describe, expect, it } from "vitest";
import { ExcelWorkbook } from "../../src/workbook/excel/ExcelWorkbook.js";

type Grid = unknown[][];

/** A workbook of sheets held as cell maps, with a log of what the adapter did. */
function installHost(sheets: Record<string, Grid>) {
  const cells = new Map<string, Map<string, unknown>>();
  for (const [name, grid] of Object.entries(sheets)) {
    const m = new Map<string, unknown>();
    grid.forEach((row, r) => row.forEach((v, c) => m.set(`${r},${c}`, v)));
    cells.set(name, m);
  }
  const log: unknown[][] = [];
  let syncs = 0;
  const sheet = (name: string) => {
    const ws = {
      isNullObject: false,
      load: () => undefined,
      set visibility(v: string) {
        log.push(["visibility", name, v]);
      },
      getRange: () => ({ clear: (what: string) => (log.push(["clear", name, what]), cells.set(name, new Map())) }),
      getRangeByIndexes: (row: number, col: number, rows: number, cols: number) => ({
        load: () => undefined,
        get values(): Grid {
          const m = cells.get(name)!;
          return Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => m.get(`${row + r},${col + c}`) ?? ""));
        },
        set values(v: Grid) {
          expect(v.length).toBe(rows);
          const m = cells.get(name)!;
          v.forEach((line, r) => {
            expect(line.length).toBe(cols);
            line.forEach((x, c) => {
              if (x !== null) m.set(`${row + r},${col + c}`, x);
            });
          });
          log.push(["values", name, row, col, v]);
        },
        set numberFormat(v: Grid) {
          log.push(["numberFormat", name, v]);
        },
      }),
    };
    return ws;
  };
  const context = {
    sync: async () => void syncs++,
    workbook: {
      worksheets: {
        getItemOrNullObject: (name: string) => (cells.has(name) ? sheet(name) : { isNullObject: true, load: () => undefined }),
        getItem: (name: string) => sheet(name),
        add: (name: string) => {
          log.push(["add", name]);
          cells.set(name, new Map());
          return sheet(name);
        },
      },
    },
  };
  (globalThis as Record<string, unknown>)["Excel"] = {
    run: (cb: (c: unknown) => Promise<unknown>) => cb(context),
    SheetVisibility: { veryHidden: "VeryHidden" },
    ClearApplyTo: { contents: "Contents" },
  };
  const value = (name: string, r: number, c: number) => cells.get(name)?.get(`${r},${c}`);
  return { log, syncs: () => syncs, value };
}

afterEach(() => {
  delete (globalThis as Record<string, unknown>)["Excel"];
});

describe("geocoding writes through Office.js", () => {
  it("adds the cache sheet very hidden and writes it as text; an existing one is cleared and rewritten", async () => {
    const host = installHost({});
    const book = new ExcelWorkbook();
    await book.writeVeryHiddenSheet("kiln-geocodes", [
      ["Key", "Candidates"],
      ["s|1 kiln lane", "[]"],
    ]);
    expect(host.log).toContainEqual(["add", "kiln-geocodes"]);
    // Excel.SheetVisibility.veryHidden = "VeryHidden" (Office.js reference, ExcelApi 1.1).
    expect(host.log).toContainEqual(["visibility", "kiln-geocodes", "VeryHidden"]);
    expect(host.log).toContainEqual([
      "numberFormat",
      "kiln-geocodes",
      [
        ["@", "@"],
        ["@", "@"],
      ],
    ]);
    expect(host.value("kiln-geocodes", 1, 0)).toBe("s|1 kiln lane");
    expect(host.syncs()).toBe(2);

    await book.writeVeryHiddenSheet("kiln-geocodes", [["Key", "Candidates"]]);
    expect(host.log).toContainEqual(["clear", "kiln-geocodes", "Contents"]);
    expect(host.value("kiln-geocodes", 1, 0)).toBeUndefined();
  });

  it("fills only empty cells: a typed value is sent as null and stays", async () => {
    const host = installHost({
      Stops: [
        ["Stop", "Street", "Latitude", "Longitude"],
        ["S1", "1 Kiln Lane", "", ""],
        ["S2", "7 Kiln Lane", 52.2, ""],
      ],
    });
    const book = new ExcelWorkbook();
    const written = await book.fillEmptyCells("Stops", 1, 2, [
      [52.09, 5.12],
      [52.1, 5.13],
    ]);
    expect(written).toBe(3);
    expect(host.log.find((e) => e[0] === "values")?.[4]).toEqual([
      [52.09, 5.12],
      [null, 5.13],
    ]);
    expect(host.value("Stops", 2, 2)).toBe(52.2);
    expect(host.value("Stops", 2, 3)).toBe(5.13);
    // One sync to read the block, one to write it.
    expect(host.syncs()).toBe(2);
    // Nothing to add: no write at all.
    expect(await book.fillEmptyCells("Stops", 1, 2, [[1, 2]])).toBe(0);
  });
});
