import type { Issue } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { isBlank, plainCell } from "./cellValue.js";
import { headerWords, type TableKind } from "./matchHeaders.js";
import { cellIssue } from "./readTable.js";

/** A column the reader did not use: its header text and 0-based column within the range. */
export interface UnusedColumn {
  readonly header: string;
  readonly col: number;
}

// Words that say what a column holds (normalised like headers). Common practice in delivery
// sheets; a column carrying one of them, or values of that shape, is worth a warning.
const TIME_WORDS = ["time", "min", "mins", "minute", "minutes", "duration", "hour", "hours", "hrs", "eta", "slot", "arrival"];
const START_WORDS = ["from", "start", "open", "opens", "earliest", "begin", "after"];
const END_WORDS = ["to", "end", "close", "closes", "latest", "until", "till", "before", "finish"];
const QUANTITY_WORDS = [
  "qty",
  "quantity",
  "units",
  "cases",
  "pallets",
  "boxes",
  "crates",
  "parcels",
  "packages",
  "pieces",
  "pcs",
  "items",
  "kg",
  "kgs",
  "weight",
  "tons",
  "tonnes",
  "litres",
  "liters",
  "volume",
  "load",
  "amount",
  "trays",
  "bags",
];
const PLACE_WORDS = [
  "address",
  "street",
  "road",
  "postcode",
  "zip",
  "postal",
  "town",
  "city",
  "village",
  "place",
  "location",
  "country",
  "house",
  "lat",
  "lon",
  "lng",
  "coord",
  "coords",
  "gps",
];
/** Words of columns that hold numbers which are not amounts (phone numbers, references). */
const NOT_AMOUNT_WORDS = ["no", "nr", "number", "id", "ref", "code", "phone", "tel", "zone", "route", "seq", "sequence", "account"];

/**
 * Warnings for columns that were not recognised but look like a field: the header carries a time,
 * quantity or place word, or the values look like clock times, coordinates or amounts. Each names
 * the column and the field it most likely holds, so nothing meaningful is ignored silently:
 * `Stops!H1: column "Drop time" is not used; if it holds service minutes, map it to Service min.`
 *
 * @param read - the table's range as read
 * @param headerRow0 - 0-based sheet row of the header
 * @param unused - the columns not used (neither mapped nor chosen to be carried or ignored)
 * @param kind - the table
 * @returns one warning per such column, at its header cell
 * @example unusedColumnWarnings(read, 0, [{ header: "Drop time", col: 7 }], "stops")[0]?.message
 * // => 'Stops!H1: column "Drop time" is not used; if it holds service minutes, map it to Service min.'
 */
export function unusedColumnWarnings(read: SheetRead, headerRow0: number, unused: readonly UnusedColumn[], kind: TableKind): Issue[] {
  const body = read.values.slice(headerRow0 - read.row + 1);
  const out: Issue[] = [];
  for (const u of unused) {
    const guess = likelyField(
      u.header,
      body.map((r) => plainCell(r[u.col])).filter((v) => !isBlank(v)),
      kind,
    );
    if (guess === undefined) continue;
    out.push(
      cellIssue(
        read.sheet,
        headerRow0,
        read.col + u.col,
        `column "${u.header}" is not used; if it holds ${guess.what}, map it to ${guess.field}.`,
      ),
    );
  }
  return out;
}

/** What a column probably holds and the field to map it to, or `undefined` when nothing suggests one. */
function likelyField(header: string, values: readonly unknown[], kind: TableKind): { what: string; field: string } | undefined {
  const words = headerWords(header);
  const has = (list: readonly string[]): boolean => words.some((w) => list.includes(w));
  const clocks = values.length > 0 && values.every(isClockLike);
  const numbers = values.length > 0 && values.every((v) => typeof v === "number" && Number.isFinite(v));
  const coords = numbers && values.every((v) => Math.abs(v as number) <= 180 && !Number.isInteger((v as number) * 100));
  const amounts = numbers && values.every((v) => (v as number) >= 0 && (v as number) < 100000) && values.some((v) => (v as number) > 0);
  const stops = kind === "stops";
  const startOrEnd = has(START_WORDS) ? "start" : has(END_WORDS) ? "end" : undefined;
  const timeField = (): { what: string; field: string } => {
    if (stops) {
      if (startOrEnd === "start") return { what: "the time a window opens", field: "Earliest" };
      if (startOrEnd === "end") return { what: "the time a window closes", field: "Latest" };
      return { what: "a time window", field: "Earliest or Latest" };
    }
    if (startOrEnd === "end") return { what: "the end of the shift", field: "Shift end" };
    return { what: "the start of the shift", field: startOrEnd === "start" ? "Shift start" : "Shift start or Shift end" };
  };
  if (has(TIME_WORDS) || (clocks && startOrEnd !== undefined)) {
    // Minutes are whole numbers of an hour or more; a day fraction below 1 is a time of day.
    if (clocks || startOrEnd !== undefined || (numbers && values.every((v) => (v as number) < 1))) return timeField();
    return stops ? { what: "service minutes", field: "Service min" } : { what: "a shift time", field: "Shift start or Shift end" };
  }
  if (has(QUANTITY_WORDS)) return stops ? { what: "the demand", field: "Demand" } : { what: "the capacity", field: "Capacity" };
  if (has(PLACE_WORDS) || (coords && !has(NOT_AMOUNT_WORDS))) {
    if (coords)
      return stops
        ? { what: "coordinates", field: "Latitude or Longitude" }
        : { what: "the depot's coordinates", field: "Start latitude or Start longitude" };
    return stops ? { what: "part of the address", field: "Address" } : { what: "the depot", field: "Depot" };
  }
  if (clocks) return timeField();
  if (amounts && !has(NOT_AMOUNT_WORDS))
    return stops ? { what: "the demand", field: "Demand" } : { what: "the capacity", field: "Capacity" };
  return undefined;
}

/** "8:30", "08:30", "8.30 pm", "14:05:30", "08:00-10:00", or a day fraction (Excel time). */
function isClockLike(v: unknown): boolean {
  if (typeof v === "number") return v > 0 && v < 1;
  if (typeof v !== "string") return false;
  return /^\s*\d{1,2}[:.h]\d{2}(:\d{2})?\s*([ap]\.?m\.?)?(\s*[-–]\s*\d{1,2}[:.h]\d{2}\s*([ap]\.?m\.?)?)?\s*$/i.test(v);
}
