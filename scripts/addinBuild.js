// Build-time facts of the add-in, shared by webpack.config.js and the tests (plain JavaScript:
// the webpack config imports it without a TypeScript step).

/** office.js for the Office host: Microsoft's documented CDN location (required for store distribution). */
export const OFFICE_JS_CDN = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";

/** Where the dev server serves the pane, and the origin manifest.xml (the template) is written for. */
export const DEV_BASE = "https://localhost:3000";

/**
 * Checks a deployment base URL: HTTPS (Office requires it for add-in pages and icons), no
 * query or fragment; a trailing slash is dropped.
 * @param {string} base
 * @returns {string} the base without a trailing slash
 * @example parseBase("https://example.org/kiln/") // => "https://example.org/kiln"
 */
export function parseBase(base) {
  let url;
  try {
    url = new URL(base);
  } catch {
    throw new RangeError(`--env base must be an absolute URL such as https://example.org/kiln, got "${base}"`);
  }
  if (url.protocol !== "https:")
    throw new RangeError(`--env base must use https (Office loads add-in pages over HTTPS only), got "${base}"`);
  if (url.search || url.hash) throw new RangeError(`--env base must have no query or fragment, got "${base}"`);
  return `${url.origin}${url.pathname}`.replace(/\/+$/, "");
}

/**
 * The manifest for one deployment: every URL under the template's base (`DEV_BASE`) moves to
 * `base`, and the AppDomain becomes the base's origin.
 * @param {string} template - manifest.xml as committed (written for DEV_BASE)
 * @param {string} base - from parseBase
 * @returns {string}
 * @example manifestForBase(xml, "https://example.org/kiln") // SourceLocation https://example.org/kiln/taskpane.html?kiln-host=office
 */
export function manifestForBase(template, base) {
  const origin = new URL(base).origin;
  return template
    .split(`<AppDomain>${DEV_BASE}</AppDomain>`)
    .join(`<AppDomain>${origin}</AppDomain>`)
    .split(`${DEV_BASE}/`)
    .join(`${base}/`);
}

/**
 * Loopback origins a user may run a geocoder or tile server on with plain http (any port).
 * Everything else the user configures must be https (Office requires it inside Excel anyway).
 * CSP host sources have no IPv6 literal form, so `[::1]` cannot be listed: use 127.0.0.1 or localhost.
 */
const LOOPBACK = ["http://localhost:*", "http://127.0.0.1:*"];

/**
 * The Content-Security-Policy of a page, written into its `<meta http-equiv>` at build time
 * (docs/content-security-policy.md says why each directive is what it is).
 *
 * - Scripts only from the page's own origin, never inline or `eval`; the add-in page also
 *   allows Microsoft's office.js CDN (`OFFICE_JS_CDN`'s origin), the standalone page does not.
 * - Styles and workers only from the page's own origin.
 * - Requests (`connect-src`) and images (`img-src`) also to any https origin and to loopback:
 *   the geocoder and the map tiles are services the user types in at run time, so no list
 *   written at build time can name them; the code sends nothing anywhere else (browser test).
 *
 * @param {{ officeHost: boolean }} page - true for the add-in page (taskpane.html)
 * @returns {string} the policy, directives separated by "; "
 * @example contentSecurityPolicy({ officeHost: false }).includes("script-src 'self';") // => true
 */
export function contentSecurityPolicy({ officeHost }) {
  const office = officeHost ? [new URL(OFFICE_JS_CDN).origin] : [];
  return [
    "default-src 'self'",
    ["script-src 'self'", ...office].join(" "),
    "worker-src 'self'",
    "style-src 'self'",
    ["img-src 'self' data: blob: https:", ...LOOPBACK].join(" "),
    ["connect-src 'self' https:", ...LOOPBACK].join(" "),
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'none'",
  ].join("; ");
}
