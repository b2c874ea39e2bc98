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
  if (typeof text !== "string") throw new TypeError("text must be a string");
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const sep = pickSeparator(src);
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let quoted = false;
  let i = 0;
  while (i < src.length) {
    const ch = src[i]!;
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
    } else if (ch === sep) {
      row.push(field);
      field = "";
    } else if (ch === "\r" || ch === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
      if (ch === "\r" && src[i + 1] === "\n") i++;
    } else {
      field += ch;
    }
    i++;
  }
  if (field !== "" || row.length > 0) {
    row.push(field);
    rows.push(row);
  }
  return rows;
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
