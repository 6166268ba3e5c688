/**
 * The across step's regional mixed model: every site-year with plots to fit enters, responding
 * or not (the model's random effects are how site-years differ, so leaving out the flat ones
 * would bias the regional curve upwards). Block offsets go in where the site's own fits used
 * them (analyzeSite's `blocks`, decided by hasBlocks), as fixed effects nested in the site.
 * Price-free: the optimum is priced later from the stored fixed effects (mixedModelOptimum).
 */
import type { SiteAnalysis } from './analyzeSite';
import {
  fitRegionalMixedModel,
  type MixedModelSite,
  type NoRegionalMixedModel,
  type RegionalMixedModel,
} from './regionalMixedModel';
import type { SitePlots } from './sitePlots';

/**
 * Fits the regional quadratic mixed model to the site-years of an across-site analysis.
 * @param plots - the sites' plots (kg/ha), as planned
 * @param sites - analyzeSite of each, same order
 * @returns the fitted model in kg/ha, or why there is none
 * @example
 * mixedModelAcrossSites(plan.plots, sites).model // 'quadratic' or null
 */
export function mixedModelAcrossSites(
  plots: readonly SitePlots[],
  sites: readonly SiteAnalysis[],
): RegionalMixedModel | NoRegionalMixedModel {
  return fitRegionalMixedModel(mixedModelSites(plots, sites));
}

/**
 * The site-years every regional mixed model reads (the quadratic and the plateau forms alike):
 * each with plots and no problem, with its block labels where its own fits used blocks.
 * @param plots - the sites' plots (kg/ha), as planned
 * @param sites - analyzeSite of each, same order
 * @returns the mixed models' input
 * @example
 * mixedModelSites(plan.plots, sites).length // site-years with plots
 */
export function mixedModelSites(
  plots: readonly SitePlots[],
  sites: readonly SiteAnalysis[],
): MixedModelSite[] {
  const input: MixedModelSite[] = [];
  plots.forEach((p, i) => {
    if (p.problem || sites[i].problem || p.rateKgHa.length === 0) return;
    input.push({
      site: p.site,
      rateKgHa: [...p.rateKgHa],
      yieldKgHa: [...p.yieldKgHa],
      block: sites[i].blocks === 'fixed' ? p.block.map((b) => b ?? '') : undefined,
    });
  });
  return input;
}
