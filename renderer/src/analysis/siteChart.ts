/**
 * The chart descriptions the screens draw (shared/report/chartSpec), built
 * from the worker's fits and the re-priced optima in display units. Only
 * conversion and layering happen here; every number comes from shared/.
 */
import type { EconomicOptimum } from '../../../shared/economics/economicOptimum';
import { leadingModelLabel, modelLabel } from '../../../shared/models/curves';
import type { ModelName } from '../../../shared/models/modelTypes';
import type { ChartLayer, ChartSpec, PointLayer } from '../../../shared/report/chartSpec';
import type { CropId, Plot } from '../../../shared/table/plotTable';
import { nutrientRateUnit, rateFromKgHa, type RateUnit } from '../../../shared/units/convertRate';
import { yieldFromKgHa, type YieldUnit } from '../../../shared/units/convertYield';
import { sharedRanges } from '../lib/sharedAxes';
import type { SiteAnalysis } from './siteAnalysis';

/** Units and crop a chart is drawn in. */
export interface ChartUnits {
  rate: RateUnit;
  yield: YieldUnit;
  crop: CropId;
  /** Currency code for money axes. */
  currency: string;
}

/**
 * The arrays a chart draws that do not depend on prices (curves, plots, residuals), kept per
 * source array and units: Plotly.react recomputes a figure whose data arrays are new objects, so a
 * price change that rebuilt them redrew every trace (about 45 ms of the one-site step at 500
 * sites), where now only the optimum's marker and band, layout shapes, move.
 */
const keptArrays = new WeakMap<object, Map<string, unknown>>();
function kept<T>(source: object, key: string, make: () => T): T {
  let bySource = keptArrays.get(source);
  if (!bySource) keptArrays.set(source, (bySource = new Map()));
  if (!bySource.has(key)) bySource.set(key, make());
  return bySource.get(key) as T;
}

/** The units of a chart as one key (kept arrays are per units). */
function unitsKey(units: ChartUnits): string {
  return `${units.rate}|${units.yield}|${units.crop}`;
}

/**
 * The panels' axis ranges, set from the curves and plots instead of left to Plotly's autorange:
 * with the data arrays kept, a price change reaches Plotly as a change of layout alone, and
 * Plotly then redraws the shapes without recomputing the autorange, against axes of its default
 * range (the optimum's marker and band were drawn thousands of pixels off the plot). x runs from
 * 0 to the highest rate (sharedRanges) with 4 % room each side, y as sharedRanges makes it (5 %
 * room); the panels share the x range, as they share the axis.
 */
function withRanges(panels: ChartSpec['panels']): ChartSpec['panels'] {
  const drawn = (panel: ChartSpec['panels'][number]) =>
    panel.layers.flatMap((l) => (l.kind === 'curve' || l.kind === 'points' ? [l] : []));
  const all = sharedRanges([panels.flatMap(drawn)]);
  if (!all) return panels;
  const room = 0.04 * Math.max(all.x[1] - all.x[0], 1e-9);
  const x = { min: all.x[0] - room, max: all.x[1] + room };
  return panels.map((panel) => {
    const y = sharedRanges([drawn(panel)])?.y;
    return {
      ...panel,
      x: { ...panel.x, ...x },
      y: y ? { ...panel.y, min: y[0], max: y[1] } : panel.y,
    };
  });
}

/** A curve's rates in display units (kept). */
function curveX(rates: Float64Array, units: ChartUnits): number[] {
  return kept(rates, unitsKey(units), () => Array.from(rates, (v) => rateFromKgHa(v, units.rate)));
}

/** A curve's yields in display units (kept). */
function curveY(yields: Float64Array, units: ChartUnits): number[] {
  return kept(yields, unitsKey(units), () =>
    Array.from(yields, (v) => yieldFromKgHa(v, units.yield, units.crop)),
  );
}

function blockPoints(
  plots: SiteAnalysis['plots'],
  y: ArrayLike<number>,
  units: ChartUnits,
  yConvert: (v: number) => number,
): PointLayer[] {
  return kept(y, `points|${unitsKey(units)}`, () => makeBlockPoints(plots, y, units, yConvert));
}

function makeBlockPoints(
  plots: SiteAnalysis['plots'],
  y: ArrayLike<number>,
  units: ChartUnits,
  yConvert: (v: number) => number,
): PointLayer[] {
  const labels = [...new Set(plots.block.map((b) => b ?? ''))];
  return labels.map((label, groupIndex) => {
    const idx = plots.block.flatMap((b, i) => ((b ?? '') === label ? [i] : []));
    return {
      kind: 'points',
      name: label ? `Block ${label}` : 'Plots',
      groupIndex,
      x: idx.map((i) => rateFromKgHa(plots.rateKgHa[i], units.rate)),
      y: idx.map((i) => yConvert(y[i])),
      labels: idx.map((i) => `Plot ${plots.plotIds[i].split('|').pop()}`),
    };
  });
}

/**
 * The one-site chart: yields by block, fitted curves (the leading one bold),
 * the optimum and its interval, residuals of the leading model below.
 * @param site - the site's price-free analysis
 * @param leading - the model that leads
 * @param optimum - its optimum at current prices, or null
 * @param intervalKgHa - the optimum's interval (bootstrap), or null
 * @param excluded - the site's excluded plots (drawn hollow)
 * @param units - display units and crop
 * @param corrected - the site's plots in the fit with a corrected value (ringed, labelled)
 * @returns the chart description
 */
export function siteChartSpec(
  site: SiteAnalysis,
  leading: ModelName | null,
  optimum: EconomicOptimum | null,
  intervalKgHa: [number, number] | null,
  excluded: readonly Plot[],
  units: ChartUnits,
  corrected: readonly Plot[] = [],
): ChartSpec {
  const r = (v: number) => rateFromKgHa(v, units.rate);
  const yv = (v: number) => yieldFromKgHa(v, units.yield, units.crop);
  const rateUnit = nutrientRateUnit(units.rate);
  const response: ChartLayer[] = [];
  if (intervalKgHa) {
    response.push({
      kind: 'band',
      name: 'Optimum interval',
      role: 'optimumInterval',
      low: r(intervalKgHa[0]),
      high: r(intervalKgHa[1]),
    });
  }
  const ranked = site.ranking.filter((m) => m.rank !== null).map((m) => m.model);
  for (const model of ranked) {
    const fit = site.fits[model];
    if (!fit || model === leading) continue;
    response.push({
      kind: 'curve',
      name: modelLabel(model),
      model,
      role: 'alternative',
      x: curveX(fit.curve.rateKgHa, units),
      y: curveY(fit.curve.yieldKgHa, units),
    });
  }
  const lead = leading ? site.fits[leading] : undefined;
  if (leading && lead) {
    response.push({
      kind: 'curve',
      name: leadingModelLabel(leading),
      model: leading,
      role: 'chosen',
      x: curveX(lead.curve.rateKgHa, units),
      y: curveY(lead.curve.yieldKgHa, units),
    });
  }
  response.push(...blockPoints(site.plots, site.plots.yieldKgHa, units, yv));
  const shownExcluded = excluded.filter((p) => p.rateKgHa !== null && p.yieldKgHa !== null);
  if (shownExcluded.length > 0) {
    response.push({
      kind: 'points',
      name: 'Excluded',
      groupIndex: 0,
      excluded: true,
      x: shownExcluded.map((p) => r(p.rateKgHa!)),
      y: shownExcluded.map((p) => yv(p.yieldKgHa!)),
      labels: shownExcluded.map((p) => `Excluded: ${p.excluded?.reason ?? ''}`),
    });
  }
  const ringed = corrected.filter((p) => p.rateKgHa !== null && p.yieldKgHa !== null);
  if (ringed.length > 0) {
    response.push({
      kind: 'points',
      name: 'Corrected value',
      groupIndex: 0,
      corrected: true,
      x: ringed.map((p) => r(p.rateKgHa!)),
      y: ringed.map((p) => yv(p.yieldKgHa!)),
      labels: ringed.map((p) =>
        (p.corrections ?? [])
          .map((c) => `${c.role} corrected (cell “${p.original[c.role]?.text ?? ''}”): ${c.reason}`)
          .join('; '),
      ),
    });
  }
  if (optimum?.rateKgHa !== null && optimum?.rateKgHa !== undefined) {
    const shown = r(optimum.rateKgHa);
    response.push({
      kind: 'marker',
      name: 'Economic optimum',
      role: 'optimumRate',
      x: shown,
      label: `Optimum ${Math.round(shown)}`,
    });
  }
  const panels: ChartSpec['panels'] = [
    {
      id: 'response',
      title: '',
      x: { title: 'N rate', unit: rateUnit },
      y: { title: 'Yield', unit: units.yield },
      heightShare: 3,
      layers: response,
    },
  ];
  if (lead) {
    // Residuals are differences, so they scale like yields without an offset.
    panels.push({
      id: 'residuals',
      title: `Residuals, ${modelLabel(leading!)}`,
      x: { title: 'N rate', unit: rateUnit },
      y: { title: 'Residual', unit: units.yield, zeroLine: true },
      heightShare: 1,
      layers: blockPoints(site.plots, lead.residuals, units, yv),
    });
  }
  return {
    title: `${site.site}: yield response to N`,
    // Curves fitted but none leads (no replication, no usable optimum): the optimum panel says why.
    subtitle: leading
      ? `Leading model: ${modelLabel(leading)}`
      : Object.keys(site.fits).length > 0
        ? 'No model leads: see the optimum'
        : 'No model could be fitted',
    widthPx: 900,
    heightPx: 560,
    panels: withRanges(panels),
    note: '',
  };
}

/**
 * The all-sites chart: every site's leading curve overlaid.
 * @param sites - analyses with their leading model
 * @param units - display units and crop
 * @returns the chart description
 */
export function sitesOverlaySpec(
  sites: readonly { site: SiteAnalysis; model: ModelName | null }[],
  units: ChartUnits,
): ChartSpec {
  const layers: ChartLayer[] = [];
  for (const { site, model } of sites) {
    const fit = model ? site.fits[model] : undefined;
    if (!fit) continue;
    layers.push({
      kind: 'curve',
      name: `${site.site} (${modelLabel(model!)})`,
      model,
      role: 'alternative',
      x: curveX(fit.curve.rateKgHa, units),
      y: curveY(fit.curve.yieldKgHa, units),
    });
  }
  return {
    title: 'Leading curve of each site',
    subtitle: '',
    widthPx: 900,
    heightPx: 460,
    panels: [
      {
        id: 'curves',
        title: '',
        x: { title: 'N rate', unit: nutrientRateUnit(units.rate) },
        y: { title: 'Yield', unit: units.yield },
        heightShare: 1,
        layers,
      },
    ],
    note: '',
  };
}
