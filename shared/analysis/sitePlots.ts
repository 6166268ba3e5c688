/**
 * The plots of one site-year gathered for the analysis: the analyzable plots only (not
 * excluded, rate and yield present), in table order. The unit is the site-year
 * (shared/table/siteYear): a site harvested in two years is two entries with their own blocks.
 * A site-year whose plots are all excluded or incomplete still appears, with no plots and a
 * reason, so that no site ever vanishes from the across-site tables.
 */
import { analyzablePlots, type Plot, type PlotTable } from '../table/plotTable';
import { siteYearsOf } from '../table/siteYear';

export interface SitePlots {
  /** The site-year's display name (siteYearsOf): "Alder Flats 2024", or the site's own name. */
  site: string;
  /** The harvest year, or null when the plots carry none. */
  year: number | null;
  /** The site's own name, the same for every year of it. */
  siteName: string;
  /** Nutrient rate of each analyzable plot, kg/ha. */
  rateKgHa: Float64Array;
  /** Yield of each analyzable plot at standard moisture, kg/ha. */
  yieldKgHa: Float64Array;
  /** Block label of each plot; null where the sheet has none. */
  block: (string | null)[];
  /** Plot ids, for messages that point back to rows. */
  plotIds: string[];
  /**
   * Grouping values shared by every analyzable plot of the site, column header →
   * value; a column whose value differs between the site's plots maps to null.
   * The year appears under the key "year" when the plots carry one.
   */
  groups: Record<string, string | null>;
  /** Why the site has nothing to fit, or null. */
  problem: string | null;
}

/** The key under which a plot's year takes part in the group analysis. */
export const YEAR_GROUP_KEY = 'year';

/**
 * Splits a plot table into site-years, in first-seen order, keeping every one.
 * @param table - the plot table (rates and yields in kg/ha)
 * @returns one entry per site-year, including those left with no analyzable plot
 * @example
 * sitePlots(table).map((s) => s.site) // ['North Field', 'Creek Bend 2024', 'Creek Bend 2025', …]
 */
export function sitePlots(table: PlotTable): SitePlots[] {
  // One pass over the plots, not one per site: tables of hundreds of sites are common in benches.
  const { siteYears, nameOf } = siteYearsOf(table);
  const bySite = new Map<string, Plot[]>(siteYears.map((s) => [s.name, []]));
  const allCount = new Map<string, number>();
  for (const p of table.plots) {
    const k = nameOf(p);
    allCount.set(k, (allCount.get(k) ?? 0) + 1);
  }
  for (const p of analyzablePlots(table)) bySite.get(nameOf(p))?.push(p);
  return siteYears.map(({ name: site, site: siteName, year }) => {
    const plots = bySite.get(site) ?? [];
    const groups: Record<string, string | null> = {};
    const keys = new Set<string>();
    for (const p of plots) for (const k of Object.keys(p.groups)) keys.add(k);
    for (const k of keys) {
      const values = new Set(plots.map((p) => p.groups[k] ?? ''));
      groups[k] = values.size === 1 ? [...values][0] || null : null;
    }
    if (plots.some((p) => p.year !== null)) {
      const years = new Set(plots.map((p) => p.year));
      groups[YEAR_GROUP_KEY] = years.size === 1 && !years.has(null) ? String([...years][0]) : null;
    }
    const all = allCount.get(site) ?? 0;
    return {
      site,
      year,
      siteName,
      rateKgHa: Float64Array.from(plots, (p) => p.rateKgHa as number),
      yieldKgHa: Float64Array.from(plots, (p) => p.yieldKgHa as number),
      block: plots.map((p) => p.block),
      plotIds: plots.map((p) => p.id),
      groups,
      problem:
        plots.length === 0
          ? `none of the site's ${all} plots can be analyzed (each is excluded or lacks a rate or a yield)`
          : null,
    };
  });
}
