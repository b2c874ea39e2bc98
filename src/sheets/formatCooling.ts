import type { AcceptanceRule, CoolingSpec } from "../core/index.js";

/**
 * A short text of a cooling schedule (and optionally its acceptance rule) for the settings
 * block and the Compare sheet. Temperatures that calibration will choose are left out.
 *
 * @param spec - the cooling schedule
 * @param rule - when given, appended after a comma
 * @returns e.g. "geometric a=0.94 L=1000, Metropolis"
 * @throws TypeError when `spec.kind` is not a known schedule
 * @example formatCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 1000 }, "metropolis")
 * // => "geometric a=0.94 L=1000, Metropolis"
 */
export function formatCooling(spec: CoolingSpec, rule?: AcceptanceRule): string {
  const text = scheduleText(spec);
  return rule === undefined ? text : `${text}, ${formatRule(rule)}`;
}

/**
 * The display name of an acceptance rule.
 *
 * @param rule - "metropolis" or "logistic"
 * @returns "Metropolis" or "logistic (Barker)"
 * @throws TypeError on an unknown rule
 * @example formatRule("logistic") // => "logistic (Barker)"
 */
export function formatRule(rule: AcceptanceRule): string {
  if (rule === "metropolis") return "Metropolis";
  if (rule === "logistic") return "logistic (Barker)";
  throw new TypeError(`formatRule: unknown rule ${String(rule)}`);
}

function scheduleText(spec: CoolingSpec): string {
  switch (spec?.kind) {
    case "geometric":
      return join(`geometric a=${num(spec.alpha)} L=${spec.movesPerLevel === undefined ? "fit" : num(spec.movesPerLevel)}`, spec.t0);
    case "linear":
      return join(`linear steps=${num(spec.steps)}`, spec.t0, spec.tEnd);
    case "lundyMees":
      return join(`Lundy-Mees b=${num(spec.beta)}`, spec.t0);
    case "timeFraction":
      return join("time-fraction", spec.t0, spec.tEnd);
    default:
      throw new TypeError(`formatCooling: unknown cooling kind ${String((spec as { kind?: unknown })?.kind)}`);
  }
}

function join(head: string, t0?: number, tEnd?: number): string {
  let text = head;
  if (t0 !== undefined) text += ` T0=${num(t0)}`;
  if (tEnd !== undefined) text += ` Tend=${num(tEnd)}`;
  return text;
}

/** Integers stay exact; other numbers keep four significant digits so the cell stays short. */
function num(x: number): string {
  if (Number.isInteger(x)) return String(x);
  return String(Number(x.toPrecision(4)));
}
