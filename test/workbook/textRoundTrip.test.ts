import ExcelJS from "exceljs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { layoutCompareRow } from "../../src/sheets/layoutCompare.js";
import { layoutPlan } from "../../src/sheets/layoutPlan.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { plan, problem, run, stopRows, extraHeaders } from "../fixtures/writerPlan.js";

/**
 * Text that spreadsheet programs would read as a formula (= + - @, tab, CR: OWASP "CSV
 * Injection" guidance, common practice) or that is easily lost (whitespace, an apostrophe
 * Excel itself uses as a text marker, right-to-left text, emoji; invented values).
 */
const TRICKY = [
  "=SUM(A1)",
  "+32 16 00 00 00",
  "-F09",
  "@cmd",
  "'quoted",
  "''two",
  "\tleading tab",
  "trailing tab\t",
  "line one\nline two",
  "cr\r\nlf",
  "\r=1",
  "  two spaces  ",
  "مخبز الحي",
  "אופה 12",
  "🥖 Bakery 🚐",
  '=HYPERLINK("http://127.0.0.1")',
  "3-4",
  "0012",
  "1e5",
  "TRUE",
  "_x000D_ literal",
  "a_x0041_b",
  "bell\u0007 and nul\u0000",
];

async function reopen(bytes: Uint8Array): Promise<ExcelJS.Workbook> {
  const book = new ExcelJS.Workbook();
  await book.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  return book;
}

/** Write strings down column A of a new sheet through the adapter, read them back with exceljs itself. */
async function roundTrip(texts: readonly string[]): Promise<{ value: unknown; type: number }[]> {
  const book = ExcelJsWorkbook.fromGrids([{ name: "In", values: [["x"]] }]);
  await book.addSheet("Out", { values: texts.map((t) => [t]), numberFormats: texts.map(() => ["@"]) });
  const ws = (await reopen(await book.toBuffer())).getWorksheet("Out")!;
  return texts.map((_, r) => {
    const cell = ws.getCell(r + 1, 1);
    return { value: cell.value, type: cell.type };
  });
}

describe("text stays exactly the user's text in files written with exceljs", () => {
  it.each(TRICKY.map((t) => [JSON.stringify(t), t]))("%s round-trips unchanged, as a string cell (not a formula)", async (_, text) => {
    const [back] = await roundTrip([text]);
    expect(back!.value).toBe(text);
    expect(back!.type).toBe(ExcelJS.ValueType.String);
  });

  it("any string, control characters included, round-trips unchanged and the file stays readable (property)", async () => {
    const xmlChar = fc.oneof(fc.string({ unit: "grapheme-composite", maxLength: 12 }), fc.string({ unit: "binary", maxLength: 12 }));
    const prefix = fc.constantFrom("", "=", "+", "-", "@", "'", "\t", "\n", " ", "\r");
    const samples = fc.sample(
      fc
        .tuple(prefix, xmlChar)
        .map(([p, s]) => p + s)
        .filter((s) => s !== ""),
      { numRuns: 200, seed: 11 },
    );
    const back = await roundTrip(samples);
    back.forEach((b, i) => expect(b.value, JSON.stringify(samples[i])).toBe(samples[i]));
  });

  it("the pure layouts carry the raw text: stop names, ids, vehicle ids and the scenario, with the text format @", () => {
    const grid = layoutPlan({ problem, plan, run, stopRows, extraHeaders }).grid;
    for (const name of ["=SUM(A1)", "-x", "@cmd"]) {
      const r = grid.values.findIndex((row) => row[3] === name);
      expect(r, name).toBeGreaterThan(0);
      expect(grid.numberFormats![r]![3]).toBe("@");
    }
    expect(grid.values.flat()).toContain("=Night");
    expect(grid.values.flat().some((v) => typeof v === "string" && v.startsWith("'"))).toBe(false);
    expect(layoutCompareRow(run, plan).values[0]![0]).toBe(run.scenario);
  });

  it("a whole plan written to a file keeps every stop id and name exactly (lookups against the Stops sheet still match)", async () => {
    const book = ExcelJsWorkbook.fromGrids([{ name: "In", values: [["x"]] }]);
    const layout = layoutPlan({ problem, plan, run, stopRows, extraHeaders });
    await book.addSheet("Plan", layout.grid, layout.chart);
    const ws = (await reopen(await book.toBuffer())).getWorksheet("Plan")!;
    const written: unknown[] = [];
    ws.eachRow((row) => row.eachCell((c) => written.push(c.value)));
    for (const s of problem.stops.filter((_, i) => plan.routes.some((r) => r.visits.some((v) => v.stop === i)))) {
      expect(written).toContain(s.id);
      expect(written).toContain(s.name);
    }
    expect(written.some((v) => typeof v === "object" && v !== null && "formula" in v)).toBe(false);
  });

  it("negative numbers stay numbers (only text is text)", () => {
    const grid = layoutPlan({ problem, plan, run, stopRows, extraHeaders }).grid;
    const numbers = grid.values.flat().filter((v): v is number => typeof v === "number");
    expect(numbers).toContain(-0.0922);
    expect(numbers).toContain(-5);
  });
});
