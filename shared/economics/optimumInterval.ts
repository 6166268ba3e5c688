/**
 * The percentile interval of a site's optimum rate (Efron & Tibshirani, An
 * Introduction to the Bootstrap, 1993, §13.3) from stored bootstrap draws
 * (drawBootstrapEstimates), priced by the closed forms of economicOptimum, so new
 * prices cost a pass over the draws and never a new bootstrap.
 *
 * Two bases:
 * - "model-reselected" (the default, what a site's recommendation gets): the model
 *   is chosen again inside every resample by the site's own rule (drawChoices), so
 *   the interval includes the uncertainty of the model choice.
 * - "fixed-model": every resample priced with one model (the one the analyst
 *   picked); it leaves the choice of model out and is narrower for it.
 *
 * Either way every resample counts (countedOptimum): no plateau → the highest tested
 * rate, full response by the lowest non-zero rate → the second-lowest tested rate,
 * no response or no fit → 0, and the shares of each kind are reported with the
 * interval, never an interval over only the resamples that gave a curve.
 */
import type { ModelName } from '../models/modelTypes';
import { StatsInputError } from '../stats/errors';
import { sortedQuantile } from '../stats/quantile';
import { drawSummaries, type BootstrapDraws } from './bootstrapDraws';
import { countedOptimum, type CountedKind } from './countedOptimum';
import { decidingModels, type IntervalBasis } from './drawChoices';
import { assertPrices, type Prices } from './priceRatio';

/** Share of the resamples of each kind (countedOptimum), each in [0, 1], summing to 1. */
export type OptimumShares = Record<CountedKind, number>;

export interface OptimumInterval {
  /** The site's model (the point estimate's); with "model-reselected" each resample chose its own. */
  model: ModelName;
  basis: IntervalBasis;
  /** Resamples drawn; every one is in the interval. */
  count: number;
  seed: number;
  level: number;
  /** Percentile interval of the optimum over all resamples, kg/ha; null only without resamples. */
  ciKgHa: [number, number] | null;
  /** Share of the resamples counted as a curve's optimum, no plateau, full response, no response. */
  shares: OptimumShares;
  /** Share of the resamples each model decided (the rest had no deciding fit). */
  modelShares: Partial<Record<ModelName, number>>;
}

/**
 * The optimum's percentile interval at one site, at these prices.
 * @param draws - the site's bootstrap draws
 * @param model - the site's model: the analyst's pick with "fixed-model" (must be drawn), else the
 *   recommendation model, reported as the interval's model
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @param level - interval level in (0, 1), e.g. 0.9
 * @param basis - "model-reselected" (default) or "fixed-model"
 * @returns the interval, the shares of each kind and of each model; null when `model` was not
 *   drawn (fixed-model) or no model was drawn
 * @throws {StatsInputError} "bad-argument" for a level outside (0, 1); price errors as economicOptimum
 * @example
 * optimumInterval(draws, 'quadraticPlateau', prices, 0.9)
 * // e.g. { ciKgHa: [0, 171], shares: { curve: 0.8, noPlateau: 0.05, fullResponse: 0, noResponse: 0.15 }, … }
 */
export function optimumInterval(
  draws: BootstrapDraws,
  model: ModelName,
  prices: Prices,
  level: number,
  basis: IntervalBasis = 'model-reselected',
): OptimumInterval | null {
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `level must lie strictly between 0 and 1; got ${level}.`,
    );
  }
  assertPrices(prices);
  const choices = decidingModels(draws, model, basis);
  if (!choices) return null;
  const readers = choices.models.map((m) => drawSummaries(draws, m)!);
  const rates = new Float64Array(draws.resamples);
  const kinds: Record<CountedKind, number> = {
    curve: 0,
    noPlateau: 0,
    fullResponse: 0,
    noResponse: 0,
  };
  const byModel = new Float64Array(choices.models.length);
  for (let b = 0; b < draws.resamples; b++) {
    const i = choices.decisive[b];
    const counted = countedOptimum(i < 0 ? null : readers[i](b), prices);
    rates[b] = counted.rateKgHa;
    kinds[counted.kind]++;
    if (i >= 0) byModel[i]++;
  }
  const count = draws.resamples;
  rates.sort();
  const tail = (1 - level) / 2;
  const modelShares: Partial<Record<ModelName, number>> = {};
  choices.models.forEach((m, i) => {
    if (byModel[i] > 0) modelShares[m] = byModel[i] / count;
  });
  return {
    model,
    basis,
    count,
    seed: draws.seed,
    level,
    ciKgHa: count > 0 ? [sortedQuantile(rates, tail), sortedQuantile(rates, 1 - tail)] : null,
    shares: {
      curve: kinds.curve / count,
      noPlateau: kinds.noPlateau / count,
      fullResponse: kinds.fullResponse / count,
      noResponse: kinds.noResponse / count,
    },
    modelShares,
  };
}
