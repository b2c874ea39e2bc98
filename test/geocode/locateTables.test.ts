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

describe("depots given as addresses: start and end", () => {
  // Invented depots: a bakery that loads at one yard and parks the vans at another.
  const DEPOTS = sheet("Vans", [
    ["Vehicle", "Capacity", "Depot", "End depot", "Shift start", "Shift end"],
    ["Van A", 10, "1 Depot Yard, Brickfield", "9 Saggar Row, Glazebury", "08:00", "17:00"],
    ["Van B", 10, "52.08, 5.11", "", "08:00", "17:00"],
    ["Van C", 10, "1 Depot Yard, Brickfield", "52.0648, 5.0755", "08:00", "17:00"],
  ]);
  const ENDS = sheet("Fleet", [
    ["Vehicle", "Capacity", "Depot address", "End address", "Shift start", "Shift end"],
    ["Van A", 10, "1 Depot Yard, Brickfield", "9 Saggar Row, Glazebury", "08:00", "17:00"],
    ["Van B", 10, "1 Depot Yard, Brickfield", "", "08:00", "17:00"],
  ]);
  const answers = new Map<string, GeocodeCandidate[]>([
    ...ANSWERS,
    ["1 Depot Yard, Brickfield", [point(52.08, 5.11, "1 Depot Yard, Brickfield", { precision: "house" })]],
    ["9 Saggar Row, Glazebury", [point(52.0601, 5.0802, "9 Saggar Row, Glazebury", { precision: "house" })]],
  ]);
  const typedStops = sheet("Stops", [
    ["Stop", "Latitude", "Longitude", "Demand"],
    ["S1", 52.0903, 5.1201, 1],
    ["S2", 52.087, 5.125, 1],
  ]);

  it("takes address text in the Depot and End depot columns as addresses, a typed pair as typed", () => {
    const { targets, typed } = addressTargets({ stops: typedStops, fleet: DEPOTS });
    expect(targets.map((t) => [t.cell, t.address, t.end ?? false])).toEqual([
      ["Vans!C2", "1 Depot Yard, Brickfield", false],
      ["Vans!C4", "1 Depot Yard, Brickfield", false],
      ["Vans!D2", "9 Saggar Row, Glazebury", true],
    ]);
    // The typed pairs (two stops, Van B's start, Van C's end) count for the far-from-others rule.
    expect(typed).toHaveLength(4);

    const located = applyGeocodes({ stops: typedStops, fleet: DEPOTS }, targets, typed, answers);
    expect(located.issues).toEqual([]);
    // The coordinates go into the very cells that held the address text (a copy; the input is unchanged).
    expect(located.fleet!.values[1]!.slice(2, 4)).toEqual(["52.08, 5.11", "52.0601, 5.0802"]);
    expect(DEPOTS.values[1]![3]).toBe("9 Saggar Row, Glazebury");
    const read = readProblem({ stops: located.stops, fleet: located.fleet! });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    const at = (id: string, which: "startLocation" | "endLocation") => {
      const v = read.problem.vehicles.find((x) => x.id === id)!;
      const p = read.problem.locations[v[which]]!;
      return [p.lat, p.lon];
    };
    expect(at("Van A", "startLocation")).toEqual([52.08, 5.11]);
    expect(at("Van A", "endLocation")).toEqual([52.0601, 5.0802]);
    // Van B has no end depot: it ends where it starts.
    expect(at("Van B", "endLocation")).toEqual([52.08, 5.11]);
    expect(at("Van C", "endLocation")).toEqual([52.0648, 5.0755]);
  });

  it("geocodes an End address column into appended End latitude and End longitude columns", () => {
    const { targets, typed } = addressTargets({ stops: typedStops, fleet: ENDS });
    expect(targets.map((t) => [t.cell, t.end ?? false])).toEqual([
      ["Fleet!C2", false],
      ["Fleet!C3", false],
      ["Fleet!D2", true],
    ]);
    const located = applyGeocodes({ stops: typedStops, fleet: ENDS }, targets, typed, answers);
    expect(located.fleet!.values[0]!.slice(6)).toEqual(["Start latitude", "Start longitude", "End latitude", "End longitude"]);
    expect(located.fleet!.values[1]!.slice(6)).toEqual([52.08, 5.11, 52.0601, 5.0802]);
    expect(located.fleet!.values[2]!.slice(6)).toEqual([52.08, 5.11, "", ""]);
    const read = readProblem({ stops: located.stops, fleet: located.fleet! });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    const vanA = read.problem.vehicles.find((v) => v.id === "Van A")!;
    expect(read.problem.locations[vanA.endLocation]).toMatchObject({ lat: 52.0601, lon: 5.0802 });
  });

  it("an end depot address not found is an issue at its cell; without a geocoder it is an error, never the start depot in silence", () => {
    const missing = new Map(answers);
    missing.set("9 Saggar Row, Glazebury", []);
    const { targets, typed } = addressTargets({ stops: typedStops, fleet: ENDS });
    const located = applyGeocodes({ stops: typedStops, fleet: ENDS }, targets, typed, missing);
    expect(located.issues.map((i) => i.message)).toEqual([
      'Fleet!D2: the end depot address "9 Saggar Row, Glazebury" was not found by the geocoding service; correct the address or type the End latitude and End longitude.',
    ]);

    const fleet = sheet("Fleet", [
      ["Vehicle", "Capacity", "Start latitude", "Start longitude", "End address"],
      ["Van A", 10, 52.08, 5.11, "9 Saggar Row, Glazebury"],
    ]);
    const read = readProblem({ stops: typedStops, fleet });
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.issues.map((i) => [i.cell, i.message])).toEqual([
      [
        "E2",
        'Fleet!E2: the end depot of vehicle "Van A" is an address without coordinates; type its End latitude and End longitude in decimal degrees (such as 45.76 and 4.83), or set up a geocoding service (--geocoder, or Geocoding in the pane) to look the address up.',
      ],
    ]);
  });
});
