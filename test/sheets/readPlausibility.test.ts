// Plausibility warnings: well-formed but doubtful data is planned around with a warning naming
// the cell (exit 0), never an input error. Invented round around York (UK); the distances quoted
// are rough great-circle figures worked from the coordinates (from memory: 1 degree of latitude
// is about 111 km).
import { describe, expect, it } from "vitest";
import type { Issue } from "../../src/core/model.js";
import type { SheetRead } from "../../src/sheets/grid.js";
import { readProblem } from "../../src/sheets/readProblem.js";

const sheet = (name: string, values: unknown[][]): SheetRead => ({ sheet: name, row: 0, col: 0, values });
const STOP_HEADER = ["Stop", "Name", "Latitude", "Longitude", "Demand", "Earliest", "Latest"];
const FLEET_HEADER = ["Vehicle", "Capacity", "Start latitude", "Start longitude", "Shift start", "Shift end"];
const VAN = ["Van", 500, 53.958, -1.08, "05:00", "15:00"];

/** Ten ordinary stops within a few km of the depot; rows 2..11. */
const ROUND: unknown[][] = Array.from({ length: 10 }, (_, i) => [
  `Y${i + 1}`,
  `Shop ${i + 1}`,
  53.95 + 0.004 * i,
  -1.09 + 0.005 * (i % 5),
  10,
  "06:00",
  "12:00",
]);

function warningsOf(stopRows: unknown[][], fleetRows: unknown[][] = [VAN]): readonly Issue[] {
  const r = readProblem({
    stops: sheet("Stops", [STOP_HEADER, ...ROUND, ...stopRows]),
    fleet: sheet("Fleet", [FLEET_HEADER, ...fleetRows]),
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.warnings;
}

function at(list: readonly Issue[], cell: string): string {
  return list.find((w) => w.cell === cell)?.message ?? `(no warning at ${cell} in ${JSON.stringify(list)})`;
}

describe("plausibility warnings name the cell and say what to check", () => {
  it("a clean round gives no warning", () => {
    expect(warningsOf([])).toEqual([]);
  });

  it("a stop at 0, 0 (a failed geocode)", () => {
    const w = warningsOf([["Z", "Nowhere", 0, 0, 10, "", ""]]);
    expect(at(w, "C12")).toMatch(/at or near 0, 0.*failed geocode/);
  });

  it("latitude and longitude swapped (still in range): swapping them brings the point among the others", () => {
    const w = warningsOf([["S", "Swapped", -1.085, 53.96, 10, "", ""]]);
    expect(at(w, "C12")).toMatch(/latitude and longitude swapped/);
  });

  it("one stop hundreds of kilometres from the rest (Edinburgh-like point, about 260 km north)", () => {
    const w = warningsOf([["F", "Far", 55.95, -3.19, 10, "", ""]]);
    expect(at(w, "C12")).toMatch(/2\d\d km from the middle of the stops/);
  });

  it("many stops on exactly the same point are one warning listing them", () => {
    const same = Array.from({ length: 5 }, (_, i) => [`P${i}`, "Centre", 53.96, -1.081, 10, "", ""]);
    const w = warningsOf(same);
    expect(w).toHaveLength(1);
    expect(at(w, "C12")).toMatch(/5 stops are at exactly the same point \(53.96, -1.081\): "P0", "P1", "P2", "P3", "P4"/);
  });

  it("a window that closes before it opens is read as overnight, and says so", () => {
    const w = warningsOf([["B", "Backwards", 53.955, -1.085, 10, "15:00", "09:30"]]);
    expect(at(w, "F12")).toContain("closes (09:30) before it opens (15:00), so it is read as overnight");
    expect(at(w, "F12")).toContain("swap the two times");
  });

  it("a window no van reaches within its shift, even as its only stop, is planned around with a warning", () => {
    // 05:00 start, about 3 km away at 40 km/h: 05:05 is already past a 05:00-05:01 window.
    const w = warningsOf([["E", "Early", 53.98, -1.1, 10, "05:00", "05:01"]]);
    expect(at(w, "F12")).toMatch(/left unassigned: its time window cannot be reached/);
  });

  it("zero capacity everywhere is one message on the fleet, not one per stop", () => {
    const w = warningsOf(
      [],
      [
        ["Van", 0, 53.958, -1.08, "05:00", "15:00"],
        ["Van 2", 0, 53.958, -1.08, "05:00", "15:00"],
      ],
    );
    expect(w).toHaveLength(1);
    expect(w[0]!.sheet).toBe("Fleet");
    expect(w[0]!.message).toMatch(/^Fleet!B1: every vehicle has capacity 0, so no stop with a demand can be served/);
  });

  it("repeated warnings of one kind fold into one line with a count and the cells", () => {
    const zeros = Array.from({ length: 6 }, (_, i) => [`Z${i}`, "Nowhere", 0, 0.001 * i, 10, "", ""]);
    const w = warningsOf(zeros).filter((x) => x.message.includes("0, 0"));
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toContain("The same for 5 more stops: C13, C14, C15, C16, C17.");
  });
});
