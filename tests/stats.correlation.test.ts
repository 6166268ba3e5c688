// pearsonCorrelation and spearmanCorrelation.
import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { pearsonCorrelation } from '../shared/stats/pearson';
import { spearmanCorrelation } from '../shared/stats/spearman';
import { expectDigits, readNistPairs, rReference } from './stats.helpers';

describe('pearsonCorrelation on NIST StRD Norris', () => {
  it('gives r = √R² with the certified R² (0.999993745883712) to 12 digits', () => {
    // NIST StRD Norris certifies R² of the straight line; for one regressor r² = R².
    const { first: y, second: x } = readNistPairs('Norris.dat');
    const result = pearsonCorrelation(x, y);
    expectDigits(result.r, Math.sqrt(0.999993745883712), 12, 'r');
    expect(result.df).toBe(34);
  });
});

describe('pearsonCorrelation against R 4.2.2 cor.test (tests/fixtures/stats-r)', () => {
  const ref = rReference.correlation;
  it('matches r, t, df and the two-sided p to 12 digits', () => {
    const result = pearsonCorrelation(ref.x, ref.y);
    expectDigits(result.r, ref.pearsonR[0], 12, 'r');
    expectDigits(result.t, ref.pearsonT[0], 12, 't');
    expect(result.df).toBe(ref.pearsonDf[0]);
    expectDigits(result.p, ref.pearsonP[0], 10, 'p');
  });
  it('matches the Fisher-z 95% and 90% intervals to 12 digits', () => {
    const r95 = pearsonCorrelation(ref.x, ref.y).interval;
    const r90 = pearsonCorrelation(ref.x, ref.y, 0.9).interval;
    expectDigits(r95?.low ?? NaN, ref.pearsonCi95[0], 12, '95% low');
    expectDigits(r95?.high ?? NaN, ref.pearsonCi95[1], 12, '95% high');
    expectDigits(r90?.low ?? NaN, ref.pearsonCi90[0], 12, '90% low');
    expectDigits(r90?.high ?? NaN, ref.pearsonCi90[1], 12, '90% high');
  });
  it('agrees with jstat.corrcoeff', () => {
    expectDigits(
      pearsonCorrelation(ref.x, ref.y).r,
      jStat.corrcoeff(ref.x, ref.y),
      12,
      'r vs jstat',
    );
  });
});

describe('pearsonCorrelation edge cases', () => {
  it('reports a perfect line as r = 1, t = ∞, p = 0 with the interval collapsed on 1', () => {
    const result = pearsonCorrelation([0, 40, 80, 120], [5000, 5400, 5800, 6200]);
    expect(result.r).toBe(1);
    expect(result.t).toBe(Infinity);
    expect(result.p).toBe(0);
    expect(result.interval).toEqual({ level: 0.95, low: 1, high: 1 });
  });
  it('gives no Fisher interval for n = 3 (its SE needs n − 3 > 0)', () => {
    const result = pearsonCorrelation([1, 2, 3], [2, 1, 4]);
    expect(result.interval).toBeNull();
    expect(result.df).toBe(1);
  });
});

describe('spearmanCorrelation against R 4.2.2 cor.test(method = "spearman", exact = FALSE)', () => {
  const ref = rReference.correlation;
  it('matches rₛ with tied ranks and the t-approximation p to 12 and 10 digits', () => {
    const result = spearmanCorrelation(ref.x, ref.y);
    expectDigits(result.rho, ref.spearmanRho[0], 12, 'rho');
    expectDigits(result.p, ref.spearmanP[0], 10, 'p');
    expect(result.ties).toBe(true);
  });
  it('agrees with jstat.spearmancoeff', () => {
    expectDigits(
      spearmanCorrelation(ref.x, ref.y).rho,
      jStat.spearmancoeff(ref.x, ref.y),
      12,
      'rho vs jstat',
    );
  });
  it('equals 1 − 6Σd²/(n(n² − 1)) without ties (Spearman 1904; Conover §5.4)', () => {
    // Ranks of x: 1..6; of y: 2, 1, 4, 3, 6, 5, so Σd² = 6 and rₛ = 1 − 36/210.
    const result = spearmanCorrelation([1, 2, 3, 4, 5, 6], [20, 10, 40, 30, 60, 50]);
    expectDigits(result.rho, 1 - 36 / 210, 14, 'rho');
    expect(result.ties).toBe(false);
  });
  it('notices ties whose average rank is a whole number (three tied at ranks 1–3)', () => {
    expect(spearmanCorrelation([1, 1, 1, 2, 3], [1, 2, 3, 4, 5]).ties).toBe(true);
  });
});
