/**
 * What one bootstrap resample counts as in the optimum's interval. Every resample
 * counts (a percentile interval over only the resamples with an interior optimum is
 * conditional on the data having looked like a curve, and too narrow): the deciding
 * fit of a resample (drawChoices, or the analyst's model) gives a rate and a kind.
 *
 * - "curve": a curve with status "ok": its economic optimum (optimumCore), wherever
 *   it lies (interior, 0, or capped at the highest tested rate).
 * - "noPlateau": the yields rise without levelling off: a plateau or exponential fit
 *   with status "no-plateau", or a straight line whose slope pays (its corner) →
 *   the highest tested rate.
 * - "fullResponse": the whole response came by the lowest non-zero rate → the
 *   second-lowest tested rate, the dearest rate the optimum can lie at (0 when the
 *   gain does not pay even that rate, as economicOptimum decides).
 * - "noResponse": a flat fit, an upward-opening quadratic, a straight line whose
 *   slope does not pay, or no fit at all → 0.
 */
import { MODEL_CURVES } from '../models/curves';
import type { CurveSummary } from '../models/modelTypes';
import { optimumCore } from './economicOptimum';
import type { Prices } from './priceRatio';

/** The kinds a resample's optimum can be counted as (see the file header). */
export type CountedKind = 'curve' | 'noPlateau' | 'fullResponse' | 'noResponse';

/** One resample's counted optimum. */
export interface CountedOptimum {
  kind: CountedKind;
  /** The rate the resample counts as, kg/ha. */
  rateKgHa: number;
}

/**
 * The rate and kind one resample counts as.
 * @param fit - the resample's deciding fit (status, parameters, tested rates), or null when none
 * @param prices - canonical prices (currency per kg grain and per kg nutrient, per ha application); not checked here
 * @returns the kind and the rate, kg/ha
 * @example
 * countedOptimum({ model: 'linearPlateau', status: 'no-plateau', params, testedRates, joinBetweenKgHa: null }, prices)
 * // { kind: 'noPlateau', rateKgHa: testedRates.highestKgHa }
 */
export function countedOptimum(fit: CurveSummary | null, prices: Prices): CountedOptimum {
  if (!fit) return { kind: 'noResponse', rateKgHa: 0 };
  switch (fit.status) {
    case 'ok': {
      const rate = optimumCore(fit, prices).rateKgHa ?? 0;
      if (MODEL_CURVES[fit.model].isCurve) return { kind: 'curve', rateKgHa: rate };
      return { kind: rate > 0 ? 'noPlateau' : 'noResponse', rateKgHa: rate };
    }
    case 'full-response-at-lowest-rate': {
      const core = optimumCore(fit, prices);
      return { kind: 'fullResponse', rateKgHa: core.rateKgHa ?? core.rangeKgHa![1] };
    }
    case 'no-plateau':
      return { kind: 'noPlateau', rateKgHa: fit.testedRates.highestKgHa };
    default:
      return { kind: 'noResponse', rateKgHa: 0 };
  }
}
