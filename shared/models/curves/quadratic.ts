/**
 * The quadratic y = a + b x + c x² (c in kg grain per (kg nutrient)² per ha): its curve
 * facts. Its fits are in shared/models/quadratic.
 */
import type { ModelCurve } from '../modelCurve';

/** The quadratic's curve. */
export const quadraticCurve = {
  spec: {
    model: 'quadratic',
    label: 'Quadratic',
    formula: 'a + b·x + c·x²',
    paramNames: ['a', 'b', 'c'],
    dimensions: { a: 'yield', b: 'yieldPerRate', c: 'yieldPerRate2' },
    value: (x, p) => p[0] + x * (p[1] + p[2] * x),
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = p[0] + xs[i] * (p[1] + p[2] * xs[i]);
    },
    gradient: (x, _p, out) => {
      out[0] = 1;
      out[1] = x;
      out[2] = x * x;
    },
    r2Kind: 'centered',
  },
  curveValue: (p, x) => p.a + x * (p.b + p.c * x),
  // dy/dx = b + 2cx = PR at x* = (PR − b)/(2c); the vertex −b/(2c) is the highest yield.
  optimum: (p, pr) => ({
    rateKgHa: (pr - p.b) / (2 * p.c),
    agronomicMaxKgHa: -p.b / (2 * p.c),
  }),
  isCurve: true,
  linearInParameters: true,
  limit: null,
  dash: '3 3',
} satisfies ModelCurve<'quadratic', null>;
