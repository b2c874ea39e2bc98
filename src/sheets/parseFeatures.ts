/**
 * Feature names from a comma- or semicolon-separated cell ("fridge, tail lift"), trimmed and
 * lower-cased so that stops and vehicles compare without regard to case or spacing.
 *
 * @param text - the cell text
 * @returns distinct feature names in the order given
 * @example parseFeatures("Fridge; tail  lift, fridge") // => ["fridge", "tail lift"]
 */
export function parseFeatures(text: string): string[] {
  const names = text
    .split(/[,;]/)
    .map((s) => s.trim().toLowerCase().replace(/\s+/g, " "))
    .filter((s) => s !== "");
  return [...new Set(names)];
}
