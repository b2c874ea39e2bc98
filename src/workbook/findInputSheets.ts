import { guessTable } from "../sheets/guessTable.js";
import { SCENARIO_SETTINGS_PREFIX } from "../sheets/scenarioSettingsKey.js";
import { SETTINGS_SHEET } from "./exceljs/ExcelJsWorkbook.js";
import type { WorkbookPort } from "./WorkbookPort.js";

/** One sheet the detection looked at, and what it made of it. */
export interface SheetLook {
  readonly sheet: string;
  /** "stops" or "fleet" when taken; otherwise why not ("it is empty", ...). */
  readonly taken?: "stops" | "fleet" | "settings";
  /** 0-based sheet row of the header, for a table taken by its content. */
  readonly headerRow0?: number;
  readonly reason?: string;
}

/** The sheets a run would read when the user names none. */
export interface InputSheets {
  readonly stops?: string;
  readonly fleet?: string;
  readonly settings?: string;
  /** Every sheet in tab order with what the detection made of it. */
  readonly looked: readonly SheetLook[];
}

/**
 * Find the input sheets: "Stops", "Fleet" and "Settings" by name (ignoring case), otherwise the
 * first sheet that `guessTable` takes for a stops or fleet table (the table reader's own header
 * search and header matcher, so title rows, blank rows and merged group headers are fine).
 * Plan sheets Kiln wrote, the Compare sheet and the add-in's own store are not candidates.
 *
 * @param port - the workbook
 * @returns the names found (a missing entry means no sheet fits) and, per sheet, why it was or was not taken
 * @example (await findInputSheets(book)).stops // => "Stops"
 */
export async function findInputSheets(port: WorkbookPort): Promise<InputSheets> {
  const names = (await port.listSheets()).filter((n) => n !== SETTINGS_SHEET);
  const stored = await port.readSettings();
  const byName = (wanted: string): string | undefined => names.find((n) => n.toLowerCase() === wanted);
  let stops = byName("stops");
  let fleet = byName("fleet");
  const settings = byName("settings");
  const looked: SheetLook[] = [];
  for (const sheet of names) {
    if (sheet === stops) looked.push({ sheet, taken: "stops", reason: "named Stops" });
    else if (sheet === fleet) looked.push({ sheet, taken: "fleet", reason: "named Fleet" });
    else if (sheet === settings) looked.push({ sheet, taken: "settings", reason: "named Settings" });
    else if (stored[SCENARIO_SETTINGS_PREFIX + sheet] !== undefined) looked.push({ sheet, reason: "it is a plan Kiln wrote" });
    else if (sheet.toLowerCase() === "compare") looked.push({ sheet, reason: "it is the Compare sheet" });
    else {
      const read = await port.readSheet(sheet);
      const guess = read ? guessTable(read) : { kind: undefined, reason: "it could not be read" };
      if (guess.kind === undefined) looked.push({ sheet, reason: guess.reason });
      else if (guess.kind === "stops" && !stops) {
        stops = sheet;
        looked.push({ sheet, taken: "stops", headerRow0: guess.headerRow0 });
      } else if (guess.kind === "fleet" && !fleet) {
        fleet = sheet;
        looked.push({ sheet, taken: "fleet", headerRow0: guess.headerRow0 });
      } else {
        const first = guess.kind === "stops" ? stops : fleet;
        looked.push({ sheet, reason: `it looks like a ${guess.kind} table too, but "${first}" was taken first` });
      }
    }
  }
  return { ...(stops ? { stops } : {}), ...(fleet ? { fleet } : {}), ...(settings ? { settings } : {}), looked };
}

/**
 * Why no sheet was taken for a table: every sheet with its reason, and how to choose one.
 *
 * @param found - what `findInputSheets` returned
 * @param table - the table that is missing
 * @param how - how the user names a sheet in this front end, e.g. "name it with --stops SHEET"
 * @returns one line, e.g. `no stops table found: "Notes" (it is empty), "Vans" (taken as the fleet); name it with --stops SHEET`
 * @example describeMissingTable(found, "stops", "choose it under Stops sheet")
 */
export function describeMissingTable(found: InputSheets, table: "stops" | "fleet", how: string): string {
  const wanted =
    table === "stops"
      ? 'no sheet named "Stops" and no sheet that looks like a stops table'
      : 'no sheet named "Fleet" and no sheet that looks like a fleet table';
  const sheets = found.looked.map((l) => `"${l.sheet}" (${l.taken ? `taken as the ${l.taken}` : l.reason})`);
  return `${wanted}${sheets.length > 0 ? `; sheets looked at: ${sheets.join(", ")}` : "; the workbook has no sheets"}; ${how}.`;
}
