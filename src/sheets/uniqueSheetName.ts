/** Excel's longest sheet name, in characters (UTF-16 code units, as Excel counts them). */
export const MAX_SHEET_NAME_LENGTH = 31;

/** The name used when the wanted one is blank after cleaning. */
export const FALLBACK_SHEET_NAME = "Plan";

/** Names Excel reserves for itself ("History" is used by change tracking; common practice). */
const RESERVED = ["HISTORY"];

/**
 * A valid, free sheet name as close as possible to the wanted one, by Excel's rules (which
 * the Office.js docs do not list, so we enforce them ourselves):
 * - `/ \ :` become "-" (they usually separate dates and times: "2026/12/01" -> "2026-12-01"),
 *   `? * [ ]` and control characters become a space; runs of spaces collapse;
 * - no leading or trailing apostrophe; blank falls back to "Plan";
 * - at most 31 characters; never "History";
 * - unique ignoring case: "Plan 2", "Plan 2 (2)", "Plan 2 (3)", with the base truncated
 *   before the suffix so the result stays within 31 characters.
 *
 * @param wanted - the scenario name the user typed
 * @param existing - names of the sheets already in the workbook
 * @returns a name Excel accepts and no sheet in `existing` has
 * @throws TypeError when `wanted` is not a string or `existing` is not an array of strings
 * @example uniqueSheetName("Plan 2", ["plan 2"]) // => "Plan 2 (2)"
 * @example uniqueSheetName("Mon 1/12: [late]?", []) // => "Mon 1-12- late"
 */
export function uniqueSheetName(wanted: string, existing: readonly string[]): string {
  if (typeof wanted !== "string") throw new TypeError("uniqueSheetName: wanted must be a string");
  if (!Array.isArray(existing) || existing.some((e) => typeof e !== "string")) {
    throw new TypeError("uniqueSheetName: existing must be an array of strings");
  }
  const taken = new Set([...existing.map(fold), ...RESERVED]);
  const base = cleanSheetName(wanted);
  const whole = truncate(base, MAX_SHEET_NAME_LENGTH);
  if (!taken.has(fold(whole))) return whole;
  for (let n = 2; ; n++) {
    const suffix = ` (${n})`;
    const head = trimEnds(truncate(base, MAX_SHEET_NAME_LENGTH - suffix.length));
    const candidate = (head === "" ? FALLBACK_SHEET_NAME : head) + suffix;
    if (!taken.has(fold(candidate))) return candidate;
  }
}

/**
 * The wanted name with forbidden characters replaced, spaces collapsed and apostrophes
 * trimmed from both ends; "Plan" when nothing is left. Not truncated, not made unique.
 *
 * @param wanted - any text
 * @returns the cleaned name
 * @example cleanSheetName("  'a*b'  ") // => "a b"
 */
export function cleanSheetName(wanted: string): string {
  const replaced = wanted
    .replace(/[/\\:]/g, "-")
    // eslint-disable-next-line no-control-regex
    .replace(/[?*[\]\u0000-\u001f\u007f]/g, " ")
    .replace(/\s+/g, " ");
  const cleaned = trimEnds(replaced);
  return cleaned === "" ? FALLBACK_SHEET_NAME : cleaned;
}

/** Excel compares sheet names without regard to case. */
function fold(name: string): string {
  return name.toUpperCase();
}

/** Strip spaces and apostrophes from both ends until neither is left there. */
function trimEnds(name: string): string {
  return name.replace(/^[\s']+|[\s']+$/g, "");
}

/** At most `max` UTF-16 code units, never splitting a surrogate pair. */
function truncate(name: string, max: number): string {
  if (name.length <= max) return name;
  let out = "";
  for (const ch of name) {
    if (out.length + ch.length > max) break;
    out += ch;
  }
  return trimEnds(out) || FALLBACK_SHEET_NAME;
}

/**
 * Excel's sheet-name rules (not in the Office.js docs, OFFICE-NOTES.md), enforced by both adapters
 * before they add a sheet: 1 to 31 characters, none of : \ / ? * [ ], not starting or ending with '.
 *
 * @param name - the name to check
 * @throws RangeError naming the rule the name breaks
 * @example checkSheetName("Plan [2]") // throws RangeError
 */
export function checkSheetName(name: string): void {
  if (typeof name !== "string" || name.length === 0 || name.length > MAX_SHEET_NAME_LENGTH) {
    throw new RangeError(`name must be 1 to ${MAX_SHEET_NAME_LENGTH} characters, got "${String(name)}"`);
  }
  if (/[:\\/?*[\]]/.test(name) || name.startsWith("'") || name.endsWith("'")) {
    throw new RangeError(`name "${name}" contains a character Excel forbids in sheet names (: \\ / ? * [ ] or a leading/trailing ')`);
  }
}
