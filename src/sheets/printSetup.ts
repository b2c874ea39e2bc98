/**
 * How a sheet prints, as pure data every workbook adapter applies: Office.js through
 * `worksheet.pageLayout` and `horizontalPageBreaks` (ExcelApi 1.9), exceljs through
 * `pageSetup`, `headerFooter` and row breaks. Row numbers are 0-based grid rows.
 */
export interface PrintSetup {
  readonly orientation?: "portrait" | "landscape";
  readonly paperSize?: "A4" | "Letter";
  /** Scale so every column fits one page wide; the sheet runs as many pages tall as it needs. */
  readonly fitToWidth?: boolean;
  /** Grid rows (first and last, inclusive) repeated at the top of every printed page. */
  readonly printTitleRows?: { readonly first: number; readonly last: number };
  /** Grid rows that start a new printed page (a break above each). */
  readonly rowBreaks?: readonly number[];
  readonly header?: PrintHeaderFooter;
  readonly footer?: PrintHeaderFooter;
}

/** Text of a page header or footer, printed literally (an "&" prints as "&"). */
export interface PrintHeaderFooter {
  readonly left?: string;
  readonly center?: string;
  /** Text at the right; ignored when `pageNumbers` is set. */
  readonly right?: string;
  /** Put "Page n of m" at the right. */
  readonly pageNumbers?: boolean;
}

/** A header or footer as Excel's three format-code sections. */
export interface HeaderFooterSections {
  readonly left: string;
  readonly center: string;
  readonly right: string;
}

/**
 * Turns literal header/footer text into Excel's format codes: "&" doubles (Excel's code for
 * a literal ampersand) and page numbers use "&P" (this page) and "&N" (pages in all).
 * Source: Microsoft, "Formatting and VBA codes for headers and footers"; ECMA-376 Part 1,
 * 18.3.1.39 (oddHeader/oddFooter) as described in MS-OI29500 2.1.619.
 * @example headerFooterSections({ center: "R&D", pageNumbers: true })
 *   // => { left: "", center: "R&&D", right: "Page &P of &N" }
 */
export function headerFooterSections(hf: PrintHeaderFooter): HeaderFooterSections {
  const literal = (text: string | undefined): string => (text ?? "").replace(/&/g, "&&");
  return {
    left: literal(hf.left),
    center: literal(hf.center),
    right: hf.pageNumbers ? "Page &P of &N" : literal(hf.right),
  };
}

/**
 * One header/footer string in the file format's single-string form ("&L…&C…&R…",
 * ECMA-376 Part 1, 18.3.1.39); empty sections are left out.
 * @example headerFooterCode({ left: "Plan A", pageNumbers: true }) // => "&LPlan A&RPage &P of &N"
 */
export function headerFooterCode(hf: PrintHeaderFooter): string {
  const s = headerFooterSections(hf);
  return (s.left ? `&L${s.left}` : "") + (s.center ? `&C${s.center}` : "") + (s.right ? `&R${s.right}` : "");
}

/**
 * Checks a print setup against the grid it belongs to.
 * @param print - the setup
 * @param rows - the grid's row count
 * @throws RangeError naming the field when a row is outside the grid or title rows are reversed
 */
export function checkPrintSetup(print: PrintSetup, rows: number): void {
  const inGrid = (r: number): boolean => Number.isInteger(r) && r >= 0 && r < rows;
  const t = print.printTitleRows;
  if (t && (!inGrid(t.first) || !inGrid(t.last) || t.last < t.first)) {
    throw new RangeError(`print.printTitleRows must be rows 0..${rows - 1} with first <= last, got ${t.first}..${t.last}`);
  }
  for (const r of print.rowBreaks ?? []) {
    if (!inGrid(r) || r === 0) throw new RangeError(`print.rowBreaks must be rows 1..${rows - 1} of the grid, got ${r}`);
  }
}

/**
 * Regions whose customary paper is US Letter; everywhere else prints on A4. From the Unicode
 * CLDR supplemental data, `paperSize` (type "US-Letter": BZ CA CL CO CR GT MX NI PA PH PR SV
 * US VE; from memory).
 */
const LETTER_REGIONS = new Set(["BZ", "CA", "CL", "CO", "CR", "GT", "MX", "NI", "PA", "PH", "PR", "SV", "US", "VE"]);

/**
 * The paper a locale prints on: Letter in the regions that use it, A4 elsewhere. Reads the
 * region subtag of a BCP 47 tag ("en-US") or a POSIX locale ("en_US.UTF-8"); a tag without a
 * region (or an unreadable one) gets A4, the ISO 216 size most of the world uses.
 *
 * @param locale - e.g. "en-US", "fr-CA", "de_DE.UTF-8", "en"
 * @returns "Letter" or "A4"
 * @example paperSizeForLocale("es-MX") // => "Letter"
 * @example paperSizeForLocale("en-GB") // => "A4"
 */
export function paperSizeForLocale(locale: string | undefined): "A4" | "Letter" {
  const tag = (locale ?? "").split(/[.@]/)[0]!.replace(/_/g, "-");
  const region = tag
    .split("-")
    .slice(1)
    .find((part) => /^([A-Za-z]{2}|\d{3})$/.test(part));
  return region !== undefined && LETTER_REGIONS.has(region.toUpperCase()) ? "Letter" : "A4";
}
