/**
 * The names of the entries of a ZIP archive (an .xlsx file is one), read from its central
 * directory (PKWARE APPNOTE.TXT 4.3.12 and 4.3.16). Nothing is decompressed.
 *
 * @param zip - the archive's bytes
 * @returns entry names in directory order, e.g. ["[Content_Types].xml", "xl/workbook.xml", ...]
 * @throws RangeError when the bytes are not a ZIP archive
 * @example zipEntryNames(bytes).some((n) => n.startsWith("xl/charts/")) // => true when the workbook has charts
 */
export function zipEntryNames(zip: Uint8Array): string[] {
  const view = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  const eocd = findEndOfCentralDirectory(view);
  const entries = view.getUint16(eocd + 10, true);
  let at = view.getUint32(eocd + 16, true);
  const names: string[] = [];
  const decoder = new TextDecoder();
  for (let i = 0; i < entries; i++) {
    if (at + 46 > view.byteLength || view.getUint32(at, true) !== 0x02014b50) {
      throw new RangeError("zip: central directory entry not found where the directory says");
    }
    const nameLength = view.getUint16(at + 28, true);
    names.push(decoder.decode(zip.subarray(at + 46, at + 46 + nameLength)));
    at += 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
  }
  return names;
}

/**
 * Offset of the end-of-central-directory record (APPNOTE.TXT 4.3.16): 22 bytes plus a comment
 * of up to 65,535 bytes at the very end of the archive.
 *
 * @param view - the archive's bytes
 * @returns the record's byte offset
 * @throws RangeError when there is none (not a ZIP archive)
 * @example findEndOfCentralDirectory(new DataView(bytes.buffer)) // => bytes.length - 22 without a comment
 */
export function findEndOfCentralDirectory(view: DataView): number {
  const last = view.byteLength - 22;
  for (let at = last; at >= 0 && at >= last - 65_535; at--) {
    if (view.getUint32(at, true) === 0x06054b50) return at;
  }
  throw new RangeError("zip: end of central directory not found (not a ZIP archive)");
}

/**
 * Parts of an .xlsx file that exceljs 4.4 skips when it loads a file (its loader in
 * lib/xlsx/xlsx.js models only workbook, styles, shared strings, worksheets, themes, media,
 * drawings, comments and tables), so a copy it saves no longer has them.
 */
const NOT_KEPT: readonly (readonly [string, string])[] = [
  ["xl/charts/", "charts"],
  ["xl/chartsheets/", "chart sheets"],
  ["xl/pivotTables/", "pivot tables"],
  ["xl/slicers/", "slicers"],
  ["xl/vbaProject.bin", "macros"],
  ["xl/ctrlProps/", "form controls"],
];

/**
 * What an .xlsx file holds that a copy saved through exceljs would lose, in words.
 *
 * @param xlsx - the workbook's bytes
 * @returns e.g. ["charts", "pivot tables"]; empty when everything is kept (or the bytes are not a ZIP)
 * @example partsNotKept(bytes) // => ["charts"]
 */
export function partsNotKept(xlsx: Uint8Array): string[] {
  let names: string[];
  try {
    names = zipEntryNames(xlsx);
  } catch {
    return [];
  }
  return NOT_KEPT.filter(([prefix]) => names.some((n) => n.startsWith(prefix))).map(([, what]) => what);
}
