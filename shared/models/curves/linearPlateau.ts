/**
 * The linear-plateau y = a + b·min(x, x0): a straight rise of slope b (kg grain per kg
 * nutrient) up to the join point x0 (kg/ha), flat beyond it; its curve facts. Its fits are
 * in shared/models/linearPlateau.
 */
import type { ModelCurve } from '../modelCurve';

/** The linear-plateau curve, parameters [a, b, x0]. */
export const linearPlateauCurve = {
  spec: {
    model: 'linearPlateau',
    label: 'Linear-plateau',
    formula: 'a + b·min(x, x0)',
    paramNames: ['a', 'b', 'x0'],
    dimensions: { a: 'yield', b: 'yieldPerRate', x0: 'rate' },
    value: (x, p) => p[0] + p[1] * Math.min(x, p[2]),
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = p[0] + p[1] * Math.min(xs[i], p[2]);
    },
    gradient: (x, p, out) => {
      out[0] = 1;
      out[1] = Math.min(x, p[2]);
      out[2] = x > p[2] ? p[1] : 0;
    },
    r2Kind: 'centered',
  },
  curveValue: (p, x) => p.a + p.b * Math.min(x, p.x0),
  // The slope is b up to the join and 0 after: the join pays when b > PR, else nothing does.
  optimum: (p, pr) => ({ rateKgHa: p.b > pr ? p.x0 : 0, agronomicMaxKgHa: p.x0 }),
  isCurve: true,
  linearInParameters: false,
  limit: 'linear',
  dash: '9 3 3 3',
} satisfies ModelCurve<'linearPlateau', 'linear'>;
