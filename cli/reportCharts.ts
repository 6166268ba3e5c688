/**
 * The charts a report's outputs carry, found once for both: each site's
 * response chart (none past the site-chart limit), each rate × factor site's
 * levels chart, each group page's regional chart and the regional chart. The
 * PDF draws them as vectors from their descriptions; the workbook, which can
 * hold only pictures, gets them as PNG ({@link chartPictures}).
 */
import type { ChartSpec } from '../shared/report/chartSpec';
import { groupPages } from '../shared/report/growerPage';
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
  /** Each group page's regional chart, by the page's id (groupPages). */
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
    if (spec) groups[g.id] = spec;
  }
  return { sites, pages, levels, groups, region: reportRegionalChart(report) };
}

/** The charts the workbook holds as pictures: each site's, each factor's levels, the region's. */
export type WorkbookCharts<T> = Pick<ReportCharts<T>, 'sites' | 'levels' | 'region'>;

/**
 * The workbook's charts as PNG pictures, drawn in worker threads in the order of the sheets that
 * hold them: each picture is a promise that settles when its batch is drawn, so the workbook
 * writes a site's sheet as soon as its chart is ready while the workers draw the next ones.
 * @param charts - the descriptions
 * @param scale - pixel density (2 for print sharpness)
 * @param onDrawn - called with the number drawn so far and the total, for progress
 * @returns the pictures to come, keyed as the descriptions; each rejects if drawing fails (no
 *   font for the labels, a worker that stops)
 */
export function chartPictures(
  charts: WorkbookCharts<ChartSpec>,
  scale: number,
  onDrawn: (done: number, total: number) => void = () => undefined,
): WorkbookCharts<Promise<SheetImage>> {
  const specs = [
    ...Object.values(charts.sites),
    ...Object.values(charts.levels),
    ...(charts.region ? [charts.region] : []),
  ];
  const pending = specs.map(() => deferred<SheetImage>());
  // A picture nobody waits for (its output failed first) must not become an unhandled rejection.
  for (const p of pending) p.promise.catch(() => undefined);
  void (async () => {
    try {
      const { chartPngs } = await import('./chartPng');
      await chartPngs(specs, scale, (done, first, pngs) => {
        pngs.forEach((png, k) => {
          const s = specs[first + k];
          pending[first + k].resolve({ png, widthPx: s.widthPx, heightPx: s.heightPx });
        });
        onDrawn(done, specs.length);
      });
    } catch (e) {
      // Pictures already drawn stay resolved; the rest fail with the reason.
      for (const p of pending) p.reject(e);
    }
  })();
  let next = 0;
  const each = (g: Record<string, ChartSpec>): Record<string, Promise<SheetImage>> =>
    Object.fromEntries(Object.keys(g).map((k) => [k, pending[next++].promise]));
  const sites = each(charts.sites);
  const levels = each(charts.levels);
  return { sites, levels, region: charts.region ? pending[next].promise : null };
}

/** A promise with its settle functions (Promise.withResolvers, which Node 20 lacks). */
function deferred<T>(): {
  promise: Promise<T>;
  resolve: (value: T) => void;
  reject: (reason: unknown) => void;
} {
  let resolve!: (value: T) => void;
  let reject!: (reason: unknown) => void;
  const promise = new Promise<T>((yes, no) => {
    resolve = yes;
    reject = no;
  });
  return { promise, resolve, reject };
}
