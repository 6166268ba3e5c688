/**
 * The bridge from the plot table to the fits: the analyzable plots of one site
 * (not excluded, rate and yield present) as parallel arrays in canonical units.
 */
import { analyzablePlots, type Plot, type PlotTable } from '../table/plotTable';
import type { SiteData } from './modelTypes';

/**
 * Site data for the model fits from plots.
 * @param source - a plot table, or plots already chosen (e.g. one site's)
 * @param site - keep only this site's plots (optional)
 * @returns rates (kg/ha), yields (kg/ha) and block labels, plus the ids of the plots used
 * @example
 * fitAllModels(siteDataFromPlots(table, 'North field'))
 */
export function siteDataFromPlots(
  source: PlotTable | readonly Plot[],
  site?: string,
): SiteData & { plotIds: string[] } {
  const all = Array.isArray(source)
    ? (source as readonly Plot[]).filter(
        (p) => p.excluded === null && p.rateKgHa !== null && p.yieldKgHa !== null,
      )
    : analyzablePlots(source as PlotTable);
  const plots = site === undefined ? all : all.filter((p) => p.site === site);
  return {
    rateKgHa: plots.map((p) => p.rateKgHa as number),
    yieldKgHa: plots.map((p) => p.yieldKgHa as number),
    block: plots.map((p) => p.block),
    plotIds: plots.map((p) => p.id),
  };
}
