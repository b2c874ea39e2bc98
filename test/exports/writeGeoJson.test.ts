// GeoJSON checked by an outside validator (@placemarkio/check-geojson) and against RFC 7946's rules:
// positions [longitude, latitude] (§3.1.1), LineStrings of two or more positions (§3.1.4), a
// FeatureCollection of Features (§3.2, §3.3). Expected values come from the plan and the problem directly.
import { check } from "@placemarkio/check-geojson";
import { describe, expect, it } from "vitest";
import { writeGeoJson } from "../../src/exports/writeGeoJson.js";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import { formatClock } from "../../src/sheets/formatClock.js";
import * as fixture from "../fixtures/writerPlan.js";
import { STOP_TEXTS, exportScenario } from "./exportScenario.js";

describe("writeGeoJson", () => {
  const s = exportScenario();
  const fc = writeGeoJson({ problem: s.problem, plan: s.plan, stopRows: s.stopRows, extraHeaders: s.extraHeaders });
  const json = JSON.stringify(fc);
  const used = s.plan.routes.filter((r) => r.visits.length > 0);

  it("passes @placemarkio/check-geojson (RFC 7946), for a solved plan and for the fixture with an unplanned stop", () => {
    expect(() => check(json)).not.toThrow();
    const other = writeGeoJson({
      problem: fixture.problem,
      plan: fixture.plan,
      stopRows: fixture.stopRows,
      extraHeaders: fixture.extraHeaders,
    });
    expect(() => check(JSON.stringify(other))).not.toThrow();
    expect(other.features.filter((f) => f.properties.kind === "unplanned").map((f) => f.properties.stop)).toEqual(["S5"]);
    expect(fc.caution).toBe(CAUTION_TEXT);
  });

  it("draws one LineString per used vehicle in [longitude, latitude] order (RFC 7946 §3.1.1), depot first and last, with vehicle, km and times", () => {
    const lines = fc.features.filter((f) => f.geometry.type === "LineString");
    expect(lines.map((f) => f.properties.vehicle)).toEqual(used.map((r) => s.problem.vehicles[r.vehicle]!.id));
    lines.forEach((f, i) => {
      const route = used[i]!;
      const v = s.problem.vehicles[route.vehicle]!;
      const locs = [v.startLocation, ...route.visits.map((x) => s.problem.stops[x.stop]!.location), v.endLocation];
      expect(f.geometry.coordinates).toEqual(locs.map((l) => [s.problem.locations[l]!.lon, s.problem.locations[l]!.lat]));
      expect(f.properties.km).toBeCloseTo(route.distanceKm, 1);
      expect(f.properties.drivingMin).toBe(Math.round(route.drivingMin));
      expect(f.properties.dutyMin).toBe(Math.round(route.dutyMin));
      expect(f.properties.departure).toBe(formatClock(route.departureMin));
      expect(f.properties.return).toBe(formatClock(route.returnMin));
      expect([f.properties["Load kg"], f.properties["Load crates"]]).toEqual(route.load);
      expect(f.properties.driver).toBe(v.driver);
    });
    // The invented stops lie near Paris: longitude about 2.3, latitude about 48.8. Swapped order would show here.
    const first = lines[0]!.geometry.coordinates as readonly (readonly number[])[];
    expect(first[1]![0]).toBeLessThan(3);
    expect(first[1]![1]).toBeGreaterThan(48);
  });

  it("puts one Point per served stop with seq, vehicle, arrival, drops per dimension and the stop's own columns, text exact", () => {
    const points = fc.features.filter((f) => f.properties.kind === "stop");
    expect(points.length).toBe(used.reduce((n, r) => n + r.visits.length, 0));
    const back = JSON.parse(json) as typeof fc;
    for (const route of used) {
      const vehicle = s.problem.vehicles[route.vehicle]!.id;
      route.visits.forEach((v, k) => {
        const stop = s.problem.stops[v.stop]!;
        const p = back.features.find((f) => f.properties.kind === "stop" && f.properties.stop === stop.id)!;
        const loc = s.problem.locations[stop.location]!;
        expect(p.geometry).toEqual({ type: "Point", coordinates: [loc.lon, loc.lat] });
        expect(p.properties.seq).toBe(k + 1);
        expect(p.properties.vehicle).toBe(vehicle);
        expect(p.properties.name).toBe(stop.name);
        expect(p.properties.arrival).toBe(formatClock(v.arrivalMin));
        expect([p.properties["Drop kg"], p.properties["Drop crates"]]).toEqual(stop.demand);
        const row = s.stopRows.find((r) => r.stop === v.stop)!;
        expect(p.properties.address).toBe(row.address ?? "");
        for (const h of s.extraHeaders) expect(p.properties[h]).toEqual(row.extra[h]);
      });
    }
    const texts = back.features.flatMap((f) => Object.values(f.properties));
    for (const t of [STOP_TEXTS.name, STOP_TEXTS.address, STOP_TEXTS.note, STOP_TEXTS.formula, STOP_TEXTS.astral])
      expect(texts).toContain(t);
  });

  it("draws each depot used once, with the vehicles that use it", () => {
    const depots = fc.features.filter((f) => f.properties.kind === "depot");
    const names = depots.map((d) => d.properties.name);
    expect(new Set(names).size).toBe(names.length);
    const byVehicle = depots.flatMap((d) => d.properties.vehicles as string[]);
    expect([...byVehicle].sort()).toEqual(used.map((r) => s.problem.vehicles[r.vehicle]!.id).sort());
  });

  it("keeps a carried header that equals one of its own keys, renamed, and a header named __proto__ as a plain property", () => {
    const rows = fixture.stopRows.map((r) => ({ ...r, extra: { ...r.extra, seq: "theirs", ["__proto__"]: "x" } }));
    const out = writeGeoJson({ problem: fixture.problem, plan: fixture.plan, stopRows: rows, extraHeaders: ["seq", "__proto__"] });
    const p = JSON.parse(JSON.stringify(out)).features.find((f: { properties: { kind: string } }) => f.properties.kind === "stop");
    expect(p.properties.seq).toBe(1);
    expect(p.properties["seq (stop column)"]).toBe("theirs");
    expect(Object.keys(p.properties)).toContain("__proto__");
  });
});
