/**
 * The quadratic-plateau y = P + c·min(x − x0, 0)², c < 0: a parabola rising to its vertex at
 * the join point x0 (kg/ha), flat at the plateau P (kg/ha) beyond; its curve facts. Its fits
 * are in shared/models/quadraticPlateau.
 */
import type { ModelCurve } from '../modelCurve';

/** The quadratic-plateau curve, parameters [P, c, x0]. */
export const quadraticPlateauCurve = {
  spec: {
    model: 'quadraticPlateau',
    label: 'Quadratic-plateau',
    formula: 'P + c·min(x − x0, 0)²',
    paramNames: ['P', 'c', 'x0'],
    dimensions: { P: 'yield', c: 'yieldPerRate2', x0: 'rate' },
    value: (x, p) => {
      const d = x < p[2] ? x - p[2] : 0;
      return p[0] + p[1] * d * d;
    },
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) {
        const d = xs[i] < p[2] ? xs[i] - p[2] : 0;
        out[i] = p[0] + p[1] * d * d;
      }
    },
    gradient: (x, p, out) => {
      const d = x < p[2] ? x - p[2] : 0;
      out[0] = 1;
      out[1] = d * d;
      out[2] = -2 * p[1] * d;
    },
    r2Kind: 'centered',
  },
  curveValue: (p, x) => {
    const d = Math.min(x - p.x0, 0);
    return p.P + p.c * d * d;
  },
  // dy/dx = 2c(x − x0) = PR at x* = x0 + PR/(2c), not below 0; the join is the highest yield.
  optimum: (p, pr) => ({ rateKgHa: Math.max(p.x0 + pr / (2 * p.c), 0), agronomicMaxKgHa: p.x0 }),
  isCurve: true,
  linearInParameters: false,
  limit: 'quadratic',
  dash: '15 15',
} satisfies ModelCurve<'quadraticPlateau', 'quadratic'>;
