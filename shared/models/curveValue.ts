/**
 * A response curve's yield from its named parameters alone, so a stored fit (or
 * one priced again with new prices) needs no refit. Formulas as in each model's file.
 */
import type { ModelName } from './modelTypes';

/**
 * Yield of a model's curve at a rate.
 * @param model - the model name
 * @param params - its parameters by name (exponential: a may be absent, meaning 0)
 * @param rateKgHa - the rate, kg/ha
 * @returns the block-average yield, kg/ha (NaN if a parameter is missing or NaN)
 * @example
 * curveValue('linearPlateau', { a: 6000, b: 25, x0: 100 }, 150) // 8500
 */
export function curveValue(
  model: ModelName,
  params: Readonly<Record<string, number>>,
  rateKgHa: number,
): number {
  const x = rateKgHa;
  switch (model) {
    case 'linear':
      return params.a + params.b * x;
    case 'proportional':
      return params.b * x;
    case 'quadratic':
      return params.a + x * (params.b + params.c * x);
    case 'linearPlateau':
      return params.a + params.b * Math.min(x, params.x0);
    case 'quadraticPlateau': {
      const d = Math.min(x - params.x0, 0);
      return params.P + params.c * d * d;
    }
    case 'exponential':
      return (params.a ?? 0) + params.b * -Math.expm1(-params.k * x);
  }
}
