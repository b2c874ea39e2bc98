/**
 * Geocoding throughput at the default rate (1 request per second, counted from request start to request start):
 * 100 invented addresses against a loopback GeoJSON service on 127.0.0.1 (a free port), then the
 * same 100 again from the cache. Target: the first run within 105 s with progress shown; the
 * second run makes no request. Prints a table and writes bench/out/geocode.json.
 *
 * Run: npx tsx bench/geocode.ts [--count 100] [--rate 1]
 */
import { mkdirSync, writeFileSync } from "node:fs";
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import { geocodeAddresses, type GeocodeCache } from "../src/geocode/index.js";

const arg = (name: string, fallback: number): number => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const count = arg("count", 100);
const rate = arg("rate", 1);

let requests = 0;
const server = createServer((req, res) => {
  requests++;
  const q = new URL(req.url ?? "/", "http://127.0.0.1").searchParams.get("q") ?? "";
  const n = Number(/(\d+)/.exec(q)?.[1] ?? 0);
  // An invented street grid: house n sits a little east of house n-1.
  const body = {
    type: "FeatureCollection",
    features: [
      { type: "Feature", geometry: { type: "Point", coordinates: [5.1 + n * 0.001, 52.09] }, properties: { label: q, type: "house" } },
    ],
  };
  res.writeHead(200, { "Content-Type": "application/geo+json" }).end(JSON.stringify(body));
});
await new Promise<void>((ok) => server.listen(0, "127.0.0.1", ok));
const template = `http://127.0.0.1:${(server.address() as AddressInfo).port}/search?q={address}`;
const addresses = Array.from({ length: count }, (_, i) => `${i + 1} Bench Street, Brickfield`);
const cache: GeocodeCache = new Map();

const started = performance.now();
let lastLine = "";
const first = await geocodeAddresses(addresses, {
  template,
  cache,
  ratePerSecond: rate,
  onProgress: (p) => {
    lastLine = `${p.done}/${p.total}  about ${Math.ceil(p.secondsLeft)} s left`;
    process.stderr.write(`\r${lastLine}   `);
  },
});
const firstSeconds = (performance.now() - started) / 1000;
process.stderr.write("\n");
const before = requests;
const again = performance.now();
const second = await geocodeAddresses(addresses, { template, cache, ratePerSecond: rate });
const secondSeconds = (performance.now() - again) / 1000;
server.close();

const result = {
  addresses: count,
  ratePerSecond: rate,
  firstRunSeconds: Number(firstSeconds.toFixed(2)),
  firstRunRequests: first.requests,
  secondRunSeconds: Number(secondSeconds.toFixed(3)),
  secondRunRequests: second.requests,
  serverRequestsDuringSecondRun: requests - before,
  lastProgress: lastLine,
};
console.log("| addresses | rate /s | first run s | requests | second run s | requests |");
console.log("|---|---|---|---|---|---|");
console.log(`| ${count} | ${rate} | ${result.firstRunSeconds} | ${first.requests} | ${result.secondRunSeconds} | ${second.requests} |`);
mkdirSync(new URL("./out/", import.meta.url), { recursive: true });
writeFileSync(new URL("./out/geocode.json", import.meta.url), JSON.stringify(result, null, 2) + "\n");
