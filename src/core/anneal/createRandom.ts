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
  const a = base.int32() >>> 0;
  const b = base.int32() >>> 0;
  const c = base.int32() >>> 0;
  const d = base.int32() >>> 0 || 1;
  const rng = new Sfc32(a | 0, b | 0, c | 0, d | 0);
  for (let i = 0; i < 12; i++) rng.next();
  return rng;
}

/**
 * sfc32's state and step. A class, so that every run's generator shares one hidden class and
 * one `next` (generators made of closures gave each run its own functions, and the move loop's
 * calls to them stopped being inlined once a process had made a few).
 */
class Sfc32 implements Random {
  constructor(
    private a: number,
    private b: number,
    private c: number,
    private d: number,
  ) {}

  next(): number {
    const t = (((this.a + this.b) | 0) + this.d) | 0;
    this.d = (this.d + 1) | 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) | 0;
    this.c = (this.c << 21) | (this.c >>> 11);
    this.c = (this.c + t) | 0;
    return (t >>> 0) / 4294967296;
  }

  int(n: number): number {
    return Math.floor(this.next() * n);
  }
}
