import type { WorkbookPort } from "./WorkbookPort.js";

/** The sheets a run would read when the user names none. */
export interface InputSheets {
  readonly stops?: string;
  readonly fleet?: string;
  readonly settings?: string;
}

/** Header words that mark a fleet table (any one is enough, ignoring case and spaces). */
const FLEET_WORDS = ["vehicle", "van", "capacity", "shiftstart", "shiftend", "costperkm", "fixedcost"];
/** Header words of coordinates, needed by a stops table. */
const LAT_WORDS = ["latitude", "lat"];
const LON_WORDS = ["longitude", "lon", "lng", "long"];

/**
 * Find the input sheets: "Stops", "Fleet" and "Settings" by name (ignoring case), otherwise the
 * first sheet whose header row looks like a stops table (latitude and longitude headers, no
 * fleet headers) or a fleet table (vehicle, capacity or shift headers).
 *
 * @param port - the workbook
 * @returns the names found; a missing entry means no sheet fits
 * @example await findInputSheets(book) // => { stops: "Stops", fleet: "Fleet", settings: "Settings" }
 */
export async function findInputSheets(port: WorkbookPort): Promise<InputSheets> {
  const names = await port.listSheets();
  const byName = (wanted: string): string | undefined => names.find((n) => n.toLowerCase() === wanted);
  let stops = byName("stops");
  let fleet = byName("fleet");
  const settings = byName("settings");
  for (const name of names) {
    if (stops && fleet) break;
    if (name === settings) continue;
    const read = await port.readSheet(name);
    const header = (read?.values[0] ?? []).map((v) =>
      String(v)
        .toLowerCase()
        .replace(/[\s_]+/g, ""),
    );
    const has = (words: readonly string[]): boolean => header.some((h) => words.includes(h));
    const isFleet = has(FLEET_WORDS);
    if (!fleet && isFleet && name !== stops) fleet = name;
    else if (!stops && !isFleet && has(LAT_WORDS) && has(LON_WORDS) && name !== fleet) stops = name;
  }
  return { ...(stops ? { stops } : {}), ...(fleet ? { fleet } : {}), ...(settings ? { settings } : {}) };
}
