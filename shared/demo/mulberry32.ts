/**
 * A small seeded pseudo-random generator, so the demo trial and the benchmark
 * tables are the same on every machine. Mulberry32 (Tommy Ettinger, 2017,
 * public domain): a 32-bit state advanced by a Weyl increment and mixed;
 * plenty for invented plot data, not for cryptography.
 */

export interface Random {
  /** Uniform on [0, 1). */
  next(): number;
  /** Standard normal, by the Box–Muller transform. */
  normal(): number;
  /** Integer uniform on [lo, hi]. */
  int(lo: number, hi: number): number;
}

/**
 * Creates a seeded generator.
 * @param seed - any 32-bit integer
 * @returns a generator; the same seed gives the same sequence
 * @example
 * mulberry32(1).next() // 0.6270739405881613
 */
export function mulberry32(seed: number): Random {
  let a = seed >>> 0;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  let spare: number | null = null;
  return {
    next,
    normal(): number {
      if (spare !== null) {
        const s = spare;
        spare = null;
        return s;
      }
      let u = 0;
      while (u === 0) u = next();
      const v = next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
    int(lo: number, hi: number): number {
      return lo + Math.floor(next() * (hi - lo + 1));
    },
  };
}
