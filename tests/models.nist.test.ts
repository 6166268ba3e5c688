// Checks the profiled exponential fit against NIST StRD Misra1a (nonlinear least
// squares, lower difficulty): y = b1 (1 − e^(−b2 x)), the exponential rise with
// the intercept fixed at zero. Certified values from tests/fixtures/nist/Misra1a.txt.
import { describe, expect, it } from 'vitest';
import { fitExponential } from '../shared/models';
import { expectDigits, readNistPairs } from './stats.helpers';

// NIST StRD Misra1a certified values.
const certified = {
  b1: 2.3894212918e2,
  b2: 5.5015643181e-4,
  sdB1: 2.7070075241,
  sdB2: 7.2668688436e-6,
  rss: 1.2455138894e-1,
  residualSd: 1.018787633e-1,
};

describe('fitExponential on NIST StRD Misra1a (intercept fixed at 0)', () => {
  const { first: y, second: x } = readNistPairs('Misra1a.txt');
  const fit = fitExponential({ rateKgHa: x, yieldKgHa: y }, { exponentialIntercept: 'zero' });

  it('reads the 14 observations and fits with 12 residual df', () => {
    expect(fit.n).toBe(14);
    expect(fit.dfResidual).toBe(12);
    expect(fit.status).toBe('ok');
  });
  it('needs no starting values and reaches the certified parameters to 8 significant digits', () => {
    expectDigits(fit.params.b, certified.b1, 8, 'fit.params.b');
    expectDigits(fit.params.k, certified.b2, 8, 'fit.params.k');
    expect(fit.params.a).toBe(0);
  });
  it('matches the certified standard deviations to 8 digits and the residual SS to 9', () => {
    expectDigits(fit.stdErrors.b, certified.sdB1, 8, 'fit.stdErrors.b');
    expectDigits(fit.stdErrors.k, certified.sdB2, 8, 'fit.stdErrors.k');
    expectDigits(fit.sse, certified.rss, 9, 'fit.sse');
    expectDigits(fit.rmse, certified.residualSd, 9, 'fit.rmse');
  });
});
