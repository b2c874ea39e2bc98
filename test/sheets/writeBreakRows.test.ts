// Breaks and pickups in the route table: a break is a row of its own ("Break" in Stop, its start in
// Start, its end in Departure); Collect shows what to pick up. Invented data; times are Excel day
// fractions (ECMA-376 Part 1, §18.17.4: the serial's fraction is the time of day).
import { describe, expect, it } from "vitest";
import type { Problem } from "../../src/core/model.js";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { BREAK_STOP, routeTableRows } from "../../src/sheets/routeTableRows.js";

const ring = [
  [0, 90, 180, 90],
  [90, 0, 90, 180],
  [180, 90, 0, 90],
  [90, 180, 90, 0],
].flat();

const problem: Problem = {
  locations: [0, 1, 2, 3].map((i) => ({ lat: 45 + i / 100, lon: 4 })),
  stops: [1, 2, 3].map((k) => ({
    id: `S${k}`,
    name: `Shop ${k}`,
    location: k,
    demand: [2],
    windows: [{ earliestMin: 0, latestMin: Infinity }],
    serviceMin: 10,
    ...(k === 2 ? { pickup: [5] } : {}),
  })),
  vehicles: [
    {
      id: "Van",
      capacity: [20],
      startLocation: 0,
      endLocation: 0,
      shiftStartMin: 360,
      shiftEndMin: 1080,
      fixedCost: 0,
      costPerKm: 1,
      costPerHour: 0,
      speedKmh: 40,
      drivingBreak: { driveMin: 270, breakMin: 45 },
    },
  ],
  loadDimensions: ["crates"],
  matrix: { size: 4, distanceKm: Float64Array.from(ring), travelMin: Float64Array.from(ring), userSupplied: true },
  referenceSpeedKmh: 40,
  hardWindows: true,
  lateCostPerMin: 1,
  objective: "weighted",
};

describe("route table rows with breaks and pickups", () => {
  it("puts the break before the visit it precedes, and what to collect in Collect", () => {
    const plan = evaluatePlan(problem, [[0, 1, 2]]);
    const t = routeTableRows(problem, plan);
    const col = (name: string): number => t.header.indexOf(name);
    expect(t.header.slice(t.longitudeCol + 1)).toEqual(["Collect crates"]);
    const stopsCol = t.rows.map((r) => r.values[col("Stop")]);
    // Depot, S1, S2, break (on arrival at S3), S3, depot: the break 10:50-11:35 (hand-worked in breaks.test.ts).
    expect(stopsCol.slice(1)).toEqual(["S1", "S2", BREAK_STOP, "S3", stopsCol[5]]);
    const b = t.rows[3]!.values;
    expect(b[col("Start")]).toBeCloseTo(650 / 1440, 12);
    expect(b[col("Departure")]).toBeCloseTo(695 / 1440, 12);
    expect(t.rows.map((r) => r.values[col("Load crates")])).toEqual([6, 4, 7, null, 5, 5]);
    expect(t.rows[2]!.values[col("Collect crates")]).toBe(5);
    expect(t.routes[0]!.count).toBe(6);
  });
});
