/**
 * A loopback geocoding service for tests: node:http on 127.0.0.1 (a free port), answering from
 * a small invented address book in GeoJSON (RFC 7946), with the failure cases a real service
 * shows. It records when each request arrived, so tests can check the rate limit as the
 * service sees it. CORS headers let the standalone page call it.
 */
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { dispatcherAddressBook } from "../fixtures/dispatcherWorkbook.js";

/** One point of the invented address book: [longitude, latitude] as GeoJSON orders them. */
interface Entry {
  readonly coordinates: readonly [number, number];
  readonly label: string;
  readonly type?: string;
  readonly confidence?: number;
}

/** Invented addresses in an invented region (towns Brickfield, Potterton, Glazebury). */
export const ADDRESS_BOOK: Readonly<Record<string, readonly Entry[]>> = {
  "1 kiln lane brickfield": [{ coordinates: [5.1201, 52.0903], label: "1 Kiln Lane, Brickfield", type: "house", confidence: 0.98 }],
  "7 kiln lane brickfield": [{ coordinates: [5.1215, 52.0911], label: "7 Kiln Lane, Brickfield", type: "house", confidence: 0.97 }],
  "3 slip road brickfield": [{ coordinates: [5.1302, 52.0855], label: "3 Slip Road, Brickfield", type: "house" }],
  "12 glaze street potterton": [{ coordinates: [5.2004, 52.1102], label: "12 Glaze Street, Potterton", type: "house" }],
  "4 throw court potterton": [{ coordinates: [5.1951, 52.1153], label: "4 Throw Court, Potterton" }],
  "9 saggar row glazebury": [{ coordinates: [5.0802, 52.0601], label: "9 Saggar Row, Glazebury", type: "house" }],
  "2 bisque way glazebury": [{ coordinates: [5.0755, 52.0648], label: "2 Bisque Way, Glazebury", type: "house" }],
  "5 pug mill lane brickfield": [{ coordinates: [5.115, 52.095], label: "5 Pug Mill Lane, Brickfield", type: "house" }],
  "clay street brickfield": [{ coordinates: [5.125, 52.087], label: "Clay Street, Brickfield", type: "street", confidence: 0.7 }],
  "market square": [
    { coordinates: [5.121, 52.089], label: "Market Square, Brickfield", type: "street", confidence: 0.8 },
    { coordinates: [5.68, 52.35], label: "Market Square, Far Kilnsey", type: "street", confidence: 0.78 },
  ],
  "1 depot yard brickfield": [{ coordinates: [5.11, 52.08], label: "1 Depot Yard, Brickfield", type: "house" }],
  "1 harbour road saltmarsh": [{ coordinates: [9.9, 57.4], label: "1 Harbour Road, Saltmarsh", type: "house" }],
  // RFC 7946 Appendix A.1, the Point example: "coordinates": [100.0, 0.0].
  "rfc point": [{ coordinates: [100.0, 0.0], label: "RFC 7946 A.1 Point" }],
  // The bakery round of test/fixtures/dispatcherWorkbook.ts (towns Crustwick, Loafton).
  ...dispatcherAddressBook(),
};

/** A request as the service saw it. */
export interface SeenRequest {
  readonly query: string;
  /** Arrival, milliseconds (performance.now of the server's process). */
  readonly atMs: number;
  readonly headers: IncomingMessage["headers"];
}

/** A running test service. */
export interface GeocodeServer {
  /** URL template with {address}, e.g. "http://127.0.0.1:PORT/search?q={address}&format=geojson". */
  readonly template: string;
  readonly origin: string;
  readonly seen: SeenRequest[];
  close(): Promise<void>;
}

/**
 * Start the service. Queries (normalised: lower case, punctuation as spaces) with special words:
 * "busy" answers 429 with Retry-After: 1 to its first request, then its entry; "broken" always
 * 500; "slow" never answers; "garbled" malformed JSON; "notgeo" JSON that is not GeoJSON;
 * anything not in the book an empty FeatureCollection (not found).
 */
export async function startGeocodeServer(): Promise<GeocodeServer> {
  const seen: SeenRequest[] = [];
  const busyTold = new Set<string>();
  const hanging: ServerResponse[] = [];
  const server = createServer((req, res) => {
    res.setHeader("Access-Control-Allow-Origin", "*");
    res.setHeader("Access-Control-Allow-Headers", "*");
    if (req.method === "OPTIONS") {
      res.writeHead(204).end();
      return;
    }
    const url = new URL(req.url ?? "/", "http://127.0.0.1");
    const query = (url.searchParams.get("q") ?? "")
      .toLowerCase()
      .replace(/[^\p{L}\p{N}]+/gu, " ")
      .trim();
    seen.push({ query, atMs: performance.now(), headers: req.headers });
    if (query.includes("slow")) {
      hanging.push(res);
      return;
    }
    if (query.includes("broken")) {
      res.writeHead(500, { "Content-Type": "text/plain" }).end("internal trouble");
      return;
    }
    if (query.includes("garbled")) {
      res.writeHead(200, { "Content-Type": "application/json" }).end('{"type": "FeatureCollection", "features": [');
      return;
    }
    if (query.includes("notgeo")) {
      res.writeHead(200, { "Content-Type": "application/json" }).end(JSON.stringify({ results: [{ lat: 1, lng: 2 }] }));
      return;
    }
    if (query.includes("busy") && !busyTold.has(query)) {
      busyTold.add(query);
      res.writeHead(429, { "Retry-After": "1", "Content-Type": "text/plain" }).end("slow down");
      return;
    }
    // The invented default country of the tests, "Kilnland", is accepted after any address.
    const entries = ADDRESS_BOOK[query.replace(/^busy /, "").replace(/ kilnland$/, "")] ?? [];
    const body = {
      type: "FeatureCollection",
      features: entries.map((e) => ({
        type: "Feature",
        geometry: { type: "Point", coordinates: e.coordinates },
        properties: {
          label: e.label,
          ...(e.type ? { type: e.type } : {}),
          ...(e.confidence !== undefined ? { confidence: e.confidence } : {}),
        },
      })),
    };
    res.writeHead(200, { "Content-Type": "application/geo+json" }).end(JSON.stringify(body));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  const origin = `http://127.0.0.1:${port}`;
  return {
    template: `${origin}/search?q={address}&format=geojson`,
    origin,
    seen,
    close: () =>
      new Promise<void>((resolve) => {
        for (const r of hanging) r.destroy();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
