import { inflateRawSync } from "node:zlib";

/**
 * The text of one entry of a ZIP archive (an .xlsx file), for tests that check the XML a
 * library wrote. Reads the central directory and the local header (PKWARE APPNOTE.TXT 4.3.7,
 * 4.3.12, 4.3.16); methods 0 (stored) and 8 (deflate) only.
 */
export function zipEntryText(zip: Uint8Array, name: string): string | undefined {
  const view = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  let eocd = zip.byteLength - 22;
  while (eocd >= 0 && view.getUint32(eocd, true) !== 0x06054b50) eocd--;
  if (eocd < 0) throw new RangeError("not a ZIP archive");
  let at = view.getUint32(eocd + 16, true);
  const decoder = new TextDecoder();
  for (let i = 0; i < view.getUint16(eocd + 10, true); i++) {
    const nameLength = view.getUint16(at + 28, true);
    const entry = decoder.decode(zip.subarray(at + 46, at + 46 + nameLength));
    if (entry === name) {
      const method = view.getUint16(at + 10, true);
      const size = view.getUint32(at + 20, true);
      const local = view.getUint32(at + 42, true);
      const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
      const data = zip.subarray(start, start + size);
      return decoder.decode(method === 0 ? data : inflateRawSync(data));
    }
    at += 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
  }
  return undefined;
}
