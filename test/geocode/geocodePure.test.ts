import { describe, expect, it } from "vitest";
import {
  buildGeocodeRequest,
  checkGeocoderTemplate,
  geocodeCacheKey,
  geocodeServiceId,
  markFarAway,
  normaliseAddress,
  parseHeaderLine,
  rateMatch,
  readGeocodeResponse,
} from "../../src/geocode/index.js";

describe("reading a geocoder's GeoJSON answer", () => {
  it("reads RFC 7946 Appendix A.1's Point [100.0, 0.0] as longitude 100, latitude 0", () => {
    // RFC 7946 Appendix A.1 (Points): { "type": "Point", "coordinates": [100.0, 0.0] }; §3.1.1: longitude first.
    const read = readGeocodeResponse({
      type: "FeatureCollection",
      features: [{ type: "Feature", geometry: { type: "Point", coordinates: [100.0, 0.0] }, properties: null }],
    });
    expect(read).toEqual({ ok: true, candidates: [{ lat: 0, lon: 100, label: "0, 100" }] });
  });

  it("takes the Point of RFC 7946 §1.5's example FeatureCollection and skips its LineString and Polygon", () => {
    // RFC 7946 §1.5, the example FeatureCollection (Point [102.0, 0.5], a LineString, a Polygon).
    const example = {
      type: "FeatureCollection",
      features: [
        { type: "Feature", geometry: { type: "Point", coordinates: [102.0, 0.5] }, properties: { prop0: "value0" } },
        {
          type: "Feature",
          geometry: {
            type: "LineString",
            coordinates: [
              [102.0, 0.0],
              [103.0, 1.0],
              [104.0, 0.0],
              [105.0, 1.0],
            ],
          },
          properties: { prop0: "value0", prop1: 0.0 },
        },
        {
          type: "Feature",
          geometry: {
            type: "Polygon",
            coordinates: [
              [
                [100.0, 0.0],
                [101.0, 0.0],
                [101.0, 1.0],
                [100.0, 1.0],
                [100.0, 0.0],
              ],
            ],
          },
          properties: { prop0: "value0", prop1: { this: "that" } },
        },
      ],
    };
    const read = readGeocodeResponse(example);
    expect(read.ok && read.candidates).toEqual([{ lat: 0.5, lon: 102, label: "0.5, 102" }]);
  });

  it("takes the label, confidence and precision from common properties", () => {
    const f = (properties: object) => ({ type: "Feature", geometry: { type: "Point", coordinates: [4.8, 45.7] }, properties });
    const read = readGeocodeResponse({
      type: "FeatureCollection",
      features: [
        f({ display_name: "1 Kiln Lane, Brickfield", importance: 0.4, addresstype: "building" }),
        f({ name: "Clay Street", confidence: 0.7, type: "street" }),
        f({ label: "Brickfield", relevance: 2, layer: "locality" }),
      ],
    });
    expect(read.ok && read.candidates).toEqual([
      { lat: 45.7, lon: 4.8, label: "1 Kiln Lane, Brickfield", precision: "house" },
      { lat: 45.7, lon: 4.8, label: "Clay Street", confidence: 0.7, precision: "street" },
      // A relevance outside 0..1 is not a confidence.
      { lat: 45.7, lon: 4.8, label: "Brickfield", precision: "town" },
    ]);
  });

  it("refuses JSON that is not a FeatureCollection, saying what it is", () => {
    expect(readGeocodeResponse({ results: [] })).toEqual({
      ok: false,
      message: 'a JSON object with no "type", not a GeoJSON FeatureCollection with "features"',
    });
    expect(readGeocodeResponse([1, 2])).toEqual({ ok: false, message: "a JSON array, not a GeoJSON FeatureCollection" });
    // RFC 7946 §3.3: a FeatureCollection has a member "features" whose value is an array.
    expect(readGeocodeResponse({ type: "FeatureCollection" }).ok).toBe(false);
    expect(readGeocodeResponse({ type: "FeatureCollection", features: [] })).toEqual({ ok: true, candidates: [] });
  });
});

describe("the request and the cache key", () => {
  it("URL-encodes the address into {address} (RFC 3986 percent-encoding) and adds the headers", () => {
    const r = buildGeocodeRequest("https://geo.example/search?q={address}&format=geojson", "12 Kiln Lane, Brickfield & Co", {
      "X-Api-Key": "k",
    });
    // RFC 3986 §2.1: space %20, comma %2C, ampersand %26.
    expect(r.url).toBe("https://geo.example/search?q=12%20Kiln%20Lane%2C%20Brickfield%20%26%20Co&format=geojson");
    expect(r.headers).toEqual({ "X-Api-Key": "k" });
  });

  it("checks the template", () => {
    expect(checkGeocoderTemplate("https://geo.example/search?q={address}")).toBeUndefined();
    expect(checkGeocoderTemplate("https://geo.example/search?q=")).toMatch(/has no \{address\}/);
    expect(checkGeocoderTemplate("geo.example/{address}")).toMatch(/not a web address/);
    expect(checkGeocoderTemplate("ftp://geo.example/{address}")).toMatch(/must start with https:\/\//);
    expect(() => buildGeocodeRequest("nothing", "x")).toThrow(RangeError);
  });

  it("reads header lines as RFC 9110 field names and values", () => {
    expect(parseHeaderLine("X-Api-Key: abc: 1")).toEqual({ name: "X-Api-Key", value: "abc: 1" });
    expect(parseHeaderLine("no colon here")).toHaveProperty("message");
    expect(parseHeaderLine("Bad Name: 1")).toHaveProperty("message");
  });

  it("names the service without the address or anything that looks like a key", () => {
    expect(geocodeServiceId("https://g.example/s?q={address}&api_key=SECRET&lang=en&format=geojson")).toBe(
      "https://g.example/s?format=geojson&lang=en",
    );
    expect(geocodeServiceId("https://g.example/search/{address}.json?token=x")).toBe("https://g.example/search/{address}.json");
  });

  it("normalises an address: case, accents, punctuation and spaces do not count", () => {
    expect(normaliseAddress("  12, Kiln Lane;  BRICKFIELD ")).toBe("12 kiln lane brickfield");
    expect(normaliseAddress("Rue de l'Église 3")).toBe("rue de l eglise 3");
    expect(geocodeCacheKey("12 Kiln Lane", "s")).toBe(geocodeCacheKey("12, kiln  lane.", "s"));
    expect(geocodeCacheKey("12 Kiln Lane", "s")).not.toBe(geocodeCacheKey("12 Kiln Lane", "t"));
  });
});

describe("rating a match", () => {
  const at = (lat: number, lon: number, extra: object = {}) => ({ lat, lon, label: `${lat}, ${lon}`, ...extra });

  it("found, approximate, ambiguous, not found", () => {
    expect(rateMatch([]).quality).toBe("not-found");
    expect(rateMatch([at(52.09, 5.12, { precision: "house" })]).quality).toBe("found");
    expect(rateMatch([at(52.09, 5.12)]).quality).toBe("found");
    expect(rateMatch([at(52.09, 5.12, { precision: "street" })]).quality).toBe("approximate");
    expect(rateMatch([at(52.09, 5.12, { precision: "town" })]).quality).toBe("approximate");
    // 52.09,5.12 to 52.35,5.68 is about 46 km (great circle; hand check: 0.26° lat ≈ 29 km, 0.56° lon at 52° ≈ 38 km).
    const two = rateMatch([at(52.09, 5.12, { confidence: 0.8 }), at(52.35, 5.68, { confidence: 0.78 })]);
    expect(two.quality).toBe("ambiguous");
    expect(two.note).toMatch(/2 candidates up to 4\d km apart/);
    // A far candidate of much lower confidence is no rival.
    expect(rateMatch([at(52.09, 5.12, { confidence: 0.9 }), at(52.35, 5.68, { confidence: 0.2 })]).quality).toBe("found");
    // Candidates within 5 km of each other (one place, several records) are not ambiguous.
    expect(rateMatch([at(52.09, 5.12), at(52.1, 5.13)]).quality).toBe("found");
  });

  it("marks a point far from the others with the reader's far-from-others rule", () => {
    const town = Array.from({ length: 9 }, (_, i) => ({ lat: 52.08 + i * 0.005, lon: 5.1 + (i % 3) * 0.01 }));
    const matches = [rateMatch([at(52.09, 5.12)]), rateMatch([at(57.4, 9.9)])];
    const marked = markFarAway(matches, town);
    expect(marked.map((m) => m.quality)).toEqual(["found", "far"]);
    // With fewer than 8 points the rule does not apply (stop warnings: "with 8 stops or more").
    expect(markFarAway(matches, town.slice(0, 3)).map((m) => m.quality)).toEqual(["found", "found"]);
  });
});
