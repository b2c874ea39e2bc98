import { describe, expect, it } from "vitest";
import { addressTargets, applyGeocodes, type GeocodeCandidate } from "../../src/geocode/index.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import { doubtfulPlaces } from "../../src/taskpane/doubtfulPlaces.js";

// Invented addresses and points; the qualities follow rateMatch's rules (a street-level match is
// approximate, two candidates of similar confidence far apart are ambiguous).
const sheet = (name: string, values: unknown[][]) => ({ sheet: name, row: 0, col: 0, values });
const at = (lat: number, lon: number, label: string, extra: object = {}): GeocodeCandidate => ({ lat, lon, label, ...extra });

const STOPS = sheet("Stops", [
  ["Round for Friday"],
  ["Stop", "Name", "Street", "Town", "Demand"],
  ["S1", "Ash", "1 Kiln Lane", "Brickfield", 1],
  ["S2", "Birch", "Clay Street", "Brickfield", 1],
  ["S3", "Cedar", "Market Square", "", 1],
  ["S4", "Dogwood", "Nowhere Road 9", "Brickfield", 1],
]);
const FLEET = sheet("Fleet", [
  ["Vehicle", "Capacity", "Depot", "End depot"],
  ["Van A", 10, "Depot Road, Brickfield", "52.09, 5.12"],
]);
const ANSWERS = new Map<string, GeocodeCandidate[]>([
  ["1 Kiln Lane, Brickfield", [at(52.0903, 5.1201, "1 Kiln Lane, Brickfield", { precision: "house" })]],
  ["Clay Street, Brickfield", [at(52.087, 5.125, "Clay Street, Brickfield", { precision: "street" })]],
  [
    "Market Square",
    [
      at(52.089, 5.121, "Market Square, Brickfield", { confidence: 0.8 }),
      at(52.35, 5.68, "Market Square, Far Kilnsey", { confidence: 0.78 }),
    ],
  ],
  ["Nowhere Road 9, Brickfield", []],
  ["Depot Road, Brickfield", [at(52.08, 5.11, "Depot Road, Brickfield", { precision: "street" })]],
]);

describe("doubtful places for the route map", () => {
  it("marks approximate and ambiguous stops and depots by where they are, not the found or the not-found ones", () => {
    const tables = { stops: STOPS, fleet: FLEET };
    const { targets, typed } = addressTargets(tables);
    const located = applyGeocodes(tables, targets, typed, ANSWERS);
    const read = readProblem({ stops: located.stops, fleet: located.fleet!, unlocated: located.unlocated });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    const places = doubtfulPlaces(read.problem, read.stopRows, located.review);
    expect(places.map((p) => [p.name, p.cell, p.match.split(":")[0]])).toEqual([
      // Hand-worked: 0.261° of latitude (29.0 km) and 0.559° of longitude at 52.2° N (38.2 km): about 48 km.
      ["Cedar", "Stops!C5", "ambiguous (2 candidates up to 48 km apart)"],
      ["Birch", "Stops!C4", "approximate (matched a street, not a house)"],
      ["Depot (Van A)", "Fleet!C2", "approximate (matched a street, not a house)"],
    ]);
    // Each entry points at the place the map draws: the stop's own location, the depot's.
    const cedar = read.problem.stops.find((s) => s.id === "S3")!;
    expect(places[0]!.location).toBe(cedar.location);
    expect(read.problem.locations[places[2]!.location]).toMatchObject({ lat: 52.08, lon: 5.11 });
    expect(read.problem.vehicles[0]!.startLocation).toBe(places[2]!.location);
  });

  it("is empty without a geocoding review", () => {
    const read = readProblem({
      stops: sheet("Stops", [
        ["Stop", "Latitude", "Longitude"],
        ["S1", 52.09, 5.12],
      ]),
      fleet: sheet("Fleet", [
        ["Vehicle", "Capacity", "Start latitude", "Start longitude"],
        ["Van", 5, 52.08, 5.11],
      ]),
    });
    expect(read.ok).toBe(true);
    if (read.ok) expect(doubtfulPlaces(read.problem, read.stopRows, [])).toEqual([]);
  });
});
