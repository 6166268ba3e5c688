// Descriptive statistics: describeSample, sampleMean/Variance/StandardDeviation,
// sampleQuantile, averageRanks.
import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { describeSample } from '../shared/stats/describeSample';
import { sampleMean, sampleStandardDeviation, sampleVariance } from '../shared/stats/variance';
import { sampleMedian, sampleQuantile } from '../shared/stats/quantile';
import { averageRanks } from '../shared/stats/ranks';
import { expectDigits, rReference } from './stats.helpers';

describe('describeSample against R 4.2.2 (tests/fixtures/stats-r, mean/var/sd/quantile type 7)', () => {
  const ref = rReference.descriptive;
  const summary = describeSample(ref.values);
  it('matches mean, variance, SD, SE and CV% to 14 digits', () => {
    expectDigits(summary.mean, ref.mean[0], 14, 'mean');
    expectDigits(summary.variance, ref.variance[0], 14, 'variance');
    expectDigits(summary.sd, ref.sd[0], 14, 'SD');
    expectDigits(summary.se, ref.se[0], 14, 'SE');
    expectDigits(summary.cvPercent ?? NaN, ref.cvPercent[0], 14, 'CV%');
  });
  it('matches the quantiles, min, median and max (Hyndman & Fan type 7)', () => {
    ref.probs.forEach((p: number, i: number) =>
      expectDigits(sampleQuantile(ref.values, p), ref.quantiles[i], 14, `quantile ${p}`),
    );
    expect(summary.min).toBe(ref.quantiles[0]);
    expect(summary.max).toBe(ref.quantiles[6]);
    expectDigits(summary.q1, ref.quantiles[2], 14, 'q1');
    expectDigits(summary.median, ref.quantiles[3], 14, 'median');
    expectDigits(summary.q3, ref.quantiles[4], 14, 'q3');
  });
  it('agrees with jstat (independent library) on mean, sample variance and median', () => {
    expectDigits(summary.mean, jStat.mean(ref.values), 13, 'mean vs jstat');
    expectDigits(summary.variance, jStat.variance(ref.values, true), 12, 'variance vs jstat');
    expectDigits(summary.median, jStat.median(ref.values), 14, 'median vs jstat');
  });
});

// NIST StRD univariate summary statistics, NumAcc1, NumAcc3 and NumAcc4 (lower,
// average and higher difficulty). Not among the reference files here: the data
// layout and certified values are from memory. They are also fixed by exact
// arithmetic, which is what makes them safe to use: NumAcc1 is 10000001,
// 10000003, 10000002 (mean 10000002, SD 1); NumAcc3/NumAcc4 are a center value
// then 500 pairs at center ∓ 0.1 (1001 values, mean = center, SD = 0.1 exactly:
// 1000 · 0.01 / 1000), with centers 1000000.2 and 10000000.2.
describe('sampleMean and sampleStandardDeviation on NIST StRD NumAcc data (from memory)', () => {
  const numAcc = (center: number, step: string): number[] => {
    const low = Number((center - Number(step)).toFixed(1));
    const high = Number((center + Number(step)).toFixed(1));
    return [center, ...Array.from({ length: 1000 }, (_, i) => (i % 2 === 0 ? low : high))];
  };
  it('NumAcc1 (lower difficulty): mean 10000002 and SD 1 to 15 digits', () => {
    const v = [10000001, 10000003, 10000002];
    expectDigits(sampleMean(v), 10000002, 15, 'mean');
    expectDigits(sampleStandardDeviation(v), 1, 15, 'SD');
  });
  it('NumAcc3 (average difficulty, center 1000000.2): mean to 15 digits, SD to 9', () => {
    // The stored doubles are off by up to 5.8e−11 against deviations of 0.1, so
    // about 9 digits of the SD are all the data hold.
    const v = numAcc(1000000.2, '0.1');
    expectDigits(sampleMean(v), 1000000.2, 15, 'mean');
    expectDigits(sampleStandardDeviation(v), 0.1, 9, 'SD');
  });
  it('NumAcc4 (higher difficulty, center 10000000.2): mean to 15 digits, SD to 8', () => {
    // One more leading digit, one fewer attainable digit in the SD.
    const v = numAcc(10000000.2, '0.1');
    expectDigits(sampleMean(v), 10000000.2, 15, 'mean');
    expectDigits(sampleStandardDeviation(v), 0.1, 8, 'SD');
  });
  it('the one-pass textbook formula would fail NumAcc4, which is why the two-pass form is used', () => {
    // A guard that the test data really are hard: Σx² − (Σx)²/n loses the SD.
    const v = numAcc(10000000.2, '0.1');
    const n = v.length;
    const s = v.reduce((a, b) => a + b, 0);
    const s2 = v.reduce((a, b) => a + b * b, 0);
    const onePass = Math.sqrt(Math.max((s2 - (s * s) / n) / (n - 1), 0));
    expect(Math.abs(onePass - 0.1) / 0.1).toBeGreaterThan(1e-4);
  });
});

describe('small cases worked by hand', () => {
  it('sampleVariance of 6100, 6400, 6250 is 22500 (deviations −150, 150, 0)', () => {
    expect(sampleVariance([6100, 6400, 6250])).toBeCloseTo(22500, 9);
  });
  it('sampleMedian averages the middle pair for even n', () => {
    expect(sampleMedian([7, 1, 4, 10])).toBe(5.5);
  });
  it('describeSample leaves CV% null when the mean is zero', () => {
    expect(describeSample([-1, 1]).cvPercent).toBeNull();
  });
  it('averageRanks gives tied values the mean of their ranks', () => {
    expect(Array.from(averageRanks([30, 10, 20, 10]))).toEqual([4, 1.5, 3, 1.5]);
    expect(Array.from(averageRanks([5, 5, 5]))).toEqual([2, 2, 2]);
  });
});
