/**
 * Tells a TSPLIB95 file from a Solomon (1987) VRPTW file by content, not by file name.
 * TSPLIB: a `DIMENSION` keyword line together with a `..._SECTION` line.
 * Solomon: a `VEHICLE` line followed (later) by a `CUSTOMER` line.
 *
 * @param text - the whole file
 * @returns "tsplib", "solomon" or `undefined` when neither layout is recognised
 * @example detectFormat("C101\n\nVEHICLE\nNUMBER CAPACITY\n25 200\n\nCUSTOMER\n...") // => "solomon"
 */
export function detectFormat(text: string): "tsplib" | "solomon" | undefined {
  if (/^\s*DIMENSION\s*:/m.test(text) && /^\s*[A-Z_]+_SECTION\s*$/m.test(text)) return "tsplib";
  if (/^\s*VEHICLE\s*$[\s\S]*^\s*CUSTOMER\s*$/im.test(text)) return "solomon";
  return undefined;
}
