/**
 * Whether a price ratio is one a grower could face, or a slip: a price typed per tonne as per
 * kilogram, a decimal comma read as a thousands mark, grain and fertilizer swapped. Compared
 * with the crop's illustrative ratio (shared/economics/illustrativePrices), which is
 * currency-free: kg of grain per kg of N. Ratios from a tenth to ten times that span every
 * grain and fertilizer market in memory (common practice: the trade's ratio tables stop well
 * inside it); beyond it a rate would follow from a typing slip, so the screen asks first.
 */
import type { CropId } from '../table/plotTable';
import { crops } from '../units/crops';
import { illustrativePrices } from './illustrativePrices';
import { priceRatio, type Prices } from './priceRatio';

/** How many times the usual ratio, either way, before a ratio is questioned. */
export const PRICE_RATIO_FACTOR_LIMIT = 10;

export interface PriceRatioCheck {
  /** kg grain per kg N at the given prices. */
  ratio: number;
  /** The crop's illustrative ratio, the yardstick. */
  usual: number;
  /** ratio ÷ usual: above 1 dearer nitrogen than usual. */
  factor: number;
  /** Within PRICE_RATIO_FACTOR_LIMIT of the usual either way. */
  plausible: boolean;
}

/**
 * Checks a price ratio against the crop's usual one.
 * @param prices - canonical prices (per kg, per ha)
 * @param crop - the crop
 * @returns the ratio, the usual ratio, their quotient and whether it is plausible
 * @example
 * checkPriceRatio({ grainPricePerKg: 0.177, nutrientPricePerKg: 1.24 }, 'corn').plausible // true
 */
export function checkPriceRatio(prices: Prices, crop: CropId): PriceRatioCheck {
  const ratio = priceRatio(prices);
  const usual = priceRatio(illustrativePrices(crop).canonical);
  const factor = ratio / usual;
  return {
    ratio,
    usual,
    factor,
    plausible: factor <= PRICE_RATIO_FACTOR_LIMIT && factor >= 1 / PRICE_RATIO_FACTOR_LIMIT,
  };
}

/**
 * What is unusual about a ratio, in words the screen and the command line both print before
 * their own advice.
 * @param check - from checkPriceRatio
 * @param crop - the crop
 * @returns e.g. "The price ratio is 761 kg grain per kg N, 108 times the usual 7.03 for corn (maize)"
 */
export function priceRatioFarOff(check: PriceRatioCheck, crop: CropId): string {
  const r = (v: number) => Number(v.toPrecision(3)).toLocaleString('en-US');
  const times = check.factor >= 1 ? `${r(check.factor)} times` : `1/${r(1 / check.factor)} of`;
  return `The price ratio is ${r(check.ratio)} kg grain per kg N, ${times} the usual ${r(check.usual)} for ${crops(crop).label.toLowerCase()}`;
}
