import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.js";
import type { CliIO } from "../../src/cli/CliIO.js";
import { FIXTURES_DIR, fixtureText } from "../reference/benchmarksDir.js";
import { checkSolomonPlan, readRawSolomon } from "../reference/solomonChecker.js";

const runBench = (args: string[], io: CliIO): Promise<number> => main(["bench", ...args], io);

function capture(): { io: CliIO; out: string[]; err: string[] } {
  const out: string[] = [];
  const err: string[] = [];
  let clock = 0;
  // A fake clock: the run is bounded by moves, so time only fills the "seconds" field.
  return { io: { stdout: (s) => void out.push(s), stderr: (s) => void err.push(s), isTTY: false, now: () => (clock += 1) }, out, err };
}

describe("kiln bench JSON lines (DESIGN.md §6) on published benchmarks (fixtures)", () => {
  it("TSPLIB burma14: fields, tour of the file's node numbers from 1, length = TSPLIB95 optimum 3323", async () => {
    const c = capture();
    expect(await runBench([FIXTURES_DIR + "burma14.tsp", "--moves", "100000", "--seed", "2"], c.io)).toBe(0);
    const lines = c.out.join("").trim().split("\n");
    expect(lines).toHaveLength(1);
    const rec = JSON.parse(lines[0]!) as Record<string, unknown>;
    expect(Object.keys(rec)).toEqual(["instance", "format", "seed", "seconds", "moves", "length", "tour"]);
    expect(rec["instance"]).toBe("burma14");
    expect(rec["format"]).toBe("tsplib");
    expect(rec["seed"]).toBe(2);
    const tour = rec["tour"] as number[];
    expect(tour[0]).toBe(1);
    expect([...tour].sort((a, b) => a - b)).toEqual(Array.from({ length: 14 }, (_, i) => i + 1));
    expect(rec["length"]).toBe(3323);
  });

  it("Solomon C101 and R101: fields, routes feasible by the independent checker, distance to 1e-6 (Solomon 1987)", async () => {
    const c = capture();
    const files = ["C101", "R101"].map((n) => FIXTURES_DIR + `${n}.txt`);
    expect(await runBench([...files, "--moves", "60000"], c.io)).toBe(0);
    const lines = c.out.join("").trim().split("\n");
    expect(lines).toHaveLength(2);
    for (const [k, name] of ["C101", "R101"].entries()) {
      const rec = JSON.parse(lines[k]!) as { [key: string]: unknown; routes: number[][]; distance: number };
      expect(Object.keys(rec)).toEqual(["instance", "format", "seed", "seconds", "moves", "vehicles", "distance", "feasible", "routes"]);
      expect(rec["instance"]).toBe(name);
      expect(rec["seed"]).toBe(1);
      const check = checkSolomonPlan(readRawSolomon(fixtureText(`${name}.txt`)), rec.routes);
      expect(check.violations).toEqual([]);
      expect(rec["feasible"]).toBe(true);
      expect(rec["vehicles"]).toBe(rec.routes.length);
      expect(Math.abs(rec.distance - check.distance)).toBeLessThan(1e-6);
    }
  });
});
