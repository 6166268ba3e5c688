/**
 * The analysed unit is the site-year: the plots of one site in one year. Two harvests of the
 * same field are two trials (their own blocks, plots, checks and fits); pooling them would make
 * block 1 of one year and block 1 of the next one block, and mix two seasons' weather into one
 * curve. This file is the one place that says which site-year a plot belongs to and what the
 * site-year is called; every stage that groups plots by site asks it.
 *
 * Names: a site seen in one year only (or with no year at all) keeps its own name, so a
 * one-season table reads as it always did; a site seen in several years is named with the year,
 * "Alder Flats 2024", "Alder Flats 2025". Plots of such a site with no year are named by the
 * site alone, a site-year of their own.
 */
import type { Plot, PlotTable } from './plotTable';

/** One site-year of a table. */
export interface SiteYear {
  /** The display name every view and the results use ("Alder Flats 2024", or "Alder Flats"). */
  name: string;
  /** The site as the file names it. */
  site: string;
  /** The harvest year, or null when the plots carry none. */
  year: number | null;
}

/** A site-year's display name from its site and year, when the site has several years. */
function nameOf(site: string, year: number | null, severalYears: boolean): string {
  return severalYears && year !== null ? `${site} ${year}` : site;
}

/**
 * The site-years of a table in first-seen order, and the name of each plot's site-year.
 * @param table - the plot table
 * @returns the site-years, and `nameOf(plot)` giving the plot's site-year name
 * @example
 * const { siteYears } = siteYearsOf(table);
 * siteYears.map((s) => s.name) // ['Alder Flats 2024', 'Alder Flats 2025', 'Creek Bend']
 */
export function siteYearsOf(table: Pick<PlotTable, 'plots'>): {
  siteYears: SiteYear[];
  nameOf: (plot: Pick<Plot, 'site' | 'year'>) => string;
} {
  const yearsOf = new Map<string, Set<number | null>>();
  for (const p of table.plots) {
    const years = yearsOf.get(p.site);
    if (years) years.add(p.year);
    else yearsOf.set(p.site, new Set([p.year]));
  }
  const plotName = (p: Pick<Plot, 'site' | 'year'>) =>
    nameOf(p.site, p.year, (yearsOf.get(p.site)?.size ?? 0) > 1);
  const seen = new Map<string, SiteYear>();
  for (const p of table.plots) {
    const name = plotName(p);
    if (!seen.has(name)) seen.set(name, { name, site: p.site, year: p.year });
  }
  return { siteYears: [...seen.values()], nameOf: plotName };
}

/**
 * Site-year names in first-seen order (a one-season table: its site names).
 * @param table - the plot table
 * @returns one name per site-year
 * @example
 * siteNames(table) // ['Alder Flats 2024', 'Alder Flats 2025']
 */
export function siteNames(table: Pick<PlotTable, 'plots'>): string[] {
  return siteYearsOf(table).siteYears.map((s) => s.name);
}
