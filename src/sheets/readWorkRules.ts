import type { DrivingBreakRule, WindowBreakRule } from "../core/index.js";
import { plainCell, readNumber, shownValue } from "./cellValue.js";
import { parseDuration } from "./parseDuration.js";
import type { RowReader } from "./rowReader.js";

/** The working-time columns of one fleet row, as the model wants them (minutes and km). */
export interface WorkRules {
  readonly maxDrivingMin?: number;
  readonly maxDutyMin?: number;
  readonly maxKm?: number;
  readonly drivingBreak?: DrivingBreakRule;
  readonly windowBreak?: WindowBreakRule;
}

/**
 * Read a fleet row's working-time columns: Drive before break (hours), Break min, Break from /
 * Break to (a break window, with Window break min or else Break min as its length), Max
 * driving h, Max duty h, Max km. Every value is the user's own: none has a default here, and
 * none is legal advice. Each defect is reported at its cell with a fix.
 *
 * @param r - the row
 * @param name - the vehicle's name, for messages
 * @returns the rules given on the row (absent ones left out)
 * @example readWorkRules(row, "Van A") // => { drivingBreak: { driveMin: 270, breakMin: 45 } }
 */
export function readWorkRules(r: RowReader, name: string): WorkRules {
  const driveMin = hours(r, "driveBeforeBreak", "drive before break", "4.5");
  const breakMin = r.duration("breakMin", "break length");
  const windowBreakMin = r.duration("windowBreakMin", "window break length");
  const from = r.time("breakFrom", "break from");
  const to = r.time("breakTo", "break to");
  const maxDrivingMin = hours(r, "maxDrivingH", "max driving", "9");
  const maxDutyMin = hours(r, "maxDutyH", "max duty", "10");
  const maxKm = r.num("maxKm", "max km", { min: 0, example: "250" });
  const out: { -readonly [K in keyof WorkRules]: WorkRules[K] } = {};
  if (maxDrivingMin !== undefined) out.maxDrivingMin = maxDrivingMin;
  if (maxDutyMin !== undefined) out.maxDutyMin = maxDutyMin;
  if (maxKm !== undefined) out.maxKm = maxKm;
  if (driveMin !== undefined) {
    if (driveMin <= 0)
      r.fail("driveBeforeBreak", `drive before break for vehicle "${name}" must be above 0 hours; type hours such as 4.5.`);
    else if (breakMin === undefined) {
      if (!r.excelErrorAt("breakMin"))
        r.fail(
          r.has("breakMin") ? "breakMin" : "driveBeforeBreak",
          `vehicle "${name}" has Drive before break but no break length; fill Break min with your own rule's minutes (such as 45).`,
        );
    } else out.drivingBreak = { driveMin, breakMin };
  }
  const fromGiven = !r.blank("breakFrom");
  const toGiven = !r.blank("breakTo");
  if (fromGiven !== toGiven) {
    const missing = fromGiven ? "breakTo" : "breakFrom";
    r.fail(
      r.has(missing) ? missing : fromGiven ? "breakFrom" : "breakTo",
      `vehicle "${name}" has only one end of its break window; fill both Break from and Break to (such as 12:00 and 13:30), or clear both.`,
    );
  } else if (from !== undefined && to !== undefined) {
    const length = windowBreakMin ?? breakMin;
    if (length === undefined) {
      r.fail("breakTo", `vehicle "${name}" has a break window but no break length; fill Break min (such as 30).`);
    } else if (to - from < length) {
      r.fail(
        "breakTo",
        `the break window of vehicle "${name}" is shorter than its ${length} min break; widen the window or shorten the break.`,
      );
    } else {
      out.windowBreak = { earliestMin: from, latestMin: to, breakMin: length };
    }
  }
  if (breakMin !== undefined && driveMin === undefined && !fromGiven && !toGiven) {
    r.fail(
      "breakMin",
      `vehicle "${name}" has Break min but no rule that uses it; fill Drive before break (hours) or Break from and Break to, or clear Break min.`,
    );
  }
  return out;
}

/** Hours as minutes: a number of hours (4.5) or h:mm text ("4:30"). */
function hours(r: RowReader, key: string, label: string, example: string): number | undefined {
  const v = r.raw(key);
  if (r.blank(key) || r.excelErrorAt(key)) return undefined;
  const h = readNumber(v);
  const fromText = h === undefined && typeof plainCell(v) === "string" && String(plainCell(v)).includes(":") ? parseDuration(v) : undefined;
  const min = h !== undefined ? h * 60 : fromText;
  if (min === undefined || !(min >= 0)) {
    r.fail(key, `${label} ${shownValue(v)} is not a number of hours; type hours such as ${example} (or h:mm such as 4:30).`);
    return undefined;
  }
  return min;
}
