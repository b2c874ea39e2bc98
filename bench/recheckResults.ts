/**
 * Re-checks the plans of `npm run bench` results files against the benchmark files themselves,
 * with no code of the engine: its own reading of the instance files, its own distances and its
 * own rules, so a defect shared by the solver and its evaluation cannot hide here.
 *
 * - Solomon (M. M. Solomon, Operations Research 35(2), 1987): every customer exactly once; no
 *   route over the vehicle capacity; service starts at arrival or at the ready time, never after
 *   the due date; back at the depot by the depot's due date; travel time equals the Euclidean
 *   distance (unrounded, the convention of the published best-known distances); the distance is
 *   summed again and must equal the recorded one, and the number of non-empty routes the
 *   recorded vehicles.
 * - TSPLIB95 (G. Reinelt, ORSA Journal on Computing 3(4), 1991): the tour is a permutation of the
 *   nodes, and its length summed again with TSPLIB95's GEO formula (`PI = 3.141592`, degrees
 *   truncated, `RRR = 6378.388`, `int(RRR * acos(...) + 1)`) or EUC_2D (`nint`) must equal the
 *   recorded length.
 *
 * Prints one line per seed and file (plans, re-checked feasible, vehicles against the best-known
 * total, instances at the best-known count, mean distance gap over them; for TSPLIB the gaps)
 * and every disagreement; exits 1 when there is one.
 *
 * Run: npx tsx bench/recheckResults.ts bench/results/<file>.json [more files]
 */
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { BENCHMARKS_DIR } from "./benchmarksDir.js";

interface Row {
  instance: string;
  seed: number;
  workers?: number;
  reference: number;
  referenceVehicles?: number;
  vehicles?: number;
  record: { format: "solomon" | "tsplib"; routes?: number[][]; distance?: number; tour?: number[]; length?: number };
}

/** Solomon's text layout: capacity after "CAPACITY", then rows of seven numbers (customer 0 the depot). */
function readSolomon(text: string): { capacity: number; rows: number[][] } {
  const lines = text.split(/\r?\n/);
  const at = lines.findIndex((l) => /^\s*NUMBER\s+CAPACITY/.test(l));
  const capacity = Number(lines[at + 1]!.trim().split(/\s+/)[1]);
  const rows = lines
    .map((l) => l.trim().split(/\s+/))
    .filter((p) => p.length === 7 && p.every((x) => /^-?\d+(\.\d+)?$/.test(x)))
    .map((p) => p.map(Number));
  return { capacity, rows };
}

function recheckSolomon(row: Row, dir: string): { problems: string[]; vehicles: number; distance: number } {
  const { capacity, rows } = readSolomon(readFileSync(join(dir, "solomon", `${row.instance}.txt`), "utf8"));
  const [X, Y, DEMAND, READY, DUE, SERVICE] = [1, 2, 3, 4, 5, 6];
  const problems: string[] = [];
  const seen = new Array<number>(rows.length).fill(0);
  let distance = 0;
  const routes = (row.record.routes ?? []).filter((r) => r.length > 0);
  for (const route of routes) {
    let t = 0;
    let load = 0;
    let at = 0;
    for (const c of [...route, 0]) {
      const leg = Math.hypot(rows[c]![X]! - rows[at]![X]!, rows[c]![Y]! - rows[at]![Y]!);
      distance += leg;
      t = Math.max(t + leg, rows[c]![READY]!);
      if (t > rows[c]![DUE]! + 1e-9)
        problems.push(`${c === 0 ? "back at the depot" : `customer ${c}`} at ${t.toFixed(2)}, due ${rows[c]![DUE]}`);
      if (c !== 0) {
        seen[c]!++;
        load += rows[c]![DEMAND]!;
        t += rows[c]![SERVICE]!;
      }
      at = c;
    }
    if (load > capacity) problems.push(`a route carries ${load}, capacity ${capacity}`);
  }
  for (let c = 1; c < rows.length; c++) if (seen[c] !== 1) problems.push(`customer ${c} served ${seen[c]} times`);
  if (Math.abs(distance - (row.record.distance ?? NaN)) > 1e-6 * distance)
    problems.push(`distance ${distance.toFixed(4)} summed again, ${row.record.distance} recorded`);
  if (routes.length !== row.vehicles) problems.push(`${routes.length} routes, ${row.vehicles} vehicles recorded`);
  return { problems, vehicles: routes.length, distance };
}

/** TSPLIB95 coordinates and edge weight type. */
function readTsplib(text: string): { kind: string; points: [number, number][] } {
  const lines = text.split(/\r?\n/);
  const kind = (lines.find((l) => l.startsWith("EDGE_WEIGHT_TYPE")) ?? "").split(":")[1]!.trim();
  const from = lines.findIndex((l) => l.trim() === "NODE_COORD_SECTION");
  const points: [number, number][] = [];
  for (const l of lines.slice(from + 1)) {
    const p = l.trim().split(/\s+/);
    if (p.length < 3) break;
    points.push([Number(p[1]), Number(p[2])]);
  }
  return { kind, points };
}

function geoRadians(x: number): number {
  const deg = Math.trunc(x);
  return (3.141592 * (deg + (5 * (x - deg)) / 3)) / 180;
}

function tsplibLength(kind: string, points: [number, number][], tour: number[]): number {
  const d = (a: [number, number], b: [number, number]): number => {
    if (kind === "EUC_2D") return Math.round(Math.hypot(a[0] - b[0], a[1] - b[1]));
    const [la1, lo1, la2, lo2] = [geoRadians(a[0]), geoRadians(a[1]), geoRadians(b[0]), geoRadians(b[1])];
    const q1 = Math.cos(lo1 - lo2);
    const q2 = Math.cos(la1 - la2);
    const q3 = Math.cos(la1 + la2);
    return Math.trunc(6378.388 * Math.acos(0.5 * ((1 + q1) * q2 - (1 - q1) * q3)) + 1);
  };
  let sum = 0;
  for (let i = 0; i < tour.length; i++) sum += d(points[tour[i]! - 1]!, points[tour[(i + 1) % tour.length]! - 1]!);
  return sum;
}

function recheckTsplib(row: Row, dir: string): { problems: string[]; length: number } {
  const { kind, points } = readTsplib(readFileSync(join(dir, "tsplib", `${row.instance}.tsp`), "utf8"));
  const tour = row.record.tour ?? [];
  const problems: string[] = [];
  if (kind !== "GEO" && kind !== "EUC_2D") problems.push(`edge weight type ${kind} is not re-checked here`);
  const sorted = [...tour].sort((a, b) => a - b);
  if (sorted.length !== points.length || sorted.some((v, i) => v !== i + 1)) problems.push("the tour is not a permutation of the nodes");
  const length = problems.length === 0 ? tsplibLength(kind, points, tour) : NaN;
  if (length !== row.record.length) problems.push(`length ${length} summed again, ${row.record.length} recorded`);
  return { problems, length };
}

const dir = BENCHMARKS_DIR;
if (!existsSync(dir)) {
  console.error(`The benchmark folder ${dir} is absent: put ../shared/benchmarks beside the checkout or set KILN_BENCHMARKS_DIR.`);
  process.exit(2);
}
let disagreements = 0;
for (const file of process.argv.slice(2)) {
  // Side-by-side files (`--equal-time`, `--sharing`) hold each instance's runs under `runs`.
  const rows = (JSON.parse(readFileSync(file, "utf8")) as { rows: (Row | { runs: Row[] })[] }).rows.flatMap((r) =>
    "runs" in r ? r.runs : [r],
  );
  const groups = [...new Set(rows.map((r) => `${r.seed}/${r.workers ?? 1}`))];
  for (const group of groups) {
    const [seed, workers] = group.split("/").map(Number) as [number, number];
    const mine = rows.filter((r) => r.seed === seed && (r.workers ?? 1) === workers);
    const solomon = mine.filter((r) => r.record.format === "solomon");
    const tsplib = mine.filter((r) => r.record.format === "tsplib");
    const label = `seed ${seed}${workers > 1 ? `, ${workers} workers` : ""}`;
    if (solomon.length > 0) {
      let feasible = 0;
      let vehicles = 0;
      let best = 0;
      const gaps: number[] = [];
      for (const row of solomon) {
        const c = recheckSolomon(row, dir);
        for (const p of c.problems) console.log(`${file}: ${row.instance} ${label}: ${p}`);
        disagreements += c.problems.length;
        if (c.problems.length === 0) feasible++;
        vehicles += c.vehicles;
        best += row.referenceVehicles ?? 0;
        if (c.vehicles === row.referenceVehicles) gaps.push((100 * (c.distance - row.reference)) / row.reference);
      }
      const mean = gaps.reduce((a, b) => a + b, 0) / Math.max(1, gaps.length);
      console.log(
        `${file} ${label}: Solomon ${solomon.length} plans, ${feasible} re-checked feasible, ${vehicles} vehicles (best-known ${best}), best-known count on ${gaps.length}, mean gap over those ${mean >= 0 ? "+" : ""}${mean.toFixed(2)}%`,
      );
    }
    if (tsplib.length > 0) {
      const parts: string[] = [];
      for (const row of tsplib) {
        const c = recheckTsplib(row, dir);
        for (const p of c.problems) console.log(`${file}: ${row.instance} ${label}: ${p}`);
        disagreements += c.problems.length;
        parts.push(`${row.instance} ${((100 * (c.length - row.reference)) / row.reference).toFixed(2)}%`);
      }
      console.log(`${file} ${label}: TSPLIB lengths re-summed, gaps ${parts.join(", ")}`);
    }
  }
}
console.log(disagreements === 0 ? "every plan re-checked: no disagreement" : `${disagreements} disagreement(s)`);
process.exit(disagreements === 0 ? 0 : 1);
