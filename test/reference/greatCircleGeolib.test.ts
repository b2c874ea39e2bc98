import { getDistance, getPreciseDistance } from "geolib";
import { describe, expect, it } from "vitest";
import { EARTH_MEAN_RADIUS_KM } from "../../src/core/constants.js";
import { buildMatrix } from "../../src/core/geo/buildMatrix.js";
import { centralAngleRad } from "../../src/core/geo/greatCircleKm.js";

// geolib 3 measures on a sphere of radius 6378137 m (its `earthRadius`, the WGS 84 equatorial
// radius), we on the mean radius 6371.0088 km, so distances differ by design: compare the
// central angles, distance / radius.
const GEOLIB_EARTH_RADIUS_M = 6378137;

const PLACES = [
  { lat: 51.5074, lon: -0.1278 }, // London
  { lat: 48.8566, lon: 2.3522 }, // Paris
  { lat: -33.8688, lon: 151.2093 }, // Sydney
  { lat: 40.7128, lon: -74.006 }, // New York
  { lat: 35.6762, lon: 139.6503 }, // Tokyo
  { lat: 52.52, lon: 13.405 }, // Berlin
  { lat: 52.53, lon: 13.41 }, // about 1.2 km from the previous one
  { lat: -0.5, lon: 179.9 }, // across the antimeridian from the next
  { lat: 0.5, lon: -179.9 },
];

describe("great-circle matrix against geolib (reference library)", () => {
  const matrix = buildMatrix(PLACES, { detourFactor: 1 });
  const n = PLACES.length;

  it("central angles agree with geolib.getDistance (spherical) to 1e-9 rad", () => {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (i === j) continue;
        const a = PLACES[i]!;
        const b = PLACES[j]!;
        const oursRad = matrix.distanceKm[i * n + j]! / EARTH_MEAN_RADIUS_KM;
        const geolibRad =
          getDistance({ latitude: a.lat, longitude: a.lon }, { latitude: b.lat, longitude: b.lon }, 1e-6) / GEOLIB_EARTH_RADIUS_M;
        expect(Math.abs(oursRad - geolibRad), `${i}->${j}`).toBeLessThan(1e-9);
      }
    }
  });

  it("distances are within 0.6% of geolib.getPreciseDistance (Vincenty on the WGS 84 ellipsoid)", () => {
    // A sphere cannot match the ellipsoid exactly; the flattening bounds the difference at about 0.5%.
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        const a = PLACES[i]!;
        const b = PLACES[j]!;
        const km = matrix.distanceKm[i * n + j]!;
        const preciseKm = getPreciseDistance({ latitude: a.lat, longitude: a.lon }, { latitude: b.lat, longitude: b.lon }, 0.001) / 1000;
        expect(Math.abs(km - preciseKm) / preciseKm, `${i}->${j}`).toBeLessThan(0.006);
      }
    }
  });

  it("the detour factor scales distance and the speed gives minutes (1.3 and 40 km/h defaults)", () => {
    const m = buildMatrix(PLACES.slice(0, 2));
    const km = centralAngleRad(PLACES[0]!, PLACES[1]!) * EARTH_MEAN_RADIUS_KM * 1.3;
    expect(m.distanceKm[1]).toBeCloseTo(km, 9);
    expect(m.travelMin[1]).toBeCloseTo((km / 40) * 60, 9);
  });
});

describe("published worked example of the central angle", () => {
  it("LAX (33°57'N 118°24'W) to JFK (40°38'N 73°47'W) is 0.623585 rad (Ed Williams, Aviation Formulary; from memory)", () => {
    const lax = { lat: 33 + 57 / 60, lon: -(118 + 24 / 60) };
    const jfk = { lat: 40 + 38 / 60, lon: -(73 + 47 / 60) };
    expect(centralAngleRad(lax, jfk)).toBeCloseTo(0.623585, 6);
  });
});
