/** The geocoding layer: the pure request/response/rating part and the fetch part. */
export * from "./GeocodeTypes.js";
export {
  ADDRESS_PLACEHOLDER,
  buildGeocodeRequest,
  checkGeocoderTemplate,
  geocodeServiceId,
  parseHeaderLine,
  type GeocodeRequest,
} from "./buildGeocodeRequest.js";
export { readGeocodeResponse } from "./readGeocodeResponse.js";
export { geocodeCacheKey, normaliseAddress } from "./normaliseAddress.js";
export { AMBIGUOUS_KM, REVIEW_ORDER, markFarAway, rateMatch } from "./rateMatch.js";
export {
  geocodeAddresses,
  type GeocodeAddressesOptions,
  type GeocodeCache,
  type GeocodeProgress,
  type GeocodeRun,
} from "./geocodeAddresses.js";
export {
  addressTargets,
  applyGeocodes,
  matchText,
  type AddressTarget,
  type LocatedTables,
  type LocateTables,
  type ReviewItem,
} from "./locateTables.js";
export { GEOCODE_CACHE_SHEET, cacheRows, readCacheSheet } from "./cacheSheet.js";
export { MATCH_HEADER, coordinateColumns } from "./coordinateColumns.js";
