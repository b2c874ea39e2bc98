import type { Issue, CoolingSpec } from "../core/index.js";
import type { SheetRead } from "./grid.js";
import { excelError, isBlank, plainCell } from "./cellValue.js";
import { headerWords } from "./matchHeaders.js";
import type { PlanSettings } from "./PlanSettings.js";
import { checkColumnMap, parseColumnMap, type ColumnMapEntry } from "./columnMap.js";
import { cellAddress } from "./cellAddress.js";
import { cellIssue } from "./readTable.js";
import { SETTING_FIELDS } from "./settingFields.js";
import { SCHEDULE_PARAMETERS } from "./scheduleNames.js";
import { rangeText, type SettingKey } from "./settingFieldTypes.js";
import { buildCooling, parseSettingValue, type ScheduleParams } from "./settingsSchema.js";

const HEADER_KEYS = new Set(["setting", "settings", "key", "name", "parameter", "option"]);
const KEYS = Object.keys(SETTING_FIELDS) as SettingKey[];
/** Keys of a column-mapping row: "Map column | Drop time=service" or "Map column | Drop time | service". */
const MAP_KEYS = new Set(["mapcolumn", "columnmap", "map", "mapping", "columnmapping", "column"]);

/**
 * Read an optional two-column Settings sheet (key | value; keys matched like headers, with the
 * labels and ranges of `SETTING_FIELDS`): Detour factor, Speed, Service time, Windows, Late cost
 * per minute, Acceptance, Schedule (geometric, linear, lundy-mees, time-based), Alpha, Moves per
 * level, Steps, Beta, T0, T end, P0, P end, Seed, Time limit (seconds), Move budget, Objective.
 * A first row "Setting | Value" is skipped. A schedule named without its parameters gets
 * alpha 0.94 (geometric) or 20 steps (linear); Lundy-Mees needs Beta. Rows "Map column | Drop time=service"
 * (or the header and the field in two cells) map a table column to a field (`columnMap`).
 *
 * @param read - the settings range
 * @returns the settings given (only those) and an issue per unknown key or bad value
 * @example parseSettingsSheet({ sheet: "Settings", row: 0, col: 0, values: [["Windows", "soft"]] }).settings
 * // => { hardWindows: false }
 */
export function parseSettingsSheet(read: SheetRead): { settings: Partial<PlanSettings>; issues: Issue[] } {
  const issues: Issue[] = [];
  const given = new Map<SettingKey, { value: unknown; row0: number }>();
  const columnMap: ColumnMapEntry[] = [];
  read.values.forEach((cells, r) => {
    const row0 = read.row + r;
    const keyRaw = plainCell(cells[0]);
    if (isBlank(keyRaw)) return;
    const word = headerWords(String(keyRaw)).join("");
    if (r === 0 && HEADER_KEYS.has(word)) return;
    if (MAP_KEYS.has(word)) {
      const mapping = mappingRow(read, cells, row0);
      if (mapping === undefined) return;
      if ("entry" in mapping) columnMap.push(mapping.entry);
      else issues.push(cellIssue(read.sheet, row0, read.col + 1, mapping.message));
      return;
    }
    const key = KEYS.find((k) => SETTING_FIELDS[k].sheetKeys.includes(word));
    if (key === undefined) {
      const names = KEYS.map((k) => SETTING_FIELDS[k].label).join(", ");
      issues.push(cellIssue(read.sheet, row0, read.col, `unknown setting "${String(keyRaw)}"; use one of ${names} (or clear the row).`));
      return;
    }
    if (isBlank(cells[1])) return;
    if (given.has(key)) {
      issues.push(
        cellIssue(
          read.sheet,
          row0,
          read.col,
          `setting "${String(keyRaw)}" is given twice (also on row ${given.get(key)!.row0 + 1}); keep one.`,
        ),
      );
      return;
    }
    given.set(key, { value: cells[1], row0 });
  });
  const fail = (key: SettingKey, message: string): void => {
    issues.push(cellIssue(read.sheet, given.get(key)!.row0, read.col + 1, message));
  };
  const values = new Map<SettingKey, number | string>();
  for (const [key, g] of given) {
    const e = excelError(g.value);
    if (e !== undefined) {
      fail(key, `the cell shows the Excel error ${e}; type ${rangeText(SETTING_FIELDS[key])}.`);
      continue;
    }
    const parsed = parseSettingValue(key, g.value);
    if (parsed.ok) values.set(key, parsed.value);
    else fail(key, parsed.message);
  }
  const out: { -readonly [K in keyof PlanSettings]?: PlanSettings[K] } = {};
  const num = (k: SettingKey): number | undefined => values.get(k) as number | undefined;
  const set = <K extends keyof PlanSettings>(k: K, v: PlanSettings[K] | undefined): void => {
    if (v !== undefined) out[k] = v;
  };
  set("detourFactor", num("detourFactor"));
  set("speedKmh", num("speedKmh"));
  set("serviceMin", num("serviceMin"));
  if (values.has("windows")) out.hardWindows = values.get("windows") === "hard";
  set("lateCostPerMin", num("lateCostPerMin"));
  set("rule", values.get("rule") as PlanSettings["rule"] | undefined);
  set("p0", num("p0"));
  set("pEnd", num("pEnd"));
  set("seed", num("seed"));
  set("seconds", num("seconds"));
  set("moves", num("moves"));
  set("objective", values.get("objective") as PlanSettings["objective"] | undefined);
  set("country", values.get("country") as string | undefined);
  set("stabilityCost", num("stabilityCost"));
  set("workers", num("workers"));
  for (const k of ["driveBeforeBreakH", "breakMin", "windowBreakMin", "breakFrom", "breakTo"] as const) set(k, num(k));

  const params: ScheduleParams = {};
  for (const p of SCHEDULE_PARAMETERS) if (values.has(p)) params[p] = num(p);
  const kind = values.get("schedule") as CoolingSpec["kind"] | undefined;
  if (kind === undefined) {
    if (!given.has("schedule"))
      for (const p of SCHEDULE_PARAMETERS)
        if (given.has(p))
          fail(p, `${SETTING_FIELDS[p].label} needs a Schedule row (${rangeText(SETTING_FIELDS.schedule)}); add one or clear this value.`);
  } else {
    const built = buildCooling(kind, params);
    if ("spec" in built) out.cooling = built.spec;
    else for (const p of built.problems) fail(given.has(p.key) ? p.key : "schedule", p.message);
  }
  if (columnMap.length > 0) out.columnMap = columnMap;
  return { settings: out, issues };
}

/** A mapping row's entry (B: "Header=field", or B: header and C: field), nothing for a blank one, or what is wrong. */
function mappingRow(read: SheetRead, cells: readonly unknown[], row0: number): { entry: ColumnMapEntry } | { message: string } | undefined {
  const b = plainCell(cells[1]);
  const c = plainCell(cells[2]);
  if (isBlank(b)) return undefined;
  const where = `${read.sheet}!${cellAddress(row0, read.col + 1)}`;
  const parsed = isBlank(c)
    ? parseColumnMap(String(b), where)
    : checkColumnMap({ header: String(b).trim(), field: String(c).trim(), where });
  // The message starts with the cell, which cellIssue adds again.
  return "message" in parsed ? { message: parsed.message.replace(`${where}: `, "") } : parsed;
}
