/**
 * A response curve's yield from its named parameters alone, so a stored fit (or
 * one priced again with new prices) needs no refit. Each model's formula is its
 * curve's (shared/models/curves), which loads no fitter.
 */
import { MODEL_CURVES, type ModelName } from './curves';

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
  return MODEL_CURVES[model].curveValue(params, rateKgHa);
}
