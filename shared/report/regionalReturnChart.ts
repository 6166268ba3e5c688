/**
 * The regional chart, the one description the screen, the workbook and the printed page draw.
 * The method is the maximum return to N across site-years (shared/analysis/regionalReturn, with
 * its source); the picture is Plotrate's own and answers two questions in two stacked panels:
 * - top, "what does each rate return on average?": the mean net return above the zero-N plots,
 *   with a ribbon of how far that mean could move with other site-years like these (pointwise,
 *   from the same resamples as the regional rate's interval), the rates within the user's
 *   tolerance of the best shaded, and the regional rate marked;
 * - bottom, "how often would each rate cost more than the tolerance?": the share of those
 *   resamples in which the rate returns less than their best by more than the tolerance.
 * Without resamples only the top panel is drawn. Display units: rate per the report, money per
 * acre or hectare in the user's currency.
 */
import type { RegionalReturn } from '../analysis/regionalReturn';
import type { RegionalRateInterval } from '../analysis/regionalRateInterval';
import type { CropId } from '../table/plotTable';
import type { DisplayUnits } from '../units/displayUnits';
import type { ChartLayer, ChartSpec } from './chartSpec';
import { unitScale } from './unitScale';
import { nutrientRateUnit } from '../units/convertRate';

/** What the regional chart draws, in canonical units, thinned to about 200 rates. */
export interface RegionalChartData {
  /** Site-years the mean is over. */
  siteYears: number;
  /** Rates of the curve, kg/ha, ascending. */
  rateKgHa: number[];
  /** Mean net return above the zero-N plots at each rate, currency/ha. */
  returnPerHa: number[];
  /**
   * From resampling site-years at the same rates: the pointwise band of the mean return
   * (currency/ha) and the share of resamples in which the rate falls short by more than the
   * tolerance; null without resamples.
   */
  resampled: {
    level: number;
    resamples: number;
    lowPerHa: number[];
    highPerHa: number[];
    shortShare: number[];
  } | null;
  bestRateKgHa: number;
  profitableRangeKgHa: [number, number];
  /** The user's tolerance (the profitable range's band), currency/ha. */
  tolerancePerHa: number;
}

/** About this many points draw smoothly at report sizes and keep files small. */
const CHART_POINTS = 200;

/**
 * The chart's data from the regional return and the interval of its resamples.
 * @param regional - the regional return at the prices in force
 * @param interval - the regional rate's interval at the same prices (its `alongGrid`), or null
 * @returns the data, thinned to about 200 rates
 * @example
 * regionalChartData(priced.across.regional.regional, priced.across.regional.rateInterval).rateKgHa.length // ≤ 201
 */
export function regionalChartData(
  regional: RegionalReturn,
  interval: RegionalRateInterval | null,
): RegionalChartData {
  const grid = regional.gridKgHa;
  const every = Math.max(1, Math.floor(grid.length / CHART_POINTS));
  const at: number[] = [];
  for (let i = 0; i < grid.length; i += every) at.push(i);
  const pick = (values: ArrayLike<number>): number[] => at.map((i) => values[i]);
  // The interval's grid is the regional grid (resampleRegionalGains keeps it); check the length.
  const along =
    interval && interval.alongGrid.lowPerHa.length === grid.length ? interval.alongGrid : null;
  return {
    siteYears: regional.siteOptima.length,
    rateKgHa: pick(grid),
    returnPerHa: pick(regional.meanReturnPerHa),
    resampled:
      along && interval
        ? {
            level: interval.level,
            resamples: interval.resamples,
            lowPerHa: pick(along.lowPerHa),
            highPerHa: pick(along.highPerHa),
            shortShare: pick(along.shortShare),
          }
        : null,
    bestRateKgHa: regional.bestRateKgHa,
    profitableRangeKgHa: [regional.profitableRange.lowKgHa, regional.profitableRange.highKgHa],
    tolerancePerHa: regional.profitableRange.bandPerHa,
  };
}

/** How the chart names money: the user's currency code per display area. */
export interface RegionalChartUnits {
  units: DisplayUnits;
  crop: CropId;
  /** ISO 4217 code (or the user's own label), shown on the money axis. */
  currency: string;
  /** The tolerance as the user reads it, e.g. "$4.47/ac", for the legend. */
  toleranceText: string;
}

/**
 * Describes the regional chart.
 * @param data - from regionalChartData
 * @param how - display units, crop, currency and the tolerance as text
 * @returns the chart
 * @example
 * regionalReturnChart(data, { units, crop: 'corn', currency: 'USD', toleranceText: '$4.47/ac' }).panels.length // 2 with resamples
 */
export function regionalReturnChart(data: RegionalChartData, how: RegionalChartUnits): ChartSpec {
  const u = unitScale(how.units, how.crop);
  const rateUnit = nutrientRateUnit(how.units.rate);
  const x = data.rateKgHa.map(u.rate);
  const best = u.rate(data.bestRateKgHa);
  const r = data.resampled;
  const top: ChartLayer[] = [
    {
      kind: 'band',
      name: `Within ${how.toleranceText} of the best`,
      role: 'profitableRange',
      low: u.rate(data.profitableRangeKgHa[0]),
      high: u.rate(data.profitableRangeKgHa[1]),
    },
  ];
  if (r) {
    top.push({
      kind: 'ribbon',
      name: `Mean with other site-years (${Math.round(r.level * 100)} %)`,
      role: 'returnBand',
      x,
      low: r.lowPerHa.map(u.perArea),
      high: r.highPerHa.map(u.perArea),
    });
  }
  top.push(
    {
      kind: 'curve',
      name: 'Mean net return',
      model: null,
      role: 'return',
      x,
      y: data.returnPerHa.map(u.perArea),
    },
    {
      kind: 'marker',
      name: 'Regional rate',
      role: 'bestRate',
      x: best,
      label: `Regional rate ${Math.round(best)}`,
    },
  );
  const xAxis = { title: 'N rate', unit: rateUnit, min: 0 };
  return {
    title: `Return to N across ${data.siteYears} site-year${data.siteYears === 1 ? '' : 's'}`,
    subtitle: r
      ? `Average of the site-years' curves, and how it moves when the site-years are resampled (${r.resamples} times)`
      : "Average of the site-years' curves",
    widthPx: 800,
    heightPx: r ? 560 : 420,
    note: r
      ? 'Ribbon: where the average could lie with other site-years like these. Lower panel: how often each rate falls short.'
      : 'Resample the site-years (resamples above 0) to see how sure the average is.',
    panels: [
      {
        id: 'return',
        title: '',
        x: xAxis,
        y: {
          title: 'Net return over zero N',
          unit: `${how.currency}/${u.areaName}`,
          zeroLine: false,
        },
        heightShare: 1,
        layers: top,
      },
      ...(r
        ? [
            {
              id: 'risk',
              title: `How often the average loses more than ${how.toleranceText}`,
              x: xAxis,
              y: { title: 'Resamples', unit: '%', min: 0, max: 100 },
              heightShare: 0.45,
              layers: [
                {
                  kind: 'curve' as const,
                  name: 'Average short by more than the tolerance',
                  model: null,
                  role: 'risk' as const,
                  x,
                  y: r.shortShare.map((s) => s * 100),
                },
                {
                  kind: 'marker' as const,
                  name: 'Regional rate',
                  role: 'bestRate' as const,
                  x: best,
                  label: '',
                },
              ],
            },
          ]
        : []),
    ],
  };
}
