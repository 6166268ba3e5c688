/**
 * The chart of one site: plots by block (excluded plots hollow), every fitted
 * curve with the chosen one bold, the optimum rate as a line with its
 * bootstrap interval as a band, and the chosen model's residuals below.
 * Built in display units, for the SVG/PNG reports and the screen alike.
 */
import { leadingModelLabel } from '../models/curves';
import type { ChartLayer, ChartSpec, PointLayer } from './chartSpec';
import type { SiteReport, TrialReport } from './trialReport';
import { unitScale } from './unitScale';
import { nutrientRateUnit } from '../units/convertRate';

/**
 * Describes the response chart of one site.
 * @param report - the analysis (units, crop, prices)
 * @param site - the site's results
 * @returns a two-panel chart: response (3 parts of the height) and residuals (1 part)
 * @example
 * siteResponseChart(report, report.sites[0]).panels.map((p) => p.id) // ['response', 'residuals']
 */
export function siteResponseChart(report: TrialReport, site: SiteReport): ChartSpec {
  const u = unitScale(report.settings.units, report.crop);
  const ru = report.settings.units.rate;
  const yu = report.settings.units.yield;
  const rateUnit = nutrientRateUnit(ru);
  const blocks = [...new Set(site.plots.map((p) => p.block ?? ''))];
  const pointLayers: PointLayer[] = blocks.map((b, i) => {
    const ps = site.plots.filter(
      (p) => (p.block ?? '') === b && !p.excluded && p.rateKgHa !== null && p.yieldKgHa !== null,
    );
    return {
      kind: 'points',
      name: b ? `Block ${b}` : 'Plots',
      groupIndex: i,
      x: ps.map((p) => u.rate(p.rateKgHa!)),
      y: ps.map((p) => u.yield(p.yieldKgHa!)),
      labels: ps.map((p) => `${p.plotLabel ?? p.id}`),
    };
  });
  const excluded = site.plots.filter(
    (p) => p.excluded && p.rateKgHa !== null && p.yieldKgHa !== null,
  );
  const layers: ChartLayer[] = [];
  const best = site.models.find((m) => m.model === site.bestModel) ?? null;
  const ci = best?.optimumCiKgHa ?? null;
  if (ci) {
    layers.push({
      kind: 'band',
      name: `Optimum interval (${Math.round((site.bootstrap?.level ?? 0.9) * 100)} %)`,
      role: 'optimumInterval',
      low: u.rate(ci[0]),
      high: u.rate(ci[1]),
    });
  }
  for (const m of site.models) {
    if (m.model === site.bestModel || m.curve.rateKgHa.length < 2) continue;
    // Fits that reduce to another model would draw the same line twice.
    if (m.status === 'no-plateau' || m.status === 'too-few-rates') continue;
    layers.push({
      kind: 'curve',
      name: m.label,
      model: m.model,
      role: 'alternative',
      x: m.curve.rateKgHa.map(u.rate),
      y: m.curve.yieldKgHa.map(u.yield),
    });
  }
  if (best) {
    layers.push({
      kind: 'curve',
      name: leadingModelLabel(best.model),
      model: best.model,
      role: 'chosen',
      x: best.curve.rateKgHa.map(u.rate),
      y: best.curve.yieldKgHa.map(u.yield),
    });
  }
  layers.push(...pointLayers.filter((l) => l.x.length > 0));
  if (excluded.length) {
    layers.push({
      kind: 'points',
      name: 'Excluded',
      groupIndex: 0,
      excluded: true,
      x: excluded.map((p) => u.rate(p.rateKgHa!)),
      y: excluded.map((p) => u.yield(p.yieldKgHa!)),
      labels: excluded.map((p) => p.excluded!.reason),
    });
  }
  if (best?.optimumRateKgHa != null) {
    const v = u.rate(best.optimumRateKgHa);
    layers.push({
      kind: 'marker',
      name: 'Economic optimum',
      role: 'optimumRate',
      x: v,
      label: `EONR ${Math.round(v)}`,
    });
  }
  const residualLayers: ChartLayer[] = blocks
    .map((b, i): PointLayer => {
      const rs = site.residuals.filter((r) => (r.block ?? '') === b);
      return {
        kind: 'points',
        name: b ? `Block ${b}` : 'Plots',
        groupIndex: i,
        x: rs.map((r) => u.rate(r.rateKgHa)),
        y: rs.map((r) => u.yield(r.residualKgHa)),
      };
    })
    .filter((l) => l.x.length > 0);
  // The y range follows the plots and the chosen curve, so a poor alternative (a line
  // through the origin) cannot squash the data into a band; alternatives are clipped.
  const ys = [
    ...pointLayers.flatMap((l) => l.y),
    ...excluded.map((p) => u.yield(p.yieldKgHa!)),
    ...(best ? best.curve.yieldKgHa.map(u.yield) : []),
  ].filter(Number.isFinite);
  // A loop, not Math.min(...ys): a site of 100,000 plots would overflow the stack as arguments.
  let yLo = ys.length ? Infinity : 0;
  let yHi = ys.length ? -Infinity : 1;
  for (const y of ys) {
    if (y < yLo) yLo = y;
    if (y > yHi) yHi = y;
  }
  const pad = 0.08 * Math.max(yHi - yLo, 1e-9);
  const pr = report.prices;
  return {
    title: `${site.site}: yield response to N`,
    subtitle: best
      ? `${best.label} chosen · price ratio ${pr.priceRatioDisplay.toPrecision(3)} ${pr.priceRatioUnit} · ${site.n} plots`
      : `No curve leads · ${site.n} plots`,
    widthPx: 800,
    heightPx: 560,
    note: ci ? 'Shaded: bootstrap interval of the economic optimum rate (EONR).' : '',
    panels: [
      {
        id: 'response',
        title: '',
        x: { title: 'N rate', unit: rateUnit, min: 0 },
        y: { title: 'Yield', unit: yu, min: Math.max(0, yLo - pad), max: yHi + pad },
        heightShare: 3,
        layers,
      },
      {
        id: 'residuals',
        title: best ? `Residuals of the ${best.label.toLowerCase()}` : 'Residuals',
        x: { title: 'N rate', unit: rateUnit, min: 0 },
        y: { title: 'Residual', unit: yu, zeroLine: true },
        heightShare: 1,
        layers: residualLayers,
      },
    ],
  };
}
