/**
 * Seconds as "m:ss" for elapsed and remaining run time.
 *
 * @param seconds - a duration in seconds
 * @returns the text; "–" for a negative or non-finite value
 * @example formatDuration(75.4) // => "1:15"
 */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return "–";
  const s = Math.round(seconds);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, "0")}`;
}
