import { describe, expect, it } from "vitest";
import type { LatLon } from "../../src/core/model.js";
import { fillGeographyCoordinates } from "../../src/sheets/fillGeographyCoordinates.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import type { SheetRead } from "../../src/sheets/grid.js";

// Geography cells reach the sheets layer as a grid of places beside the values (the Excel adapter
// reads them from valuesAsJson, ExcelApi 1.16). Places here are small invented test data.
const york: LatLon = { lat: 53.959, lon: -1.0815 };
const selby: LatLon = { lat: 53.7836, lon: -1.0672 };
const FLEET: SheetRead = {
  sheet: "Fleet",
  row: 0,
  col: 0,
  values: [
    ["Vehicle", "Capacity", "Start latitude", "Start longitude"],
    ["Van", 100, 53.95, -1.08],
  ],
};

const sheet = (values: unknown[][]): SheetRead => ({ sheet: "Stops", row: 0, col: 0, values });

describe("coordinates from Geography cells", () => {
  it("appends Latitude and Longitude when the table has no coordinate columns, and readProblem then succeeds", () => {
    const read = sheet([
      ["Stop", "Place", "Demand"],
      ["A", "York", 5],
      ["B", "Selby", 3],
    ]);
    const places = [[], [undefined, york], [undefined, selby]];
    const out = fillGeographyCoordinates(read, places);
    expect(out.filled).toBe(2);
    expect(out.read.values[0]).toEqual(["Stop", "Place", "Demand", "Latitude", "Longitude"]);
    expect(out.read.values[2]).toEqual(["B", "Selby", 3, selby.lat, selby.lon]);
    const r = readProblem({ stops: out.read, fleet: FLEET });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.problem.locations[r.problem.stops[0]!.location]).toMatchObject(york);
  });

  it("fills only blank coordinate cells: typed coordinates win", () => {
    const read = sheet([
      ["Stop", "Address", "Latitude", "Longitude"],
      ["A", "York", "", ""],
      ["B", "Selby", 53.7, -1.1],
    ]);
    const out = fillGeographyCoordinates(read, [[], [undefined, york], [undefined, selby]]);
    expect(out.filled).toBe(1);
    expect(out.read.values[1]).toEqual(["A", "York", york.lat, york.lon]);
    expect(out.read.values[2]).toEqual(["B", "Selby", 53.7, -1.1]);
  });

  it("turns a place in a single coordinates column into lat, lon text", () => {
    const read = sheet([
      ["Stop", "Location"],
      ["A", "York"],
    ]);
    const out = fillGeographyCoordinates(read, [[], [undefined, york]]);
    expect(out.read.values[1]).toEqual(["A", `${york.lat}, ${york.lon}`]);
  });

  it("changes nothing when no cell holds a place; the reader then asks for coordinates", () => {
    const read = sheet([
      ["Stop", "Address", "Demand"],
      ["A", "1 High St", 5],
    ]);
    const out = fillGeographyCoordinates(read, [[], [undefined, undefined]]);
    expect(out.filled).toBe(0);
    expect(out.read).toBe(read);
    const r = readProblem({ stops: out.read, fleet: FLEET });
    expect(r.ok).toBe(false);
  });

  it("never changes the values it was given", () => {
    const values = [
      ["Stop", "Place"],
      ["A", "York"],
    ];
    fillGeographyCoordinates(sheet(values), [[], [undefined, york]]);
    expect(values).toEqual([
      ["Stop", "Place"],
      ["A", "York"],
    ]);
  });
});
