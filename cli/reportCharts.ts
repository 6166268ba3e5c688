/**
 * The charts a report's outputs carry, found once for both: each site's
 * response chart (none past the site-chart limit), each rate × factor site's
 * levels chart, each group page's regional chart and the regional chart. The
 * PDF draws them as vectors from their descriptions; the workbook, which can
 * hold only pictures, gets them as PNG ({@link chartPictures}).
 */
import type { ChartSpec } from '../shared/report/chartSpec';
import { groupPages, growerPage } from '../shared/report/growerPage';
import { growerPageChart, reportRegionalChart } from '../shared/report/growerPageChart';
import { levelChartKey, levelCurvesChart } from '../shared/report/levelCurvesChart';
import { siteResponseChart } from '../shared/report/siteResponseChart';
import type { TrialReport } from '../shared/report/trialReport';
import type { SheetImage } from '../shared/report/workbookSite';

/** A report's charts by where they go; `T` is a description or a picture. */
export interface ReportCharts<T> {
  /** Each site's response chart, by site. */
  sites: Record<string, T>;
  /** A grower page's own chart where it is not the site's (a rate × factor site's levels). */
  pages: Record<string, T>;
  /** Each rate × factor site's levels chart, by levelChartKey(site, factor). */
  levels: Record<string, T>;
  /** Each group page's regional chart, by the page's subject. */
  groups: Record<string, T>;
  region: T | null;
}

/** No charts (a JSON-only run). */
export const NO_CHARTS: ReportCharts<never> = {
  sites: {},
  pages: {},
  levels: {},
  groups: {},
  region: null,
};

/**
 * The report's charts as descriptions.
 * @param report - the assembled analysis
 * @param siteChartLimit - above this many sites, no site's own chart (only the regional ones)
 * @returns every chart the workbook and the PDF carry
 */
export function reportChartSpecs(
  report: TrialReport,
  siteChartLimit: number,
): ReportCharts<ChartSpec> {
  const drawn = report.sites.length <= siteChartLimit ? report.sites : [];
  const sites: Record<string, ChartSpec> = {};
  for (const s of drawn) sites[s.site] = siteResponseChart(report, s);
  // Every rate × factor site's levels chart: on its factor's sheet, and the first factor's on
  // the site's grower page (growerPageChart draws that one).
  const pages: Record<string, ChartSpec> = {};
  const levels: Record<string, ChartSpec> = {};
  for (const l of report.levels) {
    if (!Object.hasOwn(sites, l.site)) continue;
    const spec = levelCurvesChart(report, l, null);
    levels[levelChartKey(l.site, l.factor)] = spec;
    if (!Object.hasOwn(pages, l.site)) pages[l.site] = spec;
  }
  // Each group page's own regional chart (growerPageChart draws the same in the workspace).
  const groups: Record<string, ChartSpec> = {};
  for (const g of groupPages(report)) {
    const spec = growerPageChart(report, g.id);
    if (spec) groups[growerPage(report, g.id).subject] = spec;
  }
  return { sites, pages, levels, groups, region: reportRegionalChart(report) };
}

/**
 * The same charts as PNG pictures, drawn in worker threads.
 * @param charts - the descriptions
 * @param scale - pixel density (2 for print sharpness)
 * @param onDrawn - called with the number drawn so far and the total, for progress
 * @returns the pictures, keyed as the descriptions
 * @throws {Error} when no font can be found for the labels
 */
export async function chartPictures(
  charts: ReportCharts<ChartSpec>,
  scale: number,
  onDrawn: (done: number, total: number) => void = () => undefined,
): Promise<ReportCharts<SheetImage>> {
  const groups = [charts.sites, charts.pages, charts.levels, charts.groups];
  // A page's levels chart is the same description as its factor's: drawn once.
  const specs = [...new Set([...groups.flatMap((g) => Object.values(g)), charts.region])].filter(
    (s): s is ChartSpec => s !== null,
  );
  const { chartPngs } = await import('./chartPng');
  const pngs = await chartPngs(specs, scale, (done) => onDrawn(done, specs.length));
  const pictures = new Map(
    specs.map((s, i) => [s, { png: pngs[i], widthPx: s.widthPx, heightPx: s.heightPx }]),
  );
  const picture = (s: ChartSpec): SheetImage => pictures.get(s)!;
  const each = (g: Record<string, ChartSpec>): Record<string, SheetImage> =>
    Object.fromEntries(Object.entries(g).map(([k, s]) => [k, picture(s)]));
  return {
    sites: each(charts.sites),
    pages: each(charts.pages),
    levels: each(charts.levels),
    groups: each(charts.groups),
    region: charts.region ? picture(charts.region) : null,
  };
}
