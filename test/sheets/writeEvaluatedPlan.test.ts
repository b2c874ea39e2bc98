import { describe, expect, it } from "vitest";
import { evaluatePlan } from "../../src/core/schedule/evaluatePlan.js";
import { layoutPlan } from "../../src/sheets/layoutPlan.js";
import { problem, run } from "../fixtures/writerPlan.js";

// The layout of a plan timed by the engine's own evaluatePlan (not hand-built): each row must
// agree with the engine's visits and route totals, within the sheet's 0.1 km rounding.
describe("layoutPlan of a plan from evaluatePlan", () => {
  const plan = evaluatePlan(problem, [[0, 1, 2], [], [3]], [{ stop: 4, reason: "too big for every vehicle" }]);
  const layout = layoutPlan({ problem, plan, run });
  const header = layout.grid.values[layout.routeTable.row]!;
  const col = (name: string): number => header.indexOf(name);
  const rows = layout.grid.values.slice(layout.routeTable.row + 1, layout.routeTable.row + layout.routeTable.rows);

  it("has one row per visit plus two depot rows per used route", () => {
    const used = plan.routes.filter((r) => r.visits.length > 0);
    expect(rows.length).toBe(used.reduce((n, r) => n + r.visits.length + 2, 0));
    expect(layout.chart.series.length).toBe(used.length);
  });

  it("times are the engine's minutes / 1440 and the end row's Total km is the route distance to 0.1", () => {
    let i = 0;
    for (const route of plan.routes) {
      if (route.visits.length === 0) continue;
      expect(rows[i]![col("Departure")]).toBeCloseTo(route.departureMin / 1440, 12);
      route.visits.forEach((v, k) => {
        const row = rows[i + 1 + k]!;
        expect(row[col("Stop")]).toBe(problem.stops[v.stop]!.id);
        expect(row[col("Arrival")]).toBeCloseTo(v.arrivalMin / 1440, 12);
        expect(row[col("Start")]).toBeCloseTo(v.startMin / 1440, 12);
        expect(row[col("Total km")]).toBeCloseTo(Math.round(v.totalKm * 10) / 10, 9);
      });
      const end = rows[i + route.visits.length + 1]!;
      expect(end[col("Arrival")]).toBeCloseTo(route.returnMin / 1440, 12);
      expect(end[col("Total km")]).toBeCloseTo(Math.round(route.distanceKm * 10) / 10, 9);
      const legs = rows.slice(i, i + route.visits.length + 2).map((r) => r[col("Leg km")] as number);
      expect(Math.abs(legs.reduce((a, b) => a + b, 0) - route.distanceKm)).toBeLessThanOrEqual(0.05 * legs.length + 1e-9);
      i += route.visits.length + 2;
    }
  });

  it("totals block shows the engine's totals", () => {
    const totals = layout.grid.values[5]!;
    expect(totals[0]).toBe(plan.totals.vehiclesUsed);
    expect(totals[1]).toBeCloseTo(Math.round(plan.totals.distanceKm * 10) / 10, 9);
    expect(totals[3]).toBeCloseTo(plan.totals.dutyMin / 1440, 12);
    expect(totals[7]).toBe(1);
  });
});

describe("layoutPlan of a plan that serves nothing", () => {
  const reasons = problem.stops.map((_, stop) => ({ stop, reason: "no vehicle available" }));
  const plan = evaluatePlan(problem, [[], [], []], reasons);
  const layout = layoutPlan({ problem, plan, run });

  it("keeps the route-table header with no rows, an empty chart, and lists every stop as unassigned", () => {
    expect(layout.routeTable.rows).toBe(1);
    expect(layout.chart.series).toEqual([]);
    const values = layout.grid.values;
    const h = values.findIndex((row, i) => i > layout.routeTable.row && row[0] === "Stop" && row[2] === "Reason");
    expect(values.slice(h + 1).map((r) => r[0])).toEqual(["S1", "S2", "3-4", "S4", "S5"]);
    expect(values[5]![0]).toBe(0);
  });
});
