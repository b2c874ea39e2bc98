/** The placeholder a geocoder URL template must hold where the address goes. */
export const ADDRESS_PLACEHOLDER = "{address}";

/** An HTTP GET request to a geocoder. */
export interface GeocodeRequest {
  readonly url: string;
  readonly headers: Readonly<Record<string, string>>;
}

/**
 * Check a geocoder URL template as the user typed it (CLI option, pane field).
 *
 * @param template - the URL with `{address}` where the address goes
 * @returns `undefined` when usable, else what is wrong and how to fix it
 * @example checkGeocoderTemplate("https://geo.example/search?q={address}") // => undefined
 */
export function checkGeocoderTemplate(template: string): string | undefined {
  const t = template.trim();
  const example = "such as https://geocoder.example/search?q={address}&format=geojson";
  if (!t.includes(ADDRESS_PLACEHOLDER)) {
    return `the geocoder URL "${t}" has no ${ADDRESS_PLACEHOLDER}; put ${ADDRESS_PLACEHOLDER} where the address goes, ${example}.`;
  }
  let url: URL;
  try {
    url = new URL(t.replaceAll(ADDRESS_PLACEHOLDER, "x"));
  } catch {
    return `the geocoder URL "${t}" is not a web address; type a full URL starting with https:// (or http://), ${example}.`;
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") {
    return `the geocoder URL "${t}" must start with https:// or http://, ${example}.`;
  }
  return undefined;
}

/**
 * Build the request for one address: `{address}` replaced by the URL-encoded address
 * (`encodeURIComponent`, RFC 3986 §2.1 percent-encoding), plus the user's extra headers.
 *
 * @param template - a template that passes `checkGeocoderTemplate`
 * @param address - the address as joined from the row
 * @param headers - extra request headers (an API key), by name
 * @returns the request
 * @throws RangeError when the template is not usable (see `checkGeocoderTemplate`)
 * @example buildGeocodeRequest("https://g.example/s?q={address}", "1 Kiln Lane, Brickfield").url
 * // => "https://g.example/s?q=1%20Kiln%20Lane%2C%20Brickfield"
 */
export function buildGeocodeRequest(template: string, address: string, headers: Readonly<Record<string, string>> = {}): GeocodeRequest {
  const problem = checkGeocoderTemplate(template);
  if (problem !== undefined) throw new RangeError(`template: ${problem}`);
  return { url: template.trim().replaceAll(ADDRESS_PLACEHOLDER, encodeURIComponent(address)), headers: { ...headers } };
}

/**
 * Read one extra header as typed, "Name: value".
 *
 * @param line - the header line
 * @returns the name and value, or a message saying how to write it
 * @example parseHeaderLine("X-Api-Key: 123") // => { name: "X-Api-Key", value: "123" }
 */
export function parseHeaderLine(line: string): { name: string; value: string } | { message: string } {
  const at = line.indexOf(":");
  const name = at < 0 ? "" : line.slice(0, at).trim();
  // Header names are RFC 9110 §5.6.2 tokens.
  if (at < 0 || !/^[!#$%&'*+\-.^_`|~0-9A-Za-z]+$/.test(name)) {
    return { message: `header "${line}" is not "Name: value"; type it such as "X-Api-Key: abc123".` };
  }
  return { name, value: line.slice(at + 1).trim() };
}

/**
 * Which service a template asks, for the cache key: the URL without the address and without
 * query parameters that look like credentials (key, token, secret, signature, auth), so a key
 * never lands in the workbook and a renewed key keeps the cache.
 *
 * @param template - a usable template
 * @returns e.g. "https://geo.example/search?format=geojson"
 * @example geocodeServiceId("https://g.example/s?q={address}&key=abc&lang=en") // => "https://g.example/s?lang=en"
 */
export function geocodeServiceId(template: string): string {
  const marker = "kiln-address-marker";
  const url = new URL(template.trim().replaceAll(ADDRESS_PLACEHOLDER, marker));
  const kept = [...url.searchParams].filter(([k, v]) => !v.includes(marker) && !/key|token|secret|signature|auth/i.test(k));
  kept.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  const query = new URLSearchParams(kept).toString();
  return `${url.origin}${url.pathname.replaceAll(marker, ADDRESS_PLACEHOLDER)}${query ? `?${query}` : ""}`;
}
