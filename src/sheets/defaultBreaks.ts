import type { DrivingBreakRule, Vehicle, WindowBreakRule } from "../core/index.js";
import type { PlanSettings } from "./PlanSettings.js";

/** Fleet fields that give a vehicle its own break rule (then the Settings' break defaults do not apply). */
export const BREAK_FIELDS = ["driveBeforeBreak", "breakMin", "windowBreakMin", "breakFrom", "breakTo"];

/** The Settings' break defaults as vehicle rules (checked whole by `crossProblems`); none when none is set. */
export function defaultBreaks(s: PlanSettings): Pick<Vehicle, "drivingBreak" | "windowBreak"> {
  const out: { drivingBreak?: DrivingBreakRule; windowBreak?: WindowBreakRule } = {};
  if (s.driveBeforeBreakH !== undefined && s.breakMin !== undefined)
    out.drivingBreak = { driveMin: s.driveBeforeBreakH * 60, breakMin: s.breakMin };
  const length = s.windowBreakMin ?? s.breakMin;
  if (s.breakFrom !== undefined && s.breakTo !== undefined && length !== undefined)
    out.windowBreak = { earliestMin: s.breakFrom, latestMin: s.breakTo, breakMin: length };
  return out;
}
