// lackOfFitTest: pure error from replicated rates.
import { describe, expect, it } from 'vitest';
import { lackOfFitTest } from '../shared/stats/lackOfFit';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { expectDigits, rReference } from './stats.helpers';

describe('lackOfFitTest against R 4.2.2 anova(model, lm(y ~ factor(x))) (tests/fixtures/stats-r)', () => {
  const ref = rReference.lackOfFit;
  it.each(['line', 'quadratic'])('matches pure error, lack of fit, F and p for the %s', (name) => {
    const r = ref[name];
    const result = lackOfFitTest({
      x: ref.x,
      y: ref.y,
      sse: r.sse[0],
      parameters: r.parameters[0],
    });
    if (!result.available) throw new Error(`expected a test, got "${result.reason}"`);
    expect(result.distinctX).toBe(6);
    expect(result.dfPureError).toBe(r.dfPureError[0]);
    expect(result.dfLackOfFit).toBe(r.dfLackOfFit[0]);
    expectDigits(result.ssPureError, r.ssPureError[0], 12, 'SS pure error');
    expectDigits(result.ssLackOfFit, r.ssLackOfFit[0], 10, 'SS lack of fit');
    expectDigits(result.F, r.F[0], 10, 'F');
    expectDigits(result.p, r.p[0], 9, 'p');
  });
  it('takes its SSE from our own fit just as well (straight line)', () => {
    const fit = fitLeastSquares({ columns: [ref.x], y: ref.y, intercept: true });
    const result = lackOfFitTest({ x: ref.x, y: ref.y, sse: fit.sse, parameters: fit.parameters });
    expect(result.available && result.F).toBeCloseTo(ref.line.F[0], 8);
  });
});

describe('lackOfFitTest says when it is not available', () => {
  it('with no replicated x', () => {
    const result = lackOfFitTest({
      x: [0, 50, 100, 150],
      y: [1, 2, 2.5, 2.6],
      sse: 0.1,
      parameters: 2,
    });
    expect(result).toMatchObject({ available: false, reason: 'no-replicates', dfPureError: 0 });
    if (!result.available) {
      expect(result.message).toBe(
        'No x value is repeated (4 points, 4 distinct x), so there is no pure error to test lack of fit against.',
      );
    }
  });
  it('when the model has a parameter per distinct x', () => {
    const result = lackOfFitTest({
      x: [0, 0, 100, 100],
      y: [1, 1.2, 2, 2.3],
      sse: 0.065,
      parameters: 2,
    });
    expect(result).toMatchObject({ available: false, reason: 'no-lack-of-fit-df', dfLackOfFit: 0 });
  });
  it('when every replicate agrees exactly', () => {
    const result = lackOfFitTest({
      x: [0, 0, 50, 50, 100, 100],
      y: [1, 1, 2, 2, 2.5, 2.5],
      sse: 0.1,
      parameters: 2,
    });
    expect(result).toMatchObject({ available: false, reason: 'zero-pure-error' });
  });
  it('treats −0 and 0 as the same rate', () => {
    const result = lackOfFitTest({
      x: [-0, 0, 50, 100],
      y: [1, 1.1, 2, 2.5],
      sse: 0.2,
      parameters: 2,
    });
    expect(result.available && result.distinctX).toBe(3);
  });
});

describe('lackOfFitTest rejects an SSE no function of x could have', () => {
  it('throws when SSE is below pure error', () => {
    expect(() =>
      lackOfFitTest({
        x: [0, 0, 50, 50, 100, 100],
        y: [1, 2, 2, 3, 2.5, 3.5],
        sse: 0.5,
        parameters: 2,
      }),
    ).toThrow(
      "lackOfFitTest: sse (0.5) is smaller than the pure-error sum of squares (1.5); the model's fitted values must depend on x alone (no block or other terms).",
    );
  });
});
