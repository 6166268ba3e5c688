/**
 * The across-site chart: the mean net return over the zero-N check against
 * rate, with the best regional rate as a line and the profitable range as a
 * band. Display units: rate per the report, money per acre or hectare.
 */
import type { ChartSpec } from './chartSpec';
import type { TrialReport } from './trialReport';
import { unitScale } from './unitScale';

/**
 * Describes the regional return chart.
 * @param report - the analysis
 * @returns the chart, or null when there is no across-site result
 * @example
 * regionalReturnChart(report)?.panels[0].id // 'return'
 */
export function regionalReturnChart(report: TrialReport): ChartSpec | null {
  const a = report.acrossSites;
  if (!a) return null;
  const u = unitScale(report.settings.units, report.crop);
  const rateUnit = report.settings.units.rate.replace('/', ' N/');
  const best = u.rate(a.bestRateKgHa);
  return {
    title: `Across ${a.sites.length} sites: net return to N`,
    subtitle: `Mean over the sites' chosen curves · price ratio ${report.prices.priceRatioDisplay.toPrecision(3)} ${report.prices.priceRatioUnit}`,
    widthPx: 800,
    heightPx: 460,
    note: `Shaded: rates within ${u.perArea(a.bandPerHa).toFixed(2)} per ${u.areaName} of the best mean return.`,
    panels: [
      {
        id: 'return',
        title: '',
        x: { title: 'N rate', unit: rateUnit, min: 0 },
        y: { title: 'Net return over no N', unit: `currency/${u.areaName}`, zeroLine: false },
        heightShare: 1,
        layers: [
          {
            kind: 'band',
            name: 'Profitable range',
            role: 'profitableRange',
            low: u.rate(a.profitableRangeKgHa[0]),
            high: u.rate(a.profitableRangeKgHa[1]),
          },
          {
            kind: 'curve',
            name: 'Mean net return',
            model: null,
            role: 'return',
            x: a.returnCurve.rateKgHa.map(u.rate),
            y: a.returnCurve.returnPerHa.map(u.perArea),
          },
          {
            kind: 'marker',
            name: 'Regional rate',
            role: 'bestRate',
            x: best,
            label: `Best ${Math.round(best)}`,
          },
        ],
      },
    ],
  };
}
