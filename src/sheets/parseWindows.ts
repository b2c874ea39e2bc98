import { DAY_MIN, type TimeWindow } from "../core/index.js";
import { plainCell } from "./cellValue.js";
import { parseTime } from "./parseTime.js";

/**
 * Time windows from one cell holding a list of ranges: "08:00-10:00; 14:00-16:00",
 * "8 am to 10 am, 2 pm to 4 pm", "22:00–02:00" (a range that ends before it starts rolls
 * over midnight). Ranges are separated by `;`, `,`, `|` or "and"; a range by `-`, `–`, "to"
 * or "until".
 *
 * @param value - a raw cell value
 * @returns the windows as typed (rolled over, not yet sorted or merged), or `undefined` when
 *   the cell is empty or any range is unreadable
 * @example parseWindows("08:00-10:00; 14:00-16:00")
 * // => [{ earliestMin: 480, latestMin: 600 }, { earliestMin: 840, latestMin: 960 }]
 */
export function parseWindows(value: unknown): TimeWindow[] | undefined {
  const v = plainCell(value);
  if (typeof v !== "string" || v.trim() === "") return undefined;
  const windows: TimeWindow[] = [];
  for (const part of v.split(/[;,|]|\band\b/i)) {
    if (part.trim() === "") continue;
    const ends = part.split(/\s*(?:[-–—]|\bto\b|\buntil\b)\s*/i);
    if (ends.length !== 2) return undefined;
    const earliest = parseTime(ends[0]);
    const latest = parseTime(ends[1]);
    if (earliest === undefined || latest === undefined) return undefined;
    windows.push(rollWindow(earliest, latest));
  }
  return windows.length > 0 ? windows : undefined;
}

/**
 * A window whose end is before its start closes the next day (end + 1440 minutes).
 *
 * @param earliestMin - opening, minutes from midnight
 * @param latestMin - closing, minutes from midnight
 * @returns the window with `latestMin >= earliestMin`
 * @example rollWindow(1320, 120) // => { earliestMin: 1320, latestMin: 1560 }
 */
export function rollWindow(earliestMin: number, latestMin: number): TimeWindow {
  return { earliestMin, latestMin: latestMin < earliestMin ? latestMin + DAY_MIN : latestMin };
}

/**
 * Windows sorted by opening time, overlapping or touching ones merged, as `Stop.windows`
 * wants them; no window at all becomes the one open window `[0, Infinity]`.
 *
 * @param windows - windows in any order
 * @returns sorted, disjoint windows (at least one)
 * @example mergeWindows([{ earliestMin: 840, latestMin: 960 }, { earliestMin: 480, latestMin: 900 }])
 * // => [{ earliestMin: 480, latestMin: 960 }]
 */
export function mergeWindows(windows: readonly TimeWindow[]): TimeWindow[] {
  if (windows.length === 0) return [{ earliestMin: 0, latestMin: Infinity }];
  const sorted = [...windows].sort((a, b) => a.earliestMin - b.earliestMin || a.latestMin - b.latestMin);
  const out: TimeWindow[] = [{ ...sorted[0]! }];
  for (const w of sorted.slice(1)) {
    const last = out[out.length - 1]!;
    if (w.earliestMin <= last.latestMin) {
      out[out.length - 1] = { earliestMin: last.earliestMin, latestMin: Math.max(last.latestMin, w.latestMin) };
    } else {
      out.push({ ...w });
    }
  }
  return out;
}
