import { plainCell } from "./cellValue.js";

/**
 * A duration in minutes from a cell: a number of minutes (also as text, optionally
 * followed by "min"), or h:mm / h:mm:ss text ("1:30" = 90).
 *
 * A cell formatted as a time in Excel holds a day fraction, which reads here as that
 * many minutes; type minutes as a number or h:mm as text.
 *
 * @param value - a raw cell value
 * @returns minutes (>= 0), or `undefined` when empty, negative or not a duration
 * @example parseDuration("1:30") // => 90
 */
export function parseDuration(value: unknown): number | undefined {
  const v = plainCell(value);
  if (typeof v === "number") return Number.isFinite(v) && v >= 0 ? v : undefined;
  if (typeof v !== "string") return undefined;
  const t = v.trim().toLowerCase();
  const plain = /^(\d+\.?\d*|\.\d+)\s*(m|min|mins|minutes?)?$/.exec(t);
  if (plain) return Number(plain[1]);
  const hm = /^(\d+):(\d{2})(?::(\d{2}(?:\.\d+)?))?$/.exec(t);
  if (!hm) return undefined;
  const minutes = Number(hm[2]);
  const seconds = hm[3] === undefined ? 0 : Number(hm[3]);
  if (minutes > 59 || seconds >= 60) return undefined;
  return Number(hm[1]) * 60 + minutes + seconds / 60;
}
