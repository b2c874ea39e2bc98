// Limits said before they bite: a large day is told what its distance and time tables cost in
// memory before a run, and the pane refuses a day it cannot hold before building them. The
// memory figure is arithmetic: two n x n tables of 8-byte IEEE 754 doubles (ECMA-262 Float64Array).
// Invented grid of stops around a depot.
import { describe, expect, it } from "vitest";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import { matrixBytes, PANE_MAX_LOCATIONS } from "../../src/sheets/sizeWarning.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });
const fleet = sheet("Fleet", [
  ["Vehicle", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"],
  ["Van", 100000, 50.85, 4.35, "05:00", "20:00"],
]);
const stops = (n: number) =>
  sheet("Stops", [
    ["Stop", "Latitude", "Longitude", "Demand"],
    ...Array.from({ length: n }, (_, i) => [`S${i + 1}`, 50.8 + 0.001 * (i % 100), 4.3 + 0.001 * Math.floor(i / 100), 1]),
  ]);

describe("a large day", () => {
  it("matrixBytes: two tables of 8-byte numbers", () => {
    expect(matrixBytes(1000)).toBe(16_000_000);
  });

  it("below 2 000 places: no size warning", () => {
    const r = readProblem({ stops: stops(300), fleet });
    expect(r.ok && r.warnings.filter((w) => /MB of memory/.test(w.message))).toEqual([]);
  });

  it("from 2 000 places: a warning on the header cell with the memory the tables take", () => {
    const r = readProblem({ stops: stops(2100), fleet });
    if (!r.ok) throw new Error(JSON.stringify(r.issues.slice(0, 3)));
    const w = r.warnings.find((x) => /MB of memory/.test(x.message));
    expect(w).toMatchObject({ sheet: "Stops", cell: "A1" });
    // 2 101 places: 2 * 8 * 2101^2 = 70.6 MB
    expect(w!.message).toMatch(/2 100 stops and their depots make 2 101 places; the distance and time tables take about 71 MB/);
    expect(w!.message).toMatch(/command line \(kiln plan\)/);
  });

  it("above the pane's limit, the pane's read fails before building the tables, naming the cell and the way out", () => {
    const r = readProblem({ stops: stops(PANE_MAX_LOCATIONS + 100), fleet }, {}, { maxLocations: PANE_MAX_LOCATIONS });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ sheet: "Stops", cell: "A1" });
    expect(r.issues[0]!.message).toMatch(
      /plans at most 5 000 places: plan this day with the command line \(kiln plan\), or split it into areas/,
    );
  });
});
