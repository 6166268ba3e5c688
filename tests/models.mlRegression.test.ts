// Plotrate's straight line and quadratic (Householder QR, shared/models) against an
// independent implementation, ml-regression 6.3.0: SimpleLinearRegression (closed-form
// least squares) and PolynomialRegression (least squares on the Vandermonde matrix
// through ml-matrix). The data: NIST StRD Norris (tests/fixtures/nist/Norris.dat), and
// a quadratic response generated with shared/optimize/seededRandom's noise.
import { PolynomialRegression, SimpleLinearRegression } from 'ml-regression';
import { describe, it } from 'vitest';
import { fitLinear, fitQuadratic } from '../shared/models';
import { seededRandom } from '../shared/optimize/seededRandom';
import { expectDigits, readNistPairs } from './stats.helpers';

describe('fitLinear against ml-regression SimpleLinearRegression on NIST StRD Norris', () => {
  const { first: y, second: x } = readNistPairs('Norris.dat');
  const ours = fitLinear({ rateKgHa: x, yieldKgHa: y });
  const theirs = new SimpleLinearRegression(x, y);
  it('agrees on the intercept and the slope to 12 significant digits', () => {
    expectDigits(ours.params.a, theirs.intercept, 12, 'intercept a (ml-regression)');
    expectDigits(ours.params.b, theirs.slope, 12, 'slope b (ml-regression)');
  });
});

describe('fitQuadratic against ml-regression PolynomialRegression (degree 2)', () => {
  // 6 rates × 4 plots, yield 5200 + 38 x − 0.09 x² kg/ha plus uniform noise of ±400 kg/ha.
  const random = seededRandom(20260412);
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  for (const x of [0, 40, 80, 120, 160, 200]) {
    for (let rep = 0; rep < 4; rep++) {
      rateKgHa.push(x);
      yieldKgHa.push(5200 + 38 * x - 0.09 * x * x + 800 * (random.next() - 0.5));
    }
  }
  const ours = fitQuadratic({ rateKgHa, yieldKgHa });
  const [c0, c1, c2] = new PolynomialRegression(rateKgHa, yieldKgHa, 2).coefficients;
  it('agrees on a, b and c to 12 significant digits', () => {
    expectDigits(ours.params.a, c0, 12, 'a (ml-regression)');
    expectDigits(ours.params.b, c1, 12, 'b (ml-regression)');
    expectDigits(ours.params.c, c2, 12, 'c (ml-regression)');
  });
});
