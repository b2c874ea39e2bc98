/**
 * End to end, for random valid workbooks: read the tables, plan (to the end of a small move
 * budget, or cancelled at a random moment), write the plan sheet into a file, read the file back
 * with exceljs and re-check the written plan sheet with rules restated here from the input alone:
 * every stop exactly once in the route table or the unassigned table, no vehicle over its
 * capacity, every service start inside its hard window, the totals row equal to the sum of the
 * rows. The same seed and move budget give the identical plan sheet. Invented data around one depot.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createSolver, solve, type SolveResult } from "../../src/core/index.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { readScenarioInput, writeScenarioResult } from "../../src/workbook/scenario.js";

interface Day {
  readonly stops: { lat: number; lon: number; kg: number; open: number; width: number; service: number }[];
  readonly vans: number[];
  readonly seed: number;
}

const DEPOT = { lat: 51.05, lon: 3.72 };
const hhmm = (min: number): string => `${String(Math.floor(min / 60)).padStart(2, "0")}:${String(min % 60).padStart(2, "0")}`;

const dayArb: fc.Arbitrary<Day> = fc.record({
  stops: fc.array(
    fc.record({
      lat: fc.double({ min: -0.08, max: 0.08, noNaN: true }),
      lon: fc.double({ min: -0.12, max: 0.12, noNaN: true }),
      kg: fc.integer({ min: 1, max: 60 }),
      open: fc.integer({ min: 360, max: 660 }),
      width: fc.integer({ min: 30, max: 240 }),
      service: fc.integer({ min: 1, max: 15 }),
    }),
    { minLength: 1, maxLength: 14 },
  ),
  vans: fc.array(fc.integer({ min: 40, max: 250 }), { minLength: 1, maxLength: 3 }),
  seed: fc.integer({ min: 1, max: 1_000_000 }),
});

function workbookOf(day: Day): ExcelJsWorkbook {
  return ExcelJsWorkbook.fromGrids([
    {
      name: "Stops",
      values: [
        ["Stop", "Latitude", "Longitude", "Demand kg", "Earliest", "Latest", "Service min"],
        ...day.stops.map((s, i) => [
          `P${i + 1}`,
          DEPOT.lat + s.lat,
          DEPOT.lon + s.lon,
          s.kg,
          hhmm(s.open),
          hhmm(s.open + s.width),
          s.service,
        ]),
      ],
    },
    {
      name: "Fleet",
      values: [
        ["Vehicle", "Capacity kg", "Start latitude", "Start longitude", "Shift start", "Shift end"],
        ...day.vans.map((cap, v) => [`Van ${v + 1}`, cap, DEPOT.lat, DEPOT.lon, "05:00", "20:00"]),
      ],
    },
  ]);
}

/** Plan, write, save, reopen: the plan sheet's cells as the file holds them. */
async function planSheetOf(day: Day, run: (problem: Parameters<typeof solve>[0]) => SolveResult): Promise<unknown[][]> {
  const book = workbookOf(day);
  const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet" });
  if (!read.ok) throw new Error(`a valid workbook did not read: ${JSON.stringify(read.issues)}`);
  const result = run(read.problem);
  const { sheetName } = await writeScenarioResult(book, {
    read,
    result,
    scenario: "Plan",
    createdAt: new Date(Date.UTC(2026, 11, 2, 6)),
    runSeconds: 1,
    stopsSource: "Stops!A1:G15",
    fleetSource: "Fleet!A1:F4",
  });
  const reopened = await ExcelJsWorkbook.fromBuffer(await book.toBuffer());
  return (await reopened.readSheet(sheetName))!.values.map((r) => [...r]);
}

/** Rows below the header row whose first cells are `header`, up to the first blank row. */
function table(values: unknown[][], header: readonly string[]): { cols: string[]; rows: unknown[][] } {
  const at = values.findIndex((r) => header.every((h, i) => r[i] === h));
  if (at < 0) return { cols: [], rows: [] };
  const rows: unknown[][] = [];
  for (let r = at + 1; r < values.length && values[r]!.some((v) => v !== "" && v !== null && v !== undefined); r++) rows.push(values[r]!);
  return { cols: values[at]!.map(String), rows };
}

function recheck(day: Day, values: unknown[][]): string[] {
  const broken: string[] = [];
  const ids = day.stops.map((_, i) => `P${i + 1}`);
  const route = table(values, ["Vehicle", "Seq", "Stop"]);
  const col = (name: string): number => route.cols.indexOf(name);
  const stopRows = route.rows.filter((r) => ids.includes(String(r[col("Stop")])));
  const left = table(values, ["Stop", "Name", "Reason"]).rows.map((r) => String(r[0]));
  for (const id of ids) {
    const n = stopRows.filter((r) => r[col("Stop")] === id).length + left.filter((x) => x === id).length;
    if (n !== 1) broken.push(`${id} appears ${n} times`);
  }
  day.vans.forEach((cap, v) => {
    const load = stopRows.filter((r) => r[col("Vehicle")] === `Van ${v + 1}`).reduce((a, r) => a + Number(r[col("Drop kg")]), 0);
    if (load > cap + 1e-9) broken.push(`Van ${v + 1} carries ${load} kg over ${cap}`);
  });
  for (const r of stopRows) {
    const s = day.stops[ids.indexOf(String(r[col("Stop")]))]!;
    const start = Number(r[col("Start")]) * 1440;
    if (start < s.open - 1e-6 || start > s.open + s.width + 1e-6)
      broken.push(`${String(r[col("Stop")])} starts at ${start} outside its window`);
  }
  const totals = table(values, ["Vehicles used", "Km"]);
  const km = route.rows.reduce((a, r) => a + Number(r[col("Leg km")] || 0), 0);
  if (Math.abs(Number(totals.rows[0]?.[1]) - km) > 0.05 * (route.rows.length + 1))
    broken.push(`total km ${String(totals.rows[0]?.[1])} is not the rows' ${km}`);
  const unassigned = Number(totals.rows[0]?.[totals.cols.indexOf("Unassigned")]);
  if (unassigned !== left.length) broken.push(`Unassigned ${unassigned} but ${left.length} rows`);
  return broken;
}

describe("plan sheets written for random valid workbooks keep every rule (fast-check)", () => {
  it("to the end of the move budget", async () => {
    await fc.assert(
      fc.asyncProperty(dayArb, async (day) => {
        const values = await planSheetOf(day, (p) => solve(p, { seed: day.seed, budget: { moves: 4000 } }));
        expect(recheck(day, values)).toEqual([]);
      }),
      { numRuns: 12 },
    );
  }, 240_000);

  it("cancelled at a random moment", async () => {
    await fc.assert(
      fc.asyncProperty(dayArb, fc.integer({ min: 0, max: 3000 }), async (day, after) => {
        const values = await planSheetOf(day, (p) => {
          const solver = createSolver(p, { seed: day.seed, budget: { moves: 1_000_000 } });
          solver.step(after);
          return solver.result();
        });
        expect(recheck(day, values)).toEqual([]);
      }),
      { numRuns: 10 },
    );
  }, 240_000);

  it("the same seed and move budget give the identical plan sheet", async () => {
    await fc.assert(
      fc.asyncProperty(dayArb, async (day) => {
        const run = (p: Parameters<typeof solve>[0]) => solve(p, { seed: day.seed, budget: { moves: 3000 } });
        expect(await planSheetOf(day, run)).toEqual(await planSheetOf(day, run));
      }),
      { numRuns: 5 },
    );
  }, 240_000);
});
