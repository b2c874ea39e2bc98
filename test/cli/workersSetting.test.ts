import { readFile } from "node:fs/promises";
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import { captureIO, demoCopy, loadWithExcelJs, sheetValues } from "../workbook/harness.js";

/** The demo with rows added to its Settings sheet (the demo is invented data). */
async function demoWithSettings(rows: readonly (readonly [string, unknown])[]): Promise<string> {
  const { path } = await demoCopy();
  const book = new ExcelJS.Workbook();
  await book.xlsx.readFile(path);
  for (const row of rows) book.getWorksheet("Settings")!.addRow([...row]);
  await book.xlsx.writeFile(path);
  return path;
}

/** The value under a label of the plan sheet's settings block. */
function settingOf(plan: unknown[][], label: string): unknown {
  const r = plan.findIndex((row) => row?.includes(label));
  return plan[r + 1]![plan[r]!.indexOf(label)];
}

describe("the Workers setting in the CLI", () => {
  it("a Workers row of the Settings sheet sets the chains when --workers is not given; --workers wins; the plan sheet records the number used", async () => {
    const path = await demoWithSettings([
      ["Move budget", 4000],
      ["Workers", 2],
    ]);
    const run = async (extra: string[], out: string): Promise<{ stdout: string; plan: unknown[][] }> => {
      const cap = captureIO();
      expect(await main(["plan", path, "--out", out, ...extra], cap.io), cap.err()).toBe(0);
      return { stdout: cap.out(), plan: sheetValues(await loadWithExcelJs(await readFile(out)), "Plan") };
    };
    const fromSheet = await run([], `${path}.sheet.xlsx`);
    expect(fromSheet.stdout).toMatch(/Chains: 2 on worker threads/);
    expect(settingOf(fromSheet.plan, "Workers")).toBe(2);
    const one = await run(["--workers", "1"], `${path}.one.xlsx`);
    expect(one.stdout).not.toMatch(/Chains:/);
    expect(settingOf(one.plan, "Workers")).toBe(1);
  }, 120_000);

  it("a bad Workers row is refused at its cell with the schema's message, and nothing is written", async () => {
    const path = await demoWithSettings([["Workers", 0]]);
    const cap = captureIO();
    expect(await main(["plan", path, "--out", `${path}.bad.xlsx`], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/Settings!B11: Workers 0 is not valid: enter a whole number from 1 to 64, such as 2\./);
    await expect(readFile(`${path}.bad.xlsx`)).rejects.toThrow();
  });
});
