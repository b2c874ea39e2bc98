import { describe, expect, it } from "vitest";
import { getDistance } from "geolib";
import { fitEquirectangular } from "../../src/taskpane/fitEquirectangular.js";

// Demo points (invented) spread over ~20 km around York.
const POINTS = [
  { lat: 53.9885, lon: -1.1005 },
  { lat: 53.9327, lon: -1.1089 },
  { lat: 53.9601, lon: -1.0315 },
  { lat: 54.0102, lon: -1.0597 },
  { lat: 53.9453, lon: -1.1702 },
];

describe("fitEquirectangular", () => {
  it("keeps every point inside the box with its padding", () => {
    const proj = fitEquirectangular(POINTS, 320, 260, 20);
    for (const p of POINTS) {
      const { x, y } = proj.project(p);
      expect(x).toBeGreaterThanOrEqual(20 - 1e-9);
      expect(x).toBeLessThanOrEqual(300 + 1e-9);
      expect(y).toBeGreaterThanOrEqual(20 - 1e-9);
      expect(y).toBeLessThanOrEqual(240 + 1e-9);
    }
  });

  it("pixel distances over pxPerKm match geolib's great-circle km within 1% over a city (reference: geolib getDistance)", () => {
    const proj = fitEquirectangular(POINTS, 1000, 800);
    for (let i = 0; i < POINTS.length; i++) {
      for (let j = i + 1; j < POINTS.length; j++) {
        const a = proj.project(POINTS[i]!);
        const b = proj.project(POINTS[j]!);
        const km = Math.hypot(a.x - b.x, a.y - b.y) / proj.pxPerKm;
        const reference = getDistance(POINTS[i]!, POINTS[j]!, 0.01) / 1000;
        expect(Math.abs(km - reference) / reference).toBeLessThan(0.01);
      }
    }
  });

  it("north is up and east is right (screen y grows downwards)", () => {
    const proj = fitEquirectangular(POINTS, 320, 260);
    const north = proj.project({ lat: 54.0102, lon: -1.0597 });
    const south = proj.project({ lat: 53.9327, lon: -1.1089 });
    expect(north.y).toBeLessThan(south.y);
    const east = proj.project({ lat: 53.9601, lon: -1.0315 });
    const west = proj.project({ lat: 53.9453, lon: -1.1702 });
    expect(east.x).toBeGreaterThan(west.x);
  });

  it("rejects an empty point list and an empty box with RangeError", () => {
    expect(() => fitEquirectangular([], 100, 100)).toThrow(RangeError);
    expect(() => fitEquirectangular(POINTS, 0, 100)).toThrow(RangeError);
  });
});
