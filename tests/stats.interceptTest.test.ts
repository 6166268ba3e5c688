// testIntercept: the straight line against the line through the origin.
import { describe, expect, it } from 'vitest';
import { testIntercept } from '../shared/stats/interceptTest';
import { expectDigits, readNistPairs, rReference } from './stats.helpers';

describe.each([0, 1])(
  'testIntercept against R 4.2.2 lm/anova, case %i (tests/fixtures/stats-r)',
  (k) => {
    const ref = rReference.interceptCases[k];
    const result = testIntercept(ref.x, ref.y);
    it('matches the intercept, its SE, t and p to 11 digits', () => {
      expectDigits(result.intercept.estimate, ref.interceptEstimate[0], 11, 'intercept');
      expectDigits(result.intercept.stdError, ref.interceptSe[0], 11, 'SE');
      expectDigits(result.t, ref.t[0], 11, 't');
      expectDigits(result.intercept.p, ref.tP[0], 10, 'p of t');
    });
    it('matches anova(origin, line): F, its p and the df to 10 digits', () => {
      expectDigits(result.F, ref.F[0], 10, 'F');
      expectDigits(result.p, ref.fP[0], 10, 'p of F');
      expect(result.df1).toBe(1);
      expect(result.df2).toBe(ref.df2[0]);
      expectDigits(result.straightLine.sse, ref.sseLine[0], 12, 'SSE line');
      expectDigits(result.throughOrigin.sse, ref.sseOrigin[0], 12, 'SSE origin');
    });
    it('matches the AICc of both fits and their difference (AIC + 2k(k+1)/(n − k − 1) from logLik)', () => {
      expectDigits(result.straightLine.aicc, ref.aiccLine[0], 12, 'AICc line');
      expectDigits(result.throughOrigin.aicc, ref.aiccOrigin[0], 12, 'AICc origin');
      expectDigits(result.aiccDifference ?? NaN, ref.aiccDifference[0], 11, 'AICc difference');
    });
  },
);

describe('testIntercept verdicts', () => {
  it('keeps a clear intercept and says why', () => {
    const ref = rReference.interceptCases[0];
    const result = testIntercept(ref.x, ref.y);
    expect(result.interceptNeeded).toBe(true);
    expect(result.verdict).toBe('The intercept differs from zero (t = 27, p < 0.001): keep it.');
  });
  it('drops an intercept indistinguishable from zero', () => {
    const ref = rReference.interceptCases[1];
    const result = testIntercept(ref.x, ref.y);
    expect(result.interceptNeeded).toBe(false);
    expect(result.verdict).toBe(
      'No evidence the intercept differs from zero (t = 0.27, p = 0.8): the line through the origin is adequate.',
    );
    expect(result.aiccDifference).toBeLessThan(0); // the simpler model wins on AICc too
  });
  it('follows the chosen alpha: p ≈ 0.030 is kept at 0.05 and dropped at 0.01', () => {
    const x = [1, 2, 3, 4, 5, 6, 7, 8];
    const y = [1.4, 3.6, 3.9, 5.6, 6.3, 6.9, 8.4, 9.2];
    const at05 = testIntercept(x, y, 0.05);
    const at01 = testIntercept(x, y, 0.01);
    expect(at05.p).toBeGreaterThan(0.01);
    expect(at05.p).toBeLessThan(0.05);
    expect(at05.interceptNeeded).toBe(true);
    expect(at01.interceptNeeded).toBe(false);
    expect(at05.verdict).toBe('The intercept differs from zero (t = 2.8, p = 0.03): keep it.');
    expect(at01.verdict).toBe(
      'No evidence the intercept differs from zero (t = 2.8, p = 0.03): the line through the origin is adequate.',
    );
  });
  it('leaves the AICc difference null when n < 5 (the straight line has no AICc)', () => {
    expect(testIntercept([1, 2, 3, 4], [1.1, 2.3, 2.8, 4.2]).aiccDifference).toBeNull();
  });
  it('on NIST StRD NoInt1 the straight line needs its intercept (its data lie on y = x + 70)', () => {
    // NoInt1's y is exactly x + 70, so the proportional model certified by NIST misfits.
    const { first: y, second: x } = readNistPairs('NoInt1.txt');
    const result = testIntercept(x, y);
    expect(result.straightLine.sse).toBeLessThan(1e-20);
    expect(result.interceptNeeded).toBe(true);
  });
});
