import type { Issue } from "../core/index.js";
import type { ColumnMatch } from "./ReadResult.js";
import { columnLetter, cellAddress } from "./cellAddress.js";
import { plainCell } from "./cellValue.js";
import { headerKey, mappedTarget, type ColumnMapEntry } from "./columnMap.js";
import { FIELD_LABELS } from "./fieldLabels.js";
import { FLEET_SYNONYMS, STOP_SYNONYMS } from "./headerSynonyms.js";

/** Which input table a header row belongs to. */
export type TableKind = "stops" | "fleet";

/** One recognised header: the field, and its load dimension or window number when it has one. */
export interface HeaderField {
  /** Base field, e.g. "latitude", "demand", "earliest", "shiftStart". */
  readonly base: string;
  /** Unit word of a load column ("kg" of "Demand kg"); absent for a plain "Demand". */
  readonly dimension?: string;
  /** Window number of repeated Earliest/Latest pairs (1 for the first). */
  readonly index?: number;
}

/** Header columns of a table, 0-based column indexes within the read range. */
export interface TableColumns {
  /** Field key ("latitude", "demand:kg", "earliest:2") -> column index. */
  readonly fields: ReadonlyMap<string, number>;
  readonly matches: readonly ColumnMatch[];
  /** Unrecognised columns, carried through, in sheet order; `chosen` when the user mapped them to carry. */
  readonly extras: readonly { readonly header: string; readonly col: number; readonly chosen?: boolean }[];
  /** The user's column mappings that matched a header of this table. */
  readonly mapped: readonly ColumnMapEntry[];
  readonly issues: readonly Issue[];
}

/** Fields whose header may carry a unit word (a load dimension). */
const DIMENSIONED: Record<TableKind, readonly string[]> = { stops: ["demand", "pickup"], fleet: ["capacity"] };
/** Fields where a second matching column is carried through instead of being an issue. */
const DESCRIPTIVE = new Set(["id", "name", "address", "street"]);
/** Fields that may repeat as numbered pairs. */
const NUMBERED = new Set(["earliest", "latest", "windows"]);

/**
 * Header text as lower-case words (letters and digits); punctuation and spacing do not count.
 *
 * @param text - a header as typed
 * @returns its words, e.g. ["speed", "km", "h"] for "Speed km/h"
 * @example headerWords(" Service (min) ") // => ["service", "min"]
 */
export function headerWords(text: string): string[] {
  return text
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .split(/[^a-z0-9]+/)
    .filter((w) => w !== "");
}

/**
 * The field a header names, case-, space- and punctuation-insensitively, with common synonyms
 * (lat/lng/lon/long, from/to, ready/due, service/dwell, qty/weight, van/truck/driver, ...).
 *
 * @param text - the header as typed
 * @param kind - the table it heads
 * @returns the field, or `undefined` for a column to carry through
 * @example matchHeader("Demand (kg)", "stops") // => { base: "demand", dimension: "kg" }
 */
export function matchHeader(text: string, kind: TableKind): HeaderField | undefined {
  const words = headerWords(text);
  if (words.length === 0) return undefined;
  const table = kind === "stops" ? STOP_SYNONYMS : FLEET_SYNONYMS;
  const exact = lookup(table, words.join(""));
  if (exact !== undefined) return { base: exact };
  // "Earliest 2", "Window 3": a numbered repeat of a window column.
  const numbered = /^(.*?)(\d+)$/.exec(words.join(""));
  if (numbered && numbered[1] !== "") {
    const base = lookup(table, numbered[1]!);
    if (base !== undefined && NUMBERED.has(base)) return { base, index: Number(numbered[2]) };
  }
  // "Demand kg", "Capacity crates", "Pickup crates": a load column with its unit word.
  for (let k = words.length - 1; k >= 1; k--) {
    for (const dimensioned of DIMENSIONED[kind]) {
      if (table[dimensioned]!.includes(words.slice(0, k).join(""))) {
        return { base: dimensioned, dimension: words.slice(k).join(" ") };
      }
    }
  }
  return undefined;
}

/**
 * Map the header row of a table to fields; unknown headers become carried-through columns.
 * Repeated window headers without a number ("Earliest", "Latest", "Earliest", "Latest")
 * count as the 2nd, 3rd... pair; a second id, name or address column is carried through;
 * any other field named twice is an issue.
 *
 * @param header - the header row's raw values
 * @param kind - the table it heads
 * @param where - sheet name and the sheet's 0-based row/col of `header[0]`
 * @returns the columns, with issues for fields named twice
 * @example mapColumns(["Stop", "Lat", "Lng", "Phone"], "stops", { sheet: "Stops", row: 0, col: 0 }).extras
 * // => [{ header: "Phone", col: 3 }]
 */
export function mapColumns(
  header: readonly unknown[],
  kind: TableKind,
  where: { readonly sheet: string; readonly row: number; readonly col: number },
  columnMap: readonly ColumnMapEntry[] = [],
): TableColumns {
  const fields = new Map<string, number>();
  const matches: ColumnMatch[] = [];
  const extras: { header: string; col: number; chosen?: boolean }[] = [];
  const mapped: ColumnMapEntry[] = [];
  const issues: Issue[] = [];
  const repeats = new Map<string, number>();
  header.forEach((raw, c) => {
    const v = plainCell(raw);
    const text = v === null ? "" : String(v).trim();
    if (text === "") return;
    const column = columnLetter(where.col + c);
    let hit = matchHeader(text, kind);
    const entry = columnMap.find((e) => headerKey(e.header) === headerKey(text));
    if (entry !== undefined) {
      const target = mappedTarget(entry.field, kind);
      const cell = cellAddress(where.row, where.col + c);
      if (target === undefined) {
        issues.push({
          sheet: where.sheet,
          cell,
          message: `${where.sheet}!${cell}: the column mapping "${entry.header}=${entry.field}"${entry.where ? ` (${entry.where})` : ""} names no field of the ${kind} table; map the column to one of ${Object.values(FIELD_LABELS[kind]).join(", ")}, or to carry or ignore.`,
        });
        return;
      }
      mapped.push(entry);
      if (target.kind === "ignore") {
        matches.push({ header: text, field: "ignored", column, mapped: true });
        return;
      }
      if (target.kind === "carry") {
        extras.push({ header: text, col: c, chosen: true });
        matches.push({ header: text, field: "extra", column, mapped: true });
        return;
      }
      hit = target;
    }
    if (hit === undefined) {
      extras.push({ header: text, col: c });
      matches.push({ header: text, field: "extra", column });
      return;
    }
    let index = hit.index;
    if (NUMBERED.has(hit.base) && index === undefined) {
      index = (repeats.get(hit.base) ?? 0) + 1;
      repeats.set(hit.base, index);
    }
    const key = fieldKey(hit.base, hit.dimension, index);
    const before = fields.get(key);
    if (before !== undefined && DESCRIPTIVE.has(key)) {
      // A second id or name column ("Stop" and "Customer ID") is harmless: show it beside the stop.
      extras.push({ header: text, col: c });
      matches.push({ header: text, field: "extra", column });
      return;
    }
    if (before !== undefined) {
      issues.push({
        sheet: where.sheet,
        cell: cellAddress(where.row, where.col + c),
        message: `${where.sheet}!${cellAddress(where.row, where.col + c)}: header "${text}" names the same field as column ${columnLetter(where.col + before)}; rename or delete one of the two columns.`,
      });
      return;
    }
    fields.set(key, c);
    matches.push({ header: text, field: key, column, ...(entry !== undefined ? { mapped: true } : {}) });
  });
  return { fields, matches, extras, mapped, issues };
}

/**
 * The key of a field in `TableColumns.fields`.
 *
 * @param base - base field, e.g. "demand"
 * @param dimension - unit word of a load column
 * @param index - window number (1 or absent for the first)
 * @returns "demand:kg", "earliest:2", or the base alone for a plain or first column
 * @example fieldKey("earliest", undefined, 2) // => "earliest:2"
 */
export function fieldKey(base: string, dimension?: string, index?: number): string {
  if (dimension !== undefined) return `${base}:${dimension}`;
  if (index !== undefined && index > 1) return `${base}:${index}`;
  return base;
}

function lookup(table: Record<string, readonly string[]>, key: string): string | undefined {
  for (const [field, keys] of Object.entries(table)) if (keys.includes(key)) return field;
  return undefined;
}
