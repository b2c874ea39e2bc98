/**
 * The column letters of a 0-based column index, as Excel names columns (A..Z, AA..ZZ, AAA..).
 *
 * @param col0 - 0-based column index (0 = "A")
 * @returns the column letters
 * @throws RangeError when `col0` is not a non-negative integer
 * @example columnLetter(26) // => "AA"
 */
export function columnLetter(col0: number): string {
  if (!Number.isInteger(col0) || col0 < 0) throw new RangeError(`col0 must be an integer >= 0, got ${col0}`);
  // Bijective base 26: there is no zero digit, so shift by one at every place.
  let n = col0 + 1;
  let letters = "";
  while (n > 0) {
    const rem = (n - 1) % 26;
    letters = String.fromCharCode(65 + rem) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return letters;
}

/**
 * The A1-style address of a cell from 0-based row and column indexes.
 *
 * @param row0 - 0-based row index (0 = row 1)
 * @param col0 - 0-based column index (0 = column A)
 * @returns the address, e.g. "E7"
 * @throws RangeError when an index is not a non-negative integer
 * @example cellAddress(6, 4) // => "E7"
 */
export function cellAddress(row0: number, col0: number): string {
  if (!Number.isInteger(row0) || row0 < 0) throw new RangeError(`row0 must be an integer >= 0, got ${row0}`);
  return `${columnLetter(col0)}${row0 + 1}`;
}

/**
 * A sheet name as Excel writes it in a reference: quoted when it is not a plain word, with
 * quotes doubled ('My stops'!A1; common practice of Excel's formula syntax).
 * @example sheetRef("Bob's van") // => "'Bob''s van'"
 */
export function sheetRef(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}

/**
 * The sheet name of a reference as `sheetRef` writes it, with or without a cell or range after
 * the "!": the quotes removed and doubled quotes undone (Excel's formula syntax, common practice).
 *
 * @param ref - e.g. "'Road km'!A1:E5", "Km!A1:E5" or "Km"
 * @returns the sheet's name
 * @example sheetOfRef("'Bob''s van'!A1:C3") // => "Bob's van"
 */
export function sheetOfRef(ref: string): string {
  const quoted = /^'((?:[^']|'')*)'(?:!|$)/.exec(ref);
  if (quoted) return quoted[1]!.replace(/''/g, "'");
  const bang = ref.lastIndexOf("!");
  return bang < 0 ? ref : ref.slice(0, bang);
}
