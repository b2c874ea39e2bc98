import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { geocodeAddresses, rateMatch, type GeocodeCache, type GeocodeProgress } from "../../src/geocode/index.js";
import { startGeocodeServer, type GeocodeServer } from "./geocodeServer.js";

// A loopback service from an invented address book (geocodeServer.ts); nothing leaves 127.0.0.1.
let server: GeocodeServer;
beforeAll(async () => {
  server = await startGeocodeServer();
});
afterAll(async () => {
  await server.close();
});

const fast = { ratePerSecond: 50, retryBaseMs: 20 };

describe("geocodeAddresses against a loopback service", () => {
  it("finds, rates and caches; a second run makes zero requests", async () => {
    const cache: GeocodeCache = new Map();
    const addresses = ["1 Kiln Lane, Brickfield", "Clay Street, Brickfield", "Market Square", "Nowhere Road 9", "rfc point"];
    const before = server.seen.length;
    const run = await geocodeAddresses(addresses, { template: server.template, cache, ...fast });
    expect(run.error).toBeUndefined();
    expect(run.requests).toBe(5);
    expect(server.seen.length - before).toBe(5);
    const quality = addresses.map((a) => rateMatch(run.answers.get(a)!).quality);
    expect(quality).toEqual(["found", "approximate", "ambiguous", "not-found", "found"]);
    // RFC 7946 Appendix A.1 Point [100.0, 0.0]: longitude 100, latitude 0.
    expect(run.answers.get("rfc point")![0]).toMatchObject({ lat: 0, lon: 100 });
    expect(run.answers.get("1 Kiln Lane, Brickfield")![0]).toMatchObject({ lat: 52.0903, lon: 5.1201, label: "1 Kiln Lane, Brickfield" });
    expect(cache.size).toBe(5);

    const again = await geocodeAddresses(addresses, { template: server.template, cache, ...fast });
    expect(again.requests).toBe(0);
    expect(server.seen.length - before).toBe(5);
    expect([...again.answers.entries()]).toEqual([...run.answers.entries()]);

    // "Look up again" ignores the cache.
    const fresh = await geocodeAddresses(addresses.slice(0, 2), { template: server.template, cache, again: true, ...fast });
    expect(fresh.requests).toBe(2);
  });

  it("asks once for two spellings of one address", async () => {
    const run = await geocodeAddresses(["7 Kiln Lane, Brickfield", "7 kiln lane brickfield"], {
      template: server.template,
      cache: new Map(),
      ...fast,
    });
    expect(run.requests).toBe(1);
    expect(run.answers.size).toBe(2);
  });

  it("keeps the default rate of 1 request per second, request start to request start, as the service measures it", async () => {
    const before = server.seen.length;
    const progress: GeocodeProgress[] = [];
    const started: number[] = [];
    const answered: number[] = [];
    await geocodeAddresses(
      ["3 Slip Road, Brickfield", "12 Glaze Street, Potterton", "4 Throw Court, Potterton", "7 Kiln Lane, Brickfield"],
      {
        template: server.template,
        cache: new Map(),
        onProgress: (p) => progress.push(p),
        // Stamps on the service's own clock (the loopback service runs in this process: performance.now).
        fetch: async (input, init) => {
          started.push(performance.now());
          const response = await fetch(input, init);
          answered.push(performance.now());
          return response;
        },
      },
    );
    const at = server.seen.slice(before).map((s) => s.atMs);
    expect(at).toHaveLength(4);
    // At most 1 request per second (the usage policy of public community geocoders, common practice),
    // counted from the start of one request to the start of the next: every request the service
    // sees began at least 1 s after the previous one began (1 ms for the stamp taken just before
    // the call), and only after the previous one was answered (one request at a time).
    for (let i = 1; i < at.length; i++) {
      expect(started[i]! - started[i - 1]!).toBeGreaterThanOrEqual(999);
      expect(at[i]! - started[i - 1]!).toBeGreaterThanOrEqual(999);
      expect(at[i]!).toBeGreaterThanOrEqual(answered[i - 1]!);
    }
    expect(progress.map((p) => p.done)).toEqual([0, 1, 2, 3, 4]);
    expect(progress[0]).toMatchObject({ total: 4, secondsLeft: 4 });
    expect(progress.at(-1)).toMatchObject({ done: 4, total: 4, secondsLeft: 0 });
  });

  it("honours Retry-After on 429 and then gets the answer", async () => {
    const before = server.seen.length;
    const run = await geocodeAddresses(["busy 1 Kiln Lane, Brickfield"], { template: server.template, cache: new Map(), ...fast });
    expect(run.error).toBeUndefined();
    expect(run.answers.get("busy 1 Kiln Lane, Brickfield")![0]!.label).toBe("1 Kiln Lane, Brickfield");
    const at = server.seen.slice(before).map((s) => s.atMs);
    expect(at).toHaveLength(2);
    // Retry-After: 1 (RFC 9110 §10.2.3, delay-seconds), not the 20 ms backoff.
    expect(at[1]! - at[0]!).toBeGreaterThanOrEqual(999);
  });

  it("gives up on 500 after the bounded retries, naming the service and what it answered", async () => {
    const before = server.seen.length;
    const run = await geocodeAddresses(["broken 1"], { template: server.template, cache: new Map(), ...fast, maxRetries: 2 });
    expect(server.seen.length - before).toBe(3);
    expect(run.error).toContain(`the geocoding service ${server.origin}/search?format=geojson answered HTTP 500 "internal trouble"`);
    expect(run.error).toContain("(3 tries)");
  });

  it("gives up on a service that does not answer in time", async () => {
    const run = await geocodeAddresses(["slow 1"], { template: server.template, cache: new Map(), ...fast, timeoutMs: 150, maxRetries: 1 });
    expect(run.error).toMatch(/did not answer within 0\.15 s \(2 tries\)/);
  });

  it("stops at malformed JSON and at JSON that is not GeoJSON, without retrying", async () => {
    const before = server.seen.length;
    const bad = await geocodeAddresses(["garbled 1"], { template: server.template, cache: new Map(), ...fast });
    expect(bad.error).toMatch(/answered text that is not JSON: "\{\\"type\\": \\"FeatureCollection\\", \\"features\\": \["/);
    const other = await geocodeAddresses(["notgeo 1"], { template: server.template, cache: new Map(), ...fast });
    expect(other.error).toMatch(/answered a JSON object with no "type", not a GeoJSON FeatureCollection/);
    expect(server.seen.length - before).toBe(2);
  });

  it("reports an unreachable service", async () => {
    const closed = await startGeocodeServer();
    const template = closed.template;
    await closed.close();
    const run = await geocodeAddresses(["1 Kiln Lane"], { template, cache: new Map(), ...fast, maxRetries: 1 });
    expect(run.error).toMatch(/could not be reached .* \(2 tries\)/);
  });

  it("cancel keeps what was found", async () => {
    const controller = new AbortController();
    const cache: GeocodeCache = new Map();
    const addresses = ["9 Saggar Row, Glazebury", "2 Bisque Way, Glazebury", "5 Pug Mill Lane, Brickfield", "1 Depot Yard, Brickfield"];
    const run = await geocodeAddresses(addresses, {
      template: server.template,
      cache,
      ratePerSecond: 20,
      signal: controller.signal,
      onProgress: (p) => {
        if (p.done === 2) controller.abort();
      },
    });
    expect(run.cancelled).toBe(true);
    expect([...run.answers.keys()]).toEqual(addresses.slice(0, 2));
    expect(cache.size).toBe(2);
    // The next run asks only for the rest.
    const rest = await geocodeAddresses(addresses, { template: server.template, cache, ...fast });
    expect(rest.requests).toBe(2);
  });

  it("sends the user's headers and an Accept for GeoJSON (RFC 7946 §12: application/geo+json)", async () => {
    const before = server.seen.length;
    await geocodeAddresses(["1 Kiln Lane, Brickfield"], {
      template: server.template,
      cache: new Map(),
      headers: { "X-Api-Key": "test-key" },
      ...fast,
    });
    const h = server.seen[before]!.headers;
    expect(h["x-api-key"]).toBe("test-key");
    expect(h["accept"]).toContain("application/geo+json");
  });
});
