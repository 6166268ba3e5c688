/**
 * The regional rate of a set of analyzed sites: each site's gain curve (regionalCurves) on one
 * rate grid that, by default, ends at the lowest of the sites' highest tested rates, so no
 * site curve is extended past its data; the mean return at the settings' prices; and the
 * sentence and cautions shown with it.
 */
import type { ModelName } from '../models/modelTypes';
import type { SiteAnalysis } from './analyzeSite';
import type { SiteLeftOut } from './commonResponseTests';
import type { AcrossSiteSettings } from './planAcrossSites';
import { rateGrid } from './rateGrid';
import { regionalCurves } from './regionalCurves';
import {
  prepareRegionalReturn,
  regionalReturnAtPrices,
  type PreparedRegionalReturn,
  type RegionalReturn,
  type SiteGainCurve,
} from './regionalReturn';
import { regionalRecommendation, type RegionalRecommendationText } from './regionalRecommendation';

/** The regional rate of a set of sites and what stands behind it. */
export interface RegionalAnalysis {
  regional: RegionalReturn;
  text: RegionalRecommendationText;
  /** The site and the model it contributes. */
  sitesUsed: { site: string; model: ModelName; note: string }[];
  sitesLeftOut: SiteLeftOut[];
  /** Where the rate grid ends and why, e.g. "… 225 kg/ha, the highest rate tested at every site …". */
  gridNote: string;
  /** Price-free part, for repricing. */
  prepared: PreparedRegionalReturn;
}

/**
 * The regional rate of a set of analyzed sites at the settings' prices, models and grid.
 * @param sites - the sites' analyses
 * @param o - the analysis settings (prices, regional model, site models, grid, band)
 * @returns the regional return, its sentence and cautions, sites used and left out
 */
export function regionalAnalysis(
  sites: readonly SiteAnalysis[],
  o: AcrossSiteSettings,
): RegionalAnalysis {
  const { used, leftOut } = regionalCurves(sites, o.regionalModel, o.siteModels);
  const top =
    o.gridToKgHa ??
    (used.length > 0
      ? Math.min(...used.map((u) => u.fit.testedRates.highestKgHa))
      : o.gridFromKgHa);
  const grid = rateGrid(o.gridFromKgHa, Math.max(top, o.gridFromKgHa), o.gridStepKgHa);
  const curves: SiteGainCurve[] = used.map((u) => ({ site: u.site, gainKgHa: u.gainKgHa }));
  const sitesUsed = used.map((u) => {
    const beyond = u.fit.testedRates.highestKgHa < grid[grid.length - 1];
    const extra = beyond
      ? `the grid runs past the site's highest tested rate (${u.fit.testedRates.highestKgHa} kg/ha)`
      : '';
    return { site: u.site, model: u.model, note: [u.note, extra].filter((t) => t).join('; ') };
  });
  const end = grid[grid.length - 1];
  const lowest = used.filter((u) => u.fit.testedRates.highestKgHa === top).map((u) => u.site);
  const gridNote =
    o.gridToKgHa !== null
      ? `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha, as chosen.`
      : `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha: ${end} kg/ha is the highest rate tested at every site` +
        (lowest.length > 0 && lowest.length < used.length
          ? ` (${lowest.join(', ')} stopped there)`
          : '') +
        ', so no site curve is extended past its data.';
  const prepared = prepareRegionalReturn(curves, grid);
  const regional = regionalReturnAtPrices(prepared, o.prices, { bandPerHa: o.bandPerHa });
  return {
    regional,
    text: regionalRecommendation(regional),
    sitesUsed,
    sitesLeftOut: leftOut,
    gridNote,
    prepared,
  };
}
