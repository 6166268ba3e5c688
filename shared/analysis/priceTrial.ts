/**
 * An analysis at a set of prices and the user's model picks, without refitting
 * or resampling: each site's leading model (leadingModel), its optimum by the
 * closed forms of shared/economics, its interval from the stored bootstrap
 * draws, its profitable range on the fitted curve, and the across-site rows and
 * regional rate (chooseSiteModels, repriceAcrossSites). Every view (screen,
 * workbook, grower page, JSON, command-line summary) reads this one value.
 */
import type { BootstrapDraws } from '../economics/bootstrapDraws';
import { economicOptimum, type EconomicOptimum } from '../economics/economicOptimum';
import { optimumAcrossModels, type OptimumComparison } from '../economics/optimumAcrossModels';
import { optimumInterval, type OptimumInterval } from '../economics/optimumInterval';
import { assertPrices, type Prices } from '../economics/priceRatio';
import { curveValue } from '../models/curveValue';
import type { ModelName } from '../models/modelTypes';
import type { AcrossSiteAnalysis } from './acrossSites';
import type { TrialAnalysis } from './analyzeTrial';
import type { SiteAnalysis } from './analyzeSite';
import { chooseSiteModels } from './chooseSiteModels';
import { leadingModel } from './leadingModel';
import { rateGrid } from './rateGrid';
import {
  prepareRegionalReturn,
  regionalReturnAtPrices,
  type PreparedRegionalReturn,
} from './regionalReturn';
import { repriceAcrossSites } from './repriceAcrossSites';

/** The model that leads a site, and why. */
export interface SiteLead {
  model: ModelName | null;
  /** A phrase without a final stop ("lowest AICc of the curves …", "picked by the analyst …"). */
  reason: string;
  /** True when the analyst's pick leads instead of the rule's model. */
  picked: boolean;
}

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
  /** Rates within the analysis' band of the best return on the leading curve, kg/ha. */
  profitableRangeKgHa: [number, number] | null;
  /**
   * The ranked curves' optima side by side (optimumAcrossModels): their spread, and a warning
   * when they lie more than 20 kg/ha apart, because then the choice of model matters.
   */
  acrossModels: OptimumComparison | null;
}

export interface PricedTrial {
  prices: Prices;
  /** Site → the analyst's model, as given. */
  choices: Readonly<Record<string, ModelName>>;
  /** The across-site analysis with these choices at these prices (rows, regional rate, groups). */
  across: AcrossSiteAnalysis;
  /** One entry per site, in the analysis' order. */
  sites: PricedSite[];
}

/** The leading model of one site and the reason to print beside it. */
export function siteLead(s: SiteAnalysis, choices: Readonly<Record<string, ModelName>>): SiteLead {
  const model = leadingModel(s, choices);
  const rec = s.recommended.model;
  if (model === rec) return { model, reason: s.recommended.reason, picked: false };
  const instead = rec
    ? `the ${s.fits!.fits[rec].label.toLowerCase()} (${s.recommended.reason})`
    : `no model (${s.recommended.reason})`;
  return { model, reason: `picked by the analyst instead of ${instead}`, picked: true };
}

/**
 * Each fitted curve's gain over its check on a fine grid of its tested rates: price-free, so it
 * is made once per fit and kept with it (a slider then costs only the pricing of the grid).
 */
const preparedCurves = new WeakMap<object, PreparedRegionalReturn>();

/** Rates within `bandPerHa` of the best return on one fitted curve, kg/ha. */
function profitableRange(
  s: SiteAnalysis,
  model: ModelName,
  prices: Prices,
  bandPerHa: number,
): [number, number] {
  const fit = s.fits!.fits[model];
  let prepared = preparedCurves.get(fit);
  if (!prepared) {
    const t = fit.testedRates;
    const step = Math.max((t.highestKgHa - t.lowestKgHa) / 400, 0.25);
    const at0 = curveValue(model, fit.params, 0);
    prepared = prepareRegionalReturn(
      [{ site: s.site, gainKgHa: (x) => curveValue(model, fit.params, x) - at0 }],
      rateGrid(t.lowestKgHa, t.highestKgHa, step),
    );
    preparedCurves.set(fit, prepared);
  }
  const r = regionalReturnAtPrices(prepared, prices, { bandPerHa });
  return [r.profitableRange.lowKgHa, r.profitableRange.highKgHa];
}

/**
 * The interval that goes with a site's lead. The rule's model gets the interval with the
 * model chosen again in each resample (the choice is part of the estimate). An analyst's pick
 * keeps the interval of that model alone: the analyst has fixed the model, so the interval
 * answers "if this curve is right", and the lead's reason says it was picked.
 */
function siteInterval(
  draws: BootstrapDraws,
  lead: SiteLead,
  model: ModelName,
  prices: Prices,
  level: number,
): OptimumInterval | null {
  return optimumInterval(
    draws,
    model,
    prices,
    level,
    lead.picked ? 'fixed-model' : 'model-reselected',
  );
}

/**
 * One site at these prices and picks.
 * @param s - the site's analysis
 * @param prices - canonical prices
 * @param choices - site → the analyst's model
 * @param level - interval level, e.g. 0.9
 * @param bandPerHa - profitable band, currency/ha
 * @returns the site's lead, optimum, interval and profitable range
 */
export function priceSite(
  s: SiteAnalysis,
  prices: Prices,
  choices: Readonly<Record<string, ModelName>>,
  level: number,
  bandPerHa: number,
): PricedSite {
  const lead = siteLead(s, choices);
  const fit = lead.model && s.fits ? s.fits.fits[lead.model] : null;
  if (!lead.model || !fit) {
    return {
      site: s.site,
      lead,
      optimum: null,
      interval: null,
      profitableRangeKgHa: null,
      acrossModels: null,
    };
  }
  return {
    site: s.site,
    lead,
    optimum: economicOptimum(fit, prices),
    interval: s.draws ? siteInterval(s.draws, lead, lead.model, prices, level) : null,
    profitableRangeKgHa: profitableRange(s, lead.model, prices, bandPerHa),
    acrossModels: optimumAcrossModels(s.fits!.fits, s.fits!.ranking, prices),
  };
}

/**
 * The analysis at these prices and model picks.
 * @param analysis - from analyzeTrial
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @param choices - site → the model the analyst picked (a model the site has no fit of is ignored)
 * @returns the priced trial every view reads
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * const priced = priceTrial(analysis, { ...prices, nutrientPricePerKg: 1.4 }, {});
 * priced.across.regional.regional.bestRateKgHa // lower than at the first prices
 */
export function priceTrial(
  analysis: TrialAnalysis,
  prices: Prices,
  choices: Readonly<Record<string, ModelName>>,
): PricedTrial {
  assertPrices(prices);
  const across = repriceAcrossSites(chooseSiteModels(analysis.across, choices), prices);
  const { intervalLevel } = analysis.settings;
  const band = across.options.bandPerHa;
  return {
    prices: { ...prices },
    choices: { ...choices },
    across,
    sites: across.sites.map((s) => priceSite(s, prices, choices, intervalLevel, band)),
  };
}
