// The layer rule of eslint.config.js (dependencies point inward) fails on a deliberate outward
// import, and passes the same file when the import points inward.
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint();

async function ruleIds(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).map((m) => m.ruleId ?? m.message);
}

describe("lint: layers point inward", () => {
  it("refuses src/core importing src/sheets", async () => {
    const ids = await ruleIds(
      'import { CAUTION_TEXT } from "../sheets/caution.js";\nexport const x = CAUTION_TEXT;\n',
      "src/core/outward.ts",
    );
    expect(ids).toContain("import-x/no-restricted-paths");
  });

  it("refuses src/sheets importing src/workbook", async () => {
    const ids = await ruleIds(
      'import type { WorkbookPort } from "../workbook/WorkbookPort.js";\nexport type P = WorkbookPort;\n',
      "src/sheets/outward.ts",
    );
    expect(ids).toContain("import-x/no-restricted-paths");
  });

  it("refuses src/sheets importing the CLI and the pane", async () => {
    const cli = await ruleIds('import { main } from "../cli/main.js";\nexport const m = main;\n', "src/sheets/outward.ts");
    const pane = await ruleIds('import { paneDom } from "../taskpane/paneDom.js";\nexport const p = paneDom;\n', "src/sheets/outward.ts");
    expect(cli).toContain("import-x/no-restricted-paths");
    expect(pane).toContain("import-x/no-restricted-paths");
  });

  it("refuses Node built-ins and Math.random in src/core", async () => {
    const ids = await ruleIds(
      'import { readFileSync } from "node:fs";\nexport const r = Math.random() + readFileSync.length;\n',
      "src/core/impure.ts",
    );
    expect(ids).toContain("no-restricted-imports");
    expect(ids).toContain("no-restricted-properties");
  });

  it("accepts src/sheets importing src/core through its public entry", async () => {
    const ids = await ruleIds('import { DAY_MIN } from "../core/index.js";\nexport const d = DAY_MIN;\n', "src/sheets/inward.ts");
    expect(ids).toEqual([]);
  });

  it("refuses a layer reaching past src/core/index.ts into the core's files", async () => {
    const sheets = await ruleIds('import { DAY_MIN } from "../core/constants.js";\nexport const d = DAY_MIN;\n', "src/sheets/deep.ts");
    const excel = await ruleIds(
      'import type { LatLon } from "../../core/model.js";\nexport type L = LatLon;\n',
      "src/workbook/excel/deep.ts",
    );
    expect(sheets).toContain("import-x/no-restricted-paths");
    expect(excel).toContain("import-x/no-restricted-paths");
  });
});
