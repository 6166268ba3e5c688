/**
 * The across step's regional plateau mixed models: the quadratic-plateau and the
 * linear-plateau fitted to the same site-years as the quadratic's (mixedModelSites), so their
 * ML AICs compare with its. Price-free: each optimum is priced later from the stored fixed
 * effects (plateauMixedModelOptimum).
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

/**
 * Fits every plateau form as a regional mixed model (Ψ diagonal).
 * @param plots - the sites' plots (kg/ha), as planned
 * @param sites - analyzeSite of each, same order
 * @returns one entry per form of PLATEAU_MIXED_FORMS: the fit, or why there is none
 * @example
 * plateauMixedModelsAcrossSites(plan.plots, sites).map((m) => m.model) // ['quadraticPlateau', 'linearPlateau']
 */
export function plateauMixedModelsAcrossSites(
  plots: readonly SitePlots[],
  sites: readonly SiteAnalysis[],
): (RegionalPlateauMixedModel | NoRegionalPlateauMixedModel)[] {
  const input = mixedModelSites(plots, sites);
  return PLATEAU_MIXED_FORMS.map((form) => fitRegionalPlateauMixedModel(input, form));
}
