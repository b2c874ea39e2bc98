import { describe, expect, it } from "vitest";
import { compileProblem, ROW_DEMAND, ROW_EARLIEST, ROW_LATEST, ROW_SERVICE, ROW_WINDOWED } from "../../src/core/schedule/compileProblem.js";
import { solomonToProblem, parseSolomon } from "../../src/core/formats/index.js";
import { readFileSync } from "node:fs";
import { rulesInstance } from "./rulesInstance.js";

describe("compileProblem's everyVehicle flag", () => {
  it("is 1 exactly for the stops every vehicle may serve, from the instance's pins and exclusions", () => {
    // rulesInstance pins stop i to one vehicle when i % 5 === 1 and excludes the first vehicle
    // when i % 7 === 3 (an invented instance); such stops can never be served by every vehicle.
    const p = rulesInstance(3, 40, 4, { breaks: false, limits: false });
    const cp = compileProblem(p);
    const V = cp.vehicleCount;
    let restricted = 0;
    for (let s = 0; s < cp.n; s++) {
      const row = Array.from(cp.compatible.subarray(s * V, s * V + V));
      expect(cp.everyVehicle[s]).toBe(row.every((x) => x === 1) ? 1 : 0);
      if (s % 5 === 1 || s % 7 === 3) {
        expect(cp.everyVehicle[s]).toBe(0);
        restricted++;
      }
    }
    expect(restricted).toBeGreaterThan(5);
    // The instance's other stops are not all restricted by capacity or windows.
    expect(Array.from(cp.everyVehicle).some((x) => x === 1)).toBe(true);
  });
});

describe("compileProblem's stopRows", () => {
  it("hold each stop's service, window hull, window flag and demands as the separate arrays do (Solomon R101)", () => {
    // R101 (Solomon 1987, committed in test/fixtures/reference): every customer has a window.
    const text = readFileSync(new URL("../fixtures/reference/R101.txt", import.meta.url), "utf8");
    const cp = compileProblem(solomonToProblem(parseSolomon(text)));
    const R = cp.stopStride;
    expect(R).toBe(ROW_DEMAND + cp.dims);
    for (let s = 0; s < cp.n; s++) {
      expect(cp.stopRows[s * R + ROW_SERVICE]).toBe(cp.serviceMin[s]);
      expect(cp.stopRows[s * R + ROW_EARLIEST]).toBe(cp.earliestMin[s]);
      expect(cp.stopRows[s * R + ROW_LATEST]).toBe(cp.latestMin[s]);
      expect(cp.stopRows[s * R + ROW_WINDOWED]).toBe(cp.windowed[s]);
      for (let d = 0; d < cp.dims; d++) expect(cp.stopRows[s * R + ROW_DEMAND + d]).toBe(cp.demand[s * cp.dims + d]);
    }
    // R101's first customer: demand 10, service 10, window 161-171 (the published instance).
    expect(cp.stopRows[ROW_SERVICE]).toBe(10);
    expect(cp.stopRows[ROW_EARLIEST]).toBe(161);
    expect(cp.stopRows[ROW_LATEST]).toBe(171);
    expect(cp.stopRows[ROW_DEMAND]).toBe(10);
  });
});
