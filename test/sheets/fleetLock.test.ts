// The Fleet's Lock column (synonyms Locked, Keep route): yes/no, blank no. Expected values are
// hand-worked from the invented rows below; Excel's TRUE/FALSE cells are the boolean cell type
// of ECMA-376 Part 1 (§18.18.11 ST_CellType "b"), which both adapters hand over as booleans.
import { describe, expect, it } from "vitest";
import type { SheetRead } from "../../src/sheets/grid.js";
import { matchHeader } from "../../src/sheets/matchHeaders.js";
import { parseYesNo } from "../../src/sheets/parseYesNo.js";
import { readProblem } from "../../src/sheets/readProblem.js";
import { ROUTE_TABLE_HEADER } from "../../src/sheets/routeTableRows.js";
import { withEarlierPlan } from "../../src/workbook/scenario.js";

const STOPS: SheetRead = {
  sheet: "Stops",
  row: 0,
  col: 0,
  values: [
    ["Stop", "Latitude", "Longitude", "Demand"],
    ["S1", 53.96, -1.08, 1],
    ["S2", 53.97, -1.1, 1],
    ["S3", 53.95, -1.06, 1],
    ["S4", 53.98, -1.07, 1],
  ],
};

function fleet(header: string, cells: readonly unknown[], count: readonly number[] = cells.map(() => 1)): SheetRead {
  return {
    sheet: "Vans",
    row: 0,
    col: 0,
    values: [
      ["Vehicle", "Count", "Capacity", "Start latitude", "Start longitude", header],
      ...cells.map((c, i) => [`Van ${String.fromCharCode(65 + i)}`, count[i]!, 10, 53.959, -1.081, c]),
    ],
  };
}

/** A plan sheet as Kiln lays it out: a title, then the route table from row 3 (only its first columns matter here). */
function planSheet(routes: Record<string, string[]>): SheetRead {
  const width = ROUTE_TABLE_HEADER.length;
  const row = (cells: unknown[]) => [...cells, ...Array<unknown>(width - cells.length).fill("")];
  const values: unknown[][] = [row(["Kiln plan: Monday"]), row([]), row([...ROUTE_TABLE_HEADER])];
  for (const [van, stops] of Object.entries(routes)) {
    values.push(row([van, 0, "", "Depot"]));
    stops.forEach((s, i) => values.push(row([van, i + 1, s, s])));
    values.push(row([van, stops.length + 1, "", "Depot end"]));
  }
  return { sheet: "Monday", row: 0, col: 0, values };
}

describe("parseYesNo", () => {
  it("reads Excel booleans, 1/0 and the usual words, blank as no, anything else as not a yes/no (hand-worked)", () => {
    for (const yes of [true, 1, "yes", " Yes ", "Y", "TRUE", "x", "on"]) expect(parseYesNo(yes), String(yes)).toBe(true);
    for (const no of [false, 0, "no", "N", "false", "off", "", "  ", null, undefined]) expect(parseYesNo(no), String(no)).toBe(false);
    for (const other of ["maybe", 2, "Van 1", -1]) expect(parseYesNo(other), String(other)).toBeUndefined();
  });
});

describe("the Fleet's Lock column", () => {
  it("is found under Lock, Locked and Keep route", () => {
    for (const header of ["Lock", "Locked", "Keep route", "keep-route"]) expect(matchHeader(header, "fleet")?.base, header).toBe("lock");
  });

  it("lists the vehicles whose Lock says yes with their cell; a Count row locks each of its vehicles", () => {
    const read = readProblem({ stops: STOPS, fleet: fleet("Keep route", ["", true, "yes", "no"], [1, 1, 2, 1]) });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    expect(read.lockedVehicles).toEqual([
      { vehicle: "Van B", sheet: "Vans", cell: "F3" },
      { vehicle: "Van C 1", sheet: "Vans", cell: "F4" },
      { vehicle: "Van C 2", sheet: "Vans", cell: "F4" },
    ]);
    expect(read.fleetColumns.find((c) => c.column === "F")?.field).toBe("lock");
  });

  it("a cell that is neither yes nor no is an error at that cell saying what to type", () => {
    const read = readProblem({ stops: STOPS, fleet: fleet("Lock", ["", "maybe"]) });
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.issues).toHaveLength(1);
    expect(read.issues[0]).toMatchObject({ sheet: "Vans", cell: "F3" });
    expect(read.issues[0]!.message).toBe(
      'Vans!F3: Lock "maybe" for vehicle "Van B" is not yes or no; type yes to keep this vehicle\'s route as published when re-planning from a plan sheet, or leave the cell blank.',
    );
  });

  it("with no plan sheet chosen, a ticked Lock is a warning at its cell (nothing to lock), never an error; the problem is unchanged", () => {
    const read = readProblem({ stops: STOPS, fleet: fleet("Lock", ["", "yes", "", ""], [1, 1, 1, 1]) });
    if (!read.ok) throw new Error("the tables are clean");
    const out = withEarlierPlan(read, undefined);
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(out.problem).toBe(read.problem);
    const warning = out.warnings.find((w) => w.cell === "F3");
    expect(warning?.sheet).toBe("Vans");
    expect(warning?.message).toContain("nothing to lock: no earlier plan chosen");
    // No Lock ticked: nothing is added.
    const clean = readProblem({ stops: STOPS, fleet: fleet("Lock", ["", "", "", ""]) });
    if (!clean.ok) throw new Error("the tables are clean");
    expect(withEarlierPlan(clean, undefined)).toBe(clean);
  });

  it("locks that vehicle's route when re-planning from a plan sheet, together with the routes ticked elsewhere (--lock, the pane)", () => {
    const read = readProblem({ stops: STOPS, fleet: fleet("Locked", ["no", "yes", ""]) });
    if (!read.ok) throw new Error("the tables are clean");
    const plan = planSheet({ "Van A": ["S1", "S2"], "Van B": ["S4"], "Van C": ["S3"] });
    const byId = (ids: readonly number[]) => ids.map((v) => read.problem.vehicles[v]!.id);
    const fleetOnly = withEarlierPlan(read, { read: plan, lock: [], lockSource: "--lock" });
    if (!fleetOnly.ok) throw new Error(JSON.stringify(fleetOnly.issues));
    expect(byId(fleetOnly.problem.earlier!.locked)).toEqual(["Van B"]);
    // Stop indexes in Stops order: S1 0, S2 1, S3 2, S4 3 (hand-worked from the plan above).
    expect(fleetOnly.problem.earlier!.routes).toEqual([[0, 1], [3], [2]]);
    const both = withEarlierPlan(read, { read: plan, lock: ["Van C", "Van B"], lockSource: "--lock" });
    if (!both.ok) throw new Error(JSON.stringify(both.issues));
    expect(byId(both.problem.earlier!.locked)).toEqual(["Van B", "Van C"]);
    expect(both.warnings.some((w) => w.message.includes("nothing to lock"))).toBe(false);
  });
});
