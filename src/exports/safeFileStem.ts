const WINDOWS_RESERVED = /^(con|prn|aux|nul|com[0-9]|lpt[0-9])$/i;

/**
 * User text (a vehicle id, a scenario name) as a file name without extension that every common
 * file system accepts: characters other than letters, digits, space, `.`, `_` and `-` become `_`,
 * at most 60 characters, no leading or trailing dots or spaces, never a device name Windows
 * reserves (CON, PRN, AUX, NUL, COM1–9, LPT1–9), never empty.
 *
 * @param text - the user's text
 * @param fallback - the prefix used when the text is empty or reserved
 * @returns the stem
 * @example safeFileStem("Van 1/North", "vehicle") // => "Van 1_North"
 */
export function safeFileStem(text: string, fallback: string): string {
  const base = text
    .replace(/[^\p{L}\p{N} ._-]/gu, "_")
    .slice(0, 60)
    .trim()
    .replace(/^\.+|\.+$/g, "")
    .trim();
  return base === "" || WINDOWS_RESERVED.test(base) ? `${fallback}_${base}` : base;
}
