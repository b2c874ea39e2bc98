/**
 * The result's status line, totals and broken rules (the map is drawn by `RouteMap`).
 */
import type { Plan, Problem, SolveResult } from "../core/index.js";
import { TERMS } from "../sheets/terms.js";
import type { PaneDom } from "./paneDom.js";

/**
 * Show the totals of a run.
 *
 * @param dom - the pane's elements
 * @param problem - the solved problem
 * @param result - the run's result
 * @param stopped - true when the user stopped the run early
 * @example renderResult(dom, read.problem, result, false)
 */
export function renderResult(dom: PaneDom, problem: Problem, result: SolveResult, stopped: boolean): void {
  const { plan, stats } = result;
  const t = plan.totals;
  const status = dom.resultStatus;
  const how = stopped ? "Stopped early; best plan so far" : "Finished";
  const left = t.mustServeUnassigned;
  status.textContent = plan.feasible
    ? `${how}: every rule kept (${stats.moves.toLocaleString("en")} moves).`
    : plan.violations.length === 0
      ? `${how}: ${left} stop${left === 1 ? "" : "s"} that must be served could not be served within capacity, windows and shifts; see below.`
      : `${how}: this plan breaks ${plan.violations.length} rule(s); see below.`;
  status.className = plan.feasible ? "status ok" : "status bad";
  status.dataset.feasible = String(plan.feasible);
  dom.totals.replaceChildren(
    ...totalsRows(problem, plan).flatMap(([k, v]) => {
      const dt = document.createElement("dt");
      dt.textContent = k;
      const dd = document.createElement("dd");
      dd.textContent = v;
      return [dt, dd];
    }),
  );
  dom.violations.replaceChildren(
    ...plan.violations.map((v) => {
      const li = document.createElement("li");
      li.textContent = v;
      return li;
    }),
    ...plan.unassigned.map((u) => {
      const li = document.createElement("li");
      li.className = "warning";
      const stop = problem.stops[u.stop];
      li.textContent = `${stop ? stop.name || stop.id : `stop ${u.stop}`} not served: ${u.reason}`;
      return li;
    }),
  );
}

/**
 * The pane's totals as label and text pairs; the unassigned counts carry the words of the plan
 * sheet and the CLI (`TERMS`).
 *
 * @param problem - the solved problem
 * @param plan - the plan shown
 * @returns rows in display order
 * @example totalsRows(problem, plan)[7] // => ["Unassigned", "2"]
 */
export function totalsRows(problem: Problem, plan: Plan): [string, string][] {
  const t = plan.totals;
  return [
    ["Vehicles", `${t.vehiclesUsed} of ${problem.vehicles.length}`],
    ["Distance", `${t.distanceKm.toFixed(1)} km`],
    ["Driving", hours(t.drivingMin)],
    ["Duty", hours(t.dutyMin)],
    ["Waiting", hours(t.waitMin)],
    ["Late", `${Math.round(t.lateMin)} min`],
    ["Cost", t.cost.toLocaleString("en", { maximumFractionDigits: 2 })],
    [TERMS.unassigned, String(t.unassigned)],
    [TERMS.mustServeLeftOut, String(t.mustServeUnassigned)],
  ];
}

function hours(minutes: number): string {
  return `${(minutes / 60).toFixed(1)} h`;
}
