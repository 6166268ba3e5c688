/**
 * How a rate is rounded wherever it is shown, so the screen, the grower page, the workbook's
 * number formats and any sentence print the same number for the same rate:
 * - a rate reported (an optimum, a range, an interval, a tested rate): whole lb/ac and kg/ha,
 *   tenths of g/m² (one kg/ha is finer than any trial places an optimum);
 * - a rate to apply (the grower page's "Apply about …" and the product amount): the spreader's
 *   step, 5 lb/ac or kg/ha and 0.5 g/m² (common practice), down for a rate not to be exceeded.
 */
import { formatNutrientRate, type RateUnit } from './convertRate';

/** Decimals a reported rate is shown with, per display unit. */
export const RATE_DECIMALS: Readonly<Record<RateUnit, number>> = {
  'kg/ha': 0,
  'lb/ac': 0,
  'g/m2': 1,
};

/**
 * A reported rate rounded as every view shows it.
 * @param value - the rate in the display unit
 * @param unit - the display unit
 * @returns the rounded rate
 * @example shownRate(157.4, 'kg/ha') // 157
 */
export function shownRate(value: number, unit: RateUnit): number {
  const f = 10 ** RATE_DECIMALS[unit];
  return Math.round(value * f) / f + 0;
}

/**
 * A reported rate as text: rounded as every view shows it, with the nutrient in its unit.
 * @param value - the rate in the display unit
 * @param unit - the display unit
 * @returns e.g. "157 kg N/ha", "15.7 g N/m²"
 * @example formatShownRate(157.4, 'kg/ha') // '157 kg N/ha'
 */
export function formatShownRate(value: number, unit: RateUnit): string {
  return formatNutrientRate(shownRate(value, unit), unit, RATE_DECIMALS[unit]);
}

/** The step a spreader or applicator is set in, per display unit (common practice). */
function applicationStep(unit: RateUnit | string): number {
  return unit === 'g/m2' ? 0.5 : 5;
}

/**
 * A rate to apply, rounded to the spreader's step.
 * @param value - the rate in the display unit
 * @param unit - the display unit
 * @returns the nearest step
 * @example applicationRate(157.4, 'kg/ha') // 155
 */
export function applicationRate(value: number, unit: RateUnit | string): number {
  const step = applicationStep(unit);
  return Math.round(value / step) * step;
}

/**
 * A rate not to be exceeded, rounded down to the spreader's step.
 * @param value - the rate in the display unit
 * @param unit - the display unit
 * @returns the step at or below it
 * @example applicationRateDown(59.9, 'lb/ac') // 55
 */
export function applicationRateDown(value: number, unit: RateUnit | string): number {
  const step = applicationStep(unit);
  return Math.floor(value / step + 1e-9) * step;
}
