import { describe, expect, it } from "vitest";
import { solve } from "../../src/core/index.js";
import { addressTargets, applyGeocodes, matchText, type GeocodeCandidate } from "../../src/geocode/index.js";
import { joinAddress } from "../../src/sheets/addressRows.js";
import { readProblem } from "../../src/sheets/readProblem.js";

const sheet = (name: string, values: unknown[][]) => ({ sheet: name, row: 0, col: 0, values });
const point = (lat: number, lon: number, label: string, extra: object = {}): GeocodeCandidate => ({ lat, lon, label, ...extra });

// Invented addresses; coordinates invented too.
const STOPS = sheet("Stops", [
  ["Deliveries for Tuesday"],
  ["Stop", "Street", "Postcode", "Town", "Latitude", "Longitude", "Demand"],
  ["S1", "1 Kiln Lane", "4021", "Brickfield", "", "", 3],
  ["S2", "Clay Street", "", "Brickfield", "", "", 2],
  ["S3", "Nowhere Road 9", "", "Brickfield", "", "", 1],
  ["S4", "7 Kiln Lane", "4021", "Brickfield", 52.2, 5.3, 1],
]);
const FLEET = sheet("Fleet", [
  ["Vehicle", "Capacity", "Depot address", "Town", "Shift start", "Shift end"],
  ["Van A", 10, "1 Depot Yard", "Brickfield", "08:00", "17:00"],
]);
const ANSWERS = new Map<string, GeocodeCandidate[]>([
  ["1 Kiln Lane, 4021 Brickfield, Kilnland", [point(52.0903, 5.1201, "1 Kiln Lane, Brickfield", { precision: "house" })]],
  ["Clay Street, Brickfield, Kilnland", [point(52.087, 5.125, "Clay Street, Brickfield", { precision: "street" })]],
  ["Nowhere Road 9, Brickfield, Kilnland", []],
  ["1 Depot Yard, Brickfield, Kilnland", [point(52.08, 5.11, "1 Depot Yard, Brickfield")]],
]);

describe("address parts, typed coordinates and not-found stops", () => {
  it("joins address parts in the usual order: street, postcode and town, country", () => {
    expect(joinAddress({ street: "12 Glaze Street", postcode: "4021", town: "Potterton", country: "Kilnland" })).toBe(
      "12 Glaze Street, 4021 Potterton, Kilnland",
    );
    expect(joinAddress({ town: "Potterton" }, "Kilnland")).toBe("Potterton, Kilnland");
    // The default country is not added twice, nor over the row's own country.
    expect(joinAddress({ address: "1 Kiln Lane, Brickfield, Kilnland" }, "Kilnland")).toBe("1 Kiln Lane, Brickfield, Kilnland");
    expect(joinAddress({ street: "1 Kiln Lane", country: "Elsewhere" }, "Kilnland")).toBe("1 Kiln Lane, Elsewhere");
  });

  it("asks only for rows without typed coordinates (typed coordinates win), depots included", () => {
    const { targets, typed } = addressTargets({ stops: STOPS, fleet: FLEET }, "Kilnland");
    expect(targets.map((t) => [t.cell, t.address])).toEqual([
      ["Stops!B3", "1 Kiln Lane, 4021 Brickfield, Kilnland"],
      ["Stops!B4", "Clay Street, Brickfield, Kilnland"],
      ["Stops!B5", "Nowhere Road 9, Brickfield, Kilnland"],
      ["Fleet!C2", "1 Depot Yard, Brickfield, Kilnland"],
    ]);
    expect(typed).toEqual([{ lat: 52.2, lon: 5.3 }]);
  });

  it("fills coordinates in memory, lists the doubtful first, and plans the not-found stop as unassigned with its reason", () => {
    const { targets, typed } = addressTargets({ stops: STOPS, fleet: FLEET }, "Kilnland");
    const located = applyGeocodes({ stops: STOPS, fleet: FLEET }, targets, typed, ANSWERS);
    expect(located.review.map((r) => [r.cell, r.quality])).toEqual([
      ["Stops!B5", "not-found"],
      ["Stops!B4", "approximate"],
      ["Stops!B3", "found"],
      ["Fleet!C2", "found"],
    ]);
    expect(matchText(located.review[1]!)).toBe("approximate (matched a street, not a house): Clay Street, Brickfield");
    expect(located.stops.values[2]!.slice(4, 6)).toEqual([52.0903, 5.1201]);
    // The user's typed point stays.
    expect(located.stops.values[5]!.slice(4, 6)).toEqual([52.2, 5.3]);
    // The fleet had no coordinate columns: two are appended in memory.
    expect(located.fleet!.values[0]!.slice(6)).toEqual(["Start latitude", "Start longitude"]);
    expect(located.fleet!.values[1]!.slice(6)).toEqual([52.08, 5.11]);
    // The input reads are not changed.
    expect(STOPS.values[2]![4]).toBe("");

    const read = readProblem({ stops: located.stops, fleet: located.fleet!, unlocated: located.unlocated });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    expect(read.warnings.map((w) => w.message)).toContain(
      'Stops!B5: stop "S3" will be left unassigned: its address "Nowhere Road 9, Brickfield, Kilnland" was not found by the geocoding service; correct the address or type its Latitude and Longitude.',
    );
    const { plan } = solve(read.problem, { seed: 1, budget: { moves: 2000 } });
    const s3 = read.problem.stops.findIndex((s) => s.id === "S3");
    expect(plan.unassigned).toEqual([
      { stop: s3, reason: 'its address "Nowhere Road 9, Brickfield, Kilnland" was not found by the geocoding service' },
    ]);
    expect(plan.routes.flatMap((r) => r.visits.map((v) => read.problem.stops[v.stop]!.id)).sort()).toEqual(["S1", "S2", "S4"]);
  });

  it("a depot address not found is an issue at its cell", () => {
    const answers = new Map(ANSWERS);
    answers.set("1 Depot Yard, Brickfield, Kilnland", []);
    const { targets, typed } = addressTargets({ stops: STOPS, fleet: FLEET }, "Kilnland");
    const located = applyGeocodes({ stops: STOPS, fleet: FLEET }, targets, typed, answers);
    expect(located.issues.map((i) => i.message)).toEqual([
      'Fleet!C2: the depot address "1 Depot Yard, Brickfield, Kilnland" was not found by the geocoding service; correct the address or type the Start latitude and Start longitude.',
    ]);
  });

  it("without a geocoder, a row with an address but no coordinates says how to add them", () => {
    const read = readProblem({ stops: STOPS, fleet: FLEET });
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.issues.find((i) => i.cell === "E3")?.message).toMatch(
      /has an address but no coordinates.*set up a geocoding service \(--geocoder/,
    );
  });
});
