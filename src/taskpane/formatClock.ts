/**
 * Minutes from midnight as "hh:mm" (a second day shows as "+1 hh:mm").
 *
 * @param minutes - minutes from the planning day's midnight
 * @returns the clock text; "–" for a non-finite value
 * @example formatClock(510) // => "08:30"
 */
export function formatClock(minutes: number): string {
  if (!Number.isFinite(minutes)) return "–";
  const whole = Math.round(minutes);
  const day = Math.floor(whole / 1440);
  const m = ((whole % 1440) + 1440) % 1440;
  const text = `${String(Math.floor(m / 60)).padStart(2, "0")}:${String(m % 60).padStart(2, "0")}`;
  return day === 0 ? text : `${day > 0 ? "+" : ""}${day} ${text}`;
}

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
