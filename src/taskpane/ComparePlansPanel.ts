/**
 * The pane's "Compare plans…": run two or more temperature plans (the form's own, the schedules
 * with their defaults, and one more typed in the notation of `kiln compare-schedules --try`) with
 * several seeds each on the same tables and budget, one run after another in the solver worker,
 * and show per plan the median, best and worst cost, vehicles and feasible runs (`summariseRuns`,
 * the same figures the command line prints) and every run's best-cost curve overlaid.
 */
import { summariseRuns, type Progress, type SeededRun, type SolveResult } from "../core/index.js";
import { formatCooling } from "../sheets/formatCooling.js";
import type { PlanSettings } from "../sheets/PlanSettings.js";
import type { ReadResult } from "../sheets/ReadResult.js";
import { parseSettingValue } from "../sheets/settingsSchema.js";
import { TERMS } from "../sheets/terms.js";
import {
  formatTemperaturePlan,
  parseTemperaturePlan,
  TEMPERATURE_PLAN_EXAMPLE,
  withTemperaturePlan,
  type TemperaturePlan,
} from "../sheets/temperaturePlan.js";
import { ComparePlot } from "./ComparePlot.js";
import type { SolverClient } from "./SolverClient.js";
import { vehicleColour } from "./vehicleColour.js";

/** The most seeds the pane runs each plan with. */
export const PANE_MAX_SEEDS = 20;

/** What the panel needs from the pane. */
export interface ComparePlansHost {
  readonly solver: SolverClient;
  /** The form's settings as they stand (the schedule of "This form's plan"). */
  formSettings(): PlanSettings;
  /** Read the tables with the form's settings; undefined (the pane shows why) when they cannot be planned. */
  prepare(): Promise<(ReadResult & { ok: true }) | undefined>;
  /** Called when a comparison starts or ends, so the pane can enable or disable Plan routes. */
  busyChanged(): void;
  guard<A extends unknown[]>(action: string, fn: (...args: A) => unknown): (...args: A) => void;
}

/** One temperature plan of a comparison, with the settings its runs use. */
interface ComparedPlan {
  readonly plan: TemperaturePlan;
  readonly settings: PlanSettings;
  readonly runs: SeededRun[];
}

/** The "Compare plans…" section of the pane. */
export class ComparePlansPanel {
  private readonly el = {
    section: byId<HTMLDetailsElement>("compare-plans"),
    current: byId<HTMLInputElement>("compare-current"),
    currentText: byId("compare-current-text"),
    choices: [...document.querySelectorAll<HTMLInputElement>("#compare-plans input[name='compare-plan']")],
    other: byId<HTMLInputElement>("compare-other"),
    seeds: byId<HTMLInputElement>("compare-seeds"),
    seconds: byId<HTMLInputElement>("compare-seconds"),
    run: byId<HTMLButtonElement>("compare-run"),
    stop: byId<HTMLButtonElement>("compare-stop"),
    status: byId("compare-status"),
    table: byId<HTMLTableElement>("compare-table"),
    body: byId<HTMLTableSectionElement>("compare-table-body"),
    list: byId<HTMLOListElement>("compare-plan-list"),
    plot: byId("compare-plot"),
  };
  private readonly plot = new ComparePlot(this.el.plot);
  private going = false;
  private stopRequested = false;

  constructor(private readonly host: ComparePlansHost) {}

  /** True while a comparison runs. */
  get running(): boolean {
    return this.going;
  }

  /** Wire the buttons and show the form's plan. */
  init(): void {
    this.el.run.addEventListener(
      "click",
      this.host.guard("Compare plans", () => this.compare()),
    );
    this.el.stop.addEventListener("click", () => {
      this.stopRequested = true;
      this.host.solver.stop();
    });
    this.el.section.addEventListener("toggle", () => this.refresh());
    this.refresh();
    this.setButtons();
  }

  /** Show the form's current temperature plan beside its checkbox (call when the form changes). */
  refresh(): void {
    const plan = this.formPlan();
    this.el.currentText.textContent = `${formatCooling(plan.cooling, plan.rule, { p0: plan.p0!, pEnd: plan.pEnd! })} (${plan.text})`;
  }

  /** Disable Run while anything runs; enable Stop only during a comparison. */
  setButtons(): void {
    this.el.run.disabled = this.going || this.host.solver.running;
    this.el.stop.disabled = !this.going;
  }

  private formPlan(): TemperaturePlan {
    const s = this.host.formSettings();
    const plan = { cooling: s.cooling, rule: s.rule, p0: s.p0, pEnd: s.pEnd };
    return { ...plan, text: formatTemperaturePlan(plan) };
  }

  /** The plans ticked or typed, or the messages saying what to fix. */
  private chosenPlans(): { plans: TemperaturePlan[] } | { errors: string[] } {
    const plans: TemperaturePlan[] = [];
    const errors: string[] = [];
    if (this.el.current.checked) plans.push(this.formPlan());
    for (const box of this.el.choices) {
      if (box === this.el.current || !box.checked) continue;
      const parsed = parseTemperaturePlan(box.value);
      if ("plan" in parsed) plans.push(parsed.plan);
      else errors.push(`${box.value}: ${parsed.error}`);
    }
    const other = this.el.other.value.trim();
    if (other !== "") {
      const parsed = parseTemperaturePlan(other);
      if ("plan" in parsed) plans.push(parsed.plan);
      else errors.push(`Another plan "${other}": ${parsed.error}`);
    }
    if (errors.length === 0 && plans.length < 2) {
      errors.push(
        `Compare plans: ${plans.length === 0 ? "no plan is chosen" : "only one plan is chosen"}; tick at least two plans, or tick one and type another under Another plan (e.g. ${TEMPERATURE_PLAN_EXAMPLE}).`,
      );
    }
    return errors.length > 0 ? { errors } : { plans };
  }

  private async compare(): Promise<void> {
    if (this.going) return;
    if (this.host.solver.running) return this.say(`${TERMS.planAction} is running: stop it or wait for it, then compare.`);
    const chosen = this.chosenPlans();
    const seeds = parseSeeds(this.el.seeds.value);
    const seconds = parseSettingValue("seconds", this.el.seconds.value);
    const errors = [
      ...("errors" in chosen ? chosen.errors : []),
      ...("error" in seeds ? [seeds.error] : []),
      ...(seconds.ok ? [] : [`Compare plans, Seconds per run: ${seconds.message}`]),
    ];
    if (errors.length > 0 || !("plans" in chosen) || !("seeds" in seeds) || !seconds.ok) return this.say(errors.join(" "));
    const read = await this.host.prepare();
    if (!read) return this.say("The tables cannot be planned yet: fix what is listed under Stops and Fleet, then compare.");
    const base = read.settings;
    const compared: ComparedPlan[] = [];
    for (const plan of chosen.plans) {
      const applied = withTemperaturePlan(base, plan);
      if ("error" in applied) return this.say(`Plan "${plan.text}": ${applied.error}`);
      compared.push({ plan, settings: applied.settings, runs: [] });
    }
    const budget = base.moves !== undefined ? { moves: base.moves } : { seconds: seconds.value as number };
    const budgetText = "moves" in budget ? `${budget.moves} moves (the Settings sheet's move budget)` : `${budget.seconds} s`;
    const total = compared.length * seeds.seeds;
    this.going = true;
    this.stopRequested = false;
    this.plot.reset();
    this.renderTable(read, []);
    this.setButtons();
    this.host.busyChanged();
    let made = 0;
    try {
      for (const [i, c] of compared.entries()) {
        if (this.stopRequested) break;
        for (let k = 0; k < seeds.seeds && !this.stopRequested; k++) {
          const seed = base.seed + k;
          this.say(`Run ${made + 1} of ${total}: plan ${i + 1}, seed ${seed}, ${budgetText} each…`);
          this.plot.addRun(`plan ${i + 1}, seed ${seed}`, vehicleColour(i));
          const { result, stopped } = await this.runOne(read, c.settings, seed, budget);
          if (stopped) {
            this.stopRequested = true;
            break;
          }
          c.runs.push({ seed, plan: result.plan });
          made++;
        }
      }
    } finally {
      this.going = false;
      this.setButtons();
      this.host.busyChanged();
    }
    this.renderTable(read, compared);
    this.say(
      made === total
        ? `Done: ${total} runs, ${seeds.seeds} seed(s) from ${base.seed} for each of ${compared.length} plans, ${budgetText} each.`
        : `Stopped after ${made} of ${total} runs; the table counts the finished runs only.`,
    );
  }

  private runOne(
    read: ReadResult & { ok: true },
    s: PlanSettings,
    seed: number,
    budget: { moves: number } | { seconds: number },
  ): Promise<{ result: SolveResult; stopped: boolean }> {
    return new Promise((resolve, reject) => {
      this.host.solver.start(
        read.problem,
        { seed, budget, rule: s.rule, cooling: s.cooling, p0: s.p0, pEnd: s.pEnd },
        {
          onProgress: (p: Progress) => this.plot.add(p),
          onResult: (result, stopped) => resolve({ result, stopped }),
          onError: (message, issues) =>
            reject(new Error([message, ...issues.map((i) => `${i.sheet}${i.cell ? "!" + i.cell : ""}: ${i.message}`)].join(" "))),
        },
      );
    });
  }

  private renderTable(read: ReadResult & { ok: true }, compared: readonly ComparedPlan[]): void {
    const { body, list, table } = this.el;
    body.replaceChildren();
    list.replaceChildren();
    table.hidden = compared.length === 0;
    for (const [i, c] of compared.entries()) {
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      const swatch = document.createElement("span");
      swatch.className = "swatch";
      swatch.style.background = vehicleColour(i);
      swatch.setAttribute("aria-hidden", "true");
      th.append(swatch, String(i + 1));
      tr.append(th);
      if (c.runs.length === 0) {
        for (let k = 0; k < 5; k++) tr.append(cell("–"));
      } else {
        const s = summariseRuns(read.problem, c.runs);
        const lo = Math.min(...s.vehicles);
        const hi = Math.max(...s.vehicles);
        tr.append(cell(money(s.median)), cell(money(s.best)), cell(money(s.worst)), cell(lo === hi ? String(lo) : `${lo}–${hi}`));
        tr.append(cell(`${s.feasible} of ${s.seeds.length}`));
        Object.assign(tr.dataset, { median: String(s.median), best: String(s.best), worst: String(s.worst), feasible: String(s.feasible) });
        tr.dataset.costs = JSON.stringify(s.costs);
      }
      body.append(tr);
      const li = document.createElement("li");
      li.textContent = `${formatCooling(c.settings.cooling, c.settings.rule, c.settings)} — ${c.plan.text}`;
      list.append(li);
    }
  }

  private say(text: string): void {
    this.el.status.textContent = text;
  }
}

/** Check the seeds field: a whole number from 1 to `PANE_MAX_SEEDS`. */
function parseSeeds(text: string): { seeds: number } | { error: string } {
  const n = Number(text.trim());
  if (text.trim() !== "" && Number.isInteger(n) && n >= 1 && n <= PANE_MAX_SEEDS) return { seeds: n };
  return { error: `Compare plans, Seeds: "${text}" is not valid: enter a whole number from 1 to ${PANE_MAX_SEEDS}, such as 3.` };
}

function cell(text: string): HTMLTableCellElement {
  const td = document.createElement("td");
  td.textContent = text;
  return td;
}

function money(x: number): string {
  return x.toLocaleString("en", { minimumFractionDigits: 2, maximumFractionDigits: 2 });
}

function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new TypeError(`taskpane.html has no element #${id}`);
  return el as T;
}
