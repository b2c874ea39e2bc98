/**
 * An independent feasibility checker for Solomon (1987) VRPTW plans, written from the file's
 * raw numbers and the benchmark's published rules (README of the benchmark folder): every
 * customer exactly once, load within CAPACITY, service starts within [READY TIME, DUE DATE]
 * (waiting allowed), travel time = Euclidean distance, back at the depot by its DUE DATE,
 * at most VEHICLE NUMBER routes. It shares no code with the project's reader or engine.
 */
export interface RawSolomon {
  vehicles: number;
  capacity: number;
  /** Rows [id, x, y, demand, ready, due, service], depot first. */
  rows: number[][];
}

export function readRawSolomon(text: string): RawSolomon {
  const lines = text.split("\n").map((l) => l.trim());
  const head = lines.findIndex((l) => /^NUMBER\s+CAPACITY/.test(l));
  const [vehicles, capacity] = lines[head + 1]!.split(/\s+/).map(Number) as [number, number];
  const rows = lines.filter((l) => /^\d+(\s+-?\d+(\.\d+)?){6}$/.test(l)).map((l) => l.split(/\s+/).map(Number));
  return { vehicles, capacity, rows };
}

/** Returns the broken rules in words (empty when the plan is feasible) and the recomputed distance. */
export function checkSolomonPlan(raw: RawSolomon, routes: readonly (readonly number[])[]): { violations: string[]; distance: number } {
  const violations: string[] = [];
  const byId = new Map(raw.rows.map((r) => [r[0]!, r]));
  const depot = raw.rows[0]!;
  const dist = (a: number[], b: number[]): number => Math.sqrt((a[1]! - b[1]!) ** 2 + (a[2]! - b[2]!) ** 2);
  const seen = new Map<number, number>();
  let distance = 0;
  if (routes.length > raw.vehicles) violations.push(`${routes.length} routes for ${raw.vehicles} vehicles`);
  routes.forEach((route, k) => {
    let load = 0;
    let time = depot[4]!;
    let prev = depot;
    for (const id of route) {
      const c = byId.get(id);
      if (!c || id === 0) {
        violations.push(`route ${k}: ${id} is not a customer`);
        continue;
      }
      seen.set(id, (seen.get(id) ?? 0) + 1);
      load += c[3]!;
      const arrive = time + dist(prev, c);
      distance += dist(prev, c);
      const start = Math.max(arrive, c[4]!);
      if (start > c[5]! + 1e-9) violations.push(`route ${k}: customer ${id} starts at ${start.toFixed(3)} after its due date ${c[5]}`);
      time = start + c[6]!;
      prev = c;
    }
    if (route.length > 0) {
      distance += dist(prev, depot);
      const back = time + dist(prev, depot);
      if (back > depot[5]! + 1e-9) violations.push(`route ${k}: back at ${back.toFixed(3)} after the depot's due date ${depot[5]}`);
    }
    if (load > raw.capacity) violations.push(`route ${k}: load ${load} over capacity ${raw.capacity}`);
  });
  for (const r of raw.rows.slice(1)) {
    const times = seen.get(r[0]!) ?? 0;
    if (times !== 1) violations.push(`customer ${r[0]} served ${times} times`);
  }
  return { violations, distance };
}
