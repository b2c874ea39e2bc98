/** Shared helpers of the workbook and CLI tests (not a test file itself). */
import { createHash } from "node:crypto";
import { access, mkdtemp, readFile, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import type { CliIO } from "../../src/cli/CliIO.js";
import type { ReadResult } from "../../src/sheets/ReadResult.js";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { readScenarioInput } from "../../src/workbook/scenario.js";

/** The committed demo workbook. */
export const DEMO_URL = new URL("../../demo/kiln-demo.xlsx", import.meta.url);

/** A CliIO that records what a command prints; the clock is a counter, so nothing depends on time. */
export function captureIO(isTTY = false): { io: CliIO; out: () => string; err: () => string } {
  let out = "";
  let err = "";
  let clock = 0;
  return {
    io: { stdout: (s) => void (out += s), stderr: (s) => void (err += s), isTTY, now: () => (clock += 1) },
    out: () => out,
    err: () => err,
  };
}

/** A fresh temporary folder with a copy of the demo workbook in it. */
export async function demoCopy(name = "demo.xlsx"): Promise<{ dir: string; path: string }> {
  const dir = await mkdtemp(join(tmpdir(), "kiln-files-"));
  const path = join(dir, name);
  await writeFile(path, await readFile(DEMO_URL));
  return { dir, path };
}

/** Load bytes with exceljs directly (the outside reference). */
export async function loadWithExcelJs(bytes: Uint8Array): Promise<ExcelJS.Workbook> {
  const book = new ExcelJS.Workbook();
  await book.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  return book;
}

/** Change one cell of a workbook file with exceljs and save it under a new name. */
export async function withCell(path: string, sheet: string, address: string, value: ExcelJS.CellValue, outPath: string): Promise<void> {
  const book = await loadWithExcelJs(await readFile(path));
  book.getWorksheet(sheet)!.getCell(address).value = value;
  await writeFile(outPath, new Uint8Array((await book.xlsx.writeBuffer()) as ArrayBuffer));
}

/** Every sheet's values as plain rows (exceljs' own reading), for equality checks. */
export function sheetValues(book: ExcelJS.Workbook, name: string): unknown[][] {
  const ws = book.getWorksheet(name);
  if (!ws) throw new Error(`no sheet ${name}`);
  const rows: unknown[][] = [];
  ws.eachRow({ includeEmpty: true }, (row, r) => {
    rows[r - 1] = (row.values as unknown[]).slice(1).map((v) => (v instanceof Date ? v.getTime() : v));
  });
  return rows;
}

/** SHA-256 of a file's bytes, to show a file was left byte for byte unchanged. */
export async function sha256(path: string): Promise<string> {
  return createHash("sha256")
    .update(await readFile(path))
    .digest("hex");
}

/** Whether a file or folder exists. */
export function exists(path: string): Promise<boolean> {
  return access(path).then(
    () => true,
    () => false,
  );
}

/**
 * The demo workbook opened with the file adapter and its Stops, Fleet and Settings read with a
 * move budget; throws (naming the cells) when the demo does not read.
 */
export async function readDemo(moves: number): Promise<{ book: ExcelJsWorkbook; read: ReadResult & { ok: true } }> {
  const book = await ExcelJsWorkbook.fromBuffer(await readFile(DEMO_URL));
  const read = await readScenarioInput(book, { stopsSheet: "Stops", fleetSheet: "Fleet", settingsSheet: "Settings", overrides: { moves } });
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.sheet}!${i.cell}: ${i.message}`).join("\n"));
  return { book, read };
}
