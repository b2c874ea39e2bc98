/**
 * The workbook for the ten-minute smoke test in real Excel (docs/excel-smoke-test.md): the demo's
 * round with formula-like and apostrophe names, a 2 000-stop day with long notes for the payload
 * limits, and a sheet of town names to turn into Geography cells by hand. Invented data, built
 * from the demo scenario's generator; rebuilt byte for byte from its seeds.
 */
import { writeFile } from "node:fs/promises";
import { fileURLToPath } from "node:url";
import { CAUTION_TEXT } from "../src/sheets/caution.js";
import type { SheetGrid } from "../src/sheets/grid.js";
import { ExcelJsWorkbook } from "../src/workbook/exceljs/ExcelJsWorkbook.js";
import { DEMO_DATE, fleetGrid, settingsGrid, stopsGrid } from "./buildDemo.js";
import { ovenbirdScenario, type DemoStop, type DemoVehicle } from "./ovenbirdScenario.js";

/** Names that a careless write would turn into a formula or lose a character of (step 4). */
export const TRICKY_NAMES = ["=SUM(1,2)", "-north gate", "'s-Hertogenbosch", "+ extra rolls", "@counter"] as const;
/** Stops of the large day (step 5). */
export const LARGE_DAY_STOPS = 2000;
/** Towns for the Geography step (step 6): places Excel's Geography type knows (from memory). */
export const GEOGRAPHY_TOWNS = ["York", "Leeds", "Harrogate", "Selby", "Tadcaster", "Malton", "Thirsk", "Ripon", "Wetherby", "Pocklington"];

/**
 * Build `kiln-smoke.xlsx`.
 *
 * @returns the .xlsx bytes
 * @example const bytes = await buildSmokeWorkbook(); // Stops, Fleet, Settings, Stops 2000, Fleet 2000, Towns, README
 */
export async function buildSmokeWorkbook(): Promise<Uint8Array> {
  const { stops, fleet } = ovenbirdScenario("ovenbird-1");
  const tricky = stops.map((s, i) => (i < TRICKY_NAMES.length ? { ...s, name: TRICKY_NAMES[i]! } : s));
  const book = ExcelJsWorkbook.fromGrids([]);
  await book.addSheet("Stops", stopsGrid(tricky));
  await book.addSheet("Fleet", fleetGrid(fleet));
  await book.addSheet("Settings", settingsGrid());
  await book.addSheet("Stops 2000", withNotes(stopsGrid(largeDay())));
  await book.addSheet("Fleet 2000", fleetGrid(largeFleet(fleet)));
  await book.addSheet("Towns", townsGrid(stops));
  await book.addSheet("README", readmeGrid());
  book.setDocumentDates(DEMO_DATE);
  return book.toBuffer();
}

/** 2 000 stops from seventeen seeds of the demo generator, renumbered so ids and names are unique. */
function largeDay(): DemoStop[] {
  const out: DemoStop[] = [];
  for (let k = 1; out.length < LARGE_DAY_STOPS; k++) {
    for (const s of ovenbirdScenario(`smoke-${k}`, 120).stops) {
      if (out.length === LARGE_DAY_STOPS) break;
      const n = out.length + 1;
      // Each copy of the generator is moved a little, so no two stops share a point; a high
      // Priority makes serving worth it while letting a day too big for the vans go ahead.
      const shift = 0.0007 * k;
      out.push({
        ...s,
        id: `L${String(n).padStart(4, "0")}`,
        name: `${s.name} ${n}`,
        lat: s.lat + shift,
        lon: s.lon - shift,
        priority: 500,
      });
    }
  }
  return out;
}

/** Forty vans: the demo's five, eight of each. */
function largeFleet(fleet: readonly DemoVehicle[]): DemoVehicle[] {
  return fleet.flatMap((v) => Array.from({ length: 8 }, (_, i) => ({ ...v, id: `${v.id} ${i + 1}` })));
}

/** A note of about 200 characters per stop, so the plan sheet's write crosses the 2 MB split. */
function withNotes(grid: SheetGrid): SheetGrid {
  const note = (r: number): string =>
    `Ring the side bell, leave crates under the awning, take the empties from the blue cage, note any shortage on the delivery slip and tell the office before ten; row ${r}.`.padEnd(
      200,
      ".",
    );
  return {
    ...grid,
    values: grid.values.map((row, r) => [...row, r === 0 ? "Notes" : note(r)]),
    ...(grid.numberFormats ? { numberFormats: grid.numberFormats.map((row) => [...row, "@"]) } : {}),
    ...(grid.columnWidths ? { columnWidths: [...grid.columnWidths, 60] } : {}),
  };
}

/** The first ten demo stops with a town name instead of coordinates (step 6 converts it). */
function townsGrid(stops: readonly DemoStop[]): SheetGrid {
  const values = [
    ["Stop", "Name", "Town", "Latitude", "Longitude", "Demand kg"],
    ...stops.slice(0, GEOGRAPHY_TOWNS.length).map((s, i) => [s.id, s.name, GEOGRAPHY_TOWNS[i]!, null, null, s.demandKg]),
  ];
  return { values, columnWidths: [7, 36, 16, 11, 11, 10], boldRows: [0], freezeRows: 1 };
}

function readmeGrid(): SheetGrid {
  const lines = [
    "Kiln smoke test workbook (invented data): see docs/excel-smoke-test.md",
    "",
    CAUTION_TEXT,
    "",
    "Stops, Fleet, Settings: the demo round; the first five stop names look like formulas or start with an apostrophe (step 4).",
    "Stops 2000, Fleet 2000: a large day with a 200-character note per stop, for the payload limits (step 5).",
    "Towns: turn the Town column into Geography cells (Data > Geography), then use the selection (step 6).",
  ];
  return { values: lines.map((l) => [l]), columnWidths: [120], boldRows: [0, 2] };
}

// Run as a script: write the workbook beside this file.
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const target = fileURLToPath(new URL("./kiln-smoke.xlsx", import.meta.url));
  await writeFile(target, await buildSmokeWorkbook());
  process.stdout.write(`wrote ${target}\n`);
}
