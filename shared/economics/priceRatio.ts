/**
 * Prices in Plotrate's canonical units and the price ratio
 * PR = nutrient price / grain price, in kg grain per kg nutrient: the slope of
 * the response curve at which one more kg of nutrient just pays for itself.
 */
import { StatsInputError } from '../stats/errors';

/** Prices in canonical units (any one currency throughout). */
export interface Prices {
  /** Grain price per kg of grain at the yields' moisture basis, currency/kg. */
  grainPricePerKg: number;
  /** Nutrient price per kg of nutrient (e.g. kg N), currency/kg. */
  nutrientPricePerKg: number;
  /** Cost of making an application at all, currency/ha, charged when the rate is above 0; default 0. */
  applicationCostPerHa?: number;
}

/**
 * Checks prices once at the entry.
 * @param prices - the prices to check
 * @throws {StatsInputError} "bad-argument" naming the price that is not a positive finite
 *   number (application cost: not negative)
 * @returns nothing; returns normally when the prices are valid
 * @example
 * assertPrices({ grainPricePerKg: 0.2, nutrientPricePerKg: 1.1 }) // no error
 */
export function assertPrices(prices: Prices): void {
  for (const key of ['grainPricePerKg', 'nutrientPricePerKg'] as const) {
    const v = prices[key];
    if (!(Number.isFinite(v) && v > 0)) {
      throw new StatsInputError('bad-argument', `${key} must be a positive number; got ${v}.`);
    }
  }
  const c = prices.applicationCostPerHa ?? 0;
  if (!(Number.isFinite(c) && c >= 0)) {
    throw new StatsInputError(
      'bad-argument',
      `applicationCostPerHa must be zero or a positive number; got ${c}.`,
    );
  }
}

/**
 * The price ratio nutrient price / grain price.
 * @param prices - grain price (currency/kg grain) and nutrient price (currency/kg nutrient)
 * @returns PR, kg grain per kg nutrient
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * priceRatio({ grainPricePerKg: 0.2, nutrientPricePerKg: 1.1 }) // 5.5
 */
export function priceRatio(prices: Prices): number {
  assertPrices(prices);
  return prices.nutrientPricePerKg / prices.grainPricePerKg;
}

/**
 * What a rate costs per hectare: the nutrient at its price, plus the application cost when any
 * is applied. The one place the cost of a rate is written, so every net return (a site's curve,
 * the regional grid, the risk tables) subtracts the same doubles.
 * @param prices - canonical prices (assumed checked)
 * @param rateKgHa - the rate, kg/ha
 * @returns currency/ha
 * @example
 * rateCostPerHa({ grainPricePerKg: 0.2, nutrientPricePerKg: 1, applicationCostPerHa: 10 }, 100) // 110
 */
export function rateCostPerHa(prices: Prices, rateKgHa: number): number {
  return (
    prices.nutrientPricePerKg * rateKgHa + (rateKgHa > 0 ? (prices.applicationCostPerHa ?? 0) : 0)
  );
}
