// Property tests (fast-check): invariances that hold in exact arithmetic, with
// tolerances for rounding. Relative tolerances are 1e−9 on well-conditioned
// generated data (values of up to 3 digits, n ≤ 30), far looser than double
// rounding (~1e−15 per operation) yet far tighter than any real error.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { testIntercept } from '../shared/stats/interceptTest';
import { pearsonCorrelation } from '../shared/stats/pearson';
import { spearmanCorrelation } from '../shared/stats/spearman';
import { oneWayAnova } from '../shared/stats/oneWayAnova';
import { randomizedBlockAnova } from '../shared/stats/randomizedBlockAnova';

/** |a − b| ≤ rel · max(|a|, |b|) + abs. */
function near(a: number, b: number, rel = 1e-9, abs = 1e-12): boolean {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)) + abs;
}

/** Paired data with at least two different x values: rates 0–300, yields with noise. */
const pairs = fc
  .array(fc.tuple(fc.integer({ min: 0, max: 30 }), fc.integer({ min: -400, max: 400 })), {
    minLength: 4,
    maxLength: 30,
  })
  .map((rows) => ({
    x: rows.map(([r]) => r * 10),
    // A response that rises with rate plus generated noise.
    y: rows.map(([r, e]) => 4000 + 25 * r + e),
  }))
  .filter(({ x }) => x.some((v) => v !== x[0]));

/** A permutation of 0…n−1 from a list of random keys. */
const withPermutation = pairs.chain((d) =>
  fc
    .array(fc.double({ min: 0, max: 1, noNaN: true }), {
      minLength: d.x.length,
      maxLength: d.x.length,
    })
    .map((keys) => ({
      ...d,
      order: keys
        .map((k, i) => [k, i])
        .sort((a, b) => a[0] - b[0])
        .map(([, i]) => i),
    })),
);

const permute = <T>(values: readonly T[], order: number[]): T[] => order.map((i) => values[i]);

describe('results do not depend on row order', () => {
  it('testIntercept, pearsonCorrelation and spearmanCorrelation', () => {
    fc.assert(
      fc.property(withPermutation, ({ x, y, order }) => {
        const px = permute(x, order);
        const py = permute(y, order);
        const a = testIntercept(x, y);
        const b = testIntercept(px, py);
        expect(near(a.t, b.t)).toBe(true);
        expect(near(a.F, b.F, 1e-8, 1e-10)).toBe(true);
        expect(near(a.p, b.p, 1e-8, 1e-14)).toBe(true);
        expect(a.interceptNeeded).toBe(b.interceptNeeded);
        const yVaries = y.some((v) => v !== y[0]);
        if (yVaries) {
          expect(near(pearsonCorrelation(x, y).r, pearsonCorrelation(px, py).r)).toBe(true);
          expect(near(spearmanCorrelation(x, y).rho, spearmanCorrelation(px, py).rho)).toBe(true);
        }
      }),
    );
  });
  it('oneWayAnova (rates as treatments) gives the same table', () => {
    fc.assert(
      fc.property(withPermutation, ({ x, y, order }) => {
        const levels = new Set(x).size;
        fc.pre(levels < x.length); // needs within-treatment df
        const a = oneWayAnova({ treatment: x, y });
        const b = oneWayAnova({ treatment: permute(x, order), y: permute(y, order) });
        expect(near(a.between.ss, b.between.ss, 1e-9, 1e-6)).toBe(true);
        expect(near(a.within.ss, b.within.ss, 1e-9, 1e-6)).toBe(true);
      }),
    );
  });
  it('randomizedBlockAnova gives the same table, complete or with a plot missing', () => {
    const trial = fc.record({
      t: fc.integer({ min: 2, max: 5 }),
      b: fc.integer({ min: 3, max: 5 }),
      seed: fc.array(fc.integer({ min: -300, max: 300 }), { minLength: 25, maxLength: 25 }),
      missing: fc.boolean(),
      shift: fc.integer({ min: 0, max: 24 }),
    });
    fc.assert(
      fc.property(trial, ({ t, b, seed, missing, shift }) => {
        const rows: Array<[string, string, number]> = [];
        for (let i = 0; i < t; i++)
          for (let j = 0; j < b; j++)
            rows.push([`T${i}`, `B${j}`, 5000 + 400 * i + 90 * j + seed[i * 5 + j]]);
        if (missing) rows.splice(rows.length - 1, 1);
        const rotated = [
          ...rows.slice(shift % rows.length),
          ...rows.slice(0, shift % rows.length),
        ].reverse();
        const run = (r: typeof rows) =>
          randomizedBlockAnova({
            treatment: r.map((v) => v[0]),
            block: r.map((v) => v[1]),
            y: r.map((v) => v[2]),
          });
        const a = run(rows);
        const c = run(rotated);
        expect(near(a.treatments.ss, c.treatments.ss, 1e-9, 1e-6)).toBe(true);
        expect(near(a.error.ss, c.error.ss, 1e-9, 1e-6)).toBe(true);
        const mean = (res: typeof a, level: string) =>
          res.treatmentMeans.find((m) => m.level === level)?.mean ?? NaN;
        expect(near(mean(a, 'T1'), mean(c, 'T1'))).toBe(true);
      }),
    );
  });
});

describe('scaling x or y scales the coefficients as it must', () => {
  const factor = fc.constantFrom(0.001, 0.5, 3, 1000, -2.5);
  it('straight line: x·c divides the slope by c; y·c multiplies both coefficients; t is unchanged', () => {
    fc.assert(
      fc.property(pairs, factor, ({ x, y }, c) => {
        const base = fitLeastSquares({ columns: [x], y, intercept: true });
        const sx = fitLeastSquares({ columns: [x.map((v) => v * c)], y, intercept: true });
        const sy = fitLeastSquares({ columns: [x], y: y.map((v) => v * c), intercept: true });
        const [a0, b0] = base.coefficients;
        expect(near(sx.coefficients[0].estimate, a0.estimate, 1e-9, 1e-9)).toBe(true);
        expect(near(sx.coefficients[1].estimate, b0.estimate / c, 1e-9, 1e-12)).toBe(true);
        expect(near(sy.coefficients[0].estimate, a0.estimate * c, 1e-9, 1e-9)).toBe(true);
        expect(near(sy.coefficients[1].estimate, b0.estimate * c, 1e-9, 1e-12)).toBe(true);
        expect(near(Math.abs(sx.coefficients[1].t), Math.abs(b0.t), 1e-8, 1e-9)).toBe(true);
        expect(near(sy.r2, base.r2, 1e-9, 1e-12)).toBe(true);
      }),
    );
  });
  it('line through the origin: x·c divides the slope by c; y·c multiplies it by c', () => {
    fc.assert(
      fc.property(pairs, factor, ({ x, y }, c) => {
        fc.pre(x.some((v) => v !== 0));
        const base = fitLeastSquares({ columns: [x], y, intercept: false }).coefficients[0]
          .estimate;
        const sx = fitLeastSquares({ columns: [x.map((v) => v * c)], y, intercept: false });
        const sy = fitLeastSquares({ columns: [x], y: y.map((v) => v * c), intercept: false });
        expect(near(sx.coefficients[0].estimate, base / c)).toBe(true);
        expect(near(sy.coefficients[0].estimate, base * c)).toBe(true);
      }),
    );
  });
});

describe('the intercept test: F = t² with the same p', () => {
  it('holds on generated data', () => {
    fc.assert(
      fc.property(pairs, ({ x, y }) => {
        const r = testIntercept(x, y);
        // F comes from a difference of SSEs, so its absolute error scales with SSE, not with F.
        expect(near(r.F, r.t * r.t, 1e-7, 1e-7)).toBe(true);
        expect(near(r.p, r.intercept.p, 1e-6, 1e-9)).toBe(true);
        expect(r.df2).toBe(x.length - 2);
      }),
    );
  });
});

describe('Pearson r', () => {
  it('stays in [−1, 1] and equals sign(slope) · √R² of the straight line', () => {
    fc.assert(
      fc.property(pairs, ({ x, y }) => {
        fc.pre(y.some((v) => v !== y[0]));
        const { r } = pearsonCorrelation(x, y);
        expect(r).toBeGreaterThanOrEqual(-1);
        expect(r).toBeLessThanOrEqual(1);
        const fit = fitLeastSquares({ columns: [x], y, intercept: true });
        const expected = Math.sign(fit.coefficients[1].estimate) * Math.sqrt(fit.r2);
        expect(near(r, expected, 1e-9, 1e-9)).toBe(true);
      }),
    );
  });
  it('stays in [−1, 1] and reaches ±1 on collinear data from 1e−150 to 1e6 (no underflow)', () => {
    const collinear = fc.record({
      digits: fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 3, maxLength: 20 }),
      exponent: fc.integer({ min: -150, max: 6 }),
      slope: fc.constantFrom(-250, -1, 0.001, 0.5, 7),
    });
    fc.assert(
      fc.property(collinear, ({ digits, exponent, slope }) => {
        fc.pre(digits.some((d) => d !== digits[0]));
        const x = digits.map((d) => d * 10 ** exponent);
        const y = x.map((v) => slope * v);
        const { r } = pearsonCorrelation(x, y);
        expect(Math.abs(r)).toBeLessThanOrEqual(1);
        expect(Math.abs(r)).toBeGreaterThan(1 - 1e-12);
        expect(Math.sign(r)).toBe(Math.sign(slope));
      }),
    );
  });
});
