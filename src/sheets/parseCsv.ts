/**
 * Rows and fields of a CSV text by RFC 4180: fields in double quotes may hold the
 * separator, line breaks and doubled quotes (`""` = `"`); lines end in CRLF or LF.
 * A leading byte-order mark is dropped. When the first line holds more `;` than `,`
 * (outside quotes) the separator is `;`, as spreadsheets write in locales with a
 * decimal comma. A final line break does not make an empty last row.
 *
 * @param text - the file's content
 * @returns rows of field text (rows may differ in length, as in the file)
 * @throws TypeError when `text` is not a string
 * @example parseCsv('a,"b ""x"""\r\n1,2') // => [["a", 'b "x"'], ["1", "2"]]
 */
export function parseCsv(text: string): string[][] {
  return readCsv(text).rows;
}

/** What `readCsv` found. */
export interface CsvRead {
  readonly rows: string[][];
  readonly separator: "," | ";";
  /** Where a quote opens that is never closed (1-based line and column), if one does. */
  readonly unclosedQuote?: { readonly line: number; readonly column: number };
}

/**
 * `parseCsv` that also says where an unclosed quote opens (the rest of the file would
 * otherwise vanish into one field), and, for a `;`-separated file, reads numbers written
 * with a decimal comma ("45,5", "1.234,5", "1 234,5") as numbers with a decimal point: a
 * semicolon separator is what spreadsheets write in decimal-comma locales (common practice).
 *
 * @param text - the file's content
 * @returns the rows, the separator and any unclosed quote
 * @throws TypeError when `text` is not a string
 * @example readCsv('a;b\n"x;45,5').unclosedQuote // => { line: 2, column: 1 }
 */
export function readCsv(text: string): CsvRead {
  if (typeof text !== "string") throw new TypeError("text must be a string");
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const sep = pickSeparator(src);
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let quoted = false;
  let line = 1;
  let lineStart = 0;
  let openedAt = { line: 1, column: 1 };
  let i = 0;
  while (i < src.length) {
    const ch = src[i]!;
    if (ch === "\n" || (ch === "\r" && src[i + 1] !== "\n")) {
      line++;
      lineStart = i + 1;
    }
    if (quoted) {
      if (ch === '"') {
        if (src[i + 1] === '"') {
          field += '"';
          i += 2;
          continue;
        }
        quoted = false;
      } else {
        field += ch;
      }
      i++;
      continue;
    }
    if (ch === '"' && field === "") {
      quoted = true;
      openedAt = { line, column: i - lineStart + 1 };
    } else if (ch === sep) {
      row.push(field);
      field = "";
    } else if (ch === "\r" || ch === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
      if (ch === "\r" && src[i + 1] === "\n") {
        i++;
        line++;
        lineStart = i + 1;
      }
    } else {
      field += ch;
    }
    i++;
  }
  if (field !== "" || row.length > 0) {
    row.push(field);
    rows.push(row);
  }
  const read = sep === ";" ? rows.map((r) => r.map(decimalComma)) : rows;
  return quoted ? { rows: read, separator: sep, unclosedQuote: openedAt } : { rows: read, separator: sep };
}

/** "45,5" -> "45.5", "1.234,5" / "1 234,5" -> "1234.5"; anything else unchanged. */
function decimalComma(field: string): string {
  const t = field.trim();
  if (!/^[-+]?\d{1,3}(?:[. \u00a0\u202f]\d{3})*,\d+$|^[-+]?\d+,\d+$/.test(t)) return field;
  return t.replace(/[. \u00a0\u202f]/g, "").replace(",", ".");
}

/** `;` when the first line (outside quotes) has more of them than commas, else `,`. */
function pickSeparator(src: string): "," | ";" {
  let commas = 0;
  let semis = 0;
  let quoted = false;
  for (const ch of src) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === "\n" || ch === "\r")) break;
    else if (!quoted && ch === ",") commas++;
    else if (!quoted && ch === ";") semis++;
  }
  return semis > commas ? ";" : ",";
}
