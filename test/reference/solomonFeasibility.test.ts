import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { detectFormat } from "../../src/core/formats/detectFormat.js";
import { parseSolomon } from "../../src/core/formats/parseSolomon.js";
import { solomonRoutesDistance } from "../../src/core/formats/solomonRoutesDistance.js";
import { solomonToProblem } from "../../src/core/formats/solomonToProblem.js";
import { solve } from "../../src/core/solve.js";
import { BENCHMARKS_DIR, benchmarkCsv, benchmarksAvailable, benchmarkText, fixtureCsv, fixtureText } from "./benchmarksDir.js";
import { checkSolomonPlan, readRawSolomon } from "./solomonChecker.js";

// Solomon (1987) instances of three classes: clustered, random, random-clustered long horizon.
const INSTANCES = ["C101", "R101", "RC201"];
const MOVES = 60_000;

describe("Solomon (1987) plans pass an independent checker (fixtures)", () => {
  for (const name of INSTANCES) {
    it(`${name}: every customer once, capacity, windows, depot due date; distance recomputed to 1e-6`, () => {
      const text = fixtureText(`${name}.txt`);
      const inst = parseSolomon(text);
      expect(inst.issues).toEqual([]);
      const raw = readRawSolomon(text);
      expect(inst.customers.length).toBe(raw.rows.length);
      const problem = solomonToProblem(inst);
      for (const seed of [1, 2]) {
        const { plan } = solve(problem, { seed, budget: { moves: MOVES } });
        const routes = plan.routes.filter((r) => r.visits.length > 0).map((r) => r.visits.map((v) => Number(problem.stops[v.stop]!.id)));
        const check = checkSolomonPlan(raw, routes);
        expect(check.violations, `${name} seed ${seed}`).toEqual([]);
        expect(plan.feasible).toBe(true);
        expect(plan.unassigned).toEqual([]);
        expect(Math.abs(plan.totals.distanceKm - check.distance)).toBeLessThan(1e-6);
        expect(Math.abs(solomonRoutesDistance(inst, routes) - check.distance)).toBeLessThan(1e-6);
      }
    });
  }

  it("the checker itself rejects broken plans (C101: one route for all, a customer left out)", () => {
    const raw = readRawSolomon(fixtureText("C101.txt"));
    const ids = raw.rows.slice(1).map((r) => r[0]!);
    const oneRoute = checkSolomonPlan(raw, [ids]).violations.join("; ");
    expect(oneRoute).toContain("over capacity 200");
    expect(oneRoute).toContain("after its due date");
    expect(
      checkSolomonPlan(
        raw,
        ids.slice(1).map((id) => [id]),
      ).violations.join("; "),
    ).toContain("customer 1 served 0 times");
  });
});

describe.skipIf(!benchmarksAvailable("Solomon suite files"))("Solomon (1987) suite in the benchmark folder", () => {
  it("every Solomon file of the folder reads as the raw numbers say (25 vehicles, depot + 100 customers)", () => {
    const files = readdirSync(BENCHMARKS_DIR + "solomon").filter((f) => f.endsWith(".txt"));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) {
      const text = benchmarkText(`solomon/${f}`);
      expect(detectFormat(text), f).toBe("solomon");
      const inst = parseSolomon(text);
      const raw = readRawSolomon(text);
      expect(inst.issues, f).toEqual([]);
      expect(inst.name, f).toBe(f.replace(".txt", ""));
      expect([inst.vehicleCount, inst.capacity], f).toEqual([raw.vehicles, raw.capacity]);
      expect(inst.vehicleCount, f).toBe(25);
      expect(
        inst.customers.map((c) => [c.id, c.x, c.y, c.demand, c.readyTime, c.dueDate, c.serviceTime]),
        f,
      ).toEqual(raw.rows);
      expect(inst.customers, f).toHaveLength(101);
    }
  });

  it("the committed fixtures are the suite's files, byte for byte, and best-known.csv agrees", () => {
    for (const name of INSTANCES) expect(fixtureText(`${name}.txt`), name).toBe(benchmarkText(`solomon/${name}.txt`));
    const suiteRows = benchmarkCsv("solomon/best-known.csv");
    for (const row of fixtureCsv("best-known.csv").slice(1)) expect(suiteRows).toContainEqual(row);
  });
});
