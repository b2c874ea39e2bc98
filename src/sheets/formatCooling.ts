import type { AcceptanceRule, CoolingSpec } from "../core/index.js";
import { RULE_NAMES, SCHEDULE_NAMES } from "./scheduleNames.js";

/**
 * A readable text of a cooling schedule (and optionally its acceptance rule and the targets its
 * calibrated temperatures come from) for the settings block, the Compare sheet and the CLI.
 *
 * @param spec - the cooling schedule
 * @param rule - when given, appended after a comma
 * @param acceptance - when given, the acceptance targets of the mean uphill change behind the
 *   temperatures the schedule leaves to calibration
 * @returns e.g. "time-based, acceptance 0.50 → 0.001, Metropolis"
 * @throws TypeError when `spec.kind` is not a known schedule
 * @example formatCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 1000 }, "metropolis")
 * // => "geometric ×0.94 every 1000 moves, Metropolis"
 */
export function formatCooling(spec: CoolingSpec, rule?: AcceptanceRule, acceptance?: { p0: number; pEnd: number }): string {
  let text = scheduleText(spec);
  const hasT0 = spec.t0 !== undefined;
  const hasTEnd = "tEnd" in spec && spec.tEnd !== undefined;
  if (hasT0) text += `, T0 ${num(spec.t0!)}`;
  if (hasTEnd) text += `${hasT0 ? " →" : ", T end"} ${num((spec as { tEnd: number }).tEnd)}`;
  if (acceptance) {
    // The calibrated ends, named by the acceptance of the mean uphill change they aim at.
    const start = hasT0 ? undefined : acceptance.p0.toFixed(2);
    const end = endsAtTEnd(spec) && !hasTEnd ? num(acceptance.pEnd) : undefined;
    if (start !== undefined && end !== undefined) text += `, acceptance ${start} → ${end}`;
    else if (start !== undefined) text += `, acceptance from ${start}`;
    else if (end !== undefined) text += `, acceptance to ${end}`;
  }
  return rule === undefined ? text : `${text}, ${formatRule(rule)}`;
}

/**
 * The display name of an acceptance rule.
 *
 * @param rule - "metropolis" or "logistic"
 * @returns its name in `RULE_NAMES`: "Metropolis" or "Logistic (Barker)"
 * @throws TypeError on an unknown rule
 * @example formatRule("logistic") // => "Logistic (Barker)"
 */
export function formatRule(rule: AcceptanceRule): string {
  const name = Object.hasOwn(RULE_NAMES, rule) ? RULE_NAMES[rule] : undefined;
  if (name === undefined) throw new TypeError(`formatRule: unknown rule ${String(rule)}`);
  return name;
}

/** True when the schedule ends at T end (typed or calibrated), false when its own parameter sets the end. */
function endsAtTEnd(spec: CoolingSpec): boolean {
  if (spec.kind === "lundyMees") return spec.beta === undefined;
  if (spec.kind === "geometric") return spec.movesPerLevel === undefined || spec.alpha === undefined;
  return true;
}

function scheduleText(spec: CoolingSpec): string {
  const name = SCHEDULE_NAMES[spec?.kind]?.toLowerCase();
  switch (spec?.kind) {
    case "geometric": {
      const factor = spec.alpha === undefined ? "factor fitted to the run" : `×${num(spec.alpha)}`;
      const level = spec.movesPerLevel === undefined ? "levels spread over the run" : `every ${num(spec.movesPerLevel)} moves`;
      return `${name} ${factor} ${level}`;
    }
    case "linear":
      return `${name} in ${num(spec.steps)} steps`;
    case "lundyMees":
      return spec.beta === undefined
        ? `${SCHEDULE_NAMES.lundyMees} β fitted to the run`
        : `${SCHEDULE_NAMES.lundyMees} β=${num(spec.beta)}`;
    case "timeFraction":
      return name!;
    default:
      throw new TypeError(`formatCooling: unknown cooling kind ${String((spec as { kind?: unknown })?.kind)}`);
  }
}

/** Integers stay exact; other numbers keep four significant digits so the cell stays short. */
function num(x: number): string {
  if (Number.isInteger(x)) return String(x);
  return String(Number(x.toPrecision(4)));
}
