import { DAY_MIN } from "../core/index.js";

/**
 * Minutes from midnight as "hh:mm" for messages; past midnight gets "+1d".
 *
 * @param minutes - minutes from the planning day's midnight
 * @returns e.g. "08:30", "01:00+1d", or "open end" for Infinity
 * @example formatClock(1500) // => "01:00+1d"
 */
export function formatClock(minutes: number): string {
  if (!Number.isFinite(minutes)) return "open end";
  const whole = Math.round(minutes);
  const day = Math.floor(whole / DAY_MIN);
  const inDay = whole - day * DAY_MIN;
  const hh = String(Math.floor(inDay / 60)).padStart(2, "0");
  const mm = String(inDay % 60).padStart(2, "0");
  return `${hh}:${mm}${day > 0 ? `+${day}d` : ""}`;
}
