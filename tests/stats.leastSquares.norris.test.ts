// Checks the QR least-squares fit against NIST StRD "Norris" (linear least squares,
// lower difficulty), certified values from tests/fixtures/nist/Norris.dat.
import { describe, expect, it } from 'vitest';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { expectDigits, readNistPairs } from './stats.helpers';

describe('fitLeastSquares on NIST StRD Norris', () => {
  const { first: y, second: x } = readNistPairs('Norris.dat');
  const fit = fitLeastSquares({ columns: [x], y, intercept: true, columnNames: ['x'] });

  it('reads all 36 observations', () => expect(fit.n).toBe(36));
  it('matches the certified coefficients and their SDs to 9 significant digits', () => {
    expectDigits(
      fit.coefficients[0].estimate,
      -0.262323073774029,
      9,
      'fit.coefficients[0].estimate',
    );
    expectDigits(fit.coefficients[1].estimate, 1.00211681802045, 9, 'fit.coefficients[1].estimate');
    expectDigits(
      fit.coefficients[0].stdError,
      0.232818234301152,
      9,
      'fit.coefficients[0].stdError',
    );
    expectDigits(
      fit.coefficients[1].stdError,
      0.429796848199937e-3,
      9,
      'fit.coefficients[1].stdError',
    );
  });
  it('matches the certified residual SD, R² and ANOVA to 9 significant digits', () => {
    expectDigits(fit.sigma, 0.884796396144373, 9, 'fit.sigma');
    expectDigits(fit.r2, 0.999993745883712, 9, 'fit.r2');
    expectDigits(fit.anova[0].ss, 4255954.13232369, 9, 'fit.anova[0].ss');
    expectDigits(fit.anova[1].ss, 26.6173985294224, 9, 'fit.anova[1].ss');
    expectDigits(fit.fStatistic, 5436385.54079785, 9, 'fit.fStatistic');
    expect(fit.r2Kind).toBe('centered');
  });

  it('without inference keeps every estimate and residual and leaves the p-values and intervals NaN', () => {
    const bare = fitLeastSquares({ columns: [x], y, intercept: true, inference: false });
    // The same certified digits, and the same numbers to the last bit as the full fit.
    expectDigits(bare.coefficients[1].estimate, 1.00211681802045, 9, 'bare slope');
    expectDigits(bare.fStatistic, 5436385.54079785, 9, 'bare F');
    expect(bare.coefficients.map((c) => [c.estimate, c.stdError, c.t])).toEqual(
      fit.coefficients.map((c) => [c.estimate, c.stdError, c.t]),
    );
    expect(Array.from(bare.studentizedResiduals)).toEqual(Array.from(fit.studentizedResiduals));
    expect(bare.coefficients.every((c) => Number.isNaN(c.p) && Number.isNaN(c.ciLow))).toBe(true);
    expect(bare.fP).toBeNaN();
    expect(fit.coefficients.every((c) => Number.isFinite(c.p))).toBe(true);
  });

  it('gives the same numbers again after fits of other sizes (its working buffer is reused)', () => {
    const before = Array.from(fit.studentizedResiduals);
    // Invented small and large designs fitted in between.
    fitLeastSquares({ columns: [[1, 2, 3, 4, 5]], y: [2, 4.1, 5.9, 8.2, 9.9], intercept: true });
    const wide = Array.from({ length: 300 }, (_, i) => i % 17);
    fitLeastSquares({
      columns: [wide, wide.map((v) => v * v)],
      y: wide.map((v) => 3 + v),
      intercept: true,
    });
    const again = fitLeastSquares({ columns: [x], y, intercept: true, columnNames: ['x'] });
    expect(Array.from(fit.studentizedResiduals)).toEqual(before);
    expect(Array.from(again.studentizedResiduals)).toEqual(before);
    expect(again.coefficients).toEqual(fit.coefficients);
    expect(again.sse).toBe(fit.sse);
  });
});
