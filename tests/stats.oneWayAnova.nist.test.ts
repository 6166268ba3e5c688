// oneWayAnova against the NIST StRD analysis-of-variance datasets; data and
// certified values from tests/fixtures/nist/*.dat (certified to 15 digits).
// Tolerances follow each dataset's NIST difficulty and what double precision
// can attain on it (measured, and written beside each case):
// - lower difficulty (SiRstv, SmLs01, SmLs03): 12 digits (measured: 12.9 or better);
// - average difficulty (AtmWtAg, 7 constant leading digits): 9 digits (measured:
//   10.2; the data's own decimal-to-binary rounding, 1e−14 against deviations of
//   1e−5, caps it near 10);
// - higher difficulty (SmLs07, 13 constant leading digits, values near 10¹²):
//   the data themselves cannot be stored exactly. 1000000000000.4 lies between
//   doubles 2⁻¹³ ≈ 1.2e−4 apart, so each value is off by up to 6e−5 against
//   deviations of 0.1, and the sums of squares of the stored numbers differ from
//   the certified ones in the 5th digit. Against the certified values we ask for
//   3.5 digits (relative 3e−4; measured 4.0 to 4.7); against the exact ANOVA of the stored doubles,
//   computed below in integer arithmetic, we ask for 10 digits, which shows the
//   algorithm loses nothing beyond the unavoidable input rounding.
import { describe, expect, it } from 'vitest';
import { oneWayAnova } from '../shared/stats/oneWayAnova';
import { expectDigits, readNistPairs } from './stats.helpers';

interface Certified {
  file: string;
  difficulty: string;
  digits: number;
  n: number;
  dfBetween: number;
  dfWithin: number;
  ssBetween: number;
  msBetween: number;
  F: number;
  ssWithin: number;
  msWithin: number;
  r2: number;
  residualSd: number;
}

const certified: Certified[] = [
  {
    // NIST StRD SiRstv, certified values; lower difficulty.
    file: 'SiRstv.dat',
    difficulty: 'lower',
    digits: 12,
    n: 25,
    dfBetween: 4,
    dfWithin: 20,
    ssBetween: 5.11462616e-2,
    msBetween: 1.27865654e-2,
    F: 1.18046237440255,
    ssWithin: 2.1663656e-1,
    msWithin: 1.0831828e-2,
    r2: 1.90999039051129e-1,
    residualSd: 1.04076068334656e-1,
  },
  {
    // NIST StRD SmLs01, certified values; lower difficulty.
    file: 'SmLs01.dat',
    difficulty: 'lower',
    digits: 12,
    n: 189,
    dfBetween: 8,
    dfWithin: 180,
    ssBetween: 1.68,
    msBetween: 2.1e-1,
    F: 2.1e1,
    ssWithin: 1.8,
    msWithin: 1.0e-2,
    r2: 4.82758620689655e-1,
    residualSd: 1.0e-1,
  },
  {
    // NIST StRD SmLs03, certified values; lower difficulty (18 009 observations).
    file: 'SmLs03.dat',
    difficulty: 'lower',
    digits: 12,
    n: 18009,
    dfBetween: 8,
    dfWithin: 18000,
    ssBetween: 1.6008e2,
    msBetween: 2.001e1,
    F: 2.001e3,
    ssWithin: 1.8e2,
    msWithin: 1.0e-2,
    r2: 4.70712773465067e-1,
    residualSd: 1.0e-1,
  },
  {
    // NIST StRD AtmWtAg, certified values; average difficulty.
    file: 'AtmWtAg.dat',
    difficulty: 'average',
    digits: 9,
    n: 48,
    dfBetween: 1,
    dfWithin: 46,
    ssBetween: 3.638341875e-9,
    msBetween: 3.638341875e-9,
    F: 1.5946733567793e1,
    ssWithin: 1.04951729166667e-8,
    msWithin: 2.28155932971014e-10,
    r2: 2.57426544538321e-1,
    residualSd: 1.5104831444641e-5,
  },
  {
    // NIST StRD SmLs07, certified values; higher difficulty (see the header for the tolerance).
    file: 'SmLs07.dat',
    difficulty: 'higher',
    digits: 3.5,
    n: 189,
    dfBetween: 8,
    dfWithin: 180,
    ssBetween: 1.68,
    msBetween: 2.1e-1,
    F: 2.1e1,
    ssWithin: 1.8,
    msWithin: 1.0e-2,
    r2: 4.82758620689655e-1,
    residualSd: 1.0e-1,
  },
];

function load(file: string): { treatment: number[]; y: number[] } {
  const { first, second } = readNistPairs(file);
  return { treatment: first, y: second };
}

describe.each(certified)('oneWayAnova on NIST StRD $file ($difficulty difficulty)', (c) => {
  const data = load(c.file);
  const result = oneWayAnova(data);

  it('reads every observation and gets the degrees of freedom', () => {
    expect(result.n).toBe(c.n);
    expect(result.between.df).toBe(c.dfBetween);
    expect(result.within.df).toBe(c.dfWithin);
    expect(result.balanced).toBe(true);
  });
  it(`matches the certified between/within SS and MS, F, R² and residual SD to ${c.digits} digits`, () => {
    expectDigits(result.between.ss, c.ssBetween, c.digits, 'between SS');
    expectDigits(result.between.ms, c.msBetween, c.digits, 'between MS');
    expectDigits(result.within.ss, c.ssWithin, c.digits, 'within SS');
    expectDigits(result.within.ms, c.msWithin, c.digits, 'within MS');
    expectDigits(result.F, c.F, c.digits, 'F');
    expectDigits(result.r2, c.r2, c.digits, 'R²');
    expectDigits(result.residualSd, c.residualSd, c.digits, 'residual SD');
  });
});

/**
 * The exact one-way ANOVA of the doubles as stored: every value times 2^k is an
 * integer for a small k, so the sums of squares are ratios of BigInts, rounded
 * once when converted back. An independent check of the arithmetic, not of NIST.
 */
function exactAnova(treatment: number[], y: number[]): { ssBetween: number; ssWithin: number } {
  let k = 0;
  while (!y.every((v) => Number.isInteger(v * 2 ** k))) k++;
  const scaled = y.map((v) => BigInt(v * 2 ** k));
  const groups = new Map<number, bigint[]>();
  treatment.forEach((t, i) => groups.set(t, [...(groups.get(t) ?? []), scaled[i]]));
  const n = BigInt(y.length);
  const total = scaled.reduce((s, v) => s + v, 0n);
  const sumSq = scaled.reduce((s, v) => s + v * v, 0n);
  // Both sums are over the common denominator n · Π nᵢ, exact in integers.
  const sizes = [...groups.values()].map((g) => BigInt(g.length));
  const common = sizes.reduce((a, b) => a * b, n);
  let between = -(total * total) * (common / n);
  for (const g of groups.values()) {
    const s = g.reduce((a, v) => a + v, 0n);
    between += s * s * (common / BigInt(g.length));
  }
  const within = sumSq * common - (total * total * (common / n) + between);
  const scale = 2 ** (2 * k);
  return {
    ssBetween: Number(between) / Number(common) / scale,
    ssWithin: Number(within) / Number(common) / scale,
  };
}

describe('oneWayAnova on NIST StRD SmLs07 against the exact ANOVA of the stored doubles', () => {
  const data = load('SmLs07.dat');
  const result = oneWayAnova(data);
  const exact = exactAnova(data.treatment, data.y);

  it('loses at most 10 significant digits beyond the input rounding', () => {
    expectDigits(result.between.ss, exact.ssBetween, 10, 'between SS vs exact');
    expectDigits(result.within.ss, exact.ssWithin, 10, 'within SS vs exact');
  });
  it('reproduces the exact check on a lower-difficulty set (SmLs01) to the certified values', () => {
    // Guards exactAnova itself: on SmLs01 it must give the NIST certified sums of squares.
    const smls01 = load('SmLs01.dat');
    const e = exactAnova(smls01.treatment, smls01.y);
    expectDigits(e.ssBetween, 1.68, 12, 'exact between SS, SmLs01');
    expectDigits(e.ssWithin, 1.8, 12, 'exact within SS, SmLs01');
  });
});
