/**
 * The optional background of the route map: a tile URL template (`{z}/{x}/{y}`, the common
 * "slippy map" tile addressing) and the attribution its provider asks for. Kept in the
 * workbook's add-in settings store under one key, so the choice travels with the workbook.
 * No template means no background and no request.
 */

/** Settings-store key of the map background (JSON of `MapBackground`). */
export const MAP_BACKGROUND_KEY = "kiln.pane.mapBackground";

/** A checked background choice. */
export interface MapBackground {
  /** http(s) URL with `{z}`, `{x}`, `{y}` and optionally `{s}` (subdomain) or `{r}` (retina suffix). */
  readonly template: string;
  /** Plain text shown under the map (never read as HTML). */
  readonly attribution: string;
}

const MAX_ATTRIBUTION = 300;
const ALLOWED = new Set(["z", "x", "y", "s", "r"]);

/**
 * Check the pane's two background fields.
 *
 * @param template - the tile URL template as typed; blank means no background
 * @param attribution - the credit line as typed
 * @returns `{ background }` (undefined for none) or `{ message }` naming the field, the problem and the fix
 * @example parseMapBackground("https://tiles.example/{z}/{x}/{y}.png", "© Example").background?.template // => "https://tiles.example/{z}/{x}/{y}.png"
 */
export function parseMapBackground(template: string, attribution: string): { background: MapBackground | undefined } | { message: string } {
  const t = template.trim();
  const a = attribution.trim();
  if (t === "") return { background: undefined };
  const where = "Background map, Tile URL template";
  const missing = ["{z}", "{x}", "{y}"].filter((p) => !t.includes(p));
  if (missing.length > 0)
    return {
      message: `${where}: ${missing.join(", ")} missing. Type the address of one tile with {z}, {x} and {y} where the zoom, column and row go, e.g. https://tiles.example.org/{z}/{x}/{y}.png.`,
    };
  const unknown = [...t.matchAll(/\{([^}]*)\}/g)].map((m) => m[1]!).filter((k) => !ALLOWED.has(k));
  if (unknown.length > 0)
    return {
      message: `${where}: {${unknown[0]}} is not a placeholder the map fills in. Use only {z}, {x}, {y}, {s} and {r}, or type the value itself.`,
    };
  let url: URL;
  try {
    url = new URL(t.replace(/\{[a-z]\}/g, "0"));
  } catch {
    return { message: `${where}: "${t}" is not a web address. Start it with https:// and the tile server's host name.` };
  }
  if (url.protocol !== "https:" && url.protocol !== "http:")
    return { message: `${where}: ${url.protocol} addresses cannot serve tiles here. Use an https:// address.` };
  if (a === "")
    return { message: "Background map, Attribution: empty. Type the credit line the tile provider asks for; it is shown under the map." };
  if (a.length > MAX_ATTRIBUTION)
    return { message: `Background map, Attribution: ${a.length} characters; shorten it to at most ${MAX_ATTRIBUTION}.` };
  return { background: { template: t, attribution: a } };
}

/**
 * Read the stored background back (a broken or hand-edited entry reads as none).
 *
 * @param stored - the settings store's text under `MAP_BACKGROUND_KEY`, if any
 * @returns the background, or undefined for none
 * @example readMapBackground('{"template":"https://t.example/{z}/{x}/{y}.png","attribution":"© T"}')?.attribution // => "© T"
 */
export function readMapBackground(stored: string | undefined): MapBackground | undefined {
  if (!stored) return undefined;
  try {
    const raw = JSON.parse(stored) as { template?: unknown; attribution?: unknown };
    if (typeof raw.template !== "string" || typeof raw.attribution !== "string") return undefined;
    const parsed = parseMapBackground(raw.template, raw.attribution);
    return "background" in parsed ? parsed.background : undefined;
  } catch {
    return undefined;
  }
}
