import type { Issue } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { FIELD_LABELS, fieldLabel } from "./fieldLabels.js";
import { fieldKey, headerWords, matchHeader, type TableKind } from "./matchHeaders.js";

/**
 * One column mapping chosen by the user: the column's header as typed in the table, and the
 * field it holds (any header word of that field, "Service min" or "service"), or `carry` (keep it
 * as a carried-through column) or `ignore` (leave it out, no warning).
 */
export interface ColumnMapEntry {
  readonly header: string;
  readonly field: string;
  /** Where the mapping was given ("--map", "Settings!A14"); absent for one remembered by the pane. */
  readonly where?: string;
}

/** Key of the mapping the pane remembers in the workbook (`WorkbookPort.writeSetting`), as JSON. */
export const COLUMN_MAP_KEY = "kiln.columnMap";

/** Words that keep a column as it is (carried through, no warning) or leave it out. */
const CARRY_WORDS = ["carry", "carried", "carriedthrough", "keep", "extra"];
const IGNORE_WORDS = ["ignore", "ignored", "none", "skip", "unused", "notused"];

/** What a mapping's field word stands for in one table. */
export type MappedTarget =
  | { readonly kind: "field"; readonly base: string; readonly dimension?: string; readonly index?: number }
  | { readonly kind: "carry" }
  | { readonly kind: "ignore" };

/**
 * The comparison key of a header: its words joined, so "Drop time", "drop_time" and "DROP TIME" match.
 *
 * @param header - a header as typed
 * @returns the key
 * @example headerKey(" Drop-Time ") // => "droptime"
 */
export function headerKey(header: string): string {
  return headerWords(header).join("");
}

/**
 * What a mapping's field word means in a table.
 *
 * @param field - the word after "=" ("service", "Service min", "carry", "ignore")
 * @param kind - the table whose column is mapped
 * @returns the target, or `undefined` when the word names no field of that table
 * @example mappedTarget("service", "stops") // => { kind: "field", base: "serviceMin" }
 */
export function mappedTarget(field: string, kind: TableKind): MappedTarget | undefined {
  const key = headerKey(field);
  if (CARRY_WORDS.includes(key)) return { kind: "carry" };
  if (IGNORE_WORDS.includes(key)) return { kind: "ignore" };
  const hit = matchHeader(field, kind);
  return hit === undefined ? undefined : { kind: "field", ...hit };
}

/**
 * Read one mapping typed as "Header=field" (a CLI `--map` value, a Settings-sheet cell).
 *
 * @param text - e.g. "Drop time=service"
 * @param where - where it was typed, for messages ("--map", "Settings!B14")
 * @returns the entry, or a message saying what is wrong and how to write it
 * @example parseColumnMap("Drop time=service", "--map") // => { entry: { header: "Drop time", field: "service", where: "--map" } }
 */
export function parseColumnMap(text: string, where: string): { entry: ColumnMapEntry } | { message: string } {
  const at = text.lastIndexOf("=");
  const header = at < 0 ? "" : text.slice(0, at).trim();
  const field = at < 0 ? "" : text.slice(at + 1).trim();
  if (header === "" || field === "") {
    return {
      message: `${where}: "${text}" is not a column mapping; write the column's header, "=" and the field, such as "Drop time=service".`,
    };
  }
  return checkColumnMap({ header, field, where });
}

/**
 * Check that a mapping's field names a field of the stops or the fleet table (or carry, ignore).
 *
 * @param entry - the mapping
 * @returns the entry, or a message listing the fields
 * @example checkColumnMap({ header: "Drop time", field: "sevrice", where: "--map" }) // => { message: '--map: "sevrice" is not a field; ...' }
 */
export function checkColumnMap(entry: ColumnMapEntry): { entry: ColumnMapEntry } | { message: string } {
  if (mappedTarget(entry.field, "stops") !== undefined || mappedTarget(entry.field, "fleet") !== undefined) return { entry };
  const fields = (kind: TableKind): string => Object.values(FIELD_LABELS[kind]).join(", ");
  return {
    message: `${entry.where ?? "column mapping"}: "${entry.field}" is not a field (mapping the column "${entry.header}"); use one of the stops fields ${fields("stops")}, the fleet fields ${fields("fleet")}, or carry or ignore.`,
  };
}

/**
 * Several mapping lists in order of precedence (later wins for the same header).
 *
 * @param lists - e.g. the pane's remembered mapping, the Settings sheet's, the `--map` options
 * @returns one entry per header key
 * @example mergeColumnMaps([{ header: "Drop time", field: "carry" }], [{ header: "drop time", field: "service" }]) // => [{ header: "drop time", field: "service" }]
 */
export function mergeColumnMaps(...lists: readonly (readonly ColumnMapEntry[] | undefined)[]): ColumnMapEntry[] {
  const byKey = new Map<string, ColumnMapEntry>();
  for (const list of lists) for (const e of list ?? []) byKey.set(headerKey(e.header), e);
  return [...byKey.values()];
}

/**
 * A mapping as the plan sheet records it: "Drop time=Service min; Notes=ignore".
 *
 * @param used - the mappings that applied, with the table each applied to
 * @returns the text, "" for none
 * @example formatColumnMap([{ header: "Drop time", field: "service", kind: "stops" }]) // => "Drop time=Service min"
 */
export function formatColumnMap(used: readonly (ColumnMapEntry & { readonly kind?: TableKind })[]): string {
  return used
    .map((e) => {
      const kind = e.kind ?? "stops";
      const t = mappedTarget(e.field, kind);
      const name = t === undefined || t.kind !== "field" ? (t?.kind ?? e.field) : fieldLabel(kind, fieldKey(t.base, t.dimension, t.index));
      return `${e.header}=${name}`;
    })
    .join("; ");
}

/**
 * The mapping the pane remembered in the workbook, read leniently: entries that are not a
 * header and a field are dropped (the store is ours, and a damaged one must not block a run).
 *
 * @param json - the stored text under `COLUMN_MAP_KEY`, or undefined
 * @returns the entries, without `where` (so a header no longer present is not an error)
 * @example storedColumnMap('[{"header":"Drop time","field":"service"}]') // => [{ header: "Drop time", field: "service" }]
 */
export function storedColumnMap(json: string | undefined): ColumnMapEntry[] {
  if (json === undefined) return [];
  try {
    const parsed: unknown = JSON.parse(json);
    if (!Array.isArray(parsed)) return [];
    return parsed.flatMap((e: unknown) => {
      const o = e as { header?: unknown; field?: unknown };
      if (typeof o?.header !== "string" || typeof o.field !== "string") return [];
      return "entry" in checkColumnMap({ header: o.header, field: o.field }) ? [{ header: o.header, field: o.field }] : [];
    });
  } catch {
    return [];
  }
}

/**
 * Mappings the user typed (an option or a Settings row, so with a `where`) whose header is in
 * neither table: an issue each, since a misspelt header would otherwise change nothing silently.
 * Mappings remembered by the pane are for whatever tables come next and are not checked.
 */
export function unmatchedMappings(
  columnMap: readonly ColumnMapEntry[],
  used: readonly ColumnMapEntry[],
  input: { stops: SheetRead; fleet: SheetRead },
  tablesRead: boolean,
): Issue[] {
  if (!tablesRead) return [];
  const applied = new Set(used.map((e) => e.header));
  return columnMap
    .filter((e) => e.where !== undefined && !applied.has(e.header))
    .map((e) => ({
      sheet: e.where!.includes("!") ? e.where!.slice(0, e.where!.lastIndexOf("!")) : "options",
      cell: e.where!.includes("!") ? e.where!.slice(e.where!.lastIndexOf("!") + 1) : "",
      message: `${e.where}: no column headed "${e.header}" in the stops table (${input.stops.sheet}) or the fleet table (${input.fleet.sheet}); check the header as it is typed in the table (case, spaces and punctuation do not matter) or remove the mapping.`,
    }));
}
