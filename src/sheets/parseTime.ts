import { plainCell } from "./cellValue.js";

/**
 * A time of day in minutes from midnight, from a cell.
 *
 * - Numbers are Excel day fractions (0.5 = 12:00); a date-time serial gives its time of day
 *   (45658.75 = 18:00); exactly 1 is 24:00. The fraction is rounded to the nearest second
 *   first, because a typed 08:30 is stored as 0.354166666... and must read as 510.
 * - Text in 24 h form "8:30", "08:30", "14:05:30", "24:00", or 12 h form "8:30 PM",
 *   "12:00 AM" (= 0:00), "8 am", "8.30 pm"; an ISO date-time "2025-01-01T08:30" gives its time.
 * - Text holding a plain number is read like the number (CSV files carry numbers as text),
 *   except a whole number above 1 ("8"), which is too ambiguous and rejected.
 *
 * @param value - a raw cell value
 * @returns minutes from midnight (0..1440, fractional when seconds are given), or
 *   `undefined` when the value is empty or not a time ("25:00", "abc", a negative number)
 * @example parseTime("8:30 PM") // => 1230
 */
export function parseTime(value: unknown): number | undefined {
  const v = plainCell(value);
  if (typeof v === "number") return fromDayNumber(v);
  if (typeof v !== "string") return undefined;
  let t = v.trim().toLowerCase();
  if (t === "") return undefined;
  if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(t)) {
    const n = Number(t);
    // "8" typed as text most likely means 8 o'clock, not day 8: too ambiguous to guess.
    return Number.isInteger(n) && n > 1 ? undefined : fromDayNumber(n);
  }
  const iso = /^\d{4}-\d{2}-\d{2}[t ](.+)$/.exec(t);
  if (iso) t = iso[1]!.replace(/(z|[+-]\d{2}:?\d{2})$/, "");
  const m = /^(\d{1,2})(?:[:.](\d{2}))?(?::(\d{2}(?:\.\d+)?))?\s*(a\.?m\.?|p\.?m\.?)?$/.exec(t);
  if (!m) return undefined;
  const hour = Number(m[1]);
  const minute = m[2] === undefined ? 0 : Number(m[2]);
  const second = m[3] === undefined ? 0 : Number(m[3]);
  const meridiem = m[4]?.[0];
  if (m[2] === undefined && meridiem === undefined) return undefined; // "8" alone is a number, not a time
  if (minute > 59 || second >= 60) return undefined;
  let h = hour;
  if (meridiem !== undefined) {
    if (hour < 1 || hour > 12) return undefined;
    h = (hour % 12) + (meridiem === "p" ? 12 : 0);
  } else if (hour > 24 || (hour === 24 && (minute > 0 || second > 0))) {
    return undefined;
  }
  return h * 60 + minute + second / 60;
}

/** Minutes of the time-of-day part of a day number, rounded to the second. */
function fromDayNumber(days: number): number | undefined {
  if (!Number.isFinite(days) || days < 0) return undefined;
  if (days === 1) return 1440;
  const seconds = Math.round((days - Math.floor(days)) * 86_400);
  return (seconds % 86_400) / 60;
}
