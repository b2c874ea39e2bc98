import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import type { CliIO } from "../../src/cli/CliIO.js";
import { main } from "../../src/cli/main.js";

const runBench = (args: string[], io: CliIO): Promise<number> => main(["bench", ...args], io);

function capture(): { io: CliIO; out: string[]; err: string[] } {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { stdout: (s) => void out.push(s), stderr: (s) => void err.push(s), isTTY: false, now: () => 0 }, out, err };
}

const dir = mkdtempSync(join(tmpdir(), "kiln-bench-"));
function file(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

describe("kiln bench reports input errors with exit 2, one per line, no stack trace", () => {
  it("a missing file: 'burma15.tsp: file not found'", async () => {
    const c = capture();
    expect(await runBench(["burma15.tsp"], c.io)).toBe(2);
    expect(c.err.join("")).toBe("burma15.tsp: file not found\n");
    expect(c.out).toEqual([]);
  });

  it("a folder instead of a file", async () => {
    const c = capture();
    expect(await runBench([dir], c.io)).toBe(2);
    expect(c.err.join("")).toContain("is a folder");
  });

  it("a file in neither format", async () => {
    const c = capture();
    expect(await runBench([file("notes.txt", "hello\nworld\n")], c.io)).toBe(2);
    expect(c.err.join("")).toMatch(/notes\.txt: unknown format/);
  });

  it("every problem of every file at once, with line numbers", async () => {
    const tsp = file("bad.tsp", "NAME: bad\nDIMENSION: 3\nEDGE_WEIGHT_TYPE: EUC_2D\nNODE_COORD_SECTION\n1 0 0\n2 x 1\n4 1 1\nEOF\n");
    const sol = file("bad.txt", "X1\n\nVEHICLE\nNUMBER CAPACITY\n5 100\n\nCUSTOMER\nCUST NO. XCOORD.\n0 0 0 0 0 100 0\n1 1 1 5 50 40 10\n");
    const c = capture();
    expect(await runBench([tsp, sol, "missing.tsp"], c.io)).toBe(2);
    const lines = c.err.join("").trim().split("\n");
    expect(lines).toContain(`${tsp}: line 6: NODE_COORD_SECTION: expected "node x y", got "2 x 1"`);
    expect(lines).toContain(`${tsp}: line 7: NODE_COORD_SECTION: node number 4 is outside 1..3 (DIMENSION)`);
    expect(lines.some((l) => l.startsWith(`${tsp}: NODE_COORD_SECTION: 2 of 3 nodes have no coordinates`))).toBe(true);
    expect(lines).toContain(`${sol}: line 10: customer 1: DUE DATE 40 is before READY TIME 50`);
    expect(lines).toContain("missing.tsp: file not found");
  });

  it("bad options: a value outside the schema's range, both budgets, no file", async () => {
    const c = capture();
    expect(await runBench(["x.tsp", "--seconds", "abc", "--seed", "-1"], c.io)).toBe(2);
    const err = c.err.join("");
    expect(err).toContain('--seconds: Time limit "abc" is not valid: enter a number above 0 up to 86400 seconds, such as 10.');
    expect(err).toContain("--seed: Seed -1 is not valid: enter a whole number from 0 to 4294967295, such as 1.");
    const d = capture();
    expect(await runBench(["x.tsp", "--seconds", "1", "--moves", "10"], d.io)).toBe(2);
    expect(d.err.join("")).toContain("use --seconds or --moves, not both");
    const e = capture();
    expect(await runBench([], e.io)).toBe(2);
    expect(e.err.join("")).toContain("missing required argument 'FILE'");
  });
});
