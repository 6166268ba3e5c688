/**
 * The step y = a + d·[x > 0]: the check plots yield a (kg/ha), every fertilized rate the same
 * a + d. It is the check set against the rest, the model of a response that was complete by the
 * lowest non-zero rate: where below that rate the response ended, the data cannot say, so the
 * optimum is a range (0, second-lowest tested rate] (shared/economics/economicOptimum), never one
 * number. With two coefficients it is what the plateau models reduce to when their join falls in
 * the first interval, without their third parameter, which such data do not identify; so the
 * recommendation's rule (shared/models/chooseModel) can weigh a full response at its real size
 * against a curve that bends just past the lowest rate. Its fits are in shared/models/step.
 */
import type { ModelCurve } from '../modelCurve';

/** The step curve, parameters [a, d]. */
export const stepCurve = {
  spec: {
    model: 'step',
    label: 'Check vs fertilized step',
    formula: 'a + d·[x > 0]',
    paramNames: ['a', 'd'],
    dimensions: { a: 'yield', d: 'yield' },
    value: (x, p) => (x > 0 ? p[0] + p[1] : p[0]),
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = xs[i] > 0 ? p[0] + p[1] : p[0];
    },
    gradient: (x, _p, out) => {
      out[0] = 1;
      out[1] = x > 0 ? 1 : 0;
    },
    r2Kind: 'centered',
  },
  curveValue: (p, x) => (x > 0 ? p.a + p.d : p.a),
  // A step has no rate where its slope equals the price ratio: a fitted step is always a full
  // response or no response, and economicOptimum prices those statuses from the tested rates.
  optimum: () => ({ rateKgHa: 0, agronomicMaxKgHa: null }),
  isCurve: true,
  linearInParameters: true,
  limit: null,
  dash: '1 4',
} satisfies ModelCurve<'step', null>;
