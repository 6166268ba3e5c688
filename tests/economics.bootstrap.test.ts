// Checks the seeded bootstrap of the economic optimum and the pieces it rests on:
// the generator's uniformity (chi-square test, quantile from stdlib via
// shared/stats/distributions), stratified resampling that keeps every plot in
// its rate, reproducibility by seed, a degenerate case with a known answer
// (no within-rate spread: every resample equals the data), and a check-vs-rest
// site where most resamples have no single optimum.
import { describe, expect, it } from 'vitest';
import { bootstrapOptimum, economicOptimum } from '../shared/economics';
import { fitLinearPlateau } from '../shared/models';
import { resampleWithinGroups, strataOf } from '../shared/optimize/resampleWithinGroups';
import { seededRandom } from '../shared/optimize/seededRandom';
import { chiSquareQuantile } from '../shared/stats/distributions';
import { StatsInputError } from '../shared/stats/errors';

const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 };
const RATES = [0, 40, 80, 120, 160, 200];

function site(curve: (x: number) => number, noise: number, blocks = 4) {
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  const r = seededRandom(99);
  for (let b = 0; b < blocks; b++) {
    for (const x of RATES) {
      rateKgHa.push(x);
      yieldKgHa.push(curve(x) + 100 * b + noise * (r.next() + r.next() + r.next() - 1.5));
      block.push(`B${b}`);
    }
  }
  return { rateKgHa, yieldKgHa, block };
}

describe('seededRandom', () => {
  it('repeats its stream for a seed and differs between seeds', () => {
    const a = seededRandom(5);
    const b = seededRandom(5);
    const c = seededRandom(6);
    const xs = [a.next(), a.next(), a.next()];
    expect([b.next(), b.next(), b.next()]).toEqual(xs);
    expect(c.next()).not.toBe(xs[0]);
    expect(xs.every((v) => v >= 0 && v < 1)).toBe(true);
  });
  it('nextInt(6) passes a chi-square test of uniformity at the 0.1 % level (60,000 draws)', () => {
    const r = seededRandom(2026);
    const counts = new Array<number>(6).fill(0);
    for (let i = 0; i < 60000; i++) counts[r.nextInt(6)]++;
    const chi2 = counts.reduce((s, c) => s + (c - 10000) ** 2 / 10000, 0);
    expect(chi2).toBeLessThan(chiSquareQuantile(0.999, 5));
  });
});

describe('resampleWithinGroups', () => {
  it('draws every position from its own group only', () => {
    const groupOf = new Int32Array([0, 1, 2, 0, 1, 2, 0, 1, 2, 2]);
    const strata = strataOf(groupOf, 3);
    const out = new Int32Array(groupOf.length);
    const r = seededRandom(1);
    for (let rep = 0; rep < 200; rep++) {
      resampleWithinGroups(strata, r, out);
      for (let k = 0; k < out.length; k++) {
        expect(groupOf[out[k]]).toBe(groupOf[strata.members[k]]);
      }
    }
  });
});

describe('bootstrapOptimum', () => {
  const data = site((x) => 6000 + 28 * Math.min(x, 115), 900);

  it('is reproducible for a seed and changes with the seed', () => {
    const a = bootstrapOptimum(data, 'linearPlateau', prices, { seed: 11, resamples: 300 });
    const b = bootstrapOptimum(data, 'linearPlateau', prices, { seed: 11, resamples: 300 });
    const c = bootstrapOptimum(data, 'linearPlateau', prices, { seed: 12, resamples: 300 });
    expect(Array.from(b.rateSamplesKgHa)).toEqual(Array.from(a.rateSamplesKgHa));
    expect(Array.from(c.rateSamplesKgHa)).not.toEqual(Array.from(a.rateSamplesKgHa));
  });

  it('uses 1,000 resamples by default; the interval holds the point estimate of the full fit', () => {
    const b = bootstrapOptimum(data, 'linearPlateau', prices);
    expect(b.resamples).toBe(1000);
    const full = economicOptimum(fitLinearPlateau(data), prices);
    expect(b.pointEstimate.rateKgHa).toBeCloseTo(full.rateKgHa!, 6);
    expect(b.ciKgHa![0]).toBeLessThan(full.rateKgHa!);
    expect(b.ciKgHa![1]).toBeGreaterThan(full.rateKgHa!);
    expect(b.probabilityWithin.every((p) => p >= 0 && p <= 1)).toBe(true);
    // Far from the optimum (no nitrogen) is rarely within 10 per ha of the best.
    expect(b.probabilityWithin[0]).toBeLessThan(0.05);
    const total = Object.values(b.shareByStatus).reduce((s, v) => s + v, 0);
    expect(total).toBeCloseTo(1, 12);
    expect(b.cautions.length).toBeGreaterThan(0);
  });

  it('gives a zero-width interval when plots of a rate do not differ (every resample is the data)', () => {
    const exact = site((x) => 6000 + 28 * Math.min(x, 115), 0, 1);
    const doubled = {
      rateKgHa: [...exact.rateKgHa, ...exact.rateKgHa],
      yieldKgHa: [...exact.yieldKgHa, ...exact.yieldKgHa],
    };
    const b = bootstrapOptimum(doubled, 'quadraticPlateau', prices, { resamples: 200 });
    expect(b.ciKgHa![1] - b.ciKgHa![0]).toBeLessThan(1e-6);
    // Resamples are searched to a relative tolerance of 1e-7 on x0 (point estimate 1e-10).
    expect(b.ciKgHa![0]).toBeCloseTo(b.pointEstimate.rateKgHa!, 4);
  });

  it('finds that most resamples have no interior optimum on a check-vs-rest site', () => {
    const step = site((x) => (x === 0 ? 6000 : 9000), 250);
    const b = bootstrapOptimum(step, 'linearPlateau', prices, { resamples: 400, seed: 3 });
    expect(b.shareNoInteriorOptimum).toBeGreaterThan(0.3);
    expect(b.shareByStatus['join-in-first-interval']).toBeGreaterThan(0.3);
  });

  it('with fixed blocks resamples block-adjusted yields within rates', () => {
    const b = bootstrapOptimum(data, 'quadratic', prices, { blocks: 'fixed', resamples: 200 });
    expect(b.resampling).toBe('within-rates-block-adjusted');
    // Block offsets do not move the quadratic's optimum in a balanced design.
    const plain = bootstrapOptimum(data, 'quadratic', prices, { resamples: 200 });
    expect(b.pointEstimate.rateKgHa).toBeCloseTo(plain.pointEstimate.rateKgHa!, 9);
  });

  it('names a bad option', () => {
    expect(() => bootstrapOptimum(data, 'linear', prices, { resamples: 0 })).toThrow(
      StatsInputError,
    );
    expect(() => bootstrapOptimum(data, 'linear', prices, { confidence: 1 })).toThrow(/confidence/);
  });
});
