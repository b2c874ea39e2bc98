import { DAY_MIN } from "../core/index.js";

/**
 * The Excel number formats the result sheets use (ECMA-376 Part 1, §18.8.31 numFmt codes).
 * Times of day are day fractions shown `hh:mm`; durations that can pass 24 h use the
 * elapsed-hours form `[h]:mm`; "@" marks a cell as text.
 */
export const NUMBER_FORMATS = {
  timeOfDay: "hh:mm",
  duration: "[h]:mm",
  dateTime: "yyyy-mm-dd hh:mm",
  date: "yyyy-mm-dd",
  km: "0.0",
  minutes: "0.0",
  money: "0.00",
  factor: "0.00",
  integer: "0",
  text: "@",
} as const;

/**
 * Minutes from the planning day's midnight as an Excel time value: the fraction of a day
 * (ECMA-376: time of day is the fractional part of the serial). Past midnight the value
 * exceeds 1, which `hh:mm` shows as the clock time of the next day.
 *
 * @param minutes - minutes from midnight (or a duration in minutes)
 * @returns `minutes / 1440`
 * @throws TypeError when `minutes` is not a finite number
 * @example dayFraction(510) // => 0.3541666666666667 (08:30)
 */
export function dayFraction(minutes: number): number {
  if (typeof minutes !== "number" || !Number.isFinite(minutes)) {
    throw new TypeError(`dayFraction: minutes must be a finite number, got ${String(minutes)}`);
  }
  return minutes / DAY_MIN;
}

/**
 * Round to a step (0.1 km, 0.01 of money) so the stored value matches what the cell shows.
 *
 * @param value - the number
 * @param decimals - decimal places kept (0..6)
 * @returns the rounded number; -0 becomes 0
 * @throws RangeError when `decimals` is not an integer in 0..6
 * @example roundTo(12.345, 1) // => 12.3
 */
export function roundTo(value: number, decimals: number): number {
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 6) {
    throw new RangeError(`roundTo: decimals must be an integer in 0..6, got ${decimals}`);
  }
  const f = 10 ** decimals;
  const r = Math.round(value * f) / f;
  return r === 0 ? 0 : r;
}
