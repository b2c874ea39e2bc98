import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseSolomon, solomonToProblem } from "../../src/core/formats/index.js";
import { parseTsplib, tsplibToProblem } from "../../src/core/formats/index.js";
import { buildMatrix, userMatrix } from "../../src/core/geo/buildMatrix.js";
import { greatCircleKm } from "../../src/core/geo/greatCircleKm.js";
import type { Problem } from "../../src/core/model.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { computablePlaces } from "../../src/core/schedule/compiledArcs.js";
import { placeKm } from "../../src/core/geo/placeKm.js";
import { initialWeights } from "../../src/core/anneal/initialWeights.js";
import { constructPlan } from "../../src/core/construct/constructPlan.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { descend } from "../../src/core/search/descend.js";
import { RouteArrays } from "../../src/core/schedule/RouteArrays.js";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { randomInstance } from "./randomInstance.js";

const fixture = (name: string): string => readFileSync(new URL(`../fixtures/reference/${name}`, import.meta.url), "utf8");

describe("buildMatrix fills every entry with the pairwise great-circle formula", () => {
  it("is bitwise greatCircleKm * detour and (km / speed) * 60 across tile edges", () => {
    // 150 points: more than two 64-point tiles, so entries in and across tiles are compared.
    // greatCircleKm itself is checked against geolib in test/reference/greatCircleGeolib.test.ts.
    const rng = createRandom("tiles");
    const points = Array.from({ length: 150 }, () => ({ lat: -60 + rng.next() * 120, lon: -180 + rng.next() * 360 }));
    points.push({ ...points[3]! }); // a coincident pair: 0 km
    const m = buildMatrix(points, { detourFactor: 1.37, speedKmh: 33 });
    const n = points.length;
    let mismatches = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const km = i === j ? 0 : greatCircleKm(points[i]!, points[j]!) * 1.37;
        if (!Object.is(m.distanceKm[i * n + j], km) || !Object.is(m.travelMin[i * n + j], (km / 33) * 60)) mismatches++;
      }
    }
    expect(mismatches).toBe(0);
    expect(m.distanceKm[3 * n + (n - 1)]).toBe(0);
  });
});

describe("compiled arc tables read the matrix's own numbers", () => {
  function derivedExactly(p: Problem): boolean {
    const cp = compileProblem(p);
    const { distanceKm, travelMin } = p.matrix;
    for (let i = 0; i < distanceKm.length; i++) {
      if (!Object.is((distanceKm[i]! / cp.travelDivisor) * cp.travelMultiplier, travelMin[i])) return false;
    }
    return true;
  }

  it("derives minutes from km only when that gives every stored minute bitwise", () => {
    const generated = randomInstance(1, { stops: 20, vehicles: 3 });
    expect(compileProblem(generated).travelFromKm).toBe(true);
    expect(derivedExactly(generated)).toBe(true);
    // Solomon (1987): travel time equals distance.
    const solomon = solomonToProblem(parseSolomon(fixture("C101.txt")));
    expect(compileProblem(solomon).travelFromKm).toBe(true);
    expect(derivedExactly(solomon)).toBe(true);
    // TSPLIB (Reinelt 1991): the tour length is the sum of the integer distances.
    const tsp = tsplibToProblem(parseTsplib(fixture("ulysses22.tsp")));
    expect(compileProblem(tsp).travelFromKm).toBe(true);
    expect(derivedExactly(tsp)).toBe(true);
    // A user's own minutes, not proportional to km: both tables are read.
    const L = generated.matrix.size;
    const km = Array.from({ length: L }, (_, i) => Array.from({ length: L }, (_, j) => generated.matrix.distanceKm[i * L + j]!));
    const min = km.map((row, i) => row.map((d, j) => d * 1.7 + ((i + j) % 3)));
    expect(compileProblem({ ...generated, matrix: userMatrix(km, min) }).travelFromKm).toBe(false);
    // The same arcs both ways (a great-circle matrix, TSPLIB's symmetric instances, Solomon's
    // Euclidean distances): one copy of the reversed legs; one arc longer one way is enough to keep two.
    expect(compileProblem(generated).symmetric).toBe(true);
    expect(compileProblem(tsp).symmetric).toBe(true);
    expect(compileProblem(solomon).symmetric).toBe(true);
    expect(compileProblem({ ...generated, matrix: userMatrix(km, min) }).symmetric).toBe(true);
    const oneWay = km.map((row, i) => row.map((d, j) => (i === 2 && j === 5 ? d + 0.5 : d)));
    expect(compileProblem({ ...generated, matrix: userMatrix(oneWay) }).symmetric).toBe(false);
    const minOneWay = min.map((row, i) => row.map((d, j) => (i === 5 && j === 2 ? d + 1 : d)));
    expect(compileProblem({ ...generated, matrix: userMatrix(km, minOneWay) }).symmetric).toBe(false);
    // One entry off by a rounding step is enough to keep both tables.
    const t = generated.matrix.travelMin.slice();
    t[5] = t[5]! + t[5]! * Number.EPSILON;
    expect(compileProblem({ ...generated, matrix: { ...generated.matrix, travelMin: t } }).travelFromKm).toBe(false);
  });

  it("copies the arcs into each end depot bitwise", () => {
    const p = randomInstance(2, { stops: 25, vehicles: 5 });
    const cp = compileProblem(p);
    const L = cp.locationCount;
    for (let v = 0; v < cp.vehicleCount; v++) {
      const e = cp.endDepot[v]!;
      expect(e).toBeGreaterThanOrEqual(0);
      for (let loc = 0; loc < L; loc++) {
        expect(cp.toEnd[(e * L + loc) * 2]).toBe(p.matrix.distanceKm[loc * L + cp.endLoc[v]!]);
        expect(cp.toEnd[(e * L + loc) * 2 + 1]).toBe(p.matrix.travelMin[loc * L + cp.endLoc[v]!]);
      }
    }
  });
});

describe("a great-circle matrix's km computed instead of read", () => {
  it("computes every entry bitwise as buildMatrix stored it", () => {
    // The stored entries are buildMatrix's, checked above against greatCircleKm (and that
    // against geolib in test/reference/greatCircleGeolib.test.ts).
    const p = randomInstance(4, { stops: 40, vehicles: 3 });
    const places = computablePlaces(p, 2)!;
    expect(places).toBeDefined();
    const L = p.matrix.size;
    let mismatches = 0;
    for (let a = 0; a < L; a++)
      for (let b = 0; b < L; b++) if (!Object.is(placeKm(places, a, b), p.matrix.distanceKm[a * L + b])) mismatches++;
    expect(mismatches).toBe(0);
  });

  it("reads the table when it is small, the user's, or changed since it was built", () => {
    const p = randomInstance(5, { stops: 20, vehicles: 2 });
    expect(computablePlaces(p)).toBeUndefined(); // below COMPUTE_KM_FROM_LOCATIONS
    expect(compileProblem(p).places).toBeUndefined();
    const L = p.matrix.size;
    const km = Array.from({ length: L }, (_, i) => Array.from({ length: L }, (_, j) => p.matrix.distanceKm[i * L + j]!));
    expect(computablePlaces({ ...p, matrix: userMatrix(km) }, 2)).toBeUndefined();
    const { greatCircle: _, ...unmarked } = p.matrix;
    expect(computablePlaces({ ...p, matrix: unmarked }, 2)).toBeUndefined();
    // One sampled entry (row 0, column 1) off by a rounding step.
    const changed = p.matrix.distanceKm.slice();
    changed[1] = changed[1]! * (1 + Number.EPSILON);
    expect(computablePlaces({ ...p, matrix: { ...p.matrix, distanceKm: changed } }, 2)).toBeUndefined();
  });

  it("leaves the search's numbers as they were: the same first plan, descent and costs", () => {
    const p = randomInstance(6, { stops: 60, vehicles: 5 });
    const run = (computeKmFrom: number): { routes: number[][]; total: number } => {
      const cp = compileProblem(p, computeKmFrom);
      const w = initialWeights(cp);
      const state = new SearchState(cp, w.wTime, w.wLoad);
      const nb = buildNeighbours(cp, 10);
      constructPlan(state, nb);
      const active = Int32Array.from({ length: cp.n }, (_, i) => i);
      descend(state, nb, createRandom(9), active, 20_000);
      return { routes: state.routes.map((r) => Array.from(r.nodes.subarray(1, r.len + 1))), total: state.total() };
    };
    const read = run(Infinity);
    const computed = run(2);
    expect(computed.routes).toEqual(read.routes);
    expect(Object.is(computed.total, read.total)).toBe(true);
  });
});

describe("RouteArrays rebuilt after an edit equals one built from scratch", () => {
  const FIELDS = [
    "legKm",
    "legMin",
    "legKmR",
    "legMinR",
    "preD",
    "preTW",
    "preE",
    "preL",
    "sufD",
    "sufTW",
    "sufE",
    "sufL",
    "cumDist",
    "cumDistR",
    "cumTrav",
    "cumTravR",
    "cumSvc",
    "cumWin",
  ] as const;
  /** Kept only while the route has a stop with a window (`RouteArrays.windowed`). */
  const WINDOW_FIELDS = new Set<string>(["preD", "preTW", "preE", "preL", "sufD", "sufTW", "sufE", "sufL"]);

  it.each([
    ["generated, shared minutes", randomInstance(3, { stops: 30, vehicles: 3 }), undefined],
    ["generated, km computed from the places", randomInstance(3, { stops: 30, vehicles: 3 }), 2],
    ["Solomon C101", solomonToProblem(parseSolomon(fixture("C101.txt"))), undefined],
    // No stop with a window: the route keeps no window summaries (TSPLIB, invented windowless day).
    ["TSPLIB ulysses22", tsplibToProblem(parseTsplib(fixture("ulysses22.tsp"))), undefined],
    ["generated, no windows", randomInstance(4, { stops: 30, vehicles: 3, windows: false }), undefined],
    // One-way arcs (an invented matrix, each arc up to 30% longer one way): reversed legs kept apart.
    ["generated, one-way arcs", oneWayArcs(randomInstance(6, { stops: 30, vehicles: 3 })), undefined],
    // Every third stop with a window: routes go from no window to some and back.
    ["generated, some windows", someWindows(randomInstance(5, { stops: 30, vehicles: 3 })), undefined],
  ])("%s: 3 000 random inserts, removals, swaps and reversals", (_, problem, computeKmFrom) => {
    const cp = compileProblem(problem, computeKmFrom);
    if (computeKmFrom !== undefined) expect(cp.places).toBeDefined();
    const v = 1;
    const route = new RouteArrays(cp, v);
    const rng = createRandom("edits");
    let stops: number[] = [];
    for (let it = 0; it < 3000; it++) {
      const next = stops.slice();
      const op = rng.int(4);
      if (op === 0 && next.length < 40) next.splice(rng.int(next.length + 1), 0, rng.int(cp.n));
      else if (op === 1 && next.length > 0) next.splice(rng.int(next.length), 1);
      else if (op === 2 && next.length > 1) {
        const a = rng.int(next.length);
        const b = rng.int(next.length);
        [next[a], next[b]] = [next[b]!, next[a]!];
      } else if (next.length > 2) {
        const a = rng.int(next.length - 1);
        const b = a + 1 + rng.int(next.length - a - 1);
        next.splice(a, b - a + 1, ...next.slice(a, b + 1).reverse());
      }
      if (next.length === stops.length && next.length > 0) {
        // The same-length path of the search: only the changed stretch is replaced.
        let lo = 1;
        let hi = next.length;
        while (lo <= hi && route.nodes[lo] === next[lo - 1]) lo++;
        while (hi >= lo && route.nodes[hi] === next[hi - 1]) hi--;
        if (lo <= hi) route.replaceRange(Int32Array.from(next), lo, hi);
      } else {
        route.assign(next, next.length);
      }
      stops = next;
      const fresh = new RouteArrays(cp, v);
      fresh.assign(stops, stops.length);
      const L = cp.locationCount;
      for (let i = 1; i <= stops.length; i++) {
        // The legs are the problem's matrix entries themselves.
        const a = route.locs[i - 1]!;
        const b = route.locs[i]!;
        expect(route.value("legKm", i)).toBe(problem.matrix.distanceKm[a * L + b]);
        expect(route.value("legMinR", i)).toBe(problem.matrix.travelMin[b * L + a]);
      }
      // A route holds window summaries exactly when some stop on it has a window.
      expect(route.windowed).toBe(stops.some((s) => cp.windowed[s] === 1));
      expect(fresh.windowed).toBe(route.windowed);
      for (let i = 0; i <= stops.length; i++) if (route.locs[i] !== fresh.locs[i]) expect.fail(`edit ${it}: locs[${i}]`);
      for (const f of FIELDS) {
        if (!route.windowed && WINDOW_FIELDS.has(f)) continue;
        const first = f.startsWith("suf") || f.startsWith("leg") ? 1 : 0;
        for (let i = first; i <= stops.length; i++) {
          const got = route.value(f, i);
          const want = fresh.value(f, i);
          // Suffixes past a replaced stretch are kept, and they take each leg's minutes as a
          // difference of prefix sums, so they may differ from a fresh build in the last bits.
          const same = Object.is(got, want) || (f.startsWith("suf") && Math.abs(got - want) <= 1e-9 * Math.max(1, Math.abs(want)));
          if (!same) expect.fail(`edit ${it}: ${f}[${i}] ${got} != ${want}`);
        }
      }
    }
  });
});

/** The instance with the windows of all but every third stop opened (never binding). */
function someWindows(p: Problem): Problem {
  return { ...p, stops: p.stops.map((s, i) => (i % 3 === 0 ? s : { ...s, windows: [{ earliestMin: 0, latestMin: Infinity }] })) };
}

/** The instance on a matrix whose arcs from a lower to a higher index are up to 30% longer (invented, asymmetric). */
function oneWayArcs(p: Problem): Problem {
  const L = p.matrix.size;
  const km = Array.from({ length: L }, (_, i) =>
    Array.from({ length: L }, (_, j) => p.matrix.distanceKm[i * L + j]! * (i < j ? 1 + ((i * 7 + j) % 10) / 33 : 1)),
  );
  return { ...p, matrix: userMatrix(km) };
}
