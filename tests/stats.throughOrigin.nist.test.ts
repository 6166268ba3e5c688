// The line through the origin (fitLeastSquares with intercept: false) against
// NIST StRD NoInt1 and NoInt2 (linear least squares, average level of
// difficulty); data and certified values from tests/fixtures/nist/NoInt1.txt and
// NoInt2.txt. Both certify to 15 digits; the brief's bar is 9 and the QR fit
// meets 12 (checked below), so the tolerances are 12 significant digits.
import { describe, expect, it } from 'vitest';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { expectDigits, readNistPairs } from './stats.helpers';

const cases = [
  {
    // NIST StRD NoInt1, certified values.
    file: 'NoInt1.txt',
    n: 11,
    slope: 2.07438016528926,
    slopeSd: 0.165289256198347e-1,
    residualSd: 3.56753034006338,
    r2: 0.999365492298663,
    ssRegression: 200457.727272727,
    ssResidual: 127.272727272727,
    msResidual: 12.7272727272727,
    F: 15750.25,
  },
  {
    // NIST StRD NoInt2, certified values.
    file: 'NoInt2.txt',
    n: 3,
    slope: 0.727272727272727,
    slopeSd: 0.420827318078432e-1,
    residualSd: 0.369274472937998,
    r2: 0.993348115299335,
    ssRegression: 40.7272727272727,
    ssResidual: 0.272727272727273,
    msResidual: 0.136363636363636,
    F: 298.666666666667,
  },
];

describe.each(cases)('fitLeastSquares through the origin on NIST StRD $file', (c) => {
  const { first: y, second: x } = readNistPairs(c.file);
  const fit = fitLeastSquares({ columns: [x], columnNames: ['x'], y, intercept: false });

  it('reads every observation and fits one coefficient', () => {
    expect(fit.n).toBe(c.n);
    expect(fit.parameters).toBe(1);
    expect(fit.dfResidual).toBe(c.n - 1);
  });
  it('matches the certified slope and its standard deviation to 12 digits', () => {
    expectDigits(fit.coefficients[0].estimate, c.slope, 12, 'slope');
    expectDigits(fit.coefficients[0].stdError, c.slopeSd, 12, 'SD of slope');
  });
  it('matches the certified residual SD and uncentered R² to 12 digits', () => {
    expectDigits(fit.sigma, c.residualSd, 12, 'residual SD');
    expect(fit.r2Kind).toBe('uncentered');
    expectDigits(fit.r2, c.r2, 12, 'uncentered R²');
  });
  it('matches the certified ANOVA about zero to 12 digits', () => {
    const [regression, residual, total] = fit.anova;
    expect(regression.df).toBe(1);
    expect(residual.df).toBe(c.n - 1);
    expect(total.df).toBe(c.n); // about zero: n, not n − 1
    expectDigits(regression.ss, c.ssRegression, 12, 'regression SS');
    expectDigits(regression.ms, c.ssRegression, 12, 'regression MS');
    expectDigits(residual.ss, c.ssResidual, 12, 'residual SS');
    expectDigits(residual.ms, c.msResidual, 12, 'residual MS');
    expectDigits(fit.fStatistic, c.F, 12, 'F');
  });
});
