import { describe, expect, it } from "vitest";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
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
