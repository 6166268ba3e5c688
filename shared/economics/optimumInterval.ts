/**
 * The percentile interval of a site's optimum rate (Efron & Tibshirani, An
 * Introduction to the Bootstrap, 1993, §13.3) from stored bootstrap draws
 * (drawBootstrapEstimates), priced by the closed forms of economicOptimum, so new
 * prices cost a pass over the draws and never a new bootstrap.
 *
 * Two bases:
 * - "model-reselected" (the default, what a site's recommendation gets): inside every
 *   resample the rule's candidates are weighed again by their Akaike weights in that
 *   resample (drawChoices), and the interval is the percentile interval of the mixture
 *   (each resample weight 1, shared among its candidates; weightedSortedQuantile), so it
 *   includes the uncertainty of the model choice.
 * - "fixed-model": every resample priced with one model (the one the analyst
 *   picked); it leaves the choice of model out and is narrower for it.
 *
 * Either way every resample counts (countedOptimum): no plateau → the highest tested
 * rate, full response by the lowest non-zero rate → the second-lowest tested rate (and,
 * when such resamples fill at least one tail, the interval reaches down to the lowest
 * tested rate, since each of them only says "at or below the second-lowest rate"),
 * no response or no fit → 0, and the shares of each kind are reported with the
 * interval, never an interval over only the resamples that gave a curve.
 */
import type { ModelName } from '../models/modelTypes';
import { StatsInputError } from '../stats/errors';
import { weightedSortedQuantile } from '../stats/quantile';
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
  /** Share of the resamples' weight counted as a curve's optimum, no plateau, full response, no response. */
  shares: OptimumShares;
  /** Share of the resamples' weight each model held (the rest had no usable fit). */
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
  return optimumIntervals(draws, model, [prices], level, basis)[0];
}

/**
 * The optimum's percentile interval at one site at several sets of prices, in one pass over the
 * resamples: each resample's fit is read once and priced at every set (a price-ratio table asks
 * for four more prices at once). Each interval is the one optimumInterval gives at its prices.
 * @param draws - the site's bootstrap draws
 * @param model - as for {@link optimumInterval}
 * @param pricesList - the sets of canonical prices
 * @param level - interval level in (0, 1), e.g. 0.9
 * @param basis - "model-reselected" (default) or "fixed-model"
 * @returns one interval per set of prices, in their order (each null as for optimumInterval)
 * @throws {StatsInputError} as optimumInterval
 * @example
 * optimumIntervals(draws, 'quadraticPlateau', [cheap, dear], 0.9).map((i) => i?.ciKgHa)
 */
export function optimumIntervals(
  draws: BootstrapDraws,
  model: ModelName,
  pricesList: readonly Prices[],
  level: number,
  basis: IntervalBasis = 'model-reselected',
): (OptimumInterval | null)[] {
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `level must lie strictly between 0 and 1; got ${level}.`,
    );
  }
  for (const prices of pricesList) assertPrices(prices);
  const choices = decidingModels(draws, model, basis);
  if (!choices) return pricesList.map(() => null);
  const count = draws.resamples;
  const k = choices.models.length;
  const readers = choices.models.map((m) => drawSummaries(draws, m)!);
  const sets = pricesList.length;
  // Every resample holds weight 1, spread over its candidates by their weights; a resample with
  // no usable fit counts as no response (0) with all its weight. The weights do not depend on
  // the prices, so the pairs share one mass array; each set of prices has its own rates.
  const cap = count * Math.max(k, 1);
  const rates = new Float64Array(cap * sets);
  const mass = new Float64Array(cap);
  let n = 0;
  const kinds = pricesList.map((): Record<CountedKind, number> => ({
    curve: 0,
    noPlateau: 0,
    fullResponse: 0,
    noResponse: 0,
  }));
  const byModel = new Float64Array(k);
  for (let b = 0; b < count; b++) {
    let held = 0;
    for (let i = 0; i < k; i++) {
      const w = choices.weights[b * k + i];
      if (!(w > 0)) continue;
      const fit = readers[i](b);
      for (let p = 0; p < sets; p++) {
        const counted = countedOptimum(fit, pricesList[p]);
        rates[p * cap + n] = counted.rateKgHa;
        kinds[p][counted.kind] += w;
      }
      mass[n++] = w;
      byModel[i] += w;
      held += w;
    }
    if (held === 0) {
      for (let p = 0; p < sets; p++) {
        rates[p * cap + n] = 0;
        kinds[p].noResponse += 1;
      }
      mass[n++] = 1;
    }
  }
  const modelShares: Partial<Record<ModelName, number>> = {};
  choices.models.forEach((m, i) => {
    if (byModel[i] > 0) modelShares[m] = byModel[i] / count;
  });
  const tail = (1 - level) / 2;
  return pricesList.map((_, p) => {
    const [sortedRates, sortedMass] = sortedWithMass(
      rates.subarray(p * cap, p * cap + n),
      mass.subarray(0, n),
    );
    const ci: [number, number] | null =
      count > 0
        ? [
            weightedSortedQuantile(sortedRates, sortedMass, tail),
            weightedSortedQuantile(sortedRates, sortedMass, 1 - tail),
          ]
        : null;
    const counted = kinds[p];
    // A full response places the optimum anywhere in (lowest, second-lowest rate], not at the
    // second-lowest rate, where it is counted: once full responses fill a tail's share of the
    // resamples, the interval reaches down to the lowest tested rate.
    if (ci && counted.fullResponse >= tail * count) {
      ci[0] = Math.min(ci[0], draws.testedRates.lowestKgHa);
    }
    return {
      model,
      basis,
      count,
      seed: draws.seed,
      level,
      ciKgHa: ci,
      shares: {
        curve: counted.curve / count,
        noPlateau: counted.noPlateau / count,
        fullResponse: counted.fullResponse / count,
        noResponse: counted.noResponse / count,
      },
      modelShares: p === 0 ? modelShares : { ...modelShares },
    };
  });
}

/**
 * The rates in ascending order with each distinct rate's summed mass on its first copy (0 on
 * the other copies, which weightedSortedQuantile skips), as a sort of (rate, mass) pairs would
 * give for its quantiles. A typed array sorts numbers natively; sorting indices through a
 * comparator cost most of a re-pricing's time (about 1,000 pairs a site, five prices).
 */
function sortedWithMass(rates: Float64Array, mass: Float64Array): [Float64Array, Float64Array] {
  const sorted = rates.slice().sort();
  const summed = new Float64Array(sorted.length);
  for (let i = 0; i < rates.length; i++) summed[firstIndexOf(sorted, rates[i])] += mass[i];
  return [sorted, summed];
}

/** The first index of `value` in ascending `sorted`, which holds it (binary search). */
function firstIndexOf(sorted: Float64Array, value: number): number {
  let lo = 0;
  let hi = sorted.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
