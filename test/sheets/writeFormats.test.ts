import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import type { Stop, Visit } from "../../src/core/model.js";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import { columnWidths } from "../../src/sheets/columnWidths.js";
import { formatCooling, formatRule } from "../../src/sheets/formatCooling.js";
import { formatLoad } from "../../src/sheets/formatLoad.js";
import { layoutPlan } from "../../src/sheets/layoutPlan.js";
import { NUMBER_FORMATS, dayFraction, roundTo } from "../../src/sheets/numberFormats.js";
import { scenarioSettingsKey } from "../../src/sheets/scenarioSettingsKey.js";
import { windowUsed } from "../../src/sheets/windowUsed.js";
import { extraHeaders, plan, problem, run, stopRows } from "../fixtures/writerPlan.js";

describe("dayFraction: ECMA-376 time values (time of day is the fraction of the day)", () => {
  it("noon is 0.5, 08:30 (510 min) is 0.3541666..., 06:00 is 0.25", () => {
    expect(dayFraction(720)).toBe(0.5);
    expect(dayFraction(510)).toBeCloseTo(0.3541666666666667, 15);
    expect(dayFraction(360)).toBe(0.25);
  });
  it("past midnight exceeds 1 (01:10 next day = 1510 min)", () => {
    expect(dayFraction(1510)).toBeCloseTo(1 + 70 / 1440, 15);
  });
  it("throws TypeError on a non-finite value", () => {
    expect(() => dayFraction(Infinity)).toThrow(TypeError);
  });
});

describe("roundTo", () => {
  it("rounds km to 0.1 and money to 0.01, no negative zero", () => {
    expect(roundTo(12.34, 1)).toBe(12.3);
    expect(roundTo(2.16, 1)).toBe(2.2);
    expect(roundTo(298.574, 2)).toBe(298.57);
    expect(Object.is(roundTo(-0.04, 1), 0)).toBe(true);
  });
  it("throws RangeError on bad decimals", () => {
    expect(() => roundTo(1, 1.5)).toThrow(RangeError);
  });
});

describe("formatCooling", () => {
  it("writes each schedule in words, with the rule after a comma", () => {
    expect(formatCooling({ kind: "geometric", alpha: 0.94, movesPerLevel: 1000 }, "metropolis")).toBe(
      "geometric ×0.94 every 1000 moves, Metropolis",
    );
    expect(formatCooling({ kind: "linear", steps: 50, t0: 12.3456, tEnd: 0.01 })).toBe("linear in 50 steps, T0 12.35 → 0.01");
    expect(formatCooling({ kind: "lundyMees", beta: 0.0001 }, "logistic")).toBe("Lundy–Mees β=0.0001, Logistic (Barker)");
    expect(formatCooling({ kind: "timeFraction" })).toBe("time-based");
    expect(formatCooling({ kind: "geometric", alpha: 0.9, movesPerLevel: 123457 })).toBe("geometric ×0.9 every 123457 moves");
  });
  it("names the calibrated ends by the acceptance they aim at, only where the schedule reaches them", () => {
    const acc = { p0: 0.5, pEnd: 0.001 };
    expect(formatCooling({ kind: "timeFraction" }, undefined, acc)).toBe("time-based, acceptance 0.50 → 0.001");
    expect(formatCooling({ kind: "lundyMees" }, "metropolis", acc)).toBe(
      "Lundy–Mees β fitted to the run, acceptance 0.50 → 0.001, Metropolis",
    );
    // A typed beta sets the end itself: only the start is calibrated.
    expect(formatCooling({ kind: "lundyMees", beta: 1e-4 }, undefined, acc)).toBe("Lundy–Mees β=0.0001, acceptance from 0.50");
    expect(formatCooling({ kind: "geometric", movesPerLevel: 500 }, undefined, acc)).toBe(
      "geometric factor fitted to the run every 500 moves, acceptance 0.50 → 0.001",
    );
    expect(formatCooling({ kind: "timeFraction", t0: 40 }, undefined, acc)).toBe("time-based, T0 40, acceptance to 0.001");
    expect(formatCooling({ kind: "linear", steps: 5, t0: 40, tEnd: 1 }, undefined, acc)).toBe("linear in 5 steps, T0 40 → 1");
  });
  it("throws TypeError on an unknown schedule or rule", () => {
    expect(() => formatCooling({ kind: "cosine" } as never)).toThrow(TypeError);
    expect(() => formatRule("greedy" as never)).toThrow(TypeError);
  });
});

describe("scenarioSettingsKey", () => {
  it("is kiln.scenario.<sheet name>, stable", () => {
    expect(scenarioSettingsKey("Plan 2 (3)")).toBe("kiln.scenario.Plan 2 (3)");
    expect(scenarioSettingsKey("Plan 2 (3)")).toBe(scenarioSettingsKey("Plan 2 (3)"));
  });
  it("throws TypeError on an empty name", () => {
    expect(() => scenarioSettingsKey("")).toThrow(TypeError);
  });
});

describe("CAUTION_TEXT", () => {
  it("says distances are straight-line estimates with a detour factor and names what to check", () => {
    for (const part of [
      "straight-line",
      "detour factor",
      "estimates",
      "roads",
      "vehicle restrictions",
      "driving and rest hours",
      "local regulations",
      "company rules prevail",
    ]) {
      expect(CAUTION_TEXT).toContain(part);
    }
  });
});

describe("windowUsed (multiple windows: show the one used)", () => {
  const stop: Stop = {
    id: "W",
    name: "W",
    location: 0,
    demand: [1],
    serviceMin: 5,
    windows: [
      { earliestMin: 480, latestMin: 540 },
      { earliestMin: 720, latestMin: 780 },
    ],
  };
  const visit = (startMin: number, lateMin: number): Visit => ({
    stop: 0,
    arrivalMin: startMin,
    waitMin: 0,
    startMin,
    departureMin: startMin + 5,
    loadAfter: [0],
    legKm: 0,
    totalKm: 0,
    lateMin,
  });
  it("picks the window containing the start", () => {
    expect(windowUsed(stop, visit(500, 0))).toBe(stop.windows[0]);
    expect(windowUsed(stop, visit(730, 0))).toBe(stop.windows[1]);
  });
  it("for a late start, picks the window the lateness was measured against", () => {
    expect(windowUsed(stop, visit(790, 10))).toBe(stop.windows[1]);
    expect(windowUsed(stop, visit(560, 20))).toBe(stop.windows[0]);
  });
});

describe("formatLoad", () => {
  it("one dimension is a number, several are text, none is empty", () => {
    expect(formatLoad([120], ["kg"])).toBe(120);
    expect(formatLoad([120, 8], ["kg", "crates"])).toBe("120 kg / 8 crates");
    expect(formatLoad([0.1 + 0.2], ["t"])).toBe(0.3);
    expect(formatLoad([], [])).toBeNull();
  });
  it("throws RangeError when the lengths differ", () => {
    expect(() => formatLoad([1, 2], ["kg"])).toThrow(RangeError);
  });
});

describe("columnWidths", () => {
  it("fits the longest shown text plus a margin, between 6 and 40", () => {
    expect(
      columnWidths(
        [
          ["Vehicle", 12.5, "x".repeat(80)],
          [null, 1, null],
        ],
        [
          [null, "0.0", null],
          [null, "0.0", null],
        ],
      ),
    ).toEqual([9, 6, 40]);
  });
  it("ignores skipped rows", () => {
    expect(columnWidths([["a".repeat(30)], ["ab"]], [[null], [null]], [0])).toEqual([6]);
  });
});

/** Day zero of the ECMA-376 1900 date system as exceljs maps it (serial 0 = 1899-12-30, common practice). */
const EPOCH_1900_MS = Date.UTC(1899, 11, 30);

describe("the scenario grid survives an xlsx round trip through exceljs (reference library)", () => {
  it("number formats, numbers and formula-like text come back unchanged", async () => {
    const { grid } = layoutPlan({ problem, plan, run, stopRows, extraHeaders });
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Plan");
    grid.values.forEach((row, r) =>
      row.forEach((v, c) => {
        if (v === null) return;
        const cell = ws.getCell(r + 1, c + 1);
        cell.value = v;
        const f = grid.numberFormats?.[r]?.[c];
        if (f) cell.numFmt = f;
      }),
    );
    const back = new ExcelJS.Workbook();
    await back.xlsx.load((await wb.xlsx.writeBuffer()) as ArrayBuffer);
    const ws2 = back.getWorksheet("Plan")!;
    const formats = new Set<string>();
    grid.values.forEach((row, r) =>
      row.forEach((v, c) => {
        if (v === null) return;
        const cell = ws2.getCell(r + 1, c + 1);
        // exceljs reads cells with a date/time format back as Dates of the 1900 system (UTC).
        const got = cell.value instanceof Date ? (cell.value.getTime() - EPOCH_1900_MS) / 86_400_000 : cell.value;
        if (typeof v === "number") expect(got as number, `${r},${c}`).toBeCloseTo(v, 8);
        else expect(got, `${r},${c}`).toEqual(v);
        expect(cell.type === ExcelJS.ValueType.Formula, `${r},${c}`).toBe(false);
        const f = grid.numberFormats?.[r]?.[c];
        if (f) {
          expect(cell.numFmt).toBe(f);
          formats.add(f);
        }
      }),
    );
    for (const f of [NUMBER_FORMATS.timeOfDay, NUMBER_FORMATS.duration, NUMBER_FORMATS.dateTime, NUMBER_FORMATS.km, NUMBER_FORMATS.text]) {
      expect(formats).toContain(f);
    }
    // The Created serial, read by exceljs as a date: 2026-12-01 18:30 (ECMA-376 1900 date system).
    expect(ws2.getCell(4, 2).value).toEqual(new Date(Date.UTC(2026, 11, 1, 18, 30)));
    // 08:30 (S2's arrival, column F after Name and Address) written as 510 / 1440 reads back as 08:30 of exceljs's day zero.
    expect(ws2.getCell(10, 6).value).toEqual(new Date(Date.UTC(1899, 11, 30, 8, 30)));
  });
});
