/**
 * The exponential rise y = a + b(1 − e^(−k x)) (a: yield at rate 0, kg/ha; b: the largest
 * possible gain, kg/ha; k: ha/kg): its curve facts. Its fits are in shared/models/exponential.
 */
import type { ModelCurve } from '../modelCurve';

/** The exponential curve, parameters [a, b, k]. */
export const exponentialCurve = {
  spec: {
    model: 'exponential',
    label: 'Exponential rise',
    formula: 'a + b·(1 − e^(−k·x))',
    paramNames: ['a', 'b', 'k'],
    // b is the largest possible gain, a yield (not a slope as in the straight line).
    dimensions: { a: 'yield', b: 'yield', k: 'perRate' },
    value: (x, p) => p[0] + p[1] * -Math.expm1(-p[2] * x),
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = p[0] + p[1] * -Math.expm1(-p[2] * xs[i]);
    },
    gradient: (x, p, out) => {
      const e = Math.exp(-p[2] * x);
      out[0] = 1;
      out[1] = -Math.expm1(-p[2] * x);
      out[2] = p[1] * x * e;
    },
    r2Kind: 'centered',
  },
  // a absent means the form through the origin (a = 0).
  curveValue: (p, x) => (p.a ?? 0) + p.b * -Math.expm1(-p.k * x),
  // dy/dx = b k e^(−kx) = PR at x* = ln(b k / PR)/k when b k > PR; the asymptote is never reached.
  optimum: (p, pr) => {
    const bk = p.b * p.k;
    return { rateKgHa: bk > pr ? Math.log(bk / pr) / p.k : 0, agronomicMaxKgHa: null };
  },
  isCurve: true,
  linearInParameters: false,
  limit: 'linear',
  dash: '4 3 1 3',
} satisfies ModelCurve<'exponential', 'linear'>;
