/**
 * Re-pricing on the main thread, with no refit: each site's optimum comes from
 * its leading model's parameters by the closed forms in shared/economics; the
 * regional return is the pipeline's, re-priced by repriceAcrossSites after the
 * user's model choices are applied (chooseSiteModels). Which model leads is
 * the pipeline's rule (shared/sites leadingModel): the user's pick, else the
 * site's recommendation model, so the screen and the workbook agree.
 */
import { economicOptimum, type EconomicOptimum } from '../../../shared/economics/economicOptimum';
import type { Prices } from '../../../shared/economics/priceRatio';
import type { ModelName } from '../../../shared/models/modelTypes';
import type { AcrossSiteAnalysis } from '../../../shared/analysis/analyzeAcrossSites';
import { leadingModel } from '../../../shared/analysis/leadingModel';
import type { RegionalReturn } from '../../../shared/analysis/regionalReturn';
import { repriceAcrossSites } from '../../../shared/analysis/repriceAcrossSites';
import type { FitData, SiteAnalysis } from './siteAnalysis';

/**
 * Each site's leading model.
 * @param analysis - the pipeline's analysis
 * @param choices - site → model the user picked
 * @returns site → the user's model when fitted, else the recommendation model (null: none)
 */
export function siteLeads(
  analysis: AcrossSiteAnalysis,
  choices: Readonly<Record<string, ModelName>>,
): Record<string, ModelName | null> {
  return Object.fromEntries(analysis.sites.map((s) => [s.site, leadingModel(s, choices)]));
}

/** One site's optimum at the current prices, with the fit it comes from. */
export interface SiteOptimum {
  site: string;
  model: ModelName | null;
  fit: FitData | null;
  optimum: EconomicOptimum | null;
  /** Why there is no optimum, when there is none. */
  reason: string | null;
}

/**
 * The optimum of every site at one set of prices.
 * @param sites - the sites as the screen shows them
 * @param leads - site → its leading model (siteLeads)
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @returns one entry per site, in order
 */
export function siteOptima(
  sites: readonly SiteAnalysis[],
  leads: Readonly<Record<string, ModelName | null>>,
  prices: Prices,
): SiteOptimum[] {
  return sites.map((site) => {
    const model = leads[site.site] ?? null;
    const fit = model ? (site.fits[model] ?? null) : null;
    if (!model || !fit) {
      return {
        site: site.site,
        model,
        fit,
        optimum: null,
        reason: site.problem ?? 'No model gave an economic optimum at this site.',
      };
    }
    try {
      return { site: site.site, model, fit, optimum: economicOptimum(fit, prices), reason: null };
    } catch (error) {
      return {
        site: site.site,
        model,
        fit,
        optimum: null,
        reason: error instanceof Error ? error.message : String(error),
      };
    }
  });
}

/**
 * The regional return at one set of prices (the side-by-side rows are left as they are:
 * the model table prices its own rows).
 * @param analysis - the pipeline's analysis with the user's models (chooseSiteModels)
 * @param prices - canonical prices
 * @returns best rate, profitable range, site optima; null when no site has a usable curve
 */
export function regionalAtPrices(
  analysis: AcrossSiteAnalysis,
  prices: Prices,
): RegionalReturn | null {
  const priced = repriceAcrossSites(analysis, prices, { rows: false });
  return priced.regional.sitesUsed.length > 0 ? priced.regional.regional : null;
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
