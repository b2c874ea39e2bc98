import seedrandom from "seedrandom";

/** A seeded source of uniform numbers. */
export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform integer in 0..n-1 (n >= 1). */
  int(n: number): number;
}

/**
 * The run's one random generator: sfc32 (Chris Doty-Humphrey's Small Fast Counting
 * generator, PractRand) seeded from `seedrandom(String(seed))`, fast enough for the
 * move loop and reproducible across platforms.
 *
 * @param seed - any number or string
 * @returns a generator; the same seed gives the same sequence
 * @example createRandom(1).int(10) // => the same digit on every run
 */
export function createRandom(seed: number | string): Random {
  const base = seedrandom(String(seed));
  let a = base.int32() >>> 0;
  let b = base.int32() >>> 0;
  let c = base.int32() >>> 0;
  let d = base.int32() >>> 0 || 1;
  const next = (): number => {
    const t = (((a + b) | 0) + d) | 0;
    d = (d + 1) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  };
  for (let i = 0; i < 12; i++) next();
  return { next, int: (n: number) => Math.floor(next() * n) };
}
