/**
 * The chart of one site tried in several years: each site-year's leading curve over its own
 * plots, overlaid, so the years' responses are read against each other beside the test of
 * whether they differ (shared/analysis/yearsCompared). Built in display units from the report's
 * site-years, so the screen and any printed view draw the same thing.
 *
 * Colors: year k's curve and points share group k of the palette, as the levels chart does.
 * Edge cases:
 * - a site-year without a leading model has its plots drawn and no curve;
 * - excluded plots are left out (each site-year's own chart shows them);
 * - a site-year named by the comparison but missing from the report is skipped.
 */
import { modelLabel } from '../models/curves';
import { nutrientRateUnit } from '../units/convertRate';
import type { ChartLayer, ChartSpec, PointLayer } from './chartSpec';
import type { SiteReport, TrialReport, YearComparisonReport } from './trialReport';
import { unitScale } from './unitScale';

/**
 * Describes the years chart of one site.
 * @param report - the report (display units, crop, the site-years)
 * @param compared - the site's years compared (report.yearsCompared[i])
 * @returns a one-panel chart: per site-year its leading curve and its kept plots
 * @example
 * yearCurvesChart(report, report.yearsCompared[0]).panels[0].layers.map((l) => l.name)
 * // ['2024 (Quadratic-plateau)', '2025 (Quadratic)', '2024 plots', '2025 plots']
 */
export function yearCurvesChart(report: TrialReport, compared: YearComparisonReport): ChartSpec {
  const u = unitScale(report.settings.units, report.crop);
  const bySite = new Map(report.sites.map((s) => [s.site, s]));
  const curves: ChartLayer[] = [];
  const points: PointLayer[] = [];
  compared.siteYears.forEach((name, k) => {
    const s: SiteReport | undefined = bySite.get(name);
    if (!s) return;
    const label = compared.years[k] === null ? 'No year' : String(compared.years[k]);
    const lead = s.models.find((m) => m.model === s.bestModel);
    if (lead && lead.curve.rateKgHa.length >= 2) {
      curves.push({
        kind: 'curve',
        name: `${label} (${modelLabel(lead.model)})`,
        model: lead.model,
        role: 'alternative',
        groupIndex: k,
        x: lead.curve.rateKgHa.map(u.rate),
        y: lead.curve.yieldKgHa.map(u.yield),
      });
    }
    const kept = s.plots.filter(
      (p) => p.excluded === null && p.rateKgHa !== null && p.yieldKgHa !== null,
    );
    points.push({
      kind: 'points',
      name: `${label} plots`,
      groupIndex: k,
      x: kept.map((p) => u.rate(p.rateKgHa!)),
      y: kept.map((p) => u.yield(p.yieldKgHa!)),
      labels: kept.map((p) => `${label}, plot ${p.plotLabel ?? p.id}`),
    });
  });
  return {
    title: `${compared.site}: yield response to N by year`,
    subtitle: compared.years.map((y) => y ?? 'no year').join(', '),
    widthPx: 800,
    heightPx: 480,
    note: "Each year's leading curve is fitted to that year's plots alone.",
    panels: [
      {
        id: 'years',
        title: '',
        x: { title: 'N rate', unit: nutrientRateUnit(report.settings.units.rate), min: 0 },
        y: { title: 'Yield', unit: report.settings.units.yield },
        heightShare: 1,
        layers: [...curves, ...points.filter((p) => p.x.length > 0)],
      },
    ],
  };
}
