// One name per concept: the pane (taskpane.html and its totals), the plan and Compare sheets and
// the CLI show the same words for each setting, cooling schedule, acceptance rule and the
// unassigned counts, and the action that plans ("Plan routes", `kiln plan`), all read from the
// tables in src/sheets (settingFields.ts, terms.ts).
// The expected words are the project's own choice; the check is that no surface diverges.
import { readFileSync, readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { COMPARE_HEADER } from "../../src/sheets/layoutCompare.js";
import { TOTALS_LABELS } from "../../src/sheets/layoutPlan.js";
import { formatCooling, formatRule } from "../../src/sheets/formatCooling.js";
import { SETTING_FIELDS } from "../../src/sheets/settingFields.js";
import { RULE_NAMES, SCHEDULE_NAMES, SCHEDULE_TOKENS } from "../../src/sheets/scheduleNames.js";
import { type SettingKey } from "../../src/sheets/settingFieldTypes.js";
import { parseSettingValue } from "../../src/sheets/settingsSchema.js";
import { TERMS } from "../../src/sheets/terms.js";
import { FIELD_OF } from "../../src/taskpane/settingsFromForm.js";
import { totalsRows } from "../../src/taskpane/renderResult.js";
import type { Plan, Problem } from "../../src/core/index.js";
import { captureIO, demoCopy } from "../workbook/harness.js";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const PANE_HTML = readFileSync(join(ROOT, "src/taskpane/taskpane.html"), "utf8");

/** The text of `<label for="id">` up to its `<small>` hint, tags stripped. */
function paneLabel(id: string): string | undefined {
  const m = new RegExp(`<label for="${id}"[^>]*>([\\s\\S]*?)(?:<small>|</label>)`).exec(PANE_HTML);
  return m?.[1]?.replace(/<[^>]*>/g, "").trim();
}

/** value -> text of the options of `<select id="id">`. */
function paneOptions(id: string): Map<string, string> {
  const select = new RegExp(`<select id="${id}"[^>]*>([\\s\\S]*?)</select>`).exec(PANE_HTML)?.[1] ?? "";
  return new Map([...select.matchAll(/<option value="([^"]*)">([^<]*)<\/option>/g)].map((m) => [m[1]!, m[2]!.trim()]));
}

/** A display text names `name` when it is the name itself or the name followed by a bracketed hint. */
function names(text: string | undefined, name: string): boolean {
  return text === name || (text?.startsWith(`${name} (`) ?? false);
}

describe("one display name per concept", () => {
  it("every pane settings field is labelled with its setting's label from the one settings table", () => {
    const keys = Object.keys(FIELD_OF) as SettingKey[];
    expect(keys.length).toBeGreaterThan(10);
    for (const key of keys) {
      const id = FIELD_OF[key]!;
      const text = paneLabel(id);
      expect(text, `label of #${id}`).toBeDefined();
      expect(names(text, SETTING_FIELDS[key].label), `#${id} is labelled "${text}", the table says "${SETTING_FIELDS[key].label}"`).toBe(
        true,
      );
    }
  });

  it("the pane's schedule and rule choices carry the table's names, and every schedule is offered", () => {
    const schedules = paneOptions("schedule");
    expect([...schedules.keys()].sort()).toEqual(Object.keys(SCHEDULE_NAMES).sort());
    for (const [kind, text] of schedules) expect(names(text, SCHEDULE_NAMES[kind as keyof typeof SCHEDULE_NAMES]), text).toBe(true);
    const rules = paneOptions("rule");
    expect([...rules.keys()].sort()).toEqual(Object.keys(RULE_NAMES).sort());
    for (const [rule, text] of rules) expect(names(text, RULE_NAMES[rule as keyof typeof RULE_NAMES]), text).toBe(true);
  });

  it("the plan and Compare sheets write the same schedule and rule names", () => {
    const specs = [
      { kind: "timeFraction" },
      { kind: "geometric", alpha: 0.9, movesPerLevel: 100 },
      { kind: "linear", steps: 20 },
      { kind: "lundyMees", beta: 0.001 },
    ] as const;
    for (const spec of specs) expect(formatCooling(spec).toLowerCase()).toContain(SCHEDULE_NAMES[spec.kind].toLowerCase());
    for (const rule of ["metropolis", "logistic"] as const) expect(formatRule(rule)).toBe(RULE_NAMES[rule]);
  });

  it("each CLI schedule token reads as the schedule of that name, and the help says which name each token is", async () => {
    for (const [token, kind] of Object.entries(SCHEDULE_TOKENS))
      expect(parseSettingValue("schedule", token)).toEqual({ ok: true, value: kind });
    const c = captureIO();
    expect(await main(["plan", "--help"], c.io)).toBe(0);
    const help = c.out().replace(/\s+/g, " ");
    for (const [token, kind] of Object.entries(SCHEDULE_TOKENS)) expect(help).toContain(`${token} = ${SCHEDULE_NAMES[kind]}`);
  });

  it("the unassigned counts have the same words on the plan sheet, the Compare sheet, in the pane and in the CLI", async () => {
    for (const term of [TERMS.unassigned, TERMS.mustServeLeftOut]) {
      expect(TOTALS_LABELS).toContain(term);
      expect(COMPARE_HEADER).toContain(term);
    }
    const problem = { stops: [], vehicles: [] } as unknown as Problem;
    const plan = {
      totals: {
        vehiclesUsed: 0,
        distanceKm: 0,
        drivingMin: 0,
        dutyMin: 0,
        waitMin: 0,
        lateMin: 0,
        cost: 0,
        unassigned: 2,
        mustServeUnassigned: 1,
      },
    } as unknown as Plan;
    const pane = new Map(totalsRows(problem, plan));
    expect(pane.get(TERMS.unassigned)).toBe("2");
    expect(pane.get(TERMS.mustServeLeftOut)).toBe("1");

    const { path } = await demoCopy("names.xlsx");
    const c = captureIO();
    expect(await main(["plan", path, "--moves", "2000", "--seed", "1"], c.io)).toBe(0);
    expect(c.out()).toMatch(new RegExp(`^${TERMS.unassigned}: \\d+`, "m"));
  });

  it("the action that plans has one name: the pane's button and step heading, the ribbon button, the help, the CLI command and the README", async () => {
    const action = TERMS.planAction;
    const text = (html: string): string =>
      html
        .replace(/<[^>]*>/g, " ")
        .replace(/\s+/g, " ")
        .trim();
    const button = /<button\b[^>]*\bid="optimize"[^>]*>([\s\S]*?)<\/button>/.exec(PANE_HTML)?.[1];
    expect(text(button ?? "")).toBe(action);
    const heading = /<section id="optimize-section"[^>]*>\s*<h2>([\s\S]*?)<\/h2>/.exec(PANE_HTML)?.[1] ?? "";
    expect(text(heading.replace(/<span class="step">[^<]*<\/span>/, ""))).toBe(action);
    // The ribbon button that opens the pane (manifest.xml resource string).
    const manifest = readFileSync(join(ROOT, "manifest.xml"), "utf8");
    expect(/<bt:String id="Kiln\.OpenPane\.Label" DefaultValue="([^"]*)"/.exec(manifest)?.[1]).toBe(action);
    // The pane's help tells the user to press it by that name.
    expect(readFileSync(join(ROOT, "src/taskpane/help.html"), "utf8")).toContain(`<em>${action}</em>`);
    // The CLI's command is the action's verb, and its help says the action.
    const verb = action.split(" ")[0]!.toLowerCase();
    const c = captureIO();
    expect(await main([verb, "--help"], c.io)).toBe(0);
    expect(c.out()).toMatch(new RegExp(`^Usage: kiln ${verb}\\b`, "m"));
    expect(c.out().toLowerCase()).toContain(action.toLowerCase());
    expect(readFileSync(join(ROOT, "README.md"), "utf8")).toContain(`"${action}"`);
  });

  it("no other word for the action that plans: 'optimize' appears in no text the user reads", () => {
    const other = /\boptimi[sz]e\b/i;
    const prose = [
      join(ROOT, "README.md"),
      join(ROOT, "DEVELOPERS.md"),
      join(ROOT, "manifest.xml"),
      ...walk(join(ROOT, "docs")).filter((f) => f.endsWith(".md")),
      ...walk(join(ROOT, "src")).filter((f) => f.endsWith(".html")),
    ];
    const hits = prose.flatMap((f) =>
      readFileSync(f, "utf8")
        // Markup and its attributes (element ids such as #optimize) are not read by the user.
        .replace(/<[^>]*>/g, " ")
        .split("\n")
        .flatMap((line, i) => (other.test(line) ? [`${f}:${i + 1}`] : [])),
    );
    // Every string the pane, the sheets and the CLI show, except ids and selectors.
    const code = walk(join(ROOT, "src")).filter((f) => f.endsWith(".ts") && !f.includes(`${join("src", "core")}`));
    for (const f of code) {
      const source = readFileSync(f, "utf8")
        .replace(/\/\*[\s\S]*?\*\//g, " ")
        .replace(/(^|[^:"'`\\])\/\/.*$/gm, "$1");
      for (const m of source.matchAll(/"(?:\\.|[^"\\\n])*"|'(?:\\.|[^'\\\n])*'|`(?:\\.|[^`\\])*`/g)) {
        const literal = m[0].slice(1, -1);
        if (/^[#.]?[\w-]+$/.test(literal)) continue;
        if (other.test(literal)) hits.push(`${f}: ${literal}`);
      }
    }
    expect(hits).toEqual([]);
  });

  it("no other word for unassigned stops is shown: 'unserved' appears in no text the user reads", () => {
    const files = [
      ...walk(join(ROOT, "src")).filter((f) => /\.(ts|html)$/.test(f) && !f.includes(`${join("src", "core")}`)),
      join(ROOT, "README.md"),
    ];
    const hits = files.flatMap((f) =>
      readFileSync(f, "utf8")
        .split("\n")
        .map((line, i) => ({ line: line.replace(/unservedCost|"unservedcost"|Unserved cost/g, ""), at: `${f}:${i + 1}` }))
        .filter(({ line }) => /unserved/i.test(line))
        .map(({ at }) => at),
    );
    expect(hits).toEqual([]);
  });
});

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? walk(path) : [path];
  });
}
