import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/anneal/createRandom.js";
import { acceptsUphill } from "../../src/core/solve.js";

/**
 * The Metropolis rule for a worse move (Metropolis, Rosenbluth, Rosenbluth, Teller & Teller 1953,
 * J. Chem. Phys. 21:1087): accept when a uniform draw r < exp(-dE / T); at T = 0 never.
 */
function metropolis(r: number, dE: number, t: number): boolean {
  return t > 0 && r < Math.exp(-dE / t);
}

describe("acceptsUphill decides as the Metropolis rule on the generator's draws", () => {
  const STEP = 2 ** -32; // the generator's draws are multiples of 2^-32 (sfc32, 32-bit output)
  it("for draws of 0, the smallest steps, and random draws, at changes around exp's cut-off", () => {
    const rng = createRandom("uphill");
    const draws = [0, STEP, 2 * STEP, 0.5, 1 - STEP];
    for (let k = 0; k < 200; k++) draws.push(Math.floor(rng.next() * 2 ** 32) * STEP);
    const temperatures = [0, 1e-9, 0.37, 1, 90, 1473, 1e12];
    // dE / T from 0 to 40, densely around 22-24 where the shortcut starts, and far beyond.
    const ratios = [1e-12, 0.01, 0.5, 1, 5, 10, 20, 22, 22.18, 22.2, 22.5, 23, 23.0000001, 23.5, 24, 30, 40, 745, 800];
    let checked = 0;
    for (const t of temperatures) {
      for (const x of ratios) {
        const dE = t > 0 ? x * t : x;
        for (const r of draws) {
          expect(acceptsUphill(r, dE, t), `r ${r}, dE ${dE}, T ${t}`).toBe(metropolis(r, dE, t));
          checked++;
        }
      }
    }
    expect(checked).toBe(temperatures.length * ratios.length * draws.length);
  });

  it("accepts with a draw of 0 wherever exp(-dE / T) is still above 0", () => {
    expect(acceptsUphill(0, 30, 1)).toBe(true); // exp(-30) = 9.4e-14 > 0
    expect(acceptsUphill(STEP, 30, 1)).toBe(false);
    expect(acceptsUphill(0, 800, 1)).toBe(false); // exp(-800) underflows to 0
  });
});
