import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { randomOrder } from "./randomStart.js";
import { parseSolomon, parseTsplib, solomonToProblem, tsplibToProblem } from "../../src/core/formats/index.js";
import { tsplibTourLength } from "../../src/core/formats/tsplibTourLength.js";
import type { Problem } from "../../src/core/model.js";
import { SearchState } from "../../src/core/moves/SearchState.js";
import { buildNeighbours } from "../../src/core/neighbours/buildNeighbours.js";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { mostEvaluations, TourDescent, tourVehicle } from "../../src/core/search/tourDescent.js";

const fixture = (name: string): string => readFileSync(new URL(`../fixtures/reference/${name}`, import.meta.url), "utf8");

/** A state holding a random tour of every stop on vehicle 0. */
function randomState(problem: Problem, seed: number) {
  const cp = compileProblem(problem);
  const state = new SearchState(cp, 1, 1);
  const rng = createRandom(seed);
  const order = randomOrder(cp.n, rng);
  state.setRoute(0, order);
  return { cp, state, active: Int32Array.from(order.keys()), nb: buildNeighbours(cp, 20), rng };
}

/** The tour's stops in route order. */
function stopsOf(tour: TourDescent): number[] {
  const out = new Int32Array(tour.size);
  return Array.from(out.subarray(0, tour.stops(out)));
}

/**
 * ulysses22 with a vehicle that also costs per hour at its own speed, a fixed cost and service
 * minutes (an invented variant: the arc cost is then km plus minutes at another speed).
 */
function pricedUlysses(shiftEndMin: number): Problem {
  const base = tsplibToProblem(parseTsplib(fixture("ulysses22.tsp")));
  return {
    ...base,
    matrix: { ...base.matrix, userSupplied: false },
    stops: base.stops.map((s, i) => ({ ...s, serviceMin: 3 + (i % 4) })),
    vehicles: base.vehicles.map((v) => ({ ...v, costPerKm: 0.7, costPerHour: 30, fixedCost: 50, speedKmh: 45, shiftEndMin })),
  };
}

describe("TourDescent: 2-opt and or-opt on the arc costs of a one-route plan", () => {
  const cases: [string, () => Problem][] = [
    ["ulysses22 (TSPLIB GEO)", () => tsplibToProblem(parseTsplib(fixture("ulysses22.tsp")))],
    ["burma14 (TSPLIB GEO)", () => tsplibToProblem(parseTsplib(fixture("burma14.tsp")))],
    ["ulysses22 with costs per km and hour, a fixed cost, service minutes and another speed", () => pricedUlysses(1e7)],
  ];
  for (const [name, make] of cases) {
    it(`${name}: each applied move's gain equals the drop of the route's cost by the engine's exact evaluation, every stop stays once, seeds 1-5`, () => {
      let moves = 0;
      for (const seed of [1, 2, 3, 4, 5]) {
        const problem = make();
        const { cp, state, active, nb, rng } = randomState(problem, seed);
        const v = tourVehicle(state, active, nb);
        expect(v, name).toBe(0);
        const tour = new TourDescent(state, v);
        const exact = (stops: number[]): number => {
          state.setRoute(0, stops);
          return state.realCost();
        };
        let cost = exact(stopsOf(tour));
        // Stops at random, the descent's moves as they come, to a local optimum and beyond.
        for (let k = 0; k < 40 * cp.n; k++) {
          const used = tour.improve(nb, rng.int(cp.n), 8, 1e-9);
          expect(used).toBeLessThanOrEqual(mostEvaluations(8));
          if (!tour.applied) continue;
          moves++;
          const stops = stopsOf(tour);
          expect([...stops].sort((a, b) => a - b)).toEqual(Array.from({ length: cp.n }, (_, s) => s));
          const after = exact(stops);
          // The engine's route evaluation (segment summaries, every rule) against the arc costs.
          expect(cost - after, `${name} seed ${seed}`).toBeCloseTo(tour.gain, 6);
          expect(tour.gain).toBeGreaterThan(0);
          cost = after;
        }
      }
      expect(moves).toBeGreaterThan(20);
    });
  }

  it("ulysses22: on a TSPLIB instance the gains are the drops of the tour length the TSPLIB reader measures (TSPLIB95 GEO distance), and the descent ends where no 2-opt between neighbours improves", () => {
    const inst = parseTsplib(fixture("ulysses22.tsp"));
    const problem = tsplibToProblem(inst);
    for (const seed of [1, 2, 3]) {
      const { state, active, nb, cp } = randomState(problem, seed);
      const tour = new TourDescent(state, tourVehicle(state, active, nb));
      const length = (): number => tsplibTourLength(inst, [1, ...stopsOf(tour).map((s) => Number(problem.stops[s]!.id))]);
      let before = length();
      let improvedSomething = true;
      while (improvedSomething) {
        improvedSomething = false;
        for (let s = 0; s < cp.n; s++) {
          tour.improve(nb, s, 8, 1e-9);
          if (!tour.applied) continue;
          improvedSomething = true;
          const after = length();
          expect(before - after).toBeCloseTo(tour.gain, 6);
          before = after;
        }
      }
      // An independent check of 2-opt optimality over each stop's 8 nearest neighbours
      // (both tour directions), on the TSPLIB lengths.
      const stops = stopsOf(tour);
      const cycle = [-1, ...stops];
      const ids = (i: number): number => (cycle[i] === -1 ? 1 : Number(problem.stops[cycle[i]!]!.id));
      const base = tsplibTourLength(
        inst,
        cycle.map((_, i) => ids(i)),
      );
      for (let i = 0; i < cycle.length; i++) {
        for (let j = i + 2; j < cycle.length; j++) {
          const turned = [...cycle.slice(0, i + 1), ...cycle.slice(i + 1, j + 1).reverse(), ...cycle.slice(j + 1)];
          const a = cycle[i]!;
          const c = cycle[j]!;
          const near = (x: number, y: number): boolean =>
            x >= 0 && y >= 0 && Array.from(nb.list.subarray(x * nb.k, x * nb.k + 8)).includes(y);
          if (!near(a, c) && !near(cycle[i + 1]!, cycle[(j + 1) % cycle.length]!)) continue;
          const rotated = turned.indexOf(-1);
          const order = [...turned.slice(rotated), ...turned.slice(0, rotated)].map((s) => (s === -1 ? 1 : Number(problem.stops[s]!.id)));
          expect(tsplibTourLength(inst, order), `seed ${seed} 2-opt ${i},${j}`).toBeGreaterThanOrEqual(base);
        }
      }
    }
  });

  it("tourVehicle refuses plans whose cost is not a sum of symmetric arc costs: windows that bind (Solomon C101), a shift too short for every order, two routes, a stop left in the pool", () => {
    const c101 = solomonToProblem(parseSolomon(fixture("C101.txt")));
    const one = randomState({ ...c101, vehicles: c101.vehicles.slice(0, 1) }, 1);
    expect(tourVehicle(one.state, one.active, one.nb)).toBe(-1);
    // ulysses22 with a shift of 1 000 minutes: some orders of its stops would run past it.
    const short = randomState(pricedUlysses(1000), 1);
    expect(tourVehicle(short.state, short.active, short.nb)).toBe(-1);
    const long = randomState(pricedUlysses(1e7), 1);
    expect(tourVehicle(long.state, long.active, long.nb)).toBe(0);
    const base = tsplibToProblem(parseTsplib(fixture("ulysses22.tsp")));
    const two = { ...base, vehicles: [base.vehicles[0]!, { ...base.vehicles[0]!, id: "2" }] };
    const split = randomState(two, 1);
    const stops = split.state.routes[0]!.stops();
    split.state.setRoute(0, stops.slice(0, 10));
    split.state.setRoute(1, stops.slice(10));
    expect(tourVehicle(split.state, split.active, split.nb)).toBe(-1);
    const pooled = randomState(base, 1);
    const left = pooled.state.routes[0]!.stops();
    pooled.state.emptyRoute(0);
    pooled.state.setRoute(0, left.slice(1));
    expect(tourVehicle(pooled.state, pooled.active, pooled.nb)).toBe(-1);
  });
});
