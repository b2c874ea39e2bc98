/**
 * An address as a cache key part: lower case, accents dropped (Unicode NFKD without combining
 * marks), punctuation as spaces, spaces collapsed. "12, Kiln Lane" and "12 kiln lane" are one key.
 *
 * @param address - the address as joined from the row
 * @returns the normalised text ("" for an address of punctuation only)
 * @example normaliseAddress("  12, Kiln Lane;  BRICKFIELD ") // => "12 kiln lane brickfield"
 */
export function normaliseAddress(address: string): string {
  return address
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^\p{L}\p{N}]+/gu, " ")
    .trim();
}

/**
 * The cache key of an address at a service.
 *
 * @param address - the address as joined from the row
 * @param serviceId - `geocodeServiceId` of the template
 * @returns "service|normalised address"
 * @example geocodeCacheKey("12, Kiln Lane", "https://g.example/s") // => "https://g.example/s|12 kiln lane"
 */
export function geocodeCacheKey(address: string, serviceId: string): string {
  return `${serviceId}|${normaliseAddress(address)}`;
}
