/**
 * A small seeded pseudo-random generator, so a bootstrap gives the same numbers
 * every time for the same seed (reports must be reproducible). xoshiro128**
 * (Blackman & Vigna, "Scrambled linear pseudorandom number generators", ACM
 * TOMS 47, 2021), its 128-bit state filled from the seed by splitmix32 so that
 * nearby seeds give unrelated streams. Not for cryptography.
 */

export interface SeededRandom {
  /** A uniform number in [0, 1) with 32 random bits. */
  next: () => number;
  /** A uniform integer in [0, n) (n ≥ 1), by rejection, so without modulo bias. */
  nextInt: (n: number) => number;
}

/**
 * Creates a generator from a seed.
 * @param seed - any finite number; its integer part (mod 2³²) is used
 * @returns the generator
 * @example
 * const r = seededRandom(42); r.nextInt(6) // the same value on every run
 */
export function seededRandom(seed: number): SeededRandom {
  let z = Math.trunc(seed) >>> 0;
  const splitmix = (): number => {
    z = (z + 0x9e3779b9) >>> 0;
    let t = z;
    t = Math.imul(t ^ (t >>> 16), 0x85ebca6b);
    t = Math.imul(t ^ (t >>> 13), 0xc2b2ae35);
    return (t ^ (t >>> 16)) >>> 0;
  };
  let s0 = splitmix();
  let s1 = splitmix();
  let s2 = splitmix();
  let s3 = splitmix();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1; // the all-zero state is a fixed point
  const nextUint = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result;
  };
  return {
    next: () => nextUint() / 4294967296,
    nextInt: (n: number) => {
      // Largest multiple of n below 2³²: draws at or above it are redrawn.
      const limit = 4294967296 - (4294967296 % n);
      let u = nextUint();
      while (u >= limit) u = nextUint();
      return u % n;
    },
  };
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
