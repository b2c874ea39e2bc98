/**
 * An invented delivery day read from sheet grids and solved with a fixed seed, for the export
 * tests (not a test file itself). Its text is chosen to stress the formats: XML specials
 * (& < > " '), commas, doubled quotes and line breaks (RFC 4180), accents and a non-BMP
 * character, formula-like text, a carriage return, two load dimensions, a stop without an
 * address, vehicles that share a depot and one with its own, and western longitudes.
 */
import { solve, type Plan } from "../../src/core/index.js";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });

/** The stops: the texts the round trips must keep exactly. */
export const STOP_TEXTS = {
  name: 'Müller & Söhne <"Bakery">',
  address: "12 Quai de l'Horloge, 2nd floor\nentrance B",
  note: 'Ring twice, "then" wait,\r\nleave at door',
  formula: '=HYPERLINK("x")',
  astral: "Café 🚚",
};

const STOPS = sheet("Stops", [
  ["Stop", "Name", "Address", "Latitude", "Longitude", "Demand kg", "Demand crates", "Earliest", "Latest", "Service min", "Phone", "Note"],
  ["A1", STOP_TEXTS.name, STOP_TEXTS.address, 48.8566, 2.3522, 120, 6, "08:00", "10:00", 10, "+33 1 00 00 00 01", STOP_TEXTS.note],
  ["A2", STOP_TEXTS.formula, "3 Rue Neuve", 48.8606, 2.3376, 80, 4, "", "", 5, "-", ""],
  ["A3", STOP_TEXTS.astral, "", 48.8738, 2.295, 60, 3, "09:00", "", 5, "", "back door"],
  ["A4", "Quay 4", "Dock, gate 2", 48.8462, 2.3464, 40, 2, "", "12:00", 5, "", ""],
  ["A5", "Market hall", "1 Place du Marché", 48.8529, 2.3499, 90, 5, "10:00", "14:00", 10, "", 'it\'s, "fine"'],
  ["A6", "West depot shop", "Route 9", 48.8049, 2.1204, 70, 3, "", "", 5, "", ""],
  ["A7", "Near zero", "", 48.80000001, 2.2000001, 10, 1, "", "", 5, "", ""],
]);

const FLEET = sheet("Fleet", [
  ["Vehicle", "Driver", "Capacity kg", "Capacity crates", "Start latitude", "Start longitude", "Shift start", "Shift end"],
  ["Van 1", "Ana", 300, 15, 48.8, 2.4, "07:00", "17:00"],
  ["Van 2", "", 300, 15, 48.8, 2.4, "07:00", "17:00"],
  ["Truck <West>", "Bo", 300, 15, 48.81, 2.1, "07:30", "17:00"],
]);

/** Read the invented tables and plan them (seeded, so every run of the tests sees the same plan). */
export function exportScenario() {
  const read = readProblem({ stops: STOPS, fleet: FLEET });
  if (!read.ok) throw new Error(`exportScenario: the invented tables do not read: ${JSON.stringify(read.issues)}`);
  const plan: Plan = solve(read.problem, { seed: 7, budget: { moves: 20_000 } }).plan;
  return { read, problem: read.problem, plan, stopRows: read.stopRows, extraHeaders: read.extraHeaders };
}
