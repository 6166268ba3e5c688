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
import type { SiteAnalysis } from './siteAnalysis';

/** Units and crop a chart is drawn in. */
export interface ChartUnits {
  rate: RateUnit;
  yield: YieldUnit;
  crop: CropId;
  /** Currency code for money axes. */
  currency: string;
}

function blockPoints(
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
      x: Array.from(fit.curve.rateKgHa, r),
      y: Array.from(fit.curve.yieldKgHa, yv),
    });
  }
  const lead = leading ? site.fits[leading] : undefined;
  if (leading && lead) {
    response.push({
      kind: 'curve',
      name: leadingModelLabel(leading),
      model: leading,
      role: 'chosen',
      x: Array.from(lead.curve.rateKgHa, r),
      y: Array.from(lead.curve.yieldKgHa, yv),
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
    subtitle: leading ? `Leading model: ${modelLabel(leading)}` : 'No model could be fitted',
    widthPx: 900,
    heightPx: 560,
    panels,
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
      x: Array.from(fit.curve.rateKgHa, (v) => rateFromKgHa(v, units.rate)),
      y: Array.from(fit.curve.yieldKgHa, (v) => yieldFromKgHa(v, units.yield, units.crop)),
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
