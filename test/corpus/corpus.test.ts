import { copyFile, mkdtemp, readFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import type { CorpusExpectation } from "../../scripts/corpusCases.js";
import { main } from "../../src/cli/main.js";
import { UNASSIGNED_HEADER } from "../../src/sheets/layoutPlan.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { findInputSheets } from "../../src/workbook/findInputSheets.js";
import { readScenarioInput } from "../../src/workbook/scenario.js";
import { captureIO, loadWithExcelJs, sheetValues } from "../workbook/harness.js";

const CASES = JSON.parse(await readFile(new URL("expected.json", import.meta.url), "utf8")) as {
  name: string;
  file: string;
  expect: CorpusExpectation;
}[];

describe("corpus of bad and unusual workbooks (scripts/buildCorpus.ts): the command line", () => {
  it.each(CASES.map((c) => [c.name, c]))("%s", async (_, c) => {
    const dir = await mkdtemp(join(tmpdir(), "kiln-corpus-"));
    const path = join(dir, c.file);
    await copyFile(new URL(c.file, import.meta.url), path);
    const out = join(dir, "out.xlsx");
    const cap = captureIO();
    const code = await main(["plan", path, "--moves", "3000", "--out", out], cap.io);
    expect(code, cap.err()).toBe(c.expect.exit);
    for (const s of c.expect.stderr ?? []) expect(cap.err()).toContain(s);
    const warnings = cap
      .err()
      .split("\n")
      .filter((l) => l.startsWith("warning:"));
    for (const w of c.expect.warnings ?? []) expect(warnings.join("\n"), `warning with "${w}"`).toContain(w);
    if (code !== 0) {
      expect(cap.out()).toBe("");
      return;
    }
    const plan = sheetValues(await loadWithExcelJs(await readFile(out)), "Plan");
    const labels = plan[4]!;
    if (c.expect.mustServeLeftOut !== undefined) expect(plan[5]![labels.indexOf("Must-serve left out")]).toBe(c.expect.mustServeLeftOut);
    const table = plan.findIndex((r) => r.slice(0, 3).join("|") === UNASSIGNED_HEADER.join("|"));
    const unassigned = plan.slice(table + 1).map((r) => r[0]);
    if (c.expect.unassigned !== undefined) expect(unassigned.sort()).toEqual([...c.expect.unassigned].sort());
    for (const u of plan.slice(table + 1)) expect(String(u[2] ?? "")).not.toBe("");
    const cells = plan.flat();
    for (const t of c.expect.textKept ?? []) expect(cells, JSON.stringify(t.slice(0, 40))).toContain(t);
  });
});

describe("the same corpus through the pane's reading path (ExcelJsWorkbook, findInputSheets, readScenarioInput)", () => {
  it.each(CASES.map((c) => [c.name, c]))("%s", async (_, c) => {
    const bytes = await readFile(new URL(c.file, import.meta.url));
    let book: ExcelJsWorkbook;
    try {
      book = await ExcelJsWorkbook.fromBuffer(new Uint8Array(bytes));
    } catch {
      expect(c.expect.exit).toBe(2);
      return;
    }
    const found = await findInputSheets(book);
    if (!found.stops || !found.fleet) {
      expect(c.expect.exit).toBe(2);
      return;
    }
    const read = await readScenarioInput(book, { stopsSheet: found.stops, fleetSheet: found.fleet });
    expect(read.ok).toBe(c.expect.exit === 0);
    if (!read.ok) {
      const text = read.issues.map((i) => i.message).join("\n");
      for (const s of (c.expect.stderr ?? []).filter((x) => /^(Stops|Fleet)!/.test(x))) expect(text).toContain(s);
      return;
    }
    const text = read.warnings.map((w) => w.message).join("\n");
    for (const w of c.expect.warnings ?? []) expect(text).toContain(w);
  });
});
