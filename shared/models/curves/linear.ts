/**
 * The straight line y = a + b x (a: yield at rate 0, kg/ha; b: kg grain per kg nutrient):
 * its curve facts. Its fits are in shared/models/linear.
 */
import type { ClosedFormOptimum, ModelCurve } from '../modelCurve';

/** The straight line's curve. */
export const linearCurve = {
  spec: {
    model: 'linear',
    label: 'Straight line',
    formula: 'a + b·x',
    paramNames: ['a', 'b'],
    dimensions: { a: 'yield', b: 'yieldPerRate' },
    value: (x, p) => p[0] + p[1] * x,
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = p[0] + p[1] * xs[i];
    },
    gradient: (x, _p, out) => {
      out[0] = 1;
      out[1] = x;
    },
    r2Kind: 'centered',
  },
  curveValue: (p, x) => p.a + p.b * x,
  optimum: lineCornerOptimum,
  isCurve: false,
  linearInParameters: true,
  limit: null,
  dash: '9 9',
} satisfies ModelCurve<'linear', null>;

/**
 * The optimum of a straight response (straight line or line through the origin): a constant
 * slope never equals the price ratio, so the optimum is a corner, the highest tested rate when
 * the slope b beats the price ratio, else no nutrient.
 * @param p - the fitted parameters (b: kg grain per kg N)
 * @param pr - price ratio, kg grain per kg N
 * @param highestKgHa - highest tested rate, kg/ha
 * @returns the corner rate and the agronomic maximum, kg/ha
 * @example
 * lineCornerOptimum({ a: 6000, b: 12 }, 7, 200) // { rateKgHa: 200, agronomicMaxKgHa: 200 }
 */
export function lineCornerOptimum(
  p: Readonly<Record<string, number>>,
  pr: number,
  highestKgHa: number,
): ClosedFormOptimum {
  return {
    rateKgHa: p.b > pr ? highestKgHa : 0,
    agronomicMaxKgHa: p.b > 0 ? highestKgHa : 0,
  };
}
