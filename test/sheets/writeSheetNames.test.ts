import ExcelJS from "exceljs";
import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { cleanSheetName, uniqueSheetName } from "../../src/sheets/uniqueSheetName.js";

// Excel's sheet-name rules (Microsoft support, "Rename a worksheet"; from memory): at most 31
// characters, none of : \ / ? * [ ], not blank, no apostrophe at either end, unique ignoring
// case, "History" reserved. exceljs 4 enforces the same list in its worksheet-name setter.
const FORBIDDEN = [":", "\\", "/", "?", "*", "[", "]"];

/** Names rich in what the rules are about: forbidden characters, apostrophes, case twins, length. */
const nameLike = fc.oneof(
  fc.string({ unit: "binary", maxLength: 45 }),
  fc.string({ unit: fc.constantFrom(...FORBIDDEN, "'", " ", "a", "A", "\t"), maxLength: 40 }),
  fc.constantFrom("History", "history", "Plan", "PLAN", "plan", "", "'", "A".repeat(31), "a".repeat(35)),
);

describe("uniqueSheetName: Excel's sheet-name rules", () => {
  it.each(FORBIDDEN)("replaces the forbidden character %j", (ch) => {
    const name = uniqueSheetName(`North${ch}South`, []);
    expect(name).not.toContain(ch);
    expect(name).toMatch(/^North[ -]South$/);
  });

  it("turns date and time separators into dashes and brackets into spaces", () => {
    expect(uniqueSheetName("Run 2026/12/01 18:30", [])).toBe("Run 2026-12-01 18-30");
    expect(uniqueSheetName("Mon 1/12: [late]?", [])).toBe("Mon 1-12- late");
  });

  it('falls back to "Plan" when nothing printable is left', () => {
    expect(uniqueSheetName("", [])).toBe("Plan");
    expect(uniqueSheetName("   ", [])).toBe("Plan");
    expect(uniqueSheetName("[*?]", [])).toBe("Plan");
    expect(uniqueSheetName("'''", [])).toBe("Plan");
    expect(uniqueSheetName("", ["Plan"])).toBe("Plan (2)");
  });

  it("strips apostrophes at both ends but keeps inner ones", () => {
    expect(uniqueSheetName("'Tom's run'", [])).toBe("Tom's run");
    expect(cleanSheetName(" ' a ' ")).toBe("a");
  });

  it("keeps at most 31 characters", () => {
    const long = "Thursday deliveries north and east of the river";
    expect(uniqueSheetName(long, [])).toBe(long.slice(0, 31).trimEnd());
    expect(uniqueSheetName(long, []).length).toBeLessThanOrEqual(31);
  });

  it("truncates before the suffix so a unique name stays within 31 characters", () => {
    const base = "A".repeat(40);
    const first = uniqueSheetName(base, []);
    expect(first).toBe("A".repeat(31));
    const second = uniqueSheetName(base, [first]);
    expect(second).toBe("A".repeat(27) + " (2)");
    expect(second.length).toBe(31);
    const third = uniqueSheetName(base, [first, second]);
    expect(third).toBe("A".repeat(27) + " (3)");
  });

  it("never splits a surrogate pair when truncating", () => {
    const name = uniqueSheetName("x".repeat(30) + "🚚🚚", []);
    expect(name).toBe("x".repeat(30));
  });

  it("is unique ignoring case: Plan 2, Plan 2 (2), Plan 2 (3)", () => {
    const sheets: string[] = [];
    for (let i = 0; i < 3; i++) sheets.push(uniqueSheetName("Plan 2", sheets));
    expect(sheets).toEqual(["Plan 2", "Plan 2 (2)", "Plan 2 (3)"]);
    expect(uniqueSheetName("plan 2", ["PLAN 2", "pLaN 2 (2)"])).toBe("plan 2 (3)");
  });

  it('never returns "History" in any case (reserved by Excel, common practice)', () => {
    expect(uniqueSheetName("History", [])).toBe("History (2)");
    expect(uniqueSheetName("history", [])).toBe("history (2)");
  });

  it("throws TypeError on arguments of the wrong type", () => {
    expect(() => uniqueSheetName(5 as never, [])).toThrow(TypeError);
    expect(() => uniqueSheetName("a", "b" as never)).toThrow(/existing/);
  });

  it("exceljs's check rejects the raw inputs the property below feeds in (so the property can fail)", () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet("plan");
    for (const bad of ["a:b", "a/b", "a[b]", "'a", "a'", "PLAN", "History"]) {
      expect(() => wb.addWorksheet(bad), bad).toThrow();
    }
  });

  it("every name it returns is accepted by exceljs's worksheet-name check (reference library, property)", () => {
    const warn = vi.spyOn(console, "warn");
    fc.assert(
      fc.property(fc.array(nameLike, { maxLength: 6 }), (wanted) => {
        const wb = new ExcelJS.Workbook();
        const names: string[] = [];
        for (const w of wanted) {
          const name = uniqueSheetName(w, names);
          expect(name.length).toBeGreaterThan(0);
          expect(name.length).toBeLessThanOrEqual(31);
          expect(names.map((n) => n.toUpperCase())).not.toContain(name.toUpperCase());
          wb.addWorksheet(name); // throws on a forbidden character, edge apostrophe or duplicate
          names.push(name);
        }
      }),
      { numRuns: 300, seed: 20261201 },
    );
    expect(warn).not.toHaveBeenCalled(); // exceljs warns (and truncates) above 31 characters
    warn.mockRestore();
  });
});
