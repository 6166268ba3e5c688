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
import type { CurveSummary, ModelFit, ModelName } from '../models/modelTypes';
import { KG_HA_FORMAT, rateRangeText, rateText, type RateFormat } from '../models/rateFormat';
import { assertPrices, rateCostPerHa, type Prices } from './priceRatio';
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
  return prices.grainPricePerKg * y - rateCostPerHa(prices, rateKgHa);
}

/**
 * The rate a site's optimum recommends: the optimum; for a full response that pays, the top of
 * its range (the optimum lies at or below it); null without one.
 * @param optimum - the site's optimum (e.g. PricedSite.optimum), or null
 * @returns kg/ha, or null
 * @example
 * recommendedRateKgHa({ ...opt, status: 'join-in-first-interval', rangeKgHa: [0, 40] }) // 40
 */
export function recommendedRateKgHa(optimum: EconomicOptimum | null): number | null {
  if (!optimum) return null;
  return optimum.status === 'join-in-first-interval' && optimum.rangeKgHa
    ? optimum.rangeKgHa[1]
    : optimum.rateKgHa;
}

/** Why the optimum is what it is: the explanation is written from this and the numbers. */
type OptimumReason =
  | 'full-response-does-not-pay'
  | 'full-response'
  | 'no-fit'
  | 'first-unit-loses'
  | 'capped'
  | 'interior'
  | 'line-corner-high'
  | 'line-corner-zero'
  | 'application-cost';

/** The optimum without its sentence: what the decision needs, made without any text. */
export type OptimumCore = Omit<EconomicOptimum, 'explanation' | 'cautions'> & {
  reason: OptimumReason;
};

function core(
  fit: CurveSummary,
  pr: number,
  reason: OptimumReason,
  status: OptimumStatus,
  rateKgHa: number | null,
): OptimumCore {
  return {
    model: fit.model,
    priceRatio: pr,
    status,
    rateKgHa,
    uncappedRateKgHa: NaN,
    rangeKgHa: null,
    yieldKgHa: null,
    netReturnPerHa: null,
    gainOverCheckPerHa: null,
    agronomicMaxRateKgHa: null,
    cappedAtHighest: false,
    reason,
  };
}

/**
 * The economic optimum without its explanation: the same decision as economicOptimum, for a
 * caller that prices many curves and shows none of the sentences (the bootstrap's draws).
 * @param fit - any CurveSummary (model, status, params, tested rates, join interval)
 * @param prices - canonical prices; not checked here (economicOptimum checks them)
 * @returns status, rate, yield and returns, and the reason
 * @example
 * optimumCore(lp, { grainPricePerKg: 0.2, nutrientPricePerKg: 1 }).rateKgHa // 100
 */
export function optimumCore(fit: CurveSummary, prices: Prices): OptimumCore {
  const pr = prices.nutrientPricePerKg / prices.grainPricePerKg;
  if (fit.status === 'full-response-at-lowest-rate') {
    const [low, high] = fit.joinBetweenKgHa ?? [
      fit.testedRates.distinctKgHa[0],
      fit.testedRates.distinctKgHa[1],
    ];
    // The whole response is bought by the second-lowest rate at most, so paying
    // for `high` is the dearest case: if that still beats no nutrient, the
    // optimum lies in (low, high].
    // A site's full-response fit blanks the parameters the data cannot fix (the
    // linear-plateau's slope and join, the exponential's rate constant), so its
    // curve has no value past the check; the plateau its drawn curve keeps (flat from
    // `high` on) prices `high`.
    const drawn = 'curve' in fit ? (fit as Pick<ModelFit, 'curve'>).curve : undefined;
    const last = drawn ? drawn.yieldKgHa.length - 1 : -1;
    let zero = netReturn(fit, prices, 0);
    let atHigh = netReturn(fit, prices, high);
    const plateau = last >= 0 ? drawn!.yieldKgHa[last] : NaN;
    if (!Number.isFinite(atHigh) && Number.isFinite(plateau) && drawn!.rateKgHa[0] === 0) {
      zero = prices.grainPricePerKg * drawn!.yieldKgHa[0];
      atHigh = prices.grainPricePerKg * plateau - rateCostPerHa(prices, high);
    }
    if (!(atHigh > zero)) {
      const c = core(fit, pr, 'full-response-does-not-pay', 'zero', 0);
      c.uncappedRateKgHa = 0;
      c.rangeKgHa = [low, high];
      c.yieldKgHa = curveValue(fit.model, fit.params, 0);
      c.netReturnPerHa = zero;
      c.gainOverCheckPerHa = 0;
      return c;
    }
    const c = core(fit, pr, 'full-response', 'join-in-first-interval', null);
    c.rangeKgHa = [low, high];
    const yHigh = curveValue(fit.model, fit.params, high);
    c.yieldKgHa = Number.isFinite(yHigh) ? yHigh : plateau;
    c.netReturnPerHa = atHigh;
    c.gainOverCheckPerHa = atHigh - zero;
    return c;
  }
  if (fit.status !== 'ok') return core(fit, pr, 'no-fit', 'not-available', null);

  const highest = fit.testedRates.highestKgHa;
  const entry = MODEL_CURVES[fit.model];
  const { rateKgHa: raw, agronomicMaxKgHa: agronomicMax } = entry.optimum(fit.params, pr, highest);
  let status: OptimumStatus = 'interior';
  let reason: OptimumReason = 'interior';
  let x = raw;
  let capped = false;
  if (!(x > 0)) {
    x = 0;
    status = 'zero';
    reason = 'first-unit-loses';
  } else if (x > highest) {
    x = highest;
    capped = true;
    status = 'capped-at-highest';
    reason = 'capped';
  }
  if (!entry.isCurve) {
    status = x > 0 || capped ? 'corner' : 'zero';
    reason = x > 0 ? 'line-corner-high' : 'line-corner-zero';
    capped = false;
  }
  const zeroReturn = netReturn(fit, prices, 0);
  let atX = netReturn(fit, prices, x);
  const costly = x > 0 && !(atX > zeroReturn);
  const c = core(fit, pr, reason, status, x);
  if (costly) {
    // The application cost is larger than what the nutrient returns; the sentence names x.
    c.reason = 'application-cost';
    c.rangeKgHa = [x, x];
    x = 0;
    c.status = 'zero';
    capped = false;
    atX = zeroReturn;
    c.rateKgHa = 0;
  }
  c.uncappedRateKgHa = raw;
  c.yieldKgHa = curveValue(fit.model, fit.params, x);
  c.netReturnPerHa = atX;
  c.gainOverCheckPerHa = atX - zeroReturn;
  c.agronomicMaxRateKgHa = agronomicMax;
  c.cappedAtHighest = capped;
  return c;
}

/** The sentence that explains an optimum, with rates in the caller's format. */
function explain(c: OptimumCore, fit: CurveSummary, format: RateFormat): string {
  const highest = fit.testedRates.highestKgHa;
  switch (c.reason) {
    case 'full-response-does-not-pay':
      return `The full response is reached by ${rateText(format, c.rangeKgHa![1])}, but at these prices it does not pay for that rate.`;
    case 'full-response':
      return `Full response by the lowest non-zero rate: the optimum lies between ${rateRangeText(format, c.rangeKgHa![0], c.rangeKgHa![1])}; these rates cannot place it more precisely.`;
    case 'no-fit':
      return NO_OPTIMUM_REASON[fit.status] ?? 'No optimum.';
    case 'first-unit-loses':
      return 'At this price ratio the first unit of nutrient already returns less than it costs: the optimum is no nutrient.';
    case 'capped':
      return `The formula gives ${rateText(format, c.uncappedRateKgHa)}, past the highest tested rate; the curve is not known there, so the highest tested rate (${rateText(format, highest)}) is given and flagged.`;
    case 'interior':
      return `Economic optimum ${rateText(format, c.rateKgHa!)}, where the curve's slope equals the price ratio (nutrient price over grain price).`;
    case 'line-corner-high':
      return `A straight line never levels off: its slope stays above the price ratio, so the optimum is the corner at the highest tested rate, ${rateText(format, highest)}; a curve with a plateau says more.`;
    case 'line-corner-zero':
      return "A straight line's slope below the price ratio puts the optimum at the corner, no nutrient.";
    case 'application-cost':
      return `At ${rateText(format, c.rangeKgHa![0])} the gain does not cover the nutrient and application cost, so the optimum is no application.`;
  }
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
  const c = optimumCore(fit, prices);
  // Field by field: V8 builds a spread copy followed by more properties slowly, and re-pricing
  // runs this thousands of times.
  return {
    model: c.model,
    priceRatio: c.priceRatio,
    status: c.status,
    rateKgHa: c.rateKgHa,
    uncappedRateKgHa: c.uncappedRateKgHa,
    // A range is part of the result only where the optimum is a range of rates.
    rangeKgHa: c.status === 'join-in-first-interval' ? c.rangeKgHa : null,
    yieldKgHa: c.yieldKgHa,
    netReturnPerHa: c.netReturnPerHa,
    gainOverCheckPerHa: c.gainOverCheckPerHa,
    agronomicMaxRateKgHa: c.agronomicMaxRateKgHa,
    cappedAtHighest: c.cappedAtHighest,
    explanation: explain(c, fit, options.rateFormat ?? KG_HA_FORMAT),
    cautions: recommendationCautions,
  };
}
