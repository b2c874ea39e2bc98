import { buildGeocodeRequest, geocodeServiceId } from "./buildGeocodeRequest.js";
import type { GeocodeCandidate } from "./GeocodeTypes.js";
import { geocodeCacheKey } from "./normaliseAddress.js";
import { readGeocodeResponse } from "./readGeocodeResponse.js";

/** Answers by cache key (`geocodeCacheKey`); an empty list is a remembered "not found". */
export type GeocodeCache = Map<string, readonly GeocodeCandidate[]>;

/** Progress of a lookup run. */
export interface GeocodeProgress {
  /** Addresses answered so far (from the cache or the service) of `total`. */
  readonly done: number;
  readonly total: number;
  /** Requests sent so far (retries included). */
  readonly requests: number;
  /** Estimated seconds until the last address is answered, at the rate limit. */
  readonly secondsLeft: number;
}

/** Options of `geocodeAddresses`. */
export interface GeocodeAddressesOptions {
  /** URL template with `{address}` (see `checkGeocoderTemplate`). */
  readonly template: string;
  /** Extra request headers (an API key). They are sent, never stored. */
  readonly headers?: Readonly<Record<string, string>>;
  /** Requests per second at most (default 1, the usage policy of public community geocoders: common practice). */
  readonly ratePerSecond?: number;
  /** Milliseconds to wait for one answer (default 10 000). */
  readonly timeoutMs?: number;
  /** Retries of one address after a network error, a timeout, 429, 500, 502, 503 or 504 (default 3). */
  readonly maxRetries?: number;
  /** First backoff after a failed try, doubled on each retry (default 1 000 ms). */
  readonly retryBaseMs?: number;
  /** Longest Retry-After honoured; a longer one ends the run with a message (default 120 000 ms). */
  readonly maxWaitMs?: number;
  /** Known answers; new ones are added. */
  readonly cache: GeocodeCache;
  /** Ask the service again even for addresses in the cache ("look up again"). */
  readonly again?: boolean;
  /** Cancel: the run stops and returns what it found so far. */
  readonly signal?: AbortSignal;
  readonly onProgress?: (p: GeocodeProgress) => void;
  /** The fetch to use (default the global `fetch` of Node 20 and browsers). */
  readonly fetch?: typeof fetch;
  /** Milliseconds clock (default `performance.now`, monotonic). */
  readonly now?: () => number;
}

/** What a run found: answers by address as given, and whether it ended early. */
export interface GeocodeRun {
  /** Candidates by address (as given); addresses not yet asked when cancelled or failed are absent. */
  readonly answers: ReadonlyMap<string, readonly GeocodeCandidate[]>;
  /** Requests sent (0 when every address was in the cache). */
  readonly requests: number;
  readonly cancelled: boolean;
  /** Why the run stopped: the service could not be reached or did not answer GeoJSON. */
  readonly error?: string;
}

/** Statuses worth another try (RFC 9110 §15.6: temporary server conditions; 429: RFC 6585 §4). */
const RETRY_STATUS = new Set([429, 500, 502, 503, 504]);

/**
 * Look up addresses one request at a time, politely: at most `ratePerSecond` requests per second
 * (each request starts at least 1/rate s after the previous request started, and only once that
 * one has been answered),
 * a timeout per request, `Retry-After` honoured on 429 and 503 (RFC 9110 §10.2.3, seconds or an
 * HTTP date), bounded retries with doubling backoff on network errors and temporary statuses.
 * Cached answers are used first (unless `again`); every new answer is added to the cache. Cancel
 * keeps what was found. A service that cannot be reached, or answers something that is not a
 * GeoJSON FeatureCollection, ends the run with `error` naming the service and what it answered.
 *
 * @param addresses - addresses to look up (repeats are asked once)
 * @param options - the service, limits, cache and callbacks
 * @returns the answers found, the number of requests and how the run ended
 * @example const run = await geocodeAddresses(["1 Kiln Lane, Brickfield"], { template, cache: new Map() });
 */
export async function geocodeAddresses(addresses: readonly string[], options: GeocodeAddressesOptions): Promise<GeocodeRun> {
  const rate = options.ratePerSecond ?? 1;
  if (!(rate > 0)) throw new RangeError(`ratePerSecond must be above 0, got ${rate}`);
  const intervalMs = 1000 / rate;
  const timeoutMs = options.timeoutMs ?? 10_000;
  const maxRetries = options.maxRetries ?? 3;
  const retryBaseMs = options.retryBaseMs ?? 1000;
  const maxWaitMs = options.maxWaitMs ?? 120_000;
  const doFetch = options.fetch ?? globalThis.fetch.bind(globalThis);
  const now = options.now ?? (() => performance.now());
  const service = geocodeServiceId(options.template);
  const signal = options.signal;

  const unique = [...new Set(addresses)];
  const answers = new Map<string, readonly GeocodeCandidate[]>();
  if (!options.again) {
    for (const a of unique) {
      const cached = options.cache.get(geocodeCacheKey(a, service));
      if (cached !== undefined) answers.set(a, cached);
    }
  }
  const toAsk = unique.filter((a) => !answers.has(a));
  // Two spellings of one address share a key: asked once per run.
  const thisRun = new Map<string, readonly GeocodeCandidate[]>();
  let requests = 0;
  // Spacing counts from request start to request start: the polite rate is the number of requests
  // begun per second. One request at a time still holds, since the next waits for the answer too.
  let lastStart = -Infinity;
  let lastAnswer: number;
  let spentMs = 0;
  let asked = 0;
  const report = (): void => {
    const left = toAsk.length - asked;
    const perMs = Math.max(intervalMs, asked > 0 ? spentMs / asked : 0);
    options.onProgress?.({ done: answers.size, total: unique.length, requests, secondsLeft: (left * perMs) / 1000 });
  };
  const stop = (error?: string): GeocodeRun => ({
    answers,
    requests,
    cancelled: error === undefined,
    ...(error !== undefined ? { error } : {}),
  });
  report();
  for (const address of toAsk) {
    const key = geocodeCacheKey(address, service);
    const fresh = thisRun.get(key);
    if (fresh !== undefined) {
      answers.set(address, fresh);
      asked++;
      report();
      continue;
    }
    if (signal?.aborted) return stop();
    const started = now();
    let failure = "";
    let candidates: GeocodeCandidate[] | undefined;
    for (let attempt = 0; attempt <= maxRetries; attempt++) {
      await sleepUntil(lastStart + intervalMs, now, signal);
      if (signal?.aborted) return stop();
      requests++;
      const tried = await tryOnce(
        doFetch,
        buildGeocodeRequest(options.template, address, options.headers ?? {}),
        timeoutMs,
        signal,
        () => (lastStart = now()),
      );
      lastAnswer = now();
      if (signal?.aborted) return stop();
      if ("candidates" in tried) {
        candidates = tried.candidates;
        break;
      }
      failure = tried.failure;
      if (tried.final) return stop(serviceMessage(service, address, failure));
      if (attempt === maxRetries) break;
      let waitMs = retryBaseMs * 2 ** attempt;
      if (tried.retryAfterMs !== undefined) {
        if (tried.retryAfterMs > maxWaitMs) {
          return stop(serviceMessage(service, address, `${failure} and asked to wait ${Math.round(tried.retryAfterMs / 1000)} s`));
        }
        waitMs = Math.max(tried.retryAfterMs, intervalMs);
      }
      await sleepUntil(lastAnswer + waitMs, now, signal);
    }
    if (candidates === undefined) {
      const tries = maxRetries + 1;
      return stop(serviceMessage(service, address, `${failure} (${tries} ${tries === 1 ? "try" : "tries"})`));
    }
    options.cache.set(key, candidates);
    thisRun.set(key, candidates);
    answers.set(address, candidates);
    asked++;
    spentMs += now() - started;
    report();
  }
  return { answers, requests, cancelled: false };
}

type Try = { candidates: GeocodeCandidate[] } | { failure: string; final: boolean; retryAfterMs?: number };

async function tryOnce(
  doFetch: typeof fetch,
  request: { url: string; headers: Readonly<Record<string, string>> },
  timeoutMs: number,
  signal: AbortSignal | undefined,
  onSent: () => void,
): Promise<Try> {
  const controller = new AbortController();
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    controller.abort();
  }, timeoutMs);
  const onCancel = (): void => controller.abort();
  signal?.addEventListener("abort", onCancel);
  try {
    const sending = doFetch(request.url, {
      headers: { Accept: "application/geo+json, application/json", ...request.headers },
      signal: controller.signal,
    });
    // The start is stamped once the request is handed over, not before: a delay between deciding
    // to send and sending (a busy machine) must not shorten the gap to the next request.
    onSent();
    const response = await sending;
    const text = await response.text();
    if (!response.ok) {
      const failure = `answered HTTP ${response.status}${text.trim() ? ` ${quote(text)}` : ""}`;
      const retryAfterMs = response.status === 429 || response.status === 503 ? retryAfter(response.headers.get("retry-after")) : undefined;
      return { failure, final: !RETRY_STATUS.has(response.status), ...(retryAfterMs !== undefined ? { retryAfterMs } : {}) };
    }
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      return { failure: `answered text that is not JSON: ${quote(text)}`, final: true };
    }
    const read = readGeocodeResponse(body);
    if (!read.ok) return { failure: `answered ${read.message}: ${quote(text)}`, final: true };
    return { candidates: read.candidates };
  } catch (e) {
    if (timedOut) return { failure: `did not answer within ${timeoutMs / 1000} s`, final: false };
    const cause = e instanceof Error ? (e.cause instanceof Error ? `${e.message}: ${e.cause.message}` : e.message) : String(e);
    return { failure: `could not be reached (${cause})`, final: false };
  } finally {
    clearTimeout(timer);
    signal?.removeEventListener("abort", onCancel);
  }
}

/** Retry-After as milliseconds: delay-seconds or an HTTP date (RFC 9110 §10.2.3). */
function retryAfter(value: string | null): number | undefined {
  if (value === null || value.trim() === "") return undefined;
  if (/^\d+$/.test(value.trim())) return Number(value.trim()) * 1000;
  const at = Date.parse(value);
  return Number.isNaN(at) ? undefined : Math.max(0, at - Date.now());
}

function serviceMessage(service: string, address: string, answered: string): string {
  return `the geocoding service ${service} ${answered} when asked for "${address}"; check the geocoder URL and its headers (the service must answer a GeoJSON FeatureCollection of points), or try again later.`;
}

function quote(text: string): string {
  const t = text.replace(/\s+/g, " ").trim();
  return JSON.stringify(t.length > 120 ? `${t.slice(0, 120)}…` : t);
}

/** Sleep until `now()` reaches `atMs`: timers may fire a little early against a monotonic clock, so check again. */
async function sleepUntil(atMs: number, now: () => number, signal: AbortSignal | undefined): Promise<void> {
  for (let left = atMs - now(); left > 0 && !signal?.aborted; left = atMs - now()) await sleep(Math.ceil(left), signal);
}

function sleep(ms: number, signal: AbortSignal | undefined): Promise<void> {
  if (!(ms > 0) || signal?.aborted) return Promise.resolve();
  return new Promise((resolve) => {
    const done = (): void => {
      clearTimeout(timer);
      signal?.removeEventListener("abort", done);
      resolve();
    };
    const timer = setTimeout(done, ms);
    signal?.addEventListener("abort", done);
  });
}
