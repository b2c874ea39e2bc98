import type { GridWritePlan } from "./planGridWrite.js";
import { cellA1 } from "./rangeAddress.js";

/** Most cells read back after one write; the rest are named as unchecked. */
export const TEXT_CHECK_LIMIT = 200;

/**
 * Reads back, in one sync, the written text cells Excel might not keep as typed (those in
 * `plan.checkCells`: starting with = + - @ or an apostrophe) and compares `values` with the
 * text sent. Whether the "@" format keeps such text exactly is not documented for the API
 * (OFFICE-NOTES.md), so the adapter checks instead of assuming.
 *
 * @returns the A1 addresses whose value differs from the text written, and how many were not checked
 * @example await verifyTextCells(context, sheet, plan) // => { changed: [], unchecked: 0 }
 */
export async function verifyTextCells(
  context: Excel.RequestContext,
  sheet: Excel.Worksheet,
  plan: GridWritePlan,
): Promise<{ changed: { address: string; wrote: string; reads: unknown }[]; unchecked: number }> {
  const cells = plan.checkCells.slice(0, TEXT_CHECK_LIMIT);
  if (cells.length === 0) return { changed: [], unchecked: 0 };
  const ranges = cells.map((cell) => {
    const range = sheet.getRange(cellA1(cell.row, cell.col));
    range.load("values");
    return range;
  });
  await context.sync();
  const changed = cells
    .map((cell, i) => ({ address: cellA1(cell.row, cell.col), wrote: cell.text, reads: ranges[i]!.values?.[0]?.[0] }))
    .filter((c) => c.reads !== c.wrote);
  return { changed, unchecked: plan.checkCells.length - cells.length };
}

/** The pane's sentence for cells that did not keep their text, or `undefined` when all did. */
export function textCheckNotice(sheet: string, result: Awaited<ReturnType<typeof verifyTextCells>>): string | undefined {
  const parts: string[] = [];
  if (result.changed.length > 0) {
    const first = result.changed[0]!;
    const list = result.changed
      .slice(0, 5)
      .map((c) => `${sheet}!${c.address}`)
      .join(", ");
    const more = result.changed.length > 5 ? ` and ${result.changed.length - 5} more` : "";
    parts.push(
      `Excel did not keep ${result.changed.length === 1 ? "a text cell" : "some text cells"} as written: ${list}${more} ` +
        `(${first.address} was written as ${JSON.stringify(first.wrote)} and reads ${JSON.stringify(first.reads)}). ` +
        `Retype those cells as text, or compare them with your input sheet.`,
    );
  }
  if (result.unchecked > 0) parts.push(`${result.unchecked} more text cells of "${sheet}" starting with = + - @ or ' were not checked.`);
  return parts.length > 0 ? parts.join(" ") : undefined;
}

/** Reads back the risky text cells of `plan` just written to `name` and tells `notice` about any Excel changed. */
export async function checkWrittenText(
  context: Excel.RequestContext,
  name: string,
  plan: GridWritePlan,
  notice: (message: string) => void,
): Promise<void> {
  if (plan.checkCells.length === 0) return;
  const text = textCheckNotice(name, await verifyTextCells(context, context.workbook.worksheets.getItem(name), plan));
  if (text) notice(text);
}
