/**
 * Text as XML 1.0 character data or attribute value (W3C XML 1.0 5th ed., §2.2 Characters and
 * §2.4 Character Data): `&`, `<`, `>`, `"` and `'` become entity references, a carriage return
 * becomes `&#13;` so a reader's line-end normalisation (§2.11) keeps it, and characters XML 1.0
 * cannot carry at all (C0 controls other than tab and line feed, lone surrogates, U+FFFE and
 * U+FFFF) become U+FFFD, the replacement character. Everything else is kept exactly.
 *
 * @param text - any string
 * @returns the escaped text, safe inside an element or a double- or single-quoted attribute (in an
 *   attribute a reader turns line feeds and tabs into spaces, §3.3.3; Kiln's attributes hold none)
 * @example xmlText('Smith & "Sons" <Depot>') // => "Smith &amp; &quot;Sons&quot; &lt;Depot&gt;"
 */
export function xmlText(text: string): string {
  return text.replace(NOT_XML_CHAR, "\uFFFD").replace(/[&<>"'\r]/g, (c) => ESCAPES[c]!);
}

/** Characters outside XML 1.0's Char production (§2.2): C0 controls but tab, LF, CR; lone surrogates; U+FFFE, U+FFFF. */
// eslint-disable-next-line no-control-regex -- these are exactly the characters XML 1.0 excludes
const NOT_XML_CHAR = /[\0-\x08\x0B\x0C\x0E-\x1F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

const ESCAPES: Readonly<Record<string, string>> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&apos;",
  "\r": "&#13;",
};
