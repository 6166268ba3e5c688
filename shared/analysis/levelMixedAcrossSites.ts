/**
 * The across step's regional model by level: for each treatment factor, every site-year with two
 * levels or more of it (trialLevels' sites) enters the regional quadratic with the level as a
 * fixed effect (regionalLevelMixedModel), its plots as its level test read them: fertilized plots
 * with their level, the shared checks once, plots without a level left out, and block offsets
 * where that test used them. A level's name is matched across site-years as written.
 * Price-free: each level's optimum is priced later from the stored fixed effects
 * (priceLevelMixedModel).
 */
import type { PlotTable } from '../table/plotTable';
import type { SiteLevelsAnalysis } from './analyzeLevels';
import {
  fitRegionalLevelMixedModel,
  type LevelMixedModelSite,
  type NoRegionalLevelMixedModel,
  type RegionalLevelMixedModel,
} from './regionalLevelMixedModel';
import { splitSiteLevels } from './siteLevels';
import type { SitePlots } from './sitePlots';

/**
 * Fits the regional model by level for every factor found at some site.
 * @param table - the plot table (each plot's factor cells)
 * @param plots - its sites' analyzable plots, in table order (as trialLevels was given)
 * @param levels - trialLevels' result
 * @returns one entry per factor with levels at some site, in the table's factor order: the fit
 *   in kg/ha, or why there is none (e.g. fewer than 4 site-years)
 * @example
 * levelMixedAcrossSites(table, plan.plots, analysis.levels)[0].model // 'quadratic-by-level' or null
 */
export function levelMixedAcrossSites(
  table: PlotTable,
  plots: readonly SitePlots[],
  levels: readonly SiteLevelsAnalysis[],
): (RegionalLevelMixedModel | NoRegionalLevelMixedModel)[] {
  const byId = new Map(table.plots.map((p) => [p.id, p]));
  const bySite = new Map(plots.map((p) => [p.site, p]));
  const out: (RegionalLevelMixedModel | NoRegionalLevelMixedModel)[] = [];
  for (const factor of table.factorKeys ?? []) {
    const found = levels.filter((l) => l.factor === factor);
    if (found.length === 0) continue;
    const names: string[] = [];
    const sites: LevelMixedModelSite[] = [];
    for (const l of found) {
      const site = bySite.get(l.site);
      if (!site) continue;
      const split = splitSiteLevels(site, factor, (id) => byId.get(id)?.groups[factor] ?? null);
      const global = split.levels.map((v) => {
        const k = names.indexOf(v.level);
        return k >= 0 ? k : names.push(v.level) - 1;
      });
      const keep: number[] = [];
      split.levelIndex.forEach((k, i) => {
        if (k !== -2) keep.push(i);
      });
      sites.push({
        site: site.site,
        rateKgHa: keep.map((i) => site.rateKgHa[i]),
        yieldKgHa: keep.map((i) => site.yieldKgHa[i]),
        block: l.test.blocks === 'fixed' ? keep.map((i) => site.block[i] ?? '') : undefined,
        levelIndex: keep.map((i) => (split.levelIndex[i] < 0 ? -1 : global[split.levelIndex[i]])),
      });
    }
    out.push(fitRegionalLevelMixedModel(sites, names, factor));
  }
  return out;
}
