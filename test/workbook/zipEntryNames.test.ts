import { readFile } from "node:fs/promises";
import { describe, expect, it } from "vitest";
import { partsNotKept, zipEntryNames } from "../../src/workbook/exceljs/zipEntryNames.js";
import { DEMO_URL } from "./harness.js";

/** A ZIP archive of empty "stored" entries, laid out as PKWARE APPNOTE.TXT 4.3 describes. */
function storedZip(names: readonly string[]): Uint8Array {
  const enc = new TextEncoder();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  for (const name of names) {
    const n = enc.encode(name);
    const local = new Uint8Array(30 + n.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    lv.setUint16(4, 20, true);
    lv.setUint16(26, n.length, true);
    local.set(n, 30);
    const central = new Uint8Array(46 + n.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, 20, true);
    cv.setUint16(6, 20, true);
    cv.setUint16(28, n.length, true);
    cv.setUint32(42, offset, true);
    central.set(n, 46);
    locals.push(local);
    centrals.push(central);
    offset += local.length;
  }
  const dirSize = centrals.reduce((s, c) => s + c.length, 0);
  const end = new Uint8Array(22);
  const ev = new DataView(end.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, names.length, true);
  ev.setUint16(10, names.length, true);
  ev.setUint32(12, dirSize, true);
  ev.setUint32(16, offset, true);
  const out = new Uint8Array(offset + dirSize + 22);
  let at = 0;
  for (const part of [...locals, ...centrals, end]) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}

describe("zipEntryNames", () => {
  it("lists the parts an .xlsx package must have (ECMA-376 Part 2: [Content_Types].xml, _rels/.rels) and the workbook part", async () => {
    const names = zipEntryNames(new Uint8Array(await readFile(DEMO_URL)));
    expect(names).toContain("[Content_Types].xml");
    expect(names).toContain("_rels/.rels");
    expect(names).toContain("xl/workbook.xml");
    expect(names.filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n))).toHaveLength(4);
  });

  it("throws a RangeError on bytes that are not a ZIP archive", () => {
    expect(() => zipEntryNames(new TextEncoder().encode("Stop,Latitude\n"))).toThrow(RangeError);
  });
});

describe("partsNotKept", () => {
  it("names the charts, pivot tables and macros a copy would lose", () => {
    const zip = storedZip([
      "[Content_Types].xml",
      "xl/workbook.xml",
      "xl/charts/chart1.xml",
      "xl/pivotTables/pivotTable1.xml",
      "xl/vbaProject.bin",
    ]);
    expect(partsNotKept(zip)).toEqual(["charts", "pivot tables", "macros"]);
  });

  it("is empty for the demo workbook and for bytes that are not a ZIP", async () => {
    expect(partsNotKept(new Uint8Array(await readFile(DEMO_URL)))).toEqual([]);
    expect(partsNotKept(new Uint8Array([1, 2, 3]))).toEqual([]);
  });
});
