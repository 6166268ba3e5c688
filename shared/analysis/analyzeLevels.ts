/**
 * The levels of a rate × factor site analyzed: each level's plots (its fertilized plots and the
 * shared checks, splitSiteLevels) go through the one per-site analysis (analyzeSite: the six
 * fits, the rate effect, the recommendation model, the bootstrap draws), so a level gets every
 * decision a site gets, by the same code. Beside them, the nested tests of whether the levels
 * differ (levelResponseTests).
 *
 * Every level of a site is resampled with the site's own seed (bootstrapSeed of the site's
 * place), and the check's rate is the first stratum drawn, so resample b of every level draws
 * the same check plots: the levels' resamples are paired through their shared check, and the
 * difference between two levels' optima is read resample by resample (priceLevels).
 */
import type { PlotTable } from '../table/plotTable';
import { analyzeSite, type SiteAnalysis } from './analyzeSite';
import { levelResponseTests, type LevelResponseTests } from './levelResponseTest';
import type { AcrossSiteSettings } from './planAcrossSites';
import { factorCrossing } from './factorCrossing';
import { splitSiteLevels, type SiteLevelSplit } from './siteLevels';
import type { SitePlots } from './sitePlots';

/** One level of one site, analyzed. */
export interface LevelAnalysis {
  /** The level as written, e.g. "Split". */
  level: string;
  /** Its plots: fertilized plots of the level and every shared check, kg/ha. */
  plots: SitePlots;
  /** How many of the plots are shared checks. */
  checkPlots: number;
  /** The per-site analysis of these plots (site name "Site (Factor: level)"). */
  analysis: SiteAnalysis;
}

/** A site's levels of one factor, each analyzed, and whether they differ. */
export interface SiteLevelsAnalysis {
  /** The site-year's display name (as SiteAnalysis.site). */
  site: string;
  /** The factor's column header. */
  factor: string;
  levels: LevelAnalysis[];
  test: LevelResponseTests;
}

/**
 * One site's levels of one factor analyzed.
 * @param site - the site's analyzable plots (sitePlots), kg/ha
 * @param factor - the factor's column header
 * @param levelOf - a plot's factor cell by plot id (null when blank)
 * @param settings - the plan's settings (as analyzeSite)
 * @param siteIndex - the site's place in the table (seeds every level's resamples alike)
 * @returns the levels with their analyses and the level tests; null when the factor has fewer
 *   than two levels at this site
 * @example
 * analyzeSiteLevels(plan.plots[0], 'Timing', levelOf, plan.options, 0)?.levels[1].analysis.recommended.model
 */
export function analyzeSiteLevels(
  site: SitePlots,
  factor: string,
  levelOf: (plotId: string) => string | null,
  settings: AcrossSiteSettings,
  siteIndex: number,
): SiteLevelsAnalysis | null {
  if (site.problem) return null;
  const split = splitSiteLevels(site, factor, levelOf);
  if (split.levels.length < 2) return null;
  const blocks = settings.blocks === 'none' ? 'none' : 'auto';
  return {
    site: site.site,
    factor,
    levels: split.levels.map((l) => ({
      level: l.level,
      plots: l.plots,
      checkPlots: l.checkPlots,
      analysis: analyzeSite(l.plots, settings, siteIndex),
    })),
    test: levelResponseTests(site, split, blocks, settings.alpha),
  };
}

/**
 * Every site's levels of every treatment factor of the table (PlotTable.factorKeys).
 * @param table - the plot table (its factor keys and each plot's factor cells)
 * @param plots - its sites' analyzable plots (sitePlots), in table order
 * @param settings - the plan's settings
 * @returns one entry per site and factor with two levels or more, in table order
 * @example
 * trialLevels(table, plan.plots, plan.options).map((s) => s.site) // ['Hollins Gap', …]
 */
export function trialLevels(
  table: PlotTable,
  plots: readonly SitePlots[],
  settings: AcrossSiteSettings,
): SiteLevelsAnalysis[] {
  const factors = table.factorKeys ?? [];
  if (factors.length === 0) return [];
  const byId = new Map(table.plots.map((p) => [p.id, p]));
  const out: SiteLevelsAnalysis[] = [];
  const blocks = settings.blocks === 'none' ? 'none' : 'auto';
  plots.forEach((site, index) => {
    const here: { analysis: SiteLevelsAnalysis; split: SiteLevelSplit }[] = [];
    for (const factor of factors) {
      const levelOf = (id: string) => byId.get(id)?.groups[factor] ?? null;
      const levels = analyzeSiteLevels(site, factor, levelOf, settings, index);
      if (levels) here.push({ analysis: levels, split: splitSiteLevels(site, factor, levelOf) });
    }
    // Two factors or more at one site: how each meets the others (factorCrossing).
    for (const h of here) {
      h.analysis.test.crossings = here
        .filter((o) => o !== h)
        .map((o) => factorCrossing(site, h.split, o.split, blocks, settings.alpha));
      out.push(h.analysis);
    }
  });
  return out;
}
