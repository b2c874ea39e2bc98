/**
 * Scale bench: what large days cost. Three parts, one results file
 * (`bench/results/scale[-<label>]-<date>.json`) and a markdown table each:
 *
 * 1. **Matrix build** for 5 000 locations (`buildMatrix`): wall and CPU milliseconds, median of 3.
 * 2. **In-run move evaluations per second** at 100, 1 000 and 5 000 stops, measured together in
 *    this one process: a `createSolver` run of the same move budget at every size (so setup
 *    never eats the budget), evaluations divided by the time spent in `step` only, per wall
 *    second and per CPU second of this process; sizes interleaved in each round, the 5 000/100
 *    ratio taken within each round, medians over the rounds. The machine may be shared: the
 *    load average is printed with the figures.
 * 3. **Whole days**: a generated 2 000-stop, 50-vehicle day with windows in 60 s and a 5 000-stop,
 *    125-vehicle day in 180 s (seconds counted from the start, setup included), each in a child
 *    process of its own so that its peak resident memory (`process.resourceUsage().maxRSS`, the
 *    kernel's peak) is its own; feasibility re-checked by `evaluatePlan`. The generator can make
 *    stops that no vehicle can serve at all (a window that closes too late to drive back within
 *    the shift): the table counts them apart (`unservableStops`, the engine's reasons listed), so
 *    "feasible" for a day means every stop that can be served is served, and gives when the best
 *    plan first did so.
 * 4. **The same days in the page's worker** (`pageDay.ts`): Debian's Chromium runs the built
 *    page's solver worker on each day; wall seconds, the worker's heap figure where the browser
 *    gives one, and the renderer's peak resident memory. Skipped with the reason printed when
 *    Chromium or the built page (`npm run build`) is missing.
 *
 * The instances are invented here (stops scattered around depots, windows over the day), no
 * real places. Run: `npx tsx bench/scale.ts [--label after] [--rounds 3] [--moves 1500000]
 * [--skip-days] [--only-days] [--skip-page] [--only-page]`, or `npm run bench:scale`.
 */
import { execFileSync } from "node:child_process";
import { loadavg } from "node:os";
import { fileURLToPath } from "node:url";
import { createRandom } from "../src/core/anneal/createRandom.js";
import { buildMatrix } from "../src/core/geo/buildMatrix.js";
import type { Problem, Stop, Vehicle } from "../src/core/model.js";
import { evaluatePlan } from "../src/core/schedule/evaluatePlan.js";
import { unservableStops } from "../src/core/schedule/unservableStops.js";
import { createSolver } from "../src/core/solve.js";
import { pageDaysUnavailable, runPageDays, type PageDayRow } from "./pageDay.js";
import { benchEnvironment, writeResults } from "./results.js";

const arg = (name: string): string | undefined => {
  const at = process.argv.indexOf(name);
  return at > 0 ? process.argv[at + 1] : undefined;
};

/**
 * An invented delivery day: `n` stops spread over a square whose side grows with the square
 * root of `n` (about the same density at every size), two depots, windows of 1-4 h between
 * 08:00 and 18:00 on 70% of the stops, 3-8 min of service, 1-12 kg each; vehicles of 350 kg,
 * shifts 07:00-18:00, two speeds.
 */
export function scaleDay(n: number, vehicleCount: number, seed = `scale-${n}`): Problem {
  const rng = createRandom(seed);
  const sideDeg = 0.12 * Math.sqrt(n / 100);
  const locations = [
    { lat: 52.0, lon: 5.0, name: "North depot" },
    { lat: 52.0 - sideDeg / 3, lon: 5.0 + sideDeg / 3, name: "South depot" },
  ];
  for (let i = 0; i < n; i++)
    locations.push({ lat: 52.0 + (rng.next() - 0.5) * sideDeg, lon: 5.0 + (rng.next() - 0.5) * sideDeg * 1.6, name: `S${i}` });
  const stops: Stop[] = Array.from({ length: n }, (_, i) => {
    const windowed = rng.next() < 0.7;
    const width = 60 + rng.int(180);
    const open = 480 + rng.int(600 - width);
    return {
      id: `S${i}`,
      name: `Stop ${i}`,
      location: i + 2,
      demand: [1 + rng.int(12)],
      windows: windowed ? [{ earliestMin: open, latestMin: open + width }] : [{ earliestMin: 0, latestMin: Infinity }],
      serviceMin: 3 + rng.int(6),
    };
  });
  const vehicles: Vehicle[] = Array.from({ length: vehicleCount }, (_, k) => ({
    id: `V${k + 1}`,
    capacity: [350],
    startLocation: k % 2,
    endLocation: k % 2,
    shiftStartMin: 420,
    shiftEndMin: 1080,
    fixedCost: 60,
    costPerKm: 0.6,
    costPerHour: 22,
    speedKmh: k % 4 === 0 ? 32 : 40,
  }));
  return {
    locations,
    stops,
    vehicles,
    loadDimensions: ["kg"],
    matrix: buildMatrix(locations, { speedKmh: 40 }),
    referenceSpeedKmh: 40,
    hardWindows: true,
    lateCostPerMin: 0,
    objective: "weighted",
  };
}

function median(values: readonly number[]): number {
  const v = [...values].sort((a, b) => a - b);
  const mid = Math.floor(v.length / 2);
  return v.length % 2 === 1 ? v[mid]! : (v[mid - 1]! + v[mid]!) / 2;
}

const cpuMs = (): number => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
};

/** One whole day in this process (the child's side of part 3); prints one JSON line. */
function runDay(n: number, vehicles: number, seconds: number): void {
  const t0 = performance.now();
  const problem = scaleDay(n, vehicles);
  const matrixMs = performance.now() - t0;
  // When the best plan first serves every stop that can be served (the progress reports a best
  // cost once such a plan exists), in seconds from the start, matrix included.
  let completeAtS: number | null = null;
  const solver = createSolver(problem, {
    seed: 1,
    budget: { seconds: seconds - matrixMs / 1000 },
    now: () => performance.now(),
    progressEveryMs: 250,
    onProgress: (p) => {
      if (completeAtS === null && Number.isFinite(p.bestCost)) completeAtS = (performance.now() - t0) / 1000;
    },
  });
  const setupMs = performance.now() - t0;
  let memoryMid = process.memoryUsage();
  let steps = 0;
  while (!solver.step(20_000)) if (++steps === 10) memoryMid = process.memoryUsage();
  const result = solver.result();
  const wallS = (performance.now() - t0) / 1000;
  const check = evaluatePlan(
    problem,
    result.plan.routes.map((r) => r.visits.map((v) => v.stop)),
  );
  // Is the day feasible at all? The stops no vehicle can serve even alone, with the engine's
  // reasons, apart from the stops the plan left out although they could be served.
  const unservable = new Set(unservableStops(problem).map((u) => u.stop));
  const reasons: Record<string, number> = {};
  for (const u of result.plan.unassigned) reasons[u.reason] = (reasons[u.reason] ?? 0) + 1;
  const servedOfServable = n - unservable.size - result.plan.unassigned.filter((u) => !unservable.has(u.stop)).length;
  const used = result.plan.routes.filter((r) => r.visits.length > 0).length;
  const mb = (b: number): number => Math.round(b / 2 ** 20);
  console.log(
    JSON.stringify({
      stops: n,
      vehicles,
      budgetSeconds: seconds,
      wallSeconds: Math.round(wallS * 10) / 10,
      matrixSeconds: Math.round(matrixMs / 100) / 10,
      setupSeconds: Math.round(setupMs / 100) / 10,
      moves: result.stats.moves,
      evaluations: result.stats.evaluations,
      feasible: result.plan.feasible && check.violations.length === 0,
      unassigned: result.plan.unassigned.length,
      unservable: unservable.size,
      servable: n - unservable.size,
      servedOfServable,
      allServableServedAtSeconds: completeAtS === null ? null : Math.round((completeAtS as number) * 10) / 10,
      unassignedReasons: reasons,
      vehiclesUsed: used,
      cost: Math.round(result.plan.totals.cost),
      peakRssMB: Math.round(process.resourceUsage().maxRSS / 1024),
      rssMidRunMB: mb(memoryMid.rss),
      heapUsedMidRunMB: mb(memoryMid.heapUsed),
      arrayBuffersMidRunMB: mb(memoryMid.arrayBuffers),
    }),
  );
}

/** The whole days of parts 3 and 4: stops, vehicles, seconds. */
const DAYS = [
  [2000, 50, 60],
  [5000, 125, 180],
] as const;

if (arg("--day") !== undefined) {
  runDay(Number(arg("--day")), Number(arg("--vehicles")), Number(arg("--seconds")));
} else {
  main().catch((e: unknown) => {
    console.error(`bench/scale: ${e instanceof Error ? e.message : String(e)}`);
    process.exitCode = 1;
  });
}

async function main(): Promise<void> {
  const label = arg("--label");
  const rounds = Math.max(1, Number(arg("--rounds") ?? 3));
  const moves = Math.max(10_000, Number(arg("--moves") ?? 1_500_000));
  const onlyPage = process.argv.includes("--only-page");
  const onlyDays = process.argv.includes("--only-days") || onlyPage;
  const environment = { ...benchEnvironment(), loadAverageAtStart: loadavg().map((x) => Math.round(x * 10) / 10) };
  console.log(
    `Node ${environment.node}, ${environment.cpuModel} x${environment.cpuCount}, load average ${environment.loadAverageAtStart.join(" ")}`,
  );

  const matrix: { wallMs: number; cpuMs: number }[] = [];
  const rateRows: { stops: number; wall: number[]; cpu: number[]; evaluations: number[] }[] = [];
  const ratios: { wall: number[]; cpu: number[] } = { wall: [], cpu: [] };
  if (!onlyDays) {
    // 1. Matrix build, 5 000 locations.
    const rng = createRandom("matrix-5000");
    const points = Array.from({ length: 5000 }, () => ({ lat: 52 + rng.next() * 0.5, lon: 5 + rng.next() * 0.8 }));
    for (let r = 0; r < 3; r++) {
      const c = cpuMs();
      const t = performance.now();
      buildMatrix(points);
      matrix.push({ wallMs: Math.round(performance.now() - t), cpuMs: Math.round(cpuMs() - c) });
    }
    console.log("\n| matrix, 5 000 locations | wall ms | CPU ms |\n|---|---:|---:|");
    matrix.forEach((m, r) => console.log(`| run ${r + 1} | ${m.wallMs} | ${m.cpuMs} |`));
    console.log(`| median | ${median(matrix.map((m) => m.wallMs))} | ${median(matrix.map((m) => m.cpuMs))} |`);

    // 2. In-run evaluations per second, sizes interleaved in each round.
    const sizes = [100, 1000, 5000];
    const problems = sizes.map((n) => scaleDay(n, Math.max(2, Math.ceil(n / 40))));
    for (const n of sizes) rateRows.push({ stops: n, wall: [], cpu: [], evaluations: [] });
    // A warm-up run, so the first size measured is not also the one that compiles the code.
    inRun(problems[0]!, Math.min(moves, 300_000));
    for (let r = 0; r < rounds; r++) {
      problems.forEach((p, k) => {
        const x = inRun(p, moves);
        rateRows[k]!.wall.push(x.wall);
        rateRows[k]!.cpu.push(x.cpu);
        rateRows[k]!.evaluations.push(x.evaluations);
      });
      const small = rateRows[0]!;
      const large = rateRows[rateRows.length - 1]!;
      ratios.wall.push(large.wall[r]! / small.wall[r]!);
      ratios.cpu.push(large.cpu[r]! / small.cpu[r]!);
    }
    console.log(
      `\nIn-run move evaluations per second (${moves.toLocaleString("en")} moves per run, setup excluded; medians of ${rounds} rounds)`,
    );
    console.log("| stops | vehicles | per wall second | per CPU second |\n|---:|---:|---:|---:|");
    rateRows.forEach((row, k) =>
      console.log(
        `| ${row.stops} | ${problems[k]!.vehicles.length} | ${Math.round(median(row.wall)).toLocaleString("en")} | ${Math.round(median(row.cpu)).toLocaleString("en")} |`,
      ),
    );
    console.log(
      `| 5000 / 100 | | ${(100 * median(ratios.wall)).toFixed(0)}% | ${(100 * median(ratios.cpu)).toFixed(0)}% |  (ratio within each round, median)`,
    );
  }

  // 3. Whole days, each in a child process.
  const days: unknown[] = [];
  if (!process.argv.includes("--skip-days") && !onlyPage) {
    const script = fileURLToPath(import.meta.url);
    for (const [n, vehicles, seconds] of DAYS) {
      const out = execFileSync(
        process.execPath,
        [...process.execArgv, script, "--day", String(n), "--vehicles", String(vehicles), "--seconds", String(seconds)],
        { encoding: "utf8", maxBuffer: 1 << 20 },
      );
      days.push(JSON.parse(out.trim().split("\n").pop()!));
    }
    console.log(
      "\n| day | budget s | wall s | matrix s | setup s | evaluations | feasible | unassigned | no vehicle can serve | servable served | all servable served at s | vehicles used | cost | peak RSS MB |",
    );
    console.log("|---|---:|---:|---:|---:|---:|:---|---:|---:|---:|---:|---:|---:|---:|");
    for (const d of days as Record<string, number | boolean>[])
      console.log(
        `| ${d.stops} stops, ${d.vehicles} vehicles | ${d.budgetSeconds} | ${d.wallSeconds} | ${d.matrixSeconds} | ${d.setupSeconds} | ${d.evaluations} | ${d.feasible} | ${d.unassigned} | ${d.unservable} | ${d.servedOfServable} of ${d.servable} | ${d.allServableServedAtSeconds ?? "never"} | ${d.vehiclesUsed} | ${d.cost} | ${d.peakRssMB} |`,
      );
    console.log("\nWhy stops were left unassigned (the engine's reasons):");
    for (const d of days as { stops: number; unassignedReasons: Record<string, number> }[])
      for (const [reason, count] of Object.entries(d.unassignedReasons)) console.log(`- ${d.stops} stops: ${count} x ${reason}`);
  }
  // 4. The same days in the page's worker.
  let pageDays: PageDayRow[] | { skipped: string } = { skipped: "--skip-page" };
  if (!process.argv.includes("--skip-page")) {
    const why = pageDaysUnavailable();
    if (why !== undefined) {
      console.log(`\nPage worker days skipped: ${why}`);
      pageDays = { skipped: why };
    } else {
      pageDays = await runPageDays(DAYS.map(([n, vehicles, seconds]) => ({ problem: scaleDay(n, vehicles), seconds })));
      console.log(
        "\nIn the page's solver worker (Chromium; memory: the renderer's peak resident set, page and worker together)\n" +
          "| day | budget s | handed to worker → result, s | wall s incl. the bench's byte transfer | moves | feasible | unassigned | vehicles used | cost | worker heap MB | renderer peak RSS MB |\n" +
          "|---|---:|---:|---:|---:|:---|---:|---:|---:|---:|---:|",
      );
      for (const d of pageDays)
        console.log(
          `| ${d.stops} stops, ${d.vehicles} vehicles | ${d.budgetSeconds} | ${d.postToResultSeconds} | ${d.wallSeconds} | ${d.moves} | ${d.feasible} | ${d.unassigned} | ${d.vehiclesUsed} | ${d.cost} | ${d.workerPeakHeapMB ?? "not available"} | ${d.rendererPeakRssMB ?? "not available"} |`,
        );
    }
  }
  const loadAverageAtEnd = loadavg().map((x) => Math.round(x * 10) / 10);
  console.log(`\nload average at the end ${loadAverageAtEnd.join(" ")}`);
  const file = writeResults(label ? `scale-${label}` : "scale", {
    bench: "scale",
    environment: { ...environment, loadAverageAtEnd },
    matrix5000: {
      runs: matrix,
      medianWallMs: matrix.length ? median(matrix.map((m) => m.wallMs)) : null,
      medianCpuMs: matrix.length ? median(matrix.map((m) => m.cpuMs)) : null,
    },
    inRun: {
      movesPerRun: moves,
      rounds,
      rows: rateRows.map((r) => ({ ...r, medianWall: Math.round(median(r.wall)), medianCpu: Math.round(median(r.cpu)) })),
      ratio5000to100: {
        wall: ratios.wall,
        cpu: ratios.cpu,
        medianWall: ratios.wall.length ? median(ratios.wall) : null,
        medianCpu: ratios.cpu.length ? median(ratios.cpu) : null,
      },
    },
    days,
    pageDays,
  });
  console.log(`wrote ${file}`);
}

/** One run of `moves` moves; evaluations per wall and CPU second spent in `step`. */
function inRun(problem: Problem, moves: number): { wall: number; cpu: number; evaluations: number } {
  const solver = createSolver(problem, { seed: 1, budget: { moves } });
  const c = cpuMs();
  const t = performance.now();
  while (!solver.step(20_000)) {
    // step runs the budget in slices.
  }
  const wallMs = performance.now() - t;
  const cpu = cpuMs() - c;
  const evaluations = solver.result().stats.evaluations;
  return { wall: Math.round((evaluations / wallMs) * 1000), cpu: Math.round((evaluations / cpu) * 1000), evaluations };
}
