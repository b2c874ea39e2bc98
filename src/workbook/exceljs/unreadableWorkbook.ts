/** First bytes of an OLE2 compound file (MS-CFB §2.2): old .xls files and encrypted .xlsx files. */
const CFB_SIGNATURE = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
/** "EncryptionInfo" in UTF-16LE: the stream an Office-encrypted package holds (MS-OFFCRYPTO §2.3.4). */
const ENCRYPTION_INFO = Array.from("EncryptionInfo").flatMap((c) => [c.charCodeAt(0), 0]);

/**
 * Why bytes that failed to open as .xlsx could not be read, and what the user should do, so
 * a password-protected workbook is told to remove the password rather than to "save as .xlsx".
 *
 * @param bytes - the file's content
 * @param name - the file name as the user gave it (for the message)
 * @returns one sentence: what the file is and how to fix it
 * @example describeUnreadableWorkbook(encryptedBytes, "week.xlsx") // => "week.xlsx is password-protected ..."
 */
export function describeUnreadableWorkbook(bytes: Uint8Array, name: string): string {
  if (bytes.length === 0) return `${name} is empty (0 bytes); choose the saved workbook, or save it again from Excel.`;
  if (startsWith(bytes, CFB_SIGNATURE)) {
    if (indexOf(bytes, ENCRYPTION_INFO) >= 0) {
      return `${name} is password-protected (encrypted), so its sheets cannot be read; remove the password in Excel (File > Info > Protect Workbook > Encrypt with Password, clear it), save, and try again.`;
    }
    return `${name} is an Excel 97-2003 (.xls) workbook; open it in Excel and save it as "Excel Workbook (*.xlsx)".`;
  }
  if (bytes[0] === 0x50 && bytes[1] === 0x4b) {
    return `${name} is a damaged or incomplete .xlsx file (the zip package cannot be read, often a file cut short while copying or downloading); save it again from Excel or copy it again.`;
  }
  if (looksLikeText(bytes)) {
    return `${name} is a text file (CSV or similar) with a workbook's name; rename it to .csv (the page reads CSV), or open it in Excel and save it as "Excel Workbook (*.xlsx)".`;
  }
  return `${name} is not an .xlsx workbook; save it as "Excel Workbook (*.xlsx)" and try again.`;
}

function startsWith(bytes: Uint8Array, prefix: readonly number[]): boolean {
  return prefix.every((b, i) => bytes[i] === b);
}

function indexOf(bytes: Uint8Array, needle: readonly number[]): number {
  outer: for (let i = 0; i + needle.length <= bytes.length; i++) {
    for (let k = 0; k < needle.length; k++) if (bytes[i + k] !== needle[k]) continue outer;
    return i;
  }
  return -1;
}

/** No NUL and mostly printable in the first 4 KB: a text file. */
function looksLikeText(bytes: Uint8Array): boolean {
  const head = bytes.subarray(0, 4096);
  let printable = 0;
  for (const b of head) {
    if (b === 0) return false;
    if (b >= 0x20 || b === 0x09 || b === 0x0a || b === 0x0d) printable++;
  }
  return printable / head.length > 0.95;
}
