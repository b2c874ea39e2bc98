/**
 * Excel serial dates of the 1900 date system (ECMA-376 Part 1, §18.17.4): serial 1 is
 * 1900-01-01, serial 60 is the fictitious 1900-02-29 kept for compatibility, serial 61 is
 * 1900-03-01; the fraction is the time of day. Both directions work in UTC so the wall-clock
 * time in the cell is the UTC time of the Date.
 */

const MS_PER_DAY = 86_400_000;
/** Day 0 of serials from 61 on: 1899-12-30, one day early to absorb the fictitious leap day. */
const EPOCH_FROM_MARCH_1900 = Date.UTC(1899, 11, 30);
/** Day 0 of serials 0..59: 1899-12-31 ("1900-01-00" in Excel). */
const EPOCH_BEFORE_MARCH_1900 = Date.UTC(1899, 11, 31);

/**
 * The Excel serial (1900 system) of a date-time, read in UTC.
 *
 * @param d - the date-time; its UTC fields are the wall-clock value of the cell
 * @returns days since 1900-01-00, fraction = time of day (1900-03-01 => 61)
 * @throws RangeError when `d` is invalid or before 1899-12-31 (serial 0)
 * @example excelSerialFromDate(new Date(Date.UTC(2025, 0, 1, 12))) // => 45658.5
 */
export function excelSerialFromDate(d: Date): number {
  const ms = d instanceof Date ? d.getTime() : NaN;
  if (!Number.isFinite(ms)) throw new RangeError("d must be a valid Date");
  const days = (ms - EPOCH_FROM_MARCH_1900) / MS_PER_DAY;
  if (days >= 61) return days;
  const early = (ms - EPOCH_BEFORE_MARCH_1900) / MS_PER_DAY;
  if (early < 0) throw new RangeError(`d must be on or after 1899-12-31 (serial 0), got ${d.toISOString()}`);
  return early;
}

/**
 * The UTC date-time of an Excel serial (1900 system).
 *
 * Serial 60 is 1900-02-29, a day that never existed; it comes back as what
 * `Date.UTC(1900, 1, 29)` gives, 1900-03-01 (the same day as serial 61).
 *
 * @param serial - days since 1900-01-00; the fraction is the time of day
 * @returns the date-time in UTC, rounded to the millisecond
 * @throws RangeError when `serial` is negative or not finite
 * @example dateFromExcelSerial(45658.75).toISOString() // => "2025-01-01T18:00:00.000Z"
 */
export function dateFromExcelSerial(serial: number): Date {
  if (!Number.isFinite(serial) || serial < 0) {
    throw new RangeError(`serial must be a finite number >= 0, got ${serial}`);
  }
  const epoch = serial >= 61 ? EPOCH_FROM_MARCH_1900 : EPOCH_BEFORE_MARCH_1900;
  return new Date(epoch + Math.round(serial * MS_PER_DAY));
}
