import { writeFile } from "node:fs/promises";
import { fileURLToPath } from "node:url";
import { CAUTION_TEXT } from "../src/sheets/caution.js";
import type { CellValue, SheetGrid } from "../src/sheets/grid.js";
import { ExcelJsWorkbook } from "../src/workbook/exceljs/ExcelJsWorkbook.js";
import { ovenbirdScenario, type DemoStop, type DemoVehicle } from "./ovenbirdScenario.js";

/** Fixed created/modified date of the demo file, so a rebuild gives the same workbook. */
export const DEMO_DATE = new Date(Date.UTC(2026, 0, 5, 18, 0, 0));

export const STOP_HEADERS = [
  "Stop",
  "Name",
  "Address",
  "Latitude",
  "Longitude",
  "Demand kg",
  "Demand crates",
  "Earliest",
  "Latest",
  "Earliest 2",
  "Latest 2",
  "Service min",
  "Priority",
  "Phone",
] as const;
export const FLEET_HEADERS = [
  "Vehicle",
  "Count",
  "Capacity kg",
  "Capacity crates",
  "Start latitude",
  "Start longitude",
  "End latitude",
  "End longitude",
  "Shift start",
  "Shift end",
  "Fixed cost",
  "Cost per km",
  "Cost per hour",
  "Speed km/h",
  "Max stops",
] as const;

/**
 * Build the demo workbook `kiln-demo.xlsx` in memory: Stops, Fleet, Settings and README sheets
 * of the invented Ovenbird Bakery dawn round (see `ovenbirdScenario`).
 *
 * @param seed - generator seed (default "ovenbird-1", the committed file)
 * @returns the .xlsx bytes
 * @example const bytes = await buildDemoWorkbook(); // 84 stops, 5 vans
 */
export async function buildDemoWorkbook(seed = "ovenbird-1"): Promise<Uint8Array> {
  const { stops, fleet } = ovenbirdScenario(seed);
  const book = ExcelJsWorkbook.fromGrids([]);
  await book.addSheet("Stops", stopsGrid(stops));
  await book.addSheet("Fleet", fleetGrid(fleet));
  await book.addSheet("Settings", settingsGrid());
  await book.addSheet("README", readmeGrid());
  book.setDocumentDates(DEMO_DATE);
  return book.toBuffer();
}

const day = (min: number): number => min / 1440;

export function stopsGrid(stops: readonly DemoStop[]): SheetGrid {
  const values: CellValue[][] = [[...STOP_HEADERS]];
  const formats: (string | null)[][] = [STOP_HEADERS.map(() => null)];
  for (const s of stops) {
    const [w1, w2] = s.windows;
    values.push([
      s.id,
      s.name,
      s.address,
      s.lat,
      s.lon,
      s.demandKg,
      s.crates,
      day(w1![0]),
      day(w1![1]),
      w2 ? day(w2[0]) : null,
      w2 ? day(w2[1]) : null,
      s.serviceMin,
      s.priority ?? null,
      s.phone,
    ]);
    formats.push([null, null, null, "0.00000", "0.00000", "0", "0", "hh:mm", "hh:mm", "hh:mm", "hh:mm", "0", "0", "@"]);
  }
  return {
    values,
    numberFormats: formats,
    columnWidths: [7, 36, 34, 11, 11, 10, 13, 9, 9, 10, 9, 11, 9, 14],
    freezeRows: 1,
    boldRows: [0],
  };
}

export function fleetGrid(fleet: readonly DemoVehicle[]): SheetGrid {
  const values: CellValue[][] = [[...FLEET_HEADERS]];
  const formats: (string | null)[][] = [FLEET_HEADERS.map(() => null)];
  for (const v of fleet) {
    values.push([
      v.id,
      1,
      v.capacityKg,
      v.capacityCrates,
      v.start[0],
      v.start[1],
      v.end[0],
      v.end[1],
      day(v.shiftStartMin),
      day(v.shiftEndMin),
      v.fixedCost,
      v.costPerKm,
      v.costPerHour,
      v.speedKmh,
      v.maxStops ?? null,
    ]);
    formats.push([null, "0", "0", "0", "0.00000", "0.00000", "0.00000", "0.00000", "hh:mm", "hh:mm", "0.00", "0.00", "0.00", "0", "0"]);
  }
  return {
    values,
    numberFormats: formats,
    columnWidths: [18, 7, 12, 15, 14, 15, 13, 14, 11, 10, 10, 12, 13, 11, 10],
    freezeRows: 1,
    boldRows: [0],
  };
}

export function settingsGrid(): SheetGrid {
  return {
    values: [
      ["Setting", "Value", "Note"],
      ["Detour factor", 1.3, "road km over straight-line km (a common rule of thumb)"],
      ["Speed km/h", 40, "for vans that give no speed"],
      ["Service min", 6, "for stops that give no service minutes"],
      ["Windows", "hard", "soft = allow late arrivals at the late cost"],
      ["Late cost per min", 2, "used only when windows are soft"],
      ["Acceptance rule", "metropolis", "metropolis or logistic"],
      ["Cooling schedule", "time", "geometric, linear, lundy-mees or time"],
      ["Seed", 7, "same seed and move budget give the same plan"],
      ["Seconds", 10, "run length when no move budget is given"],
    ],
    columnWidths: [20, 12, 60],
    boldRows: [0],
    freezeRows: 1,
  };
}

function readmeGrid(): SheetGrid {
  const lines = [
    "Ovenbird Bakery: dawn bread round around York (invented demo data)",
    "",
    CAUTION_TEXT,
    "",
    "Stops: one row per delivery. Latitude/Longitude in decimal degrees. Demand kg and Demand crates are the two load dimensions.",
    "Earliest/Latest bound the start of service; Earliest 2/Latest 2 give a second window (e.g. the hospital kitchen's second drop).",
    "Service min is the time at the door. Priority is the cost of leaving the stop unserved; empty means it must be served.",
    "Phone and other columns the planner does not know are carried through to the plan sheets.",
    "Fleet: one row per van. Capacity per load dimension, start and end depot, shift, costs, speed and an optional stop limit.",
    "Van 5 starts and ends at the Tadcaster depot; the others at the bakery.",
    "Settings: defaults for a run; command-line options and the pane override them.",
    "Try: npx kiln plan demo/kiln-demo.xlsx --moves 1000000 (a few seconds), then open demo/kiln-demo.plan.xlsx.",
    "All business names, addresses and phone numbers are invented (phones use the 01632 960xxx drama range).",
  ];
  return { values: lines.map((l) => [l]), columnWidths: [120], boldRows: [0, 2] };
}

// Run as a script: write the workbook beside this file.
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const target = fileURLToPath(new URL("./kiln-demo.xlsx", import.meta.url));
  await writeFile(target, await buildDemoWorkbook());
  process.stdout.write(`wrote ${target}\n`);
}
