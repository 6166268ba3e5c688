// The lack-of-fit F test every fit reports (finishFit, with pureError as its
// yardstick) against R 4.2.2: anova(model, lm(y ~ factor(x))) in
// tests/fixtures/stats-r/make-stats-reference.R.
import { describe, expect, it } from 'vitest';
import { fitLinear, fitQuadratic } from '../shared/models';
import { expectDigits, rReference } from './stats.helpers';

describe('the fits’ lack-of-fit test against R 4.2.2 anova(model, lm(y ~ factor(x)))', () => {
  const ref = rReference.lackOfFit;
  const data = { rateKgHa: ref.x as number[], yieldKgHa: ref.y as number[] };
  it.each([
    ['line', fitLinear],
    ['quadratic', fitQuadratic],
  ] as const)('matches pure error, lack of fit, F and p for the %s', (name, fit) => {
    const r = ref[name];
    const lof = fit(data).lackOfFit;
    if (!lof) throw new Error('expected a lack-of-fit test');
    expect(lof.dfPureError).toBe(r.dfPureError[0]);
    expect(lof.dfLackOfFit).toBe(r.dfLackOfFit[0]);
    expectDigits(lof.ssPureError, r.ssPureError[0], 12, 'SS pure error');
    expectDigits(lof.ssLackOfFit, r.ssLackOfFit[0], 10, 'SS lack of fit');
    expectDigits(lof.f, r.F[0], 10, 'F');
    expectDigits(lof.p, r.p[0], 9, 'p');
  });
});

describe('the fits give no lack-of-fit test when the layout cannot carry one', () => {
  it('with no replicated rate (no pure error)', () => {
    const fit = fitLinear({ rateKgHa: [0, 50, 100, 150], yieldKgHa: [1, 2, 2.5, 2.6] });
    expect(fit.lackOfFit).toBeNull();
  });
  it('when the model has a parameter per distinct rate (no lack-of-fit df)', () => {
    const fit = fitLinear({ rateKgHa: [0, 0, 100, 100], yieldKgHa: [1, 1.2, 2, 2.3] });
    expect(fit.lackOfFit).toBeNull();
  });
  it('treats −0 and 0 as the same rate', () => {
    const fit = fitLinear({ rateKgHa: [-0, 0, 50, 100], yieldKgHa: [1, 1.1, 2, 2.5] });
    expect(fit.lackOfFit?.dfPureError).toBe(1);
    expect(fit.lackOfFit?.dfLackOfFit).toBe(1);
  });
});
