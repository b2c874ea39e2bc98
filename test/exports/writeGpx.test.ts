// GPX files read back by outside readers: fast-xml-parser's XMLValidator (XML 1.0 well-formedness),
// @xmldom/xmldom (a W3C DOM parser) for names, namespaces and text, and @tmcw/togeojson (a GPX reader)
// for the routes and their points. Expected points come from the plan and the problem directly.
import { gpx } from "@tmcw/togeojson";
import { DOMParser, type Element as XmlElement } from "@xmldom/xmldom";
import { XMLValidator } from "fast-xml-parser";
import { describe, expect, it } from "vitest";
import type { Plan, Problem } from "../../src/core/index.js";
import { decimalText } from "../../src/exports/decimalText.js";
import { GPX_CREATOR, GPX_NAMESPACE, writeGpx } from "../../src/exports/writeGpx.js";
import { xmlText } from "../../src/exports/xmlText.js";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import { formatClock } from "../../src/sheets/formatClock.js";
import * as fixture from "../fixtures/writerPlan.js";
import { STOP_TEXTS, exportScenario } from "./exportScenario.js";

/** A strict DOM parse: xmldom's errors throw (its warnings, such as on U+FFFD, are ignored). */
const parseXml = (text: string) =>
  new DOMParser({
    onError: (level, message) => {
      if (level !== "warning") throw new Error(`xmldom ${level}: ${message}`);
    },
  }).parseFromString(text, "text/xml");

/** [lat, lon] of every point of every used route, depot first and last, straight from the model. */
function expectedRoutes(problem: Problem, plan: Plan): { name: string; points: [number, number][] }[] {
  return plan.routes
    .filter((r) => r.visits.length > 0)
    .map((r) => {
      const v = problem.vehicles[r.vehicle]!;
      const at = (i: number): [number, number] => [problem.locations[i]!.lat, problem.locations[i]!.lon];
      return { name: v.id, points: [at(v.startLocation), ...r.visits.map((x) => at(problem.stops[x.stop]!.location)), at(v.endLocation)] };
    });
}

describe("writeGpx", () => {
  const s = exportScenario();
  const text = writeGpx({ problem: s.problem, plan: s.plan, stopRows: s.stopRows, scenario: "Tuesday & <rush>" });

  it("is well-formed XML 1.0 (fast-xml-parser XMLValidator)", () => {
    expect(XMLValidator.validate(text)).toBe(true);
    expect(XMLValidator.validate(writeGpx({ problem: fixture.problem, plan: fixture.plan, stopRows: fixture.stopRows }))).toBe(true);
  });

  it("is a GPX 1.1 document: root gpx in the 1.1 namespace with version and creator (GPX 1.1 schema, topografix.com, 2004)", () => {
    const root = parseXml(text).documentElement!;
    expect(root.localName).toBe("gpx");
    expect(root.namespaceURI).toBe("http://www.topografix.com/GPX/1/1");
    expect(GPX_NAMESPACE).toBe("http://www.topografix.com/GPX/1/1");
    expect(root.getAttribute("version")).toBe("1.1");
    expect(root.getAttribute("creator")).toBe(GPX_CREATOR);
    // GPX 1.1 gpxType: metadata, then wpt, rte, trk in that order; rteType: name, cmt, desc, ..., number, ..., rtept.
    const children = Array.from(root.childNodes)
      .filter((n) => n.nodeType === 1)
      .map((n) => (n as XmlElement).localName);
    expect(children[0]).toBe("metadata");
    expect(children.slice(1).every((c) => c === "rte")).toBe(true);
    for (const rte of Array.from(root.getElementsByTagNameNS(GPX_NAMESPACE, "rte"))) {
      const order = Array.from(rte.childNodes)
        .filter((n) => n.nodeType === 1)
        .map((n) => (n as XmlElement).localName);
      const firstPoint = order.indexOf("rtept");
      expect(order.slice(0, firstPoint)).toEqual(["name", "desc", "number"]);
      expect(order.slice(firstPoint).every((c) => c === "rtept")).toBe(true);
    }
  });

  it("reads back with @tmcw/togeojson: one route per used vehicle, named after it, every point in plan order to 1e-6 degrees", () => {
    const read = gpx(parseXml(text) as unknown as Document) as {
      features: { properties: Record<string, unknown> | null; geometry: { type: string } | null }[];
    };
    const expected = expectedRoutes(s.problem, s.plan);
    expect(expected.length).toBeGreaterThan(1);
    expect(read.features.map((f) => f.properties?.name)).toEqual(expected.map((r) => r.name));
    read.features.forEach((f, i) => {
      expect(f.geometry?.type).toBe("LineString");
      const coords = (f.geometry as unknown as { coordinates: number[][] }).coordinates;
      const want = expected[i]!.points;
      expect(coords.length).toBe(want.length);
      coords.forEach(([lon, lat], k) => {
        // togeojson returns GeoJSON positions, [lon, lat] (RFC 7946 §3.1.1).
        expect(Math.abs(lat! - want[k]![0])).toBeLessThan(1e-6);
        expect(Math.abs(lon! - want[k]![1])).toBeLessThan(1e-6);
      });
    });
  });

  it("names each point after its stop (text kept exactly through escaping) and describes planned arrival and window", () => {
    const doc = parseXml(text);
    const rtes = Array.from(doc.getElementsByTagNameNS(GPX_NAMESPACE, "rte"));
    const used = s.plan.routes.filter((r) => r.visits.length > 0);
    rtes.forEach((rte, i) => {
      const route = used[i]!;
      const pts = Array.from(rte.getElementsByTagNameNS(GPX_NAMESPACE, "rtept"));
      const child = (el: XmlElement, tag: string) => el.getElementsByTagNameNS(GPX_NAMESPACE, tag)[0]?.textContent ?? undefined;
      const vehicle = s.problem.vehicles[route.vehicle]!;
      const depot = s.problem.locations[vehicle.startLocation]!;
      // The route's description names the driver when the fleet table has one (issue 8).
      const routeDesc = rte.getElementsByTagNameNS(GPX_NAMESPACE, "desc")[0]!.textContent!;
      if (vehicle.driver) expect(routeDesc).toMatch(new RegExp(`^Driver ${vehicle.driver}: ${route.visits.length} stops?`));
      else expect(routeDesc).not.toMatch(/Driver/);
      expect(child(pts[0]!, "name")).toBe(depot.name);
      expect(child(pts[0]!, "desc")).toContain(formatClock(route.departureMin));
      expect(child(pts[pts.length - 1]!, "desc")).toContain(formatClock(route.returnMin));
      route.visits.forEach((v, k) => {
        const stop = s.problem.stops[v.stop]!;
        const pt = pts[k + 1]!;
        expect(child(pt, "name")).toBe(stop.name);
        const desc = child(pt, "desc")!;
        expect(desc).toContain(`Seq ${k + 1}`);
        expect(desc).toContain(`arrive ${formatClock(v.arrivalMin)}`);
        const w = stop.windows[0]!;
        if (w.latestMin !== Infinity && w.earliestMin > 0)
          expect(desc).toContain(`window ${formatClock(w.earliestMin)}–${formatClock(w.latestMin)}`);
        const address = s.stopRows.find((r) => r.stop === v.stop)?.address;
        expect(child(pt, "cmt")).toBe(address || undefined); // no <cmt> for a blank address
      });
    });
    const allNames = Array.from(doc.getElementsByTagNameNS(GPX_NAMESPACE, "name")).map((n) => n.textContent);
    expect(allNames).toContain(STOP_TEXTS.name); // & < > " survive (XML 1.0 §2.4)
    expect(allNames).toContain(STOP_TEXTS.astral); // a character outside the BMP survives
    expect(allNames).toContain("Truck <West>");
    expect(allNames).toContain("Tuesday & <rush>");
    const cmts = Array.from(doc.getElementsByTagNameNS(GPX_NAMESPACE, "cmt")).map((n) => n.textContent);
    expect(cmts).toContain(STOP_TEXTS.address); // a line break in an address survives
  });

  it("carries the caution and names the stops left out of the plan", () => {
    const doc = parseXml(writeGpx({ problem: fixture.problem, plan: fixture.plan, stopRows: fixture.stopRows }));
    const desc = doc.getElementsByTagNameNS(GPX_NAMESPACE, "metadata")[0]!.getElementsByTagNameNS(GPX_NAMESPACE, "desc")[0]!.textContent!;
    expect(desc).toContain(CAUTION_TEXT);
    expect(desc).toContain("Not in any route: 1 stop (S5)");
    // The fixture's unused vehicle gets no route (the issue: one rte per vehicle used).
    const names = Array.from(doc.getElementsByTagNameNS(GPX_NAMESPACE, "rte")).map(
      (r) => r.getElementsByTagNameNS(GPX_NAMESPACE, "name")[0]!.textContent,
    );
    expect(names).toEqual(fixture.plan.routes.filter((r) => r.visits.length > 0).map((r) => fixture.problem.vehicles[r.vehicle]!.id));
  });
});

describe("xmlText", () => {
  it("round-trips every XML special, a carriage return and astral text through a DOM parser (@xmldom/xmldom; XML 1.0 §2.4, §2.11)", () => {
    const s = `a & b < c > d "e" 'f' \r\n g\th 🚚`;
    const doc = parseXml(`<r a="${xmlText(s.replace(/[\r\n\t]/g, " "))}">${xmlText(s)}</r>`);
    expect(doc.documentElement!.textContent).toBe(s);
    expect(doc.documentElement!.getAttribute("a")).toBe(s.replace(/[\r\n\t]/g, " "));
  });

  it("replaces characters XML 1.0 cannot carry (§2.2 Char) so the document stays well-formed (fast-xml-parser)", () => {
    const bad = "x\u0001y\u001Fz\uFFFEw\uD800v";
    const xml = `<r>${xmlText(bad)}</r>`;
    expect(XMLValidator.validate(xml)).toBe(true);
    expect(parseXml(xml).documentElement!.textContent).toBe("x\uFFFDy\uFFFDz\uFFFDw\uFFFDv");
  });
});

describe("decimalText", () => {
  it("writes xsd:decimal, never an exponent (XML Schema Part 2 §3.2.3), and reads back to 1e-12", () => {
    for (const x of [1e-7, -1e-7, 45.764043, -0.1276, 179.9999999, 0, -0, 5e-13]) {
      const t = decimalText(x);
      expect(t).toMatch(/^-?\d+(\.\d+)?$/);
      expect(Math.abs(Number(t) - x)).toBeLessThan(1e-12);
    }
    expect(decimalText(1e-7)).toBe("0.0000001");
    expect(decimalText(-0)).toBe("0");
    expect(() => decimalText(NaN)).toThrow(RangeError);
  });
});
