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
