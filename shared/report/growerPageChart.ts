/**
 * The chart a grower page carries: the site's response chart on a site's page (its levels' curves
 * on a rate × factor site's), the regional chart on the region's and, drawn from the group's own
 * site-years, on a group's. One choice for the workspace's preview and the command line's PDF,
 * so the printed page and the screen show the same picture.
 */
import type { ChartSpec } from './chartSpec';
import { regionalReturnChart } from './regionalReturnChart';
import { formatMoneyPerArea } from '../units/formatMoney';
import { siteResponseChart } from './siteResponseChart';
import { levelCurvesChart } from './levelCurvesChart';
import { groupOfPage } from './growerPage';
import type { RegionalChartData } from './regionalReturnChart';
import type { TrialReport } from './trialReport';

/**
 * The chart of one grower page.
 * @param report - the assembled report
 * @param which - a site's name, or "region"
 * @returns the chart, or null when that page has none (an unknown site, no across-site result)
 * @example growerPageChart(report, 'region')?.panels[0].id // 'return'
 */
export function growerPageChart(report: TrialReport, which: string): ChartSpec | null {
  if (which === 'region') return reportRegionalChart(report);
  const group = groupOfPage(which);
  if (group) {
    const g = report.acrossSites?.groups.find((x) => x.key === group.key);
    const chart = g?.values.find((v) => v.value === group.value)?.chart ?? null;
    return chart ? regionalChartSpec(report, chart) : null;
  }
  // A rate × factor site's page speaks of its levels: their curves with the shared check.
  const levels = report.levels.find((l) => l.site === which);
  if (levels) return levelCurvesChart(report, levels, null);
  const site = report.sites.find((s) => s.site === which);
  return site ? siteResponseChart(report, site) : null;
}

/**
 * The regional chart of a report, in its display units and currency.
 * @param report - the assembled report
 * @returns the chart, or null when there is no across-site result
 * @example
 * reportRegionalChart(report)?.panels[0].id // 'return'
 */
export function reportRegionalChart(report: TrialReport): ChartSpec | null {
  return report.acrossSites ? regionalChartSpec(report, report.acrossSites.chart) : null;
}

/** A regional return chart (the region's or a group's) in the report's units and currency. */
function regionalChartSpec(report: TrialReport, data: RegionalChartData): ChartSpec {
  const { units, currency, locale } = report.settings;
  return regionalReturnChart(data, {
    units,
    crop: report.crop,
    currency,
    toleranceText: formatMoneyPerArea(report.acrossSites!.bandPerHa, currency, units.rate, locale),
  });
}
