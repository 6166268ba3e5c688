/**
 * Re-pricing: the part of the analysis that depends on prices, done on the
 * main thread because it needs no refit. Each site's optimum comes from its
 * chosen model's parameters by the closed forms in shared/economics; the
 * regional curve re-prices a gain matrix evaluated once per set of fits
 * (shared/sites/regionalReturn). Together they take well under a frame for
 * 50 sites (bench/renderer.bench.ts).
 */
import { economicOptimum, type EconomicOptimum } from '../../../shared/economics/economicOptimum';
import type { Prices } from '../../../shared/economics/priceRatio';
import { curveValue } from '../../../shared/models/curveValue';
import type { ModelName } from '../../../shared/models/modelTypes';
import { rateGrid } from '../../../shared/sites/rateGrid';
import {
  prepareRegionalReturn,
  regionalReturnAtPrices,
  type PreparedRegionalReturn,
  type RegionalReturn,
} from '../../../shared/sites/regionalReturn';
import type { FitData, SiteAnalysis } from './siteAnalysis';

/** Optimum statuses that give a rate a page can print. */
const GIVES_RATE = new Set(['interior', 'zero', 'capped-at-highest', 'corner']);
/** Curves, preferred over straight lines (a line only gives a corner rate). */
const CURVES = new Set<ModelName>([
  'quadratic',
  'linearPlateau',
  'quadraticPlateau',
  'exponential',
]);

/**
 * Which model leads at a site: the user's choice; else the same rule the
 * report writer uses (shared/report/analyzeTrials), so the screen and the
 * workbook agree — the lowest-AICc curve whose optimum is a rate, else the
 * lowest-AICc model with a rate, else the best by AICc.
 * @param site - the site's analysis
 * @param choices - site → model the user picked
 * @param prices - canonical prices (which fits give a rate depends on them); null skips that test
 * @returns the leading model, or null when nothing was fitted
 */
export function leadingModel(
  site: SiteAnalysis,
  choices: Readonly<Record<string, ModelName>>,
  prices: Prices | null = null,
): ModelName | null {
  const chosen = choices[site.site];
  if (chosen && site.fits[chosen]) return chosen;
  if (!prices) return site.best;
  const ranked = site.ranking.filter((r) => r.rank !== null).map((r) => r.model);
  const givesRate = (model: ModelName) => {
    const fit = site.fits[model];
    if (!fit) return false;
    try {
      return GIVES_RATE.has(economicOptimum(fit, prices).status);
    } catch {
      return false;
    }
  };
  const usable = ranked.filter(givesRate);
  return usable.find((m) => CURVES.has(m)) ?? usable[0] ?? site.best;
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
 * @param sites - price-free analyses from the worker
 * @param choices - site → model the user picked
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @returns one entry per site, in order
 */
export function siteOptima(
  sites: readonly SiteAnalysis[],
  choices: Readonly<Record<string, ModelName>>,
  prices: Prices,
): SiteOptimum[] {
  return sites.map((site) => {
    const model = leadingModel(site, choices, prices);
    const fit = model ? (site.fits[model] ?? null) : null;
    if (!model || !fit) {
      return {
        site: site.site,
        model,
        fit,
        optimum: null,
        reason: site.problem ?? 'No model could be ranked at this site.',
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

/** Step of the regional rate grid, kg/ha: finer than any rate a spreader can set. */
export const REGIONAL_GRID_STEP_KG_HA = 1;

/**
 * The price-free part of the regional curve: each site's leading curve as gain
 * over its own check, evaluated once on a rate grid across the tested range.
 * @param sites - price-free analyses
 * @param leading - site → its leading model (see siteOptima)
 * @returns the prepared gains, or null when no site has a usable curve
 */
export function prepareRegional(
  sites: readonly SiteAnalysis[],
  leading: Readonly<Record<string, ModelName | null>>,
): PreparedRegionalReturn | null {
  const curves = [];
  let highest = 0;
  for (const site of sites) {
    const model = leading[site.site] ?? null;
    const fit = model ? site.fits[model] : undefined;
    if (!model || !fit) continue;
    highest = Math.max(highest, fit.testedRates.highestKgHa);
    const params = fit.params;
    const check = curveValue(model, params, 0);
    curves.push({ site: site.site, gainKgHa: (x: number) => curveValue(model, params, x) - check });
  }
  if (curves.length === 0 || !(highest > 0)) return null;
  return prepareRegionalReturn(curves, rateGrid(0, highest, REGIONAL_GRID_STEP_KG_HA));
}

/**
 * The regional return at one set of prices.
 * @param prepared - from prepareRegional
 * @param prices - canonical prices
 * @returns best rate, profitable range, site optima; null without a prepared curve
 */
export function regionalAtPrices(
  prepared: PreparedRegionalReturn | null,
  prices: Prices,
): RegionalReturn | null {
  return prepared ? regionalReturnAtPrices(prepared, prices) : null;
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
