/**
 * The economic optimum rate (EONR) of a fitted response curve: the rate where
 * the marginal revenue equals the marginal cost, i.e. where the curve's slope
 * equals the price ratio PR = nutrient price / grain price. From the fitted
 * parameters alone (no refit), so re-pricing is a few arithmetic operations.
 *
 * Each model's closed form (dy/dx = PR solved for x) and agronomic maximum is its
 * curve's `optimum` (shared/models/curves), e.g. the quadratic's
 * x* = (PR − b) / (2c); a straight line (a model that is not a curve) gives a
 * corner, the highest tested rate when b > PR, else 0. Then: x* below 0 becomes 0; x* past the highest tested rate is capped there
 * and flagged (the curve is not known beyond the data); with an application
 * cost the optimum is 0 unless the net return at x* beats no application.
 *
 * The agronomic maximum is the rate of the highest yield: the vertex −b/(2c) of
 * the quadratic, the join of the plateau models, none for the exponential
 * (approached but not reached) and the highest tested rate for a rising line.
 */
import { MODEL_CURVES } from '../models/curves';
import { curveValue } from '../models/curveValue';
import type { CurveSummary, ModelName } from '../models/modelTypes';
import { KG_HA_FORMAT, rateRangeText, rateText, type RateFormat } from '../models/rateFormat';
import { assertPrices, type Prices } from './priceRatio';
import { recommendationCautions } from './recommendationCautions';

/**
 * - "interior": slope = PR inside the tested rates
 * - "zero": applying does not pay (slope at 0 below PR, or the gain does not cover the application cost)
 * - "capped-at-highest": the formula lies past the highest tested rate; the highest rate is given and flagged
 * - "corner": straight line or line through the origin, whose constant slope gives 0 or the highest rate
 * - "join-in-first-interval": full response by the lowest non-zero rate; the optimum lies
 *   between the two lowest rates and is not given as one number
 * - "not-available": the fit has no optimum (no plateau, convex, flat, or not fitted)
 */
export type OptimumStatus =
  'interior' | 'zero' | 'capped-at-highest' | 'corner' | 'join-in-first-interval' | 'not-available';

export interface EconomicOptimum {
  model: ModelName;
  status: OptimumStatus;
  /** PR, kg grain per kg nutrient. */
  priceRatio: number;
  /** The optimum rate, kg/ha; null for "join-in-first-interval" and "not-available". */
  rateKgHa: number | null;
  /** The closed form before capping at the tested range, kg/ha (NaN when none). */
  uncappedRateKgHa: number;
  /** For "join-in-first-interval": the two lowest rates, kg/ha. */
  rangeKgHa: [number, number] | null;
  /** Fitted yield at the optimum, kg/ha. */
  yieldKgHa: number | null;
  /** Grain revenue minus nutrient and application cost at the optimum, currency/ha. */
  netReturnPerHa: number | null;
  /** Net return at the optimum minus the net return at rate 0 (the fitted check), currency/ha. */
  gainOverCheckPerHa: number | null;
  /** Rate of the highest fitted yield, kg/ha; null when the curve has none within reach. */
  agronomicMaxRateKgHa: number | null;
  /** True when the optimum was capped at the highest tested rate. */
  cappedAtHighest: boolean;
  /**
   * One or two sentences for the screen and reports. Rates are written with the
   * caller's RateFormat (default kg/ha, rounded); the price ratio is named, not
   * given as a number, since its unit depends on the display units.
   */
  explanation: string;
  /** The cautions that go with any recommended rate. */
  cautions: readonly string[];
}

/**
 * Net return at a rate: grain price × yield − nutrient price × rate − application cost (if rate > 0).
 * @param fit - model, parameters
 * @param prices - canonical prices
 * @param rateKgHa - the rate, kg/ha
 * @returns currency/ha
 * @example
 * netReturn({ model: 'linear', params: { a: 5000, b: 10 } }, { grainPricePerKg: 0.2, nutrientPricePerKg: 1 }, 100) // 1100
 */
export function netReturn(
  fit: Pick<CurveSummary, 'model' | 'params'>,
  prices: Prices,
  rateKgHa: number,
): number {
  const y = curveValue(fit.model, fit.params, rateKgHa);
  const app = rateKgHa > 0 ? (prices.applicationCostPerHa ?? 0) : 0;
  return prices.grainPricePerKg * y - prices.nutrientPricePerKg * rateKgHa - app;
}

/** A result without a single optimum rate (module level: no closure per call). */
function noOptimum(
  model: ModelName,
  pr: number,
  status: OptimumStatus,
  explanation: string,
): EconomicOptimum {
  return {
    model,
    priceRatio: pr,
    cautions: recommendationCautions,
    status,
    rateKgHa: null,
    uncappedRateKgHa: NaN,
    rangeKgHa: null,
    yieldKgHa: null,
    netReturnPerHa: null,
    gainOverCheckPerHa: null,
    agronomicMaxRateKgHa: null,
    cappedAtHighest: false,
    explanation,
  };
}

const NO_OPTIMUM_REASON: Record<string, string> = {
  'no-plateau': 'No plateau within the tested rates, so this model gives no optimum.',
  convex: 'The quadratic opens upward, so it has no maximum and no optimum.',
  'no-response': 'Yield does not rise with rate: no nutrient pays.',
  'too-few-rates': 'The model could not be fitted to this site.',
};

export interface EconomicOptimumOptions {
  /** How the explanation writes rates; default kg/ha rounded (shared/models/rateFormat). */
  rateFormat?: RateFormat;
}

/**
 * The economic optimum rate of one fitted curve at given prices.
 * @param fit - a ModelFit or any CurveSummary (model, status, params, tested rates)
 * @param prices - grain price (currency/kg grain), nutrient price (currency/kg nutrient),
 *   optional application cost (currency/ha)
 * @param options - rateFormat: how the explanation writes rates (default kg/ha, rounded)
 * @returns the optimum with its status, yield, net return and gain over the check
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * const lp = { model: 'linearPlateau', status: 'ok', params: { a: 6000, b: 25, x0: 100 },
 *   testedRates: { lowestKgHa: 0, highestKgHa: 200, distinctKgHa: [0, 50, 100, 150, 200] }, joinBetweenKgHa: null } as const;
 * economicOptimum(lp, { grainPricePerKg: 0.2, nutrientPricePerKg: 1 }).rateKgHa // 100
 */
export function economicOptimum(
  fit: CurveSummary,
  prices: Prices,
  options: EconomicOptimumOptions = {},
): EconomicOptimum {
  assertPrices(prices);
  const format = options.rateFormat ?? KG_HA_FORMAT;
  const pr = prices.nutrientPricePerKg / prices.grainPricePerKg;
  if (fit.status === 'full-response-at-lowest-rate') {
    const [low, high] = fit.joinBetweenKgHa ?? [
      fit.testedRates.distinctKgHa[0],
      fit.testedRates.distinctKgHa[1],
    ];
    // The whole response is bought by the second-lowest rate at most, so paying
    // for `high` is the dearest case: if that still beats no nutrient, the
    // optimum lies in (low, high].
    const zero = netReturn(fit, prices, 0);
    const atHigh = netReturn(fit, prices, high);
    if (!(atHigh > zero)) {
      return {
        ...noOptimum(
          fit.model,
          pr,
          'zero',
          `The full response is reached by ${rateText(format, high)}, but at these prices it does not pay for that rate.`,
        ),
        rateKgHa: 0,
        uncappedRateKgHa: 0,
        yieldKgHa: curveValue(fit.model, fit.params, 0),
        netReturnPerHa: zero,
        gainOverCheckPerHa: 0,
      };
    }
    return {
      ...noOptimum(
        fit.model,
        pr,
        'join-in-first-interval',
        `Full response by the lowest non-zero rate: the optimum lies between ${rateRangeText(format, low, high)}; these rates cannot place it more precisely.`,
      ),
      rangeKgHa: [low, high],
      yieldKgHa: curveValue(fit.model, fit.params, high),
      netReturnPerHa: atHigh,
      gainOverCheckPerHa: atHigh - zero,
    };
  }
  if (fit.status !== 'ok') {
    return noOptimum(
      fit.model,
      pr,
      'not-available',
      NO_OPTIMUM_REASON[fit.status] ?? 'No optimum.',
    );
  }

  const highest = fit.testedRates.highestKgHa;
  const entry = MODEL_CURVES[fit.model];
  const { rateKgHa: raw, agronomicMaxKgHa: agronomicMax } = entry.optimum(fit.params, pr, highest);
  let status: OptimumStatus = 'interior';
  let x = raw;
  let capped = false;
  let explanation: string;
  if (!(x > 0)) {
    x = 0;
    status = 'zero';
    explanation =
      'At this price ratio the first unit of nutrient already returns less than it costs: the optimum is no nutrient.';
  } else if (x > highest) {
    x = highest;
    capped = true;
    status = 'capped-at-highest';
    explanation = `The formula gives ${rateText(format, raw)}, past the highest tested rate; the curve is not known there, so the highest tested rate (${rateText(format, highest)}) is given and flagged.`;
  } else {
    explanation = `Economic optimum ${rateText(format, x)}, where the curve's slope equals the price ratio (nutrient price over grain price).`;
  }
  if (!entry.isCurve) {
    status = x > 0 || capped ? 'corner' : 'zero';
    capped = false;
    explanation =
      x > 0
        ? `A straight line never levels off: its slope stays above the price ratio, so the optimum is the corner at the highest tested rate, ${rateText(format, highest)}; a curve with a plateau says more.`
        : "A straight line's slope below the price ratio puts the optimum at the corner, no nutrient.";
  }
  const zeroReturn = netReturn(fit, prices, 0);
  let atX = netReturn(fit, prices, x);
  if (x > 0 && !(atX > zeroReturn)) {
    // The application cost is larger than what the nutrient returns.
    explanation = `At ${rateText(format, x)} the gain does not cover the nutrient and application cost, so the optimum is no application.`;
    x = 0;
    status = 'zero';
    capped = false;
    atX = zeroReturn;
  }
  return {
    model: fit.model,
    priceRatio: pr,
    cautions: recommendationCautions,
    status,
    rateKgHa: x,
    uncappedRateKgHa: raw,
    rangeKgHa: null,
    yieldKgHa: curveValue(fit.model, fit.params, x),
    netReturnPerHa: atX,
    gainOverCheckPerHa: atX - zeroReturn,
    agronomicMaxRateKgHa: agronomicMax,
    cappedAtHighest: capped,
    explanation,
  };
}
