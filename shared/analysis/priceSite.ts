/**
 * One site at a set of prices and the analyst's picks, without refitting or resampling: its
 * leading model (siteDecision), its optimum by the closed forms of shared/economics, its interval
 * from the stored bootstrap draws, its profitable range on the fitted curve, how its
 * recommendation moves with the price ratio (priceRatioSensitivity) and the risk of each
 * candidate rate (shortfallRisk). priceTrial prices every site with it, and priceLevels every
 * treatment level (moved here from priceTrial.ts unchanged, so both can call it).
 */
import {
  economicOptimum,
  recommendedRateKgHa,
  type EconomicOptimum,
} from '../economics/economicOptimum';
import { optimumAcrossModels, type OptimumComparison } from '../economics/optimumAcrossModels';
import { optimumIntervals, type OptimumInterval } from '../economics/optimumInterval';
import { optimumProfileInterval, type OptimumProfileInterval } from '../economics/optimumProfile';
import type { Prices } from '../economics/priceRatio';
import { keptOnFirstRead } from './keptOnFirstRead';
import {
  PRICE_RATIO_MULTIPLIERS,
  priceRatioSensitivity,
  pricesAtRatioMultiple,
  type RatioMultiple,
} from '../economics/priceRatioSensitivity';
import { shortfallRisk } from '../economics/shortfallRisk';
import { candidateRates, toleranceInForce, type ShortfallRisk } from '../economics/shortfallRule';
import type { IntervalBasis } from '../economics/drawChoices';
import { curveValue } from '../models/curveValue';
import type { ModelName } from '../models/modelTypes';
import type { FitData, SiteAnalysis } from './analyzeSite';
import { rateGrid } from './rateGrid';
import {
  prepareRegionalReturn,
  profitableRangeAtPrices,
  type PreparedRegionalReturn,
} from './regionalReturn';
import {
  noResponseSentence,
  siteDecision,
  siteGainCurve,
  type RecommendationBasis,
  type SiteLead,
} from './siteDecision';

/** One site at these prices. */
export interface PricedSite {
  site: string;
  lead: SiteLead;
  /** The leading model's optimum at these prices; null without a leading model. */
  optimum: EconomicOptimum | null;
  /**
   * The bootstrap interval of the site's optimum; null without draws. With the rule's model
   * the model is chosen again inside every resample ("model-reselected"); with the analyst's
   * pick it is that model's interval ("fixed-model"), see priceSite.
   */
  interval: OptimumInterval | null;
  /**
   * The profile interval of the leading model's optimum at these prices, beside the bootstrap
   * interval (optimumProfileInterval: the linear-plateau's join interval when its slope pays,
   * the quadratic's in closed form); null for the other models, without a leading model and
   * for a site that did not respond.
   */
  optimumProfile: OptimumProfileInterval | null;
  /** Rates within the analysis' band of the best return on the leading curve, kg/ha. */
  profitableRangeKgHa: [number, number] | null;
  /**
   * The ranked curves' optima side by side (optimumAcrossModels): their spread, and a warning
   * when they lie more than 20 kg/ha apart, because then the choice of model matters.
   */
  acrossModels: OptimumComparison | null;
  /**
   * The recommended rate and its interval at the price ratio scaled by 0.5, 0.75, 1, 1.5 and 2
   * (the nitrogen price scaled, the grain price kept); null without a leading model.
   */
  priceRatioSensitivity: SiteSensitivityRow[] | null;
  /**
   * For the tested rates and the recommended rate: the share of resamples in which the rate
   * returns less than that resample's best by more than the tolerance; null without draws.
   */
  shortfallRisk: ShortfallRisk | null;
}

/** The site's recommendation at one multiple of the price ratio. */
export interface SiteSensitivityRow extends RatioMultiple {
  /** The recommended rate at this ratio (recommendedRateKgHa), kg/ha. */
  rateKgHa: number | null;
  /** Its bootstrap interval at this ratio, kg/ha; null without draws. */
  intervalKgHa: [number, number] | null;
}

/** The leading model of one site, the reason to print beside it and its basis (siteDecision). */
export function siteLead(s: SiteAnalysis, choices: Readonly<Record<string, ModelName>>): SiteLead {
  return siteDecision(s, choices);
}

/**
 * Each fitted curve's gain over its check on a fine grid of its tested rates: price-free, so it
 * is made once per fit and kept with it (a slider then costs only the pricing of the grid).
 */
const preparedCurves = new WeakMap<object, PreparedRegionalReturn>();
/** The same for a non-responding site's flat gain (zero at every rate). */
const preparedFlat = new WeakMap<object, PreparedRegionalReturn>();

/**
 * The grid of a site's profitable range: 400 steps over its tested rates (at least 0.25 kg/ha).
 * Sites tested over the same rates share one grid (it is only read), instead of one new array
 * each: a typed array of this size is an allocation the garbage collector tracks.
 */
const siteGrids = new Map<string, Float64Array>();
function siteGrid(lowestKgHa: number, highestKgHa: number): Float64Array {
  const key = `${lowestKgHa}|${highestKgHa}`;
  let grid = siteGrids.get(key);
  if (!grid) {
    grid = rateGrid(lowestKgHa, highestKgHa, Math.max((highestKgHa - lowestKgHa) / 400, 0.25));
    // A bound, not a cache policy: trials test a handful of ranges.
    if (siteGrids.size >= 256) siteGrids.clear();
    siteGrids.set(key, grid);
  }
  return grid;
}

/** Rates within `bandPerHa` of the best return on one fitted curve, kg/ha. */
function profitableRange(
  s: SiteAnalysis,
  model: ModelName,
  basis: RecommendationBasis | null,
  prices: Prices,
  bandPerHa: number,
): [number, number] {
  const fit = s.fits!.fits[model];
  const flat = basis === 'no-response';
  const cache = flat ? preparedFlat : preparedCurves;
  let prepared = cache.get(fit);
  if (!prepared) {
    const t = fit.testedRates;
    prepared = prepareRegionalReturn(
      [{ site: s.site, gainKgHa: siteGainCurve(fit, basis) }],
      siteGrid(t.lowestKgHa, t.highestKgHa),
    );
    cache.set(fit, prepared);
  }
  const r = profitableRangeAtPrices(prepared, prices, { bandPerHa });
  return [r.lowKgHa, r.highKgHa];
}

/**
 * How a site's resamples are read, for its interval and its shortfall risk alike. The rule's
 * model gets the model chosen again in each resample (the choice is part of the estimate). An
 * analyst's pick keeps that model alone: the analyst has fixed the model, so the interval
 * answers "if this curve is right", and the lead's reason says it was picked.
 */
function resampleBasis(lead: SiteLead): IntervalBasis {
  return lead.picked ? 'fixed-model' : 'model-reselected';
}

/**
 * A non-responding site's optimum: no N, with its own sentence, whatever the curve says
 * (siteDecision). Yield and return are the fitted check's.
 */
function noResponseOptimum(
  fitted: EconomicOptimum,
  fit: FitData,
  prices: Prices,
  rateEffect: SiteAnalysis['rateEffect'],
): EconomicOptimum {
  const at0 = curveValue(fit.model, fit.params, 0);
  const check = Number.isFinite(at0) ? at0 : fit.curve.yieldKgHa[0];
  const p = rateEffect.test.kind === 'f-test' ? rateEffect.test.p : NaN;
  return {
    ...fitted,
    status: 'zero',
    rateKgHa: 0,
    uncappedRateKgHa: 0,
    rangeKgHa: null,
    yieldKgHa: check,
    netReturnPerHa: prices.grainPricePerKg * check,
    gainOverCheckPerHa: 0,
    cappedAtHighest: false,
    explanation: noResponseSentence(p),
  };
}

/**
 * The interval of a non-responding site, widened down to 0 when its resamples' choices all lay
 * above: the site's answer is 0 because the test could not rule out no response, so 0 stays
 * inside the interval; the upper end still says how high the optimum could be if the site did
 * respond (the curves chosen in the resamples). The shares are the resamples' own.
 */
function reachingZero(interval: OptimumInterval): OptimumInterval {
  const ci = interval.ciKgHa;
  return ci && ci[0] > 0 ? { ...interval, ciKgHa: [0, ci[1]] } : interval;
}

/** A site's optimum at one set of prices, as its decision makes it. */
function optimumAt(
  s: SiteAnalysis,
  lead: SiteLead & { model: ModelName },
  fit: FitData,
  prices: Prices,
): EconomicOptimum {
  const fitted = economicOptimum(fit, prices);
  return lead.basis === 'no-response'
    ? noResponseOptimum(fitted, fit, prices, s.rateEffect)
    : fitted;
}

/**
 * The optimum's interval at each set of prices from the site's resamples (one pass over them);
 * null without them.
 */
function intervalsAt(
  s: SiteAnalysis,
  lead: SiteLead & { model: ModelName },
  pricesList: readonly Prices[],
  level: number,
): (OptimumInterval | null)[] {
  if (!s.draws) return pricesList.map(() => null);
  const intervals = optimumIntervals(s.draws, lead.model, pricesList, level, resampleBasis(lead));
  return intervals.map((interval) =>
    lead.basis === 'no-response' && interval ? reachingZero(interval) : interval,
  );
}

/**
 * One site at these prices and picks.
 * @param s - the site's analysis
 * @param prices - canonical prices
 * @param choices - site → the analyst's model
 * @param level - interval level, e.g. 0.9
 * @param tolerancePerHa - the tolerance, currency/ha (the profitable range's band below the best
 *   return and the shortfall risk's limit); default the cost of 10 kg N/ha
 * @returns the site's lead, optimum, interval, profitable range, price-ratio sensitivity and
 *   shortfall risk
 * @throws {StatsInputError} "bad-argument" for a bad price or a negative tolerance
 */
export function priceSite(
  s: SiteAnalysis,
  prices: Prices,
  choices: Readonly<Record<string, ModelName>>,
  level: number,
  tolerancePerHa: number = toleranceInForce(null, prices),
): PricedSite {
  const lead = siteLead(s, choices);
  const model = lead.model;
  const fit = model && s.fits ? s.fits.fits[model] : null;
  if (!model || !fit) {
    return {
      site: s.site,
      lead,
      optimum: null,
      interval: null,
      optimumProfile: null,
      profitableRangeKgHa: null,
      acrossModels: null,
      priceRatioSensitivity: null,
      shortfallRisk: null,
    };
  }
  const led = { ...lead, model };
  const optimum = optimumAt(s, led, fit, prices);
  const priced: PricedSite = {
    site: s.site,
    lead,
    optimum,
    interval: null,
    optimumProfile:
      lead.basis === 'no-response'
        ? null
        : optimumProfileInterval(fit, s.joinProfiles[model] ?? null, prices, level),
    profitableRangeKgHa: profitableRange(s, model, lead.basis, prices, tolerancePerHa),
    acrossModels: optimumAcrossModels(s.fits!.fits, s.fits!.ranking, prices),
    priceRatioSensitivity: null,
    shortfallRisk: null,
  };
  // The interval costs a pass over every resample and candidate model: made when a view reads it.
  keptOnFirstRead(priced, 'interval', () => intervalsAt(s, led, [prices], level)[0]);
  // The 1× row is the recommendation itself; the other rows ask the same functions again, their
  // intervals in one pass over the resamples.
  keptOnFirstRead(priced, 'priceRatioSensitivity', () => {
    const others = PRICE_RATIO_MULTIPLIERS.filter((m) => m !== 1);
    const intervals = intervalsAt(
      s,
      led,
      others.map((m) => pricesAtRatioMultiple(prices, m)),
      level,
    );
    return priceRatioSensitivity(prices, (scaled, m) =>
      m === 1
        ? { rateKgHa: recommendedRateKgHa(optimum), intervalKgHa: priced.interval?.ciKgHa ?? null }
        : {
            rateKgHa: recommendedRateKgHa(optimumAt(s, led, fit, scaled)),
            intervalKgHa: intervals[others.indexOf(m)]?.ciKgHa ?? null,
          },
    );
  });
  keptOnFirstRead(priced, 'shortfallRisk', () =>
    s.draws
      ? shortfallRisk(
          s.draws,
          model,
          resampleBasis(lead),
          prices,
          candidateRates(fit.testedRates.distinctKgHa, recommendedRateKgHa(optimum)),
          tolerancePerHa,
        )
      : null,
  );
  return priced;
}
