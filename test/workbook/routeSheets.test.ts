// Route sheets written into an .xlsx file by a whole run on the invented demo workbook, read back
// with a fresh exceljs load (the reference library) and checked in the file's own XML against
// ECMA-376 Part 1: 18.3.1.63 pageSetup (fitToWidth, fitToHeight, paperSize 1 = Letter, 9 = A4),
// 18.3.1.65 pageSetUpPr@fitToPage, 18.3.1.73 rowBreaks / 18.3.1.3 brk (id = the zero-based row
// the break lies above), 18.2.5 definedName "_xlnm.Print_Titles", 18.3.1.40 oddFooter.
import { readFile } from "node:fs/promises";
import { describe, expect, it } from "vitest";
import { solve } from "../../src/core/solve.js";
import { RETURN_STOP } from "../../src/sheets/layoutRouteSheets.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { zipEntryNames } from "../../src/workbook/exceljs/zipEntryNames.js";
import { writeScenarioResult } from "../../src/workbook/scenario.js";
import { DEMO_URL, loadWithExcelJs, readDemo } from "./harness.js";
import { zipEntryText } from "./zipEntryText.js";

const MOVES = 20_000;

async function run(options: { sheetPerVehicle?: boolean; locale?: string }) {
  const { book, read } = await readDemo(MOVES);
  const result = solve(read.problem, { seed: 3, budget: { moves: MOVES } });
  const out = await writeScenarioResult(book, {
    read,
    result,
    scenario: "Dawn run",
    createdAt: new Date(Date.UTC(2026, 0, 6, 4)),
    runSeconds: 1,
    stopsSource: "Stops!A1:N85",
    fleetSource: "Fleet!A1:O6",
    ...options,
  });
  const bytes = new Uint8Array(await book.toBuffer());
  return { read, result, out, bytes, fresh: await loadWithExcelJs(bytes) };
}

/** The worksheet XML part of a sheet, found through workbook.xml and its relationships (ECMA-376 Part 1, 18.2.19/18.2.20). */
function sheetXml(bytes: Uint8Array, name: string): string {
  const workbook = zipEntryText(bytes, "xl/workbook.xml") ?? "";
  const rels = zipEntryText(bytes, "xl/_rels/workbook.xml.rels") ?? "";
  const escaped = name.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/"/g, "&quot;");
  const rid = new RegExp(`<sheet [^>]*name="${escaped.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}"[^>]*r:id="([^"]+)"`).exec(workbook)?.[1];
  const target = new RegExp(`Id="${rid}"[^>]*Target="([^"]+)"|Target="([^"]+)"[^>]*Id="${rid}"`).exec(rels);
  const path = (target?.[1] ?? target?.[2] ?? "").replace(/^\/?(xl\/)?/, "xl/");
  expect(zipEntryNames(bytes)).toContain(path);
  return zipEntryText(bytes, path) ?? "";
}

describe("route sheets in the written workbook (exceljs read-back, ECMA-376 XML)", () => {
  it("one sheet per scenario: every served stop once in plan order, drops summing to each van's load and the stops' demand", async () => {
    const { read, result, out, fresh } = await run({ locale: "en-GB" });
    expect(out.routeSheets).toEqual(["Dawn run routes"]);
    const ws = fresh.getWorksheet("Dawn run routes")!;
    const rows: unknown[][] = [];
    ws.eachRow({ includeEmpty: true }, (row, r) => void (rows[r - 1] = (row.values as unknown[]).slice(1)));
    const header = rows[1] as string[];
    const col = (h: string): number => header.indexOf(h);
    const dims = read.problem.loadDimensions;
    expect(dims).toEqual(["kg", "crates"]);
    // Blocks start at a "Vehicle" row; stop rows have a numeric Seq and a text Stop other than the return.
    const blocks: { vehicle: string; stops: string[]; drops: number[][]; totalsLoad: number[] }[] = [];
    for (let r = 2; r < rows.length; r++) {
      const row = rows[r] ?? [];
      if (row[0] === "Vehicle") blocks.push({ vehicle: String(row[1]), stops: [], drops: [], totalsLoad: [] });
      const b = blocks[blocks.length - 1]!;
      if (typeof row[col("Seq")] === "number" && typeof row[col("Stop")] === "string" && row[col("Stop")] !== RETURN_STOP) {
        b.stops.push(row[col("Stop")] as string);
        b.drops.push(dims.map((d) => Number(row[col(`Drop ${d}`)] ?? 0)));
      }
      if (row[0] === "Stops") b.totalsLoad = dims.map((d) => Number(rows[r + 1]![(row as string[]).indexOf(`Load ${d}`)]));
    }
    const used = result.plan.routes.filter((r) => r.visits.length > 0);
    expect(blocks.map((b) => b.vehicle)).toEqual(used.map((r) => read.problem.vehicles[r.vehicle]!.id));
    const served = blocks.flatMap((b) => b.stops);
    expect(new Set(served).size).toBe(served.length);
    expect(served.length).toBe(read.problem.stops.length - result.plan.unassigned.length);
    blocks.forEach((b, i) => {
      const route = used[i]!;
      expect(b.stops).toEqual(route.visits.map((v) => read.problem.stops[v.stop]!.id));
      // Demand of each stop as the Stops sheet gives it, read back from the file by exceljs.
      const demand = b.stops.map((id) => {
        const stop = read.problem.stops.find((s) => s.id === id)!;
        return stop.demand;
      });
      dims.forEach((_, k) => {
        const dropped = b.drops.reduce((a, d) => a + d[k]!, 0);
        expect(dropped, `${b.vehicle} ${dims[k]}`).toBeCloseTo(
          demand.reduce((a, d) => a + d[k]!, 0),
          6,
        );
        expect(dropped, `${b.vehicle} ${dims[k]} load leaving`).toBeCloseTo(route.load[k]!, 6);
        expect(b.totalsLoad[k], `${b.vehicle} totals`).toBeCloseTo(dropped, 6);
      });
    });
    // The stop's address and phone are carried exactly as the Stops sheet holds them.
    const stops = (await (await ExcelJsWorkbook.fromBuffer(await readFile(DEMO_URL))).readSheet("Stops"))!.values;
    const first = rows.find((r) => r?.[col("Stop")] === blocks[0]!.stops[0])!;
    const source = stops.find((r) => r[0] === blocks[0]!.stops[0])!;
    expect([first[col("Name")], first[col("Address")], first[col("Phone")]]).toEqual([source[1], source[2], source[13]]);
  });

  it("prints on A4 for en-GB, one page wide, the two title rows repeated, a break above every block but the first, a footer", async () => {
    const { bytes, fresh } = await run({ locale: "en-GB" });
    const xml = sheetXml(bytes, "Dawn run routes");
    expect(xml).toMatch(/<pageSetUpPr[^>]*fitToPage="1"/);
    const setup = /<pageSetup [^>]*>/.exec(xml)?.[0] ?? "";
    expect(setup).toMatch(/fitToWidth="1"/);
    expect(setup).toMatch(/fitToHeight="0"/);
    expect(setup).toMatch(/paperSize="9"/);
    const ws = fresh.getWorksheet("Dawn run routes")!;
    const blockStarts: number[] = [];
    ws.eachRow((row, r) => void (row.getCell(1).value === "Vehicle" && blockStarts.push(r - 1)));
    expect(blockStarts.length).toBeGreaterThan(1);
    const breaks = [...xml.matchAll(/<brk [^>]*id="(\d+)"/g)].map((m) => Number(m[1]));
    expect(breaks).toEqual(blockStarts.slice(1));
    const workbook = zipEntryText(bytes, "xl/workbook.xml") ?? "";
    // The quoted sheet name may be written with &apos; (an XML escape of the apostrophe).
    expect(workbook).toMatch(/<definedName name="_xlnm\.Print_Titles"[^>]*>(?:'|&apos;)Dawn run routes(?:'|&apos;)!\$1:\$2<\/definedName>/);
    expect(/<oddFooter>([^<]*)<\/oddFooter>/.exec(xml)?.[1]).toMatch(/^&amp;LDawn run&amp;C.+&amp;RPage &amp;P of &amp;N$/);
  });

  it("with --sheet-per-vehicle semantics, one Letter sheet per van for en-US, each naming its van in the footer", async () => {
    const { result, read, out, bytes } = await run({ sheetPerVehicle: true, locale: "en-US" });
    const used = result.plan.routes.filter((r) => r.visits.length > 0).map((r) => read.problem.vehicles[r.vehicle]!.id);
    expect(out.routeSheets).toHaveLength(used.length);
    out.routeSheets.forEach((name, i) => {
      expect(name.length).toBeLessThanOrEqual(31);
      const xml = sheetXml(bytes, name);
      expect(/<pageSetup [^>]*>/.exec(xml)?.[0]).toMatch(/paperSize="1"/);
      expect(xml).not.toMatch(/<brk /);
      expect(/<oddFooter>([^<]*)<\/oddFooter>/.exec(xml)?.[1]).toContain(`&amp;C${used[i]!.replace(/&/g, "&amp;&amp;")}&amp;R`);
    });
  });
});
