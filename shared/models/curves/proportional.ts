/**
 * The line through the origin y = b x (b: kg grain per kg nutrient): its curve facts. Its
 * R² is the uncentered one (about zero). Its fits are in shared/models/proportional.
 */
import type { ModelCurve } from '../modelCurve';
import { lineCornerOptimum } from './linear';

/** The proportional model's curve. */
export const proportionalCurve = {
  spec: {
    model: 'proportional',
    label: 'Line through the origin',
    formula: 'b·x',
    paramNames: ['b'],
    dimensions: { b: 'yieldPerRate' },
    value: (x, p) => p[0] * x,
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = p[0] * xs[i];
    },
    gradient: (x, _p, out) => {
      out[0] = x;
    },
    r2Kind: 'uncentered',
  },
  curveValue: (p, x) => p.b * x,
  // A corner, as for the straight line.
  optimum: lineCornerOptimum,
  isCurve: false,
  linearInParameters: true,
  limit: null,
  dash: '15 6 3 6',
} satisfies ModelCurve<'proportional', null>;
