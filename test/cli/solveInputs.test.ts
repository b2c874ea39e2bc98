import { readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import type { CliIO } from "../../src/cli/CliIO.js";

const runSolve = (args: string[], io: CliIO): Promise<number> => main(["plan", ...args], io);
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { captureIO, demoCopy } from "../workbook/harness.js";

describe("kiln solve input checks", () => {
  it("exits 2 naming the sheets there are when --stops names a missing sheet", async () => {
    const { path } = await demoCopy();
    const cap = captureIO();
    expect(await runSolve([path, "--moves", "1000", "--stops", "Drops"], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/^Drops: .*Stops, Fleet, Settings, README/m);
  });

  it("exits 2 on a file that is not an .xlsx workbook, and on a missing file", async () => {
    const { dir } = await demoCopy();
    const text = join(dir, "stops.xlsx");
    await writeFile(text, "Stop,Latitude\nS1,52\n");
    const cap = captureIO();
    expect(await runSolve([text], cap.io)).toBe(2);
    expect(cap.err()).toMatch(/stops\.xlsx is a text file \(CSV or similar\) with a workbook's name; rename it to \.csv/);
    const none = captureIO();
    expect(await runSolve([join(dir, "absent.xlsx")], none.io)).toBe(2);
    expect(none.err()).toMatch(/cannot read the file/);
  });

  it("runs with a seconds budget on the real clock and draws progress on a terminal", async () => {
    const { dir, path } = await demoCopy();
    let err = "";
    const io = { stdout: () => undefined, stderr: (s: string) => void (err += s), isTTY: true, now: () => performance.now() };
    expect(await runSolve([path, "--seconds", "0.3", "--out", join(dir, "timed.xlsx")], io)).toBe(0);
    // Progress comes at most every 100 ms; a 0.3 s run may end before the first report,
    // so only the format is checked when one was drawn, and the line is cleared at the end.
    if (err.includes("[")) expect(err).toMatch(/\r\[[#-]+\] +\d+%/);
    expect(err).not.toMatch(/warning/i);
  });

  it("carries the flags into the run record stored with the scenario (over the Settings sheet's values)", async () => {
    const { dir, path } = await demoCopy();
    const out = join(dir, "flags.xlsx");
    const flags = [
      "--moves",
      "3000",
      "--seed",
      "42",
      "--rule",
      "logistic",
      "--schedule",
      "geometric",
      "--alpha",
      "0.9",
      "--level",
      "250",
      "--t0",
      "80",
      "--detour",
      "1.45",
      "--speed",
      "35",
      "--soft-windows",
      "--out",
      out,
    ];
    expect(await runSolve([path, ...flags], captureIO().io)).toBe(0);
    const settings = await (await ExcelJsWorkbook.fromBuffer(await readFile(out))).readSettings();
    const record = JSON.parse(settings["kiln.scenario.Plan"]!);
    expect(record.settings).toMatchObject({
      seed: 42,
      rule: "logistic",
      moves: 3000,
      detourFactor: 1.45,
      speedKmh: 35,
      hardWindows: false,
      cooling: { kind: "geometric", alpha: 0.9, movesPerLevel: 250, t0: 80 },
    });
    expect(record.moves).toBe(3000);
    // The demo's Settings sheet says seed 7 and 1.3; without flags those values hold.
    const plain = join(dir, "plain.xlsx");
    expect(await runSolve([path, "--moves", "3000", "--out", plain], captureIO().io)).toBe(0);
    const plainRecord = JSON.parse((await (await ExcelJsWorkbook.fromBuffer(await readFile(plain))).readSettings())["kiln.scenario.Plan"]!);
    expect(plainRecord.settings).toMatchObject({ seed: 7, detourFactor: 1.3, hardWindows: true, cooling: { kind: "timeFraction" } });
  });
});
