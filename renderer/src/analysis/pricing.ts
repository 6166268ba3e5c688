/**
 * Re-pricing on the main thread, with no refit and no new bootstrap: the one
 * priced view of shared/analysis (priceTrial: each site's leading model, its
 * optimum by the closed forms, its interval from the stored draws, the regional
 * rate) reshaped for the components. Which model leads is the analysis' rule
 * (leadingModel: the user's pick, else the site's recommendation model), so the
 * screen, the workbook and the command line agree.
 */
import { keptOnFirstRead } from '../../../shared/analysis/keptOnFirstRead';
import { economicOptimum, type EconomicOptimum } from '../../../shared/economics/economicOptimum';
import type { OptimumProfileInterval } from '../../../shared/economics/optimumProfile';
import type { Prices } from '../../../shared/economics/priceRatio';
import type { ModelName } from '../../../shared/models/modelTypes';
import type { TrialAnalysis } from '../../../shared/analysis/analyzeTrial';
import { leadingModel } from '../../../shared/analysis/leadingModel';
import type { PricedTrial } from '../../../shared/analysis/priceTrial';
import type { RecommendationBasis } from '../../../shared/analysis/siteDecision';
import type { RegionalReturn } from '../../../shared/analysis/regionalReturn';
import type { FitData, SiteAnalysis } from './siteAnalysis';

/**
 * Each site's leading model (price-free, so a price change does not rebuild what reads it).
 * @param analysis - the trial's analysis
 * @param choices - site → model the user picked
 * @returns site → the user's model when fitted, else the recommendation model (null: none)
 */
export function siteLeads(
  analysis: TrialAnalysis,
  choices: Readonly<Record<string, ModelName>>,
): Record<string, ModelName | null> {
  return Object.fromEntries(analysis.across.sites.map((s) => [s.site, leadingModel(s, choices)]));
}

/** One site's optimum at the current prices, with the fit it comes from. */
export interface SiteOptimum {
  site: string;
  model: ModelName | null;
  fit: FitData | null;
  optimum: EconomicOptimum | null;
  /** What the recommendation rests on (siteDecision); null without a leading model. */
  basis: RecommendationBasis | null;
  /** The bootstrap interval of the optimum, kg/ha; null when there is none. */
  intervalKgHa: [number, number] | null;
  /** The optimum's profile interval beside it (priceTrial's optimumProfile); null when there is none. */
  profile: OptimumProfileInterval | null;
  /**
   * Lowest and highest optimum of the ranked curves when they lie far apart (optimumAcrossModels
   * warns), kg/ha; null when they agree.
   */
  spreadKgHa: [number, number] | null;
  /** Why there is no optimum, when there is none. */
  reason: string | null;
}

/** Why a site has no leading model, as a sentence: the decision's own reason. */
function leadReason(reason: string | undefined): string {
  if (!reason) return 'No model gave an economic optimum at this site.';
  return `No rate is recommended: ${reason}.`;
}

/**
 * The optimum of every site in a priced view.
 * @param sites - the sites as the screen shows them
 * @param priced - the priced analysis (same site order)
 * @returns one entry per site, in order
 */
export function siteOptima(sites: readonly SiteAnalysis[], priced: PricedTrial): SiteOptimum[] {
  return sites.map((site, i) => {
    const p = priced.sites[i];
    const model = p?.lead.model ?? null;
    const fit = model ? (site.fits[model] ?? null) : null;
    const optimum: SiteOptimum = {
      site: site.site,
      model,
      fit,
      optimum: fit ? p.optimum : null,
      basis: fit ? (p.lead.basis ?? null) : null,
      intervalKgHa: null,
      profile: fit ? p.optimumProfile : null,
      spreadKgHa: p?.acrossModels?.warning
        ? [p.acrossModels.lowestRateKgHa, p.acrossModels.highestRateKgHa]
        : null,
      reason: fit ? null : (site.problem ?? leadReason(p?.lead.reason)),
    };
    // Read by the one-site step for the site on screen; the prices step's table of every site
    // shows optima only, so the intervals of the others are never made (priceSite's interval).
    keptOnFirstRead(optimum, 'intervalKgHa', () => (fit ? (p.interval?.ciKgHa ?? null) : null));
    return optimum;
  });
}

/**
 * The regional return of a priced view.
 * @param priced - the priced analysis
 * @returns best rate, profitable range, site optima; null when no site has a usable curve
 */
export function regionalOf(priced: PricedTrial): RegionalReturn | null {
  return priced.across.regional.sitesUsed.length > 0 ? priced.across.regional.regional : null;
}

/**
 * Every fitted model's optimum at one site, for the model table.
 * @param site - the site's analysis
 * @param prices - canonical prices
 * @returns model → optimum (null where the economics refuses the fit)
 */
export function modelOptima(
  site: SiteAnalysis,
  prices: Prices,
): Partial<Record<ModelName, EconomicOptimum | null>> {
  const out: Partial<Record<ModelName, EconomicOptimum | null>> = {};
  for (const [model, fit] of Object.entries(site.fits) as [ModelName, FitData][]) {
    try {
      out[model] = economicOptimum(fit, prices);
    } catch {
      out[model] = null;
    }
  }
  return out;
}
