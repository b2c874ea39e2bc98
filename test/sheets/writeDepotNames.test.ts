// Depot rows of the route table name their own depot: invented fleet where Van 1, Van 2 and
// Van 3 share the yard and Van 4 has its own. The expected coordinates come from the fleet table
// typed below (the input is the outside reference), not from the code under test.
import { describe, expect, it } from "vitest";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import { DEPOT_END_NAME, DEPOT_START_NAME, routeTableRows } from "../../src/sheets/routeTableRows.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });

const YARD = { lat: 51.5, lon: -0.12 };
const NORTH = { lat: 51.6, lon: -0.1 };
const fleet = sheet("Fleet", [
  ["Vehicle", "Driver", "Capacity", "Start latitude", "Start longitude"],
  ["Van 1", "Ada", 100, YARD.lat, YARD.lon],
  ["Van 2", "Ben", 100, YARD.lat, YARD.lon],
  ["Van 3", "", 100, YARD.lat, YARD.lon],
  ["Van 4", "Dee", 100, NORTH.lat, NORTH.lon],
]);
const stops = sheet("Stops", [
  ["Stop", "Name", "Address", "Latitude", "Longitude", "Demand"],
  ["S1", "Mill", "1 Mill Road", 51.51, -0.11, 10],
  ["S2", "Quay", "2 Quay Side", 51.52, -0.13, 10],
  ["S3", "Lane", "", 51.49, -0.12, 10],
  ["S4", "Hill", "4 Hill Top", 51.61, -0.09, 10],
]);

describe("depot rows are named after their own depot", () => {
  const read = readProblem({ stops, fleet });
  if (!read.ok) throw new Error(JSON.stringify(read.issues));
  const { problem } = read;
  const plan = evaluatePlan(problem, [[0], [1], [2], [3]]);
  const table = routeTableRows(problem, plan, read.stopRows, read.extraHeaders);
  const col = (h: string): number => table.header.indexOf(h);
  const depotRows = table.rows.filter((r) => r.values[col("Name")] === DEPOT_START_NAME || r.values[col("Name")] === DEPOT_END_NAME);

  it("each vehicle's depot rows sit at the coordinates its fleet row gives, and name only vehicles of that depot", () => {
    expect(depotRows).toHaveLength(8);
    for (const r of depotRows) {
      const vehicle = String(r.values[col("Vehicle")]);
      const own = vehicle === "Van 4" ? NORTH : YARD;
      expect([r.values[col("Latitude")], r.values[col("Longitude")]], vehicle).toEqual([own.lat, own.lon]);
      const name = String(r.values[col("Stop")]);
      expect(name, vehicle).toContain(vehicle);
      if (vehicle === "Van 4") expect(name).toBe("Depot (Van 4)");
      else expect(name).toBe("Depot (Van 1, Van 2, Van 3)");
    }
  });

  it("Van 2's route no longer starts at a depot named after Van 1 alone", () => {
    const van2 = depotRows.filter((r) => r.values[col("Vehicle")] === "Van 2");
    expect(van2.map((r) => r.values[col("Stop")])).not.toContain("Depot (Van 1)");
  });

  it("the fleet's Driver column is the driver, not a second vehicle name", () => {
    expect(problem.vehicles.map((v) => [v.id, v.driver])).toEqual([
      ["Van 1", "Ada"],
      ["Van 2", "Ben"],
      ["Van 3", undefined],
      ["Van 4", "Dee"],
    ]);
  });

  it("a fleet named only by a Driver column keeps those names as vehicle names", () => {
    const byDriver = sheet("Fleet", [
      ["Driver", "Capacity", "Start latitude", "Start longitude"],
      ["Ada", 100, YARD.lat, YARD.lon],
    ]);
    const r = readProblem({ stops, fleet: byDriver });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.vehicles.map((v) => [v.id, v.driver])).toEqual([["Ada", "Ada"]]);
  });

  it("the address column is carried to the table beside the name", () => {
    const s1 = table.rows.find((r) => r.values[col("Stop")] === "S1")!;
    expect(s1.values[col("Address")]).toBe("1 Mill Road");
    expect(col("Address")).toBe(col("Name") + 1);
  });
});
