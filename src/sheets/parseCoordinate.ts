import { plainCell } from "./cellValue.js";

/**
 * A latitude or longitude in decimal degrees from a cell.
 *
 * Reads numbers, decimal text ("45.76", "-4.83"), decimal text with a hemisphere letter
 * ("45.76 N"), and degrees-minutes-seconds text with or without spaces: `45°45'36"N`,
 * `4°50'W`, `45° 45' 36" N`, `N 45°45.6'`, also with the prime signs ′ ″ or º for °.
 * S and W make the value negative; a letter of the other axis (E on a latitude) is rejected.
 *
 * @param value - a raw cell value
 * @param axis - "lat" (range -90..90, letters N/S) or "lon" (-180..180, letters E/W)
 * @returns decimal degrees, or `undefined` when empty, unreadable or out of range
 * @throws TypeError when `axis` is neither "lat" nor "lon"
 * @example parseCoordinate(`45°45'36"N`, "lat") // => 45.76
 */
export function parseCoordinate(value: unknown, axis: "lat" | "lon"): number | undefined {
  if (axis !== "lat" && axis !== "lon") throw new TypeError(`axis must be "lat" or "lon", got ${String(axis)}`);
  const degrees = readDegrees(value, axis);
  if (degrees === undefined) return undefined;
  const limit = axis === "lat" ? 90 : 180;
  return Math.abs(degrees) <= limit ? degrees : undefined;
}

/**
 * Decimal degrees from a cell without the range check, so that a message can quote an
 * out-of-range value ("latitude 123.4 is outside -90..90").
 *
 * @param value - a raw cell value
 * @param axis - which hemisphere letters are allowed
 * @returns decimal degrees, or `undefined` when empty or unreadable
 * @example readDegrees("123.4", "lat") // => 123.4
 */
export function readDegrees(value: unknown, axis: "lat" | "lon"): number | undefined {
  const v = plainCell(value);
  if (typeof v === "number") return Number.isFinite(v) ? v : undefined;
  if (typeof v !== "string") return undefined;
  let t = v
    .trim()
    .toUpperCase()
    .replace(/[′’]/g, "'")
    .replace(/[″”]|''/g, '"')
    .replace(/[º˚]/g, "°");
  if (t === "") return undefined;
  let hemisphere: string | undefined;
  const letters = axis === "lat" ? "NS" : "EW";
  const first = t[0]!;
  const last = t[t.length - 1]!;
  if (/[NSEW]/.test(last)) {
    hemisphere = last;
    t = t.slice(0, -1).trim();
  } else if (/[NSEW]/.test(first)) {
    hemisphere = first;
    t = t.slice(1).trim();
  }
  if (hemisphere !== undefined && !letters.includes(hemisphere)) return undefined;
  const m =
    /^([+-])?\s*(\d+(?:\.\d+)?)\s*°?\s*(?:(\d+(?:\.\d+)?)\s*'\s*(?:(\d+(?:\.\d+)?)\s*"?)?)?$/.exec(t) ??
    /^([+-])?\s*(\d+)\s+(\d+(?:\.\d+)?)(?:\s+(\d+(?:\.\d+)?))?$/.exec(t);
  if (!m) return undefined;
  const deg = Number(m[2]);
  const min = m[3] === undefined ? 0 : Number(m[3]);
  const sec = m[4] === undefined ? 0 : Number(m[4]);
  // Minutes and seconds must be whole-degree parts; a decimal degree cannot carry them.
  if (min >= 60 || sec >= 60) return undefined;
  if ((m[3] !== undefined && m[2]!.includes(".")) || (m[4] !== undefined && m[3]!.includes("."))) return undefined;
  const sign = m[1] === "-" ? -1 : 1;
  if (sign < 0 && hemisphere !== undefined) return undefined;
  const south = hemisphere === "S" || hemisphere === "W" ? -1 : 1;
  return sign * south * (deg + min / 60 + sec / 3600);
}
