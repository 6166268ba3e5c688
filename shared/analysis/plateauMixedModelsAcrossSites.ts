/**
 * The across step's regional plateau mixed models: the quadratic-plateau and the
 * linear-plateau fitted to the same site-years as the quadratic's (mixedModelSites), so their
 * ML AICs compare with its. Price-free: each optimum is priced later from the stored fixed
 * effects (plateauMixedModelOptimum).
 *
 * Bounded: above PLATEAU_MIXED_MAX_SITE_YEARS site-years the plateau forms are not fitted in
 * the analysis run (each entry says why). Each round of their alternating fit re-linearizes
 * every site-year, so the cost grows with the site-years and the rounds: measured in
 * `npm run bench -- mixedModel`, under 1 s CPU per form at 1,000 site-years × 24 plots (17
 * rounds converged, 30 settled); at 2,000 the linear-plateau cycled without settling through
 * all 60 rounds (4 s CPU). The cap is the largest size measured to stay near a second.
 */
import type { SiteAnalysis } from './analyzeSite';
import { mixedModelSites } from './mixedModelAcrossSites';
import {
  fitRegionalPlateauMixedModel,
  PLATEAU_MIXED_FORMS,
  type NoRegionalPlateauMixedModel,
  type RegionalPlateauMixedModel,
} from './regionalPlateauMixedModel';
import type { SitePlots } from './sitePlots';

/** The most site-years for which the analysis fits the plateau forms. */
export const PLATEAU_MIXED_MAX_SITE_YEARS = 1000;

/**
 * Fits every plateau form as a regional mixed model (Ψ diagonal).
 * @param plots - the sites' plots (kg/ha), as planned
 * @param sites - analyzeSite of each, same order
 * @returns one entry per form of PLATEAU_MIXED_FORMS: the fit, or why there is none (including
 *   more than PLATEAU_MIXED_MAX_SITE_YEARS site-years)
 * @example
 * plateauMixedModelsAcrossSites(plan.plots, sites).map((m) => m.model) // ['quadraticPlateau', 'linearPlateau']
 */
export function plateauMixedModelsAcrossSites(
  plots: readonly SitePlots[],
  sites: readonly SiteAnalysis[],
): (RegionalPlateauMixedModel | NoRegionalPlateauMixedModel)[] {
  const input = mixedModelSites(plots, sites);
  if (input.length > PLATEAU_MIXED_MAX_SITE_YEARS) {
    return PLATEAU_MIXED_FORMS.map((form) => ({
      model: null,
      form,
      reason: `Not fitted: ${input.length} site-years, more than the ${PLATEAU_MIXED_MAX_SITE_YEARS} for which the analysis fits the plateau forms as mixed models (their fit re-linearizes every site-year at every round).`,
    }));
  }
  return PLATEAU_MIXED_FORMS.map((form) => fitRegionalPlateauMixedModel(input, form));
}
