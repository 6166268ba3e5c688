/**
 * The percentile interval of a site's optimum rate (Efron & Tibshirani, An
 * Introduction to the Bootstrap, 1993, §13.3) from stored bootstrap draws
 * (drawBootstrapEstimates): each draw's optimum at the given prices by the
 * closed forms of economicOptimum, so new prices cost a pass over the draws and
 * never a new bootstrap.
 */
import type { ModelName } from '../models/modelTypes';
import { sortedQuantile } from '../stats/quantile';
import { StatsInputError } from '../stats/errors';
import { drawSummaries, type BootstrapDraws } from './bootstrapDraws';
import { optimumCore } from './economicOptimum';
import { assertPrices, type Prices } from './priceRatio';

export interface OptimumInterval {
  model: ModelName;
  /** Resamples drawn. */
  count: number;
  /** Resamples whose optimum is one rate (the interval is taken over these). */
  usable: number;
  seed: number;
  level: number;
  /** Percentile interval of the optimum, kg/ha; null when no resample gave a rate. */
  ciKgHa: [number, number] | null;
}

/**
 * The optimum's percentile interval of one model at one site, at these prices.
 * @param draws - the site's bootstrap draws
 * @param model - the model whose optimum is wanted (must be among the drawn models)
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @param level - interval level in (0, 1), e.g. 0.9
 * @returns the interval and how many resamples gave a rate; null when the model was not drawn
 * @throws {StatsInputError} "bad-argument" for a level outside (0, 1); price errors as economicOptimum
 * @example
 * optimumInterval(draws, 'quadraticPlateau', prices, 0.9)?.ciKgHa // e.g. [138, 171]
 */
export function optimumInterval(
  draws: BootstrapDraws,
  model: ModelName,
  prices: Prices,
  level: number,
): OptimumInterval | null {
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `level must lie strictly between 0 and 1; got ${level}.`,
    );
  }
  assertPrices(prices);
  const at = drawSummaries(draws, model);
  if (!at) return null;
  const rates = new Float64Array(draws.resamples);
  let usable = 0;
  for (let b = 0; b < draws.resamples; b++) {
    const rate = optimumCore(at(b), prices).rateKgHa;
    if (rate !== null && Number.isFinite(rate)) rates[usable++] = rate;
  }
  const finite = rates.subarray(0, usable).sort();
  const tail = (1 - level) / 2;
  return {
    model,
    count: draws.resamples,
    usable,
    seed: draws.seed,
    level,
    ciKgHa: usable > 0 ? [sortedQuantile(finite, tail), sortedQuantile(finite, 1 - tail)] : null,
  };
}
