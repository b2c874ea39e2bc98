import { findEndOfCentralDirectory } from "./zipEntryNames.js";

/**
 * Set every entry's modification time in a ZIP archive (an .xlsx file is one) to one date,
 * in place, so the same workbook content always gives the same bytes.
 *
 * Follows PKWARE's ZIP File Format Specification (APPNOTE.TXT, sections 4.3.7, 4.3.12, 4.3.16):
 * the end-of-central-directory record locates the central directory; each central entry holds
 * the DOS time and date (offsets 12 and 14) and the offset of its local header, whose copy of
 * the time and date sits at offsets 10 and 12. Neither is covered by the CRC, so the archive
 * stays valid.
 *
 * @param zip - the archive's bytes (modified in place)
 * @param date - the time to store, read in UTC (DOS times have 2-second steps, years 1980..2107)
 * @returns the same array, for chaining
 * @throws RangeError when the bytes are not a ZIP archive or the date is outside 1980..2107
 * @example pinZipDates(await book.toBuffer(), new Date(Date.UTC(2026, 0, 5)))
 */
export function pinZipDates(zip: Uint8Array, date: Date): Uint8Array {
  const year = date.getUTCFullYear();
  if (!(year >= 1980 && year <= 2107)) throw new RangeError(`date must fall in 1980..2107, got ${date.toISOString()}`);
  const dosDate = ((year - 1980) << 9) | ((date.getUTCMonth() + 1) << 5) | date.getUTCDate();
  const dosTime = (date.getUTCHours() << 11) | (date.getUTCMinutes() << 5) | (date.getUTCSeconds() >> 1);
  const view = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  const eocd = findEndOfCentralDirectory(view);
  const entries = view.getUint16(eocd + 10, true);
  let at = view.getUint32(eocd + 16, true);
  for (let i = 0; i < entries; i++) {
    if (at + 46 > view.byteLength || view.getUint32(at, true) !== 0x02014b50) {
      throw new RangeError("zip: central directory entry not found where the directory says");
    }
    view.setUint16(at + 12, dosTime, true);
    view.setUint16(at + 14, dosDate, true);
    const local = view.getUint32(at + 42, true);
    if (local + 30 > view.byteLength || view.getUint32(local, true) !== 0x04034b50) {
      throw new RangeError("zip: local file header not found where the directory says");
    }
    view.setUint16(local + 10, dosTime, true);
    view.setUint16(local + 12, dosDate, true);
    at += 46 + view.getUint16(at + 28, true) + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
  }
  return zip;
}
