// The distribution functions in shared/stats/distributions.ts against
// (1) printed tables of critical values and (2) jstat on a grid.
import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import {
  chiSquareCdf,
  chiSquareQuantile,
  chiSquareUpperP,
  fisherFCdf,
  fisherFQuantile,
  fisherFUpperP,
  standardNormalCdf,
  standardNormalQuantile,
  studentTCdf,
  studentTQuantile,
  studentTTwoSidedP,
} from '../shared/stats/distributions';
import { expectWithin } from './stats.helpers';

// Upper critical values of Student's t, NIST/SEMATECH e-Handbook of Statistical
// Methods, §1.3.6.7.2 ("Critical values of the Student's t distribution"),
// columns 0.90, 0.95, 0.975, 0.99, 0.995, 0.999. Typed from memory; before
// committing, each was confirmed against R 4.2.2 qt() rounded to 3 decimals.
// The ν = 1, 0.999 cell is left out: as remembered it reads 318.313 while the
// exact value is 318.309, and a remembered entry that disagrees is not a source.
const tProbabilities = [0.9, 0.95, 0.975, 0.99, 0.995, 0.999];
const tTable: Array<[number, number[]]> = [
  [1, [3.078, 6.314, 12.706, 31.821, 63.657]],
  [2, [1.886, 2.92, 4.303, 6.965, 9.925, 22.327]],
  [3, [1.638, 2.353, 3.182, 4.541, 5.841, 10.215]],
  [5, [1.476, 2.015, 2.571, 3.365, 4.032, 5.893]],
  [10, [1.372, 1.812, 2.228, 2.764, 3.169, 4.144]],
  [20, [1.325, 1.725, 2.086, 2.528, 2.845, 3.552]],
  [30, [1.31, 1.697, 2.042, 2.457, 2.75, 3.385]],
  [60, [1.296, 1.671, 2.0, 2.39, 2.66, 3.232]],
  [100, [1.29, 1.66, 1.984, 2.364, 2.626, 3.174]],
];
// The Handbook's ∞ row: the standard normal quantiles (same section, from memory).
const normalRow = [1.282, 1.645, 1.96, 2.326, 2.576, 3.09];

// Upper 5% and 1% critical values of F, NIST/SEMATECH e-Handbook §1.3.6.7.3
// ("Upper critical values of the F distribution"), ν₁ = 1, 2, 3, 4, 5, 10 across.
// Typed from memory; each confirmed against R 4.2.2 qf() rounded to 3 decimals.
const fNumeratorDf = [1, 2, 3, 4, 5, 10];
const fTable5: Array<[number, number[]]> = [
  [1, [161.448, 199.5, 215.707, 224.583, 230.162, 241.882]],
  [2, [18.513, 19.0, 19.164, 19.247, 19.296, 19.396]],
  [5, [6.608, 5.786, 5.409, 5.192, 5.05, 4.735]],
  [10, [4.965, 4.103, 3.708, 3.478, 3.326, 2.978]],
  [20, [4.351, 3.493, 3.098, 2.866, 2.711, 2.348]],
  [30, [4.171, 3.316, 2.922, 2.69, 2.534, 2.165]],
];
const fTable1: Array<[number, number[]]> = [
  [5, [16.258, 13.274, 12.06, 11.392, 10.967, 10.051]],
  [10, [10.044, 7.559, 6.552, 5.994, 5.636, 4.849]],
  [20, [8.096, 5.849, 4.938, 4.431, 4.103, 3.368]],
];

// The tables print 3 decimals, so a correct value is within half a unit of the
// last place (0.0005); the 1e−9 allows for the table's own binary representation.
const printedHalfUnit = 0.0005 + 1e-9;

describe('studentTQuantile against the NIST/SEMATECH t table (§1.3.6.7.2)', () => {
  it.each(tTable)('matches every printed column for ν = %i', (df, row) => {
    row.forEach((value, j) =>
      expectWithin(
        studentTQuantile(tProbabilities[j], df),
        value,
        printedHalfUnit,
        `t(${tProbabilities[j]}, ${df})`,
      ),
    );
  });
  it('approaches the ∞ row (standard normal) for very large ν', () => {
    normalRow.forEach((value, j) => {
      expectWithin(
        standardNormalQuantile(tProbabilities[j]),
        value,
        printedHalfUnit,
        `z(${tProbabilities[j]})`,
      );
      expectWithin(
        studentTQuantile(tProbabilities[j], 1e7),
        value,
        printedHalfUnit,
        `t(${tProbabilities[j]}, 1e7)`,
      );
    });
  });
});

describe('fisherFQuantile against the NIST/SEMATECH F tables (§1.3.6.7.3)', () => {
  it.each(fTable5)('matches the upper 5%% points for ν₂ = %i', (df2, row) => {
    row.forEach((value, j) =>
      expectWithin(
        fisherFQuantile(0.95, fNumeratorDf[j], df2),
        value,
        printedHalfUnit,
        `F.95(${fNumeratorDf[j]}, ${df2})`,
      ),
    );
  });
  it.each(fTable1)('matches the upper 1%% points for ν₂ = %i', (df2, row) => {
    row.forEach((value, j) =>
      expectWithin(
        fisherFQuantile(0.99, fNumeratorDf[j], df2),
        value,
        printedHalfUnit,
        `F.99(${fNumeratorDf[j]}, ${df2})`,
      ),
    );
  });
});

// jstat (an independent implementation, devDependency) on a grid. Its inverse
// incomplete beta is an iterative approximation, measured here to agree with
// stdlib within 1.2e−7 relative at worst (F and t); the tolerance is 1e−6
// relative plus 1e−12 absolute (for values at or near zero). Chi-square and the
// normal agree far better (measured 1.3e−11), so they get 1e−9.
const probabilities = [
  0.001, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 0.975, 0.99, 0.999,
];
const dfs = [1, 2, 3, 4, 5, 7, 10, 15, 20, 30, 50, 100, 1000];
const denominatorDfs = [1, 2, 5, 10, 30, 100];
const close = (a: number, b: number, rel: number, what: string) =>
  expectWithin(a, b, rel * Math.abs(b) + 1e-12, what);

describe('distribution functions against jstat on a grid', () => {
  it('t quantiles and CDF', () => {
    for (const df of dfs) {
      for (const p of probabilities)
        close(studentTQuantile(p, df), jStat.studentt.inv(p, df), 1e-6, `qt(${p}, ${df})`);
      for (const t of [-6, -2.5, -1, -0.3, 0, 0.2, 1, 2.5, 6])
        close(studentTCdf(t, df), jStat.studentt.cdf(t, df), 1e-6, `pt(${t}, ${df})`);
    }
  });
  it('F quantiles and CDF', () => {
    for (const df1 of dfs) {
      for (const df2 of denominatorDfs) {
        for (const p of probabilities)
          close(
            fisherFQuantile(p, df1, df2),
            jStat.centralF.inv(p, df1, df2),
            1e-6,
            `qf(${p}, ${df1}, ${df2})`,
          );
        for (const f of [0.05, 0.3, 1, 2, 4, 10])
          close(
            fisherFCdf(f, df1, df2),
            jStat.centralF.cdf(f, df1, df2),
            1e-6,
            `pf(${f}, ${df1}, ${df2})`,
          );
      }
    }
  });
  it('chi-square quantiles and CDF', () => {
    for (const df of dfs) {
      for (const p of probabilities)
        close(chiSquareQuantile(p, df), jStat.chisquare.inv(p, df), 1e-9, `qchisq(${p}, ${df})`);
      for (const x of [0.05, 0.3, 1, 2, 4, 10])
        close(chiSquareCdf(x, df), jStat.chisquare.cdf(x, df), 1e-9, `pchisq(${x}, ${df})`);
    }
  });
  it('standard normal quantiles and CDF', () => {
    for (const p of probabilities)
      close(standardNormalQuantile(p), jStat.normal.inv(p, 0, 1), 1e-9, `qnorm(${p})`);
    for (const z of [-5, -2, -1, -0.3, 0, 0.2, 1, 2.5, 6])
      close(standardNormalCdf(z), jStat.normal.cdf(z, 0, 1), 1e-9, `pnorm(${z})`);
  });
});

describe('p-value helpers', () => {
  it('chiSquareUpperP is R 4.2.2 pchisq(x, df, lower.tail = FALSE) within 1e-15 absolute', () => {
    // Values printed by R 4.2.2 (Debian r-base-core) with formatC(..., digits = 17).
    const cases: [number, number, number][] = [
      [0.5, 1, 0.47950012218695348],
      [3.841458820694124, 1, 0.049999999999999975],
      [5.991464547107979, 2, 0.050000000000000072],
      [12.5, 4, 0.013995792487650892],
      [30, 6, 3.9308448184484619e-5],
    ];
    for (const [x, df, p] of cases)
      expectWithin(chiSquareUpperP(x, df), p, 1e-15, `pchisq(${x}, ${df}, lower.tail = FALSE)`);
    expect(chiSquareUpperP(0, 2)).toBe(1);
    expect(chiSquareUpperP(NaN, 2)).toBeNaN();
  });
  it('studentTTwoSidedP is twice the tail beyond |t| (t table: ν = 10, 0.975 point → p = 0.05)', () => {
    // Same NIST/SEMATECH §1.3.6.7.2 entry as above, used the other way round.
    expectWithin(studentTTwoSidedP(2.228, 10), 0.05, 1e-4, 'p for t = 2.228, ν = 10');
    expectWithin(studentTTwoSidedP(-2.228, 10), 0.05, 1e-4, 'p for t = −2.228, ν = 10');
  });
  it('fisherFUpperP is the upper tail (F table: F.95(3, 10) = 3.708 → p = 0.05)', () => {
    // NIST/SEMATECH §1.3.6.7.3 entry as above.
    expectWithin(fisherFUpperP(3.708, 3, 10), 0.05, 1e-4, 'p for F = 3.708 on (3, 10)');
    expectWithin(fisherFUpperP(Infinity, 3, 10), 0, 0, 'p for F = ∞');
  });
  it('fisherFUpperP keeps its digits in the far tail: F(1, ν) = t² gives the two-sided t p-value', () => {
    // Identity F(1, ν) = T²(ν) (Johnson, Kotz & Balakrishnan vol. 2, ch. 27); the t tail
    // is computed directly, so it is an independent route. 1 − cdf would keep ~7 digits here.
    for (const [t, df] of [
      [26.9, 8],
      [12, 30],
      [40, 5],
    ]) {
      const viaT = studentTTwoSidedP(t, df);
      expectWithin(
        fisherFUpperP(t * t, 1, df),
        viaT,
        1e-11 * viaT,
        `p for F = ${t}² on (1, ${df})`,
      );
    }
  });
});

describe('remembered quantiles', () => {
  // R (Debian r-base-core), print(…, digits = 16): qt(0.975, 10) = 2.228138851986274,
  // qf(0.95, 3, 10) = 3.708264819046843.
  it('give the same number the first time and every time after, for t and F alike', () => {
    for (let i = 0; i < 3; i++) {
      expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228138851986274, 12);
      expect(fisherFQuantile(0.95, 3, 10)).toBeCloseTo(3.708264819046843, 12);
    }
    // Neighbouring arguments are not confused: each is its own quantile.
    expect(studentTQuantile(0.975, 11)).not.toBe(studentTQuantile(0.975, 10));
    expect(studentTQuantile(0.95, 10)).not.toBe(studentTQuantile(0.975, 10));
    expect(fisherFQuantile(0.95, 10, 3)).not.toBe(fisherFQuantile(0.95, 3, 10));
  });

  it('stay right past the memory bound (it starts again, it does not grow)', () => {
    for (let df = 1; df <= 5000; df++) studentTQuantile(0.9, df);
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228138851986274, 12);
  });
});
