import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { prepareRun } from "../../src/cli/prepareRun.js";
import { solve } from "../../src/core/index.js";
import { captureIO, demoCopy } from "../workbook/harness.js";

const MOVES = 20_000;
const PLANS = [
  { spec: "time-based", flags: ["--schedule", "time-based"] },
  { spec: "geometric:alpha=0.95,level=2000", flags: ["--schedule", "geometric", "--alpha", "0.95", "--level", "2000"] },
];
const SEEDS = [3, 4, 5];

interface JsonRow {
  schedule: string;
  description: string;
  seeds: number[];
  costs: number[];
  vehicles: number[];
  feasible: number;
  median: number;
  best: number;
  worst: number;
}

describe("kiln compare-schedules", () => {
  it("two plans × three seeds on the demo: the table and --json give exactly the costs of three separate `kiln plan` runs per plan", async () => {
    const { dir, path } = await demoCopy();
    const args = [path, ...PLANS.flatMap((p) => ["--try", p.spec]), "--seeds", "3", "--seed", String(SEEDS[0]), "--moves", String(MOVES)];
    const json = captureIO();
    expect(await main(["compare-schedules", ...args, "--json"], json.io)).toBe(0);
    const rows = JSON.parse(json.out()) as JsonRow[];
    const text = captureIO();
    expect(await main(["compare-schedules", ...args], text.io)).toBe(0);
    expect(text.err()).toBe("");
    const out = text.out();
    expect(rows.map((r) => r.schedule)).toEqual(PLANS.map((p) => p.spec));

    // The independent check: `kiln plan` itself, one process-level command per plan and seed.
    const prepared = await prepareRun(path, {}, { moves: String(MOVES) });
    if ("errors" in prepared) throw new Error(prepared.errors.join("\n"));
    for (const [i, plan] of PLANS.entries()) {
      const row = rows[i]!;
      expect(row.seeds).toEqual(SEEDS);
      for (const [k, seed] of SEEDS.entries()) {
        const cap = captureIO();
        const outPath = join(dir, `p${i}-s${seed}.xlsx`);
        const planArgs = [path, ...plan.flags, "--seed", String(seed), "--moves", String(MOVES), "--out", outPath];
        expect(await main(["plan", ...planArgs], cap.io)).toBe(0);
        const printed = /^Cost: ([\d.]+)$/m.exec(cap.out())?.[1];
        const vehicles = Number(/^Vehicles used: (\d+) of/m.exec(cap.out())?.[1]);
        expect(row.costs[k]!.toFixed(2)).toBe(printed);
        expect(row.vehicles[k]).toBe(vehicles);
        expect(out).toContain(`seed ${seed} ${printed} (${vehicles})`);
        // And to the last bit against the core's solve with the settings kiln plan uses.
        const s = prepared.read.settings;
        const cooling = i === 0 ? { kind: "timeFraction" as const } : { kind: "geometric" as const, alpha: 0.95, movesPerLevel: 2000 };
        const direct = solve(prepared.read.problem, { seed, budget: { moves: MOVES }, rule: s.rule, cooling, p0: s.p0, pEnd: s.pEnd });
        expect(row.costs[k]).toBe(direct.plan.totals.cost);
      }
      // Median, best and worst of three feasible runs: the middle, lowest and highest cost (hand rule).
      const sorted = [...row.costs].sort((a, b) => a - b);
      expect(row.feasible).toBe(3);
      expect([row.best, row.median, row.worst]).toEqual(sorted);
      const tableRow = new RegExp(
        `^${i + 1}\\s+${row.median.toFixed(2)}\\s+${row.best.toFixed(2)}\\s+${row.worst.toFixed(2)}\\s+\\S+\\s+3 of 3$`,
        "m",
      );
      expect(out).toMatch(tableRow);
    }
    expect(out).toContain("geometric ×0.95 every 2000 moves");
    expect(out).toMatch(/straight-line distances/);
  }, 120_000);

  it.each([
    [
      "an unknown schedule",
      ["--try", "geometrc"],
      /--try "geometrc": Cooling schedule "geometrc" is not valid: enter one of geometric, linear, lundy-mees, time-based/,
    ],
    [
      "an unknown setting",
      ["--try", "geometric:alfa=0.9"],
      /"alfa" is not a setting of a temperature plan: use alpha, level, steps, beta, t0, tend, p0, pend, rule/,
    ],
    ["a setting the schedule does not use", ["--try", "linear:alpha=0.9"], /Alpha does not apply to the Linear schedule/],
    [
      "a value out of range (the settings schema's message)",
      ["--try", "geometric:alpha=1.5"],
      /Alpha 1.5 is not valid: enter a number above 0 and below 1/,
    ],
    ["a setting without a value", ["--try", "lundy-mees:beta"], /"beta" is not NAME=VALUE/],
    ["a setting given twice", ["--try", "geometric:alpha=0.9,alpha=0.8"], /alpha is given twice/],
    [
      "crossed acceptance targets",
      ["--try", "time-based:p0=0.1,pend=0.2"],
      /Final acceptance 0.2 must be below the initial acceptance 0.1/,
    ],
    ["no plan at all", [], /--try: no temperature plan given/],
    ["a bad seed count", ["--try", "linear", "--seeds", "0"], /--seeds: "0" is not a whole number from 1 to 1000/],
  ])("refuses %s with exit 2 and a line that says how to fix it", async (_what, extra, message) => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await main(["compare-schedules", path, "--moves", "1000", ...extra], cap.io)).toBe(2);
    expect(cap.err()).toMatch(message);
    expect(cap.out()).toBe("");
  });

  it("asks for the budget of each run when neither --moves nor --seconds is given", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await main(["compare-schedules", path, "--try", "linear"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/give the budget of each run: --moves K .* or --seconds S/);
  });

  it("takes the schedule only from --try: the schedule options of kiln plan are not offered", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await main(["compare-schedules", path, "--try", "linear", "--moves", "1000", "--alpha", "0.9"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/unknown option '--alpha'/);
  });

  it("documents the notation in --help", async () => {
    const cap = captureIO();
    expect(await main(["compare-schedules", "--help"], cap.io)).toBe(0);
    expect(cap.out()).toContain("--try <PLAN>");
    expect(cap.out()).toContain("geometric:alpha=0.95,level=2000");
    expect(cap.out()).toMatch(/alpha, level \(moves per level\), steps, beta, t0, tend, p0, pend, rule/);
  });
});
