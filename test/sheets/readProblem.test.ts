// Small invented tables that check the parsing rules; the outside references are named beside
// each check (ECMA-376 serials, common practice of the trade).
import { describe, expect, it } from "vitest";
import { greatCircleKm } from "../../src/core/geo/greatCircleKm.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import type { SheetRead } from "../../src/sheets/grid.js";

const sheet = (name: string, values: unknown[][], row = 0, col = 0): SheetRead => ({ sheet: name, row, col, values });

const FLEET = sheet("Fleet", [
  ["Vehicle", "Count", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"],
  ["Van A", 2, 100, 45.75, 4.85, "07:00", "17:00"],
]);

function stopsOf(rows: unknown[][], header = ["Stop", "Name", "Latitude", "Longitude", "Demand", "Earliest", "Latest"]): SheetRead {
  return sheet("Stops", [header, ...rows]);
}

describe("readProblem: a clean table", () => {
  it("finds the header below blank rows and a title, matches synonyms and carries unknown columns through", () => {
    const stops = sheet(
      "Stops",
      [
        [],
        ["Deliveries for Tuesday"],
        ["", "", "", "", "", "", "", ""],
        ["stop_id", "Customer", "LAT", "lng", "Qty", "Ready", "Due", "Dwell time", "Phone"],
        ["S1", "Bakery", 45.76, 4.83, 10, 0.354166666, "10:00", 7, "+33 4 00 00 00"],
        ["S2", "Florist", "45°45'36\"N", "4°50'E", "5", "1:30 PM", "2:30 PM", "", "n/a"],
      ],
      4,
      1,
    );
    const r = readProblem({ stops, fleet: FLEET });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const p = r.problem;
    expect(p.stops.map((s) => s.id)).toEqual(["S1", "S2"]);
    expect(p.stops[0]!.windows).toEqual([{ earliestMin: 510, latestMin: 600 }]);
    expect(p.stops[0]!.serviceMin).toBe(7);
    expect(p.stops[1]!.serviceMin).toBe(5); // PLAN_SETTINGS_DEFAULTS.serviceMin
    expect(p.stops[1]!.windows).toEqual([{ earliestMin: 810, latestMin: 870 }]);
    expect(p.locations[p.stops[1]!.location]!.lat).toBeCloseTo(45.76, 10);
    expect(p.loadDimensions).toEqual(["load"]);
    expect(p.stops.map((s) => s.demand)).toEqual([[10], [5]]);
    expect(r.extraHeaders).toEqual(["Phone"]);
    // The header sits on range row 3 (0-based) of a range starting at B5: sheet row 8, data from row 9.
    expect(r.stopRows).toEqual([
      { stop: 0, sheetRow: 9, extra: { Phone: "+33 4 00 00 00" } },
      { stop: 1, sheetRow: 10, extra: { Phone: "n/a" } },
    ]);
    expect(r.stopColumns.find((c) => c.field === "latitude")).toEqual({ header: "LAT", field: "latitude", column: "D" });
    expect(r.stopColumns.find((c) => c.field === "extra")?.column).toBe("J");
  });

  it("expands Count to Van A 1, Van A 2, puts one depot first and builds the great-circle matrix with the detour factor", () => {
    const r = readProblem({ stops: stopsOf([["S1", "A", 45.76, 4.83, 1, "", ""]]), fleet: FLEET });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const p = r.problem;
    expect(p.vehicles.map((v) => v.id)).toEqual(["Van A 1", "Van A 2"]);
    expect(p.locations.length).toBe(2);
    // The fleet's only depot is simply "Depot".
    expect(p.locations[0]!.name).toBe("Depot");
    expect(p.vehicles.every((v) => v.startLocation === 0 && v.endLocation === 0)).toBe(true);
    expect(p.vehicles[0]!.shiftStartMin).toBe(420);
    expect(p.vehicles[0]!.speedKmh).toBe(40);
    // No window given: open all day (the solver's shifts bound it).
    expect(p.stops[0]!.windows).toEqual([{ earliestMin: 0, latestMin: Infinity }]);
    const km = greatCircleKm({ lat: 45.75, lon: 4.85 }, { lat: 45.76, lon: 4.83 }) * 1.3; // common practice: detour 1.3
    expect(p.matrix.distanceKm[1]).toBeCloseTo(km, 9);
    expect(p.matrix.travelMin[1]).toBeCloseTo((km / 40) * 60, 9);
    expect(p.matrix.userSupplied).toBe(false);
  });

  it("keeps the name of a Count of 1 or blank, and sends a vehicle back to its start when the end columns are empty", () => {
    const fleet = sheet("Fleet", [
      ["Truck", "Number", "Capacity kg", "Depot lat", "Depot lng", "End lat", "End lon", "From", "To", "Speed km/h"],
      ["North", 1, 500, 46, 5, "", "", "22:00", "06:00", 60],
      ["South", "", 800, 45, 4, 45.5, 4.5, "", "", ""],
    ]);
    const stops = stopsOf([["S1", "A", 45.76, 4.83, 1]], ["Stop", "Name", "Lat", "Lon", "Demand kg"]);
    const r = readProblem({ stops, fleet });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const [north, south] = r.problem.vehicles;
    expect(north!.id).toBe("North");
    expect(north!.startLocation).toBe(north!.endLocation);
    // A shift that ends before it starts rolls over midnight (end + 1440).
    expect([north!.shiftStartMin, north!.shiftEndMin]).toEqual([1320, 1800]);
    expect(north!.speedKmh).toBe(60);
    expect(south!.id).toBe("South");
    expect([south!.shiftStartMin, south!.shiftEndMin]).toEqual([0, 1440]);
    expect(south!.endLocation).not.toBe(south!.startLocation);
    expect(r.problem.locations.length).toBe(4);
    expect(r.problem.loadDimensions).toEqual(["kg"]);
  });

  it("reads several windows: one cell with a list, repeated Earliest/Latest pairs, overlap merged, midnight rolled over", () => {
    const stops = stopsOf(
      [
        ["S1", "A", 45.76, 4.83, 1, "14:00", "16:00", "08:00", "10:00", ""],
        ["S2", "B", 45.76, 4.83, 1, "", "", "", "", "08:00-10:00; 09:30-11:00, 22:00-02:00"],
        ["S3", "C", 45.76, 4.83, 1, "08:00-10:00; 14:00-16:00", "", "", "", ""],
      ],
      ["Stop", "Name", "Latitude", "Longitude", "Demand", "Earliest", "Latest", "Earliest 2", "Latest 2", "Windows"],
    );
    const r = readProblem({ stops, fleet: FLEET, settings: sheet("Settings", [["Windows", "soft"]]) });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    const [s1, s2, s3] = r.problem.stops;
    expect(s1!.windows).toEqual([
      { earliestMin: 480, latestMin: 600 },
      { earliestMin: 840, latestMin: 960 },
    ]);
    expect(s2!.windows).toEqual([
      { earliestMin: 480, latestMin: 660 },
      { earliestMin: 1320, latestMin: 1560 },
    ]);
    expect(s3!.windows).toEqual([
      { earliestMin: 480, latestMin: 600 },
      { earliestMin: 840, latestMin: 960 },
    ]);
  });

  it("pairs Demand kg / Demand crates with Capacity kg / Capacity crates and reads Priority and Features", () => {
    const stops = stopsOf(
      [
        ["S1", "A", 45.76, 4.83, 12, 3, 250, "Fridge"],
        ["S2", "B", 45.7, 4.8, 1, 0, "", ""],
      ],
      ["Stop", "Name", "Lat", "Lon", "Demand kg", "Demand crates", "Priority", "Features"],
    );
    const fleet = sheet("Fleet", [
      ["Van", "Capacity crates", "Capacity kg", "Lat", "Lon", "Features"],
      ["A", 10, 500, 45.75, 4.85, "fridge, tail lift"],
    ]);
    const r = readProblem({ stops, fleet });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.loadDimensions).toEqual(["kg", "crates"]);
    expect(r.problem.stops[0]!.demand).toEqual([12, 3]);
    expect(r.problem.vehicles[0]!.capacity).toEqual([500, 10]);
    expect(r.problem.stops[0]!.unservedCost).toBe(250);
    expect(r.problem.stops[1]!.unservedCost).toBeUndefined();
    expect(r.problem.stops[0]!.requiredFeatures).toEqual(["fridge"]);
    expect(r.problem.vehicles[0]!.features).toEqual(["fridge", "tail lift"]);
    expect(r.warnings).toEqual([]);
  });

  it("reads one Coordinates column with lat, lon and ids from row numbers when there is no Stop column", () => {
    const stops = sheet("Stops", [
      ["Name", "Coordinates"],
      ["A", "45.76, 4.83"],
      ["B", `45°45'36"N, 4°50'W`],
    ]);
    const r = readProblem({ stops, fleet: FLEET });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.stops.map((s) => s.id)).toEqual(["2", "3"]);
    expect(r.problem.locations[r.problem.stops[1]!.location]!.lon).toBeCloseTo(-4.8333, 4);
  });

  it("applies overrides over the Settings sheet over the defaults", () => {
    const settings = sheet("Settings", [
      ["Setting", "Value"],
      ["Detour factor", 1.5],
      ["Speed (km/h)", 30],
      ["Service min", 3],
      ["Late cost per min", 2],
      ["Acceptance", "Logistic"],
      ["Schedule", "Geometric"],
      ["Alpha", 0.9],
      ["Seed", 42],
      ["Moves", 5000],
      ["Objective", "hierarchical"],
    ]);
    const r = readProblem({ stops: stopsOf([["S1", "A", 45.76, 4.83, 1]]), fleet: FLEET, settings }, { seed: 7 });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.settings.detourFactor).toBe(1.5);
    expect(r.settings.speedKmh).toBe(30);
    expect(r.settings.rule).toBe("logistic");
    expect(r.settings.cooling).toEqual({ kind: "geometric", alpha: 0.9 });
    expect(r.settings.seed).toBe(7);
    expect(r.settings.moves).toBe(5000);
    expect(r.problem.objective).toBe("hierarchical");
    expect(r.problem.referenceSpeedKmh).toBe(30);
    expect(r.problem.vehicles[0]!.speedKmh).toBe(30);
    expect(r.problem.stops[0]!.serviceMin).toBe(3);
    expect(r.problem.lateCostPerMin).toBe(2);
  });

  it("replaces the great-circle matrix by a matrix sheet given in any order", () => {
    const matrix = sheet("Km", [
      ["km", "s2", "Depot", "S1"],
      ["S1", 3, 5, ""],
      ["Depot", 4, 0, 6],
      ["S2", 0, 7, 8],
    ]);
    const stops = stopsOf([
      ["S1", "A", 45.76, 4.83, 1],
      ["S2", "B", 45.7, 4.8, 1],
    ]);
    const r = readProblem({ stops, fleet: FLEET, matrix });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(Array.from(r.problem.matrix.distanceKm)).toEqual([0, 6, 4, 5, 0, 3, 7, 8, 0]);
    expect(r.problem.matrix.userSupplied).toBe(true);
  });
});
