/**
 * How the optimum moves with the price ratio: the same recommendation made again at the user's
 * price ratio scaled by 0.5, 0.75, 1, 1.5 and 2. The ratio is scaled through the nitrogen price
 * alone; the grain price and the application cost stay as given, so every row's net return is
 * in the same grain money and a row reads "if nitrogen cost half / twice as much".
 *
 * The rows are made by whoever owns the recommendation (priceSite for a site, the regional
 * return for the region), called at each scaled price, so the table can never disagree with
 * the recommendation at 1×. Prices only: each row is a pass of closed forms over stored
 * parameters and draws, never a refit or a new resample.
 */
import { StatsInputError } from '../stats/errors';
import { assertPrices, type Prices } from './priceRatio';

/** The multiples of the user's price ratio the table shows, in order. */
export const PRICE_RATIO_MULTIPLIERS: readonly number[] = [0.5, 0.75, 1, 1.5, 2];

/** One row's ratio: the multiple and the price ratio it gives. */
export interface RatioMultiple {
  /** The multiple of the user's price ratio, e.g. 1.5. */
  ratioMultiplier: number;
  /** The price ratio of the row, kg grain per kg N. */
  priceRatio: number;
}

/**
 * The prices of one row: the nitrogen price scaled, the grain price and application cost kept.
 * @param prices - the user's canonical prices
 * @param multiplier - the multiple of the price ratio, > 0
 * @returns prices whose ratio is `multiplier` times the user's
 * @throws {StatsInputError} "bad-argument" for a multiplier that is not a positive number, or a bad price
 * @example
 * pricesAtRatioMultiple({ grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 }, 2).nutrientPricePerKg // 2.4
 */
export function pricesAtRatioMultiple(prices: Prices, multiplier: number): Prices {
  assertPrices(prices);
  if (!(Number.isFinite(multiplier) && multiplier > 0)) {
    throw new StatsInputError(
      'bad-argument',
      `a price ratio multiplier must be a positive number; got ${multiplier}.`,
    );
  }
  return { ...prices, nutrientPricePerKg: prices.nutrientPricePerKg * multiplier };
}

/**
 * One row per multiple: the caller's answer at that row's prices, beside its ratio.
 * @param prices - the user's canonical prices
 * @param at - the recommendation at a set of prices (the owner's own function)
 * @param multipliers - multiples of the price ratio, default PRICE_RATIO_MULTIPLIERS
 * @returns the rows, in the order of `multipliers`
 * @throws {StatsInputError} "bad-argument" for a bad price or multiplier
 * @example
 * priceRatioSensitivity(prices, (p) => ({ rateKgHa: economicOptimum(fit, p).rateKgHa }))
 * // [{ ratioMultiplier: 0.5, priceRatio: 3, rateKgHa: 171 }, …]
 */
export function priceRatioSensitivity<T extends object>(
  prices: Prices,
  at: (scaled: Prices, multiplier: number) => T,
  multipliers: readonly number[] = PRICE_RATIO_MULTIPLIERS,
): (RatioMultiple & T)[] {
  return multipliers.map((m) => {
    const scaled = pricesAtRatioMultiple(prices, m);
    return {
      ratioMultiplier: m,
      priceRatio: scaled.nutrientPricePerKg / scaled.grainPricePerKg,
      ...at(scaled, m),
    };
  });
}
