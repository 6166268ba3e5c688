/**
 * The chart of a rate × factor site (a rate × timing or rate × source trial): each level's
 * leading curve over its own fertilized plots, and the zero-rate check plots every level shares
 * drawn once, in a marker of their own. With one level picked, that level alone: its curve bold,
 * its recommended rate and the rate's interval. Built in display units from the report's levels
 * (assembleReport's SiteLevelsReport), so the screen and the printed reports can draw the same.
 *
 * Colors: level k's curve and points share group k of the palette (CurveLayer.groupIndex), so a
 * curve is read against its own plots; the shared checks take the group after the last level.
 * Edge cases:
 * - a level without a leading model has its plots drawn and no curve;
 * - a check plot belongs to every level (splitSiteLevels): it is drawn once, by plot id;
 * - excluded plots are left out (the one-site chart of the whole site shows them).
 */
import { modelLabel } from '../models/curves';
import type { ChartLayer, ChartSpec, PointLayer } from './chartSpec';
import type { LevelReport, SiteLevelsReport, TrialReport } from './trialReport';
import { unitScale } from './unitScale';
import { nutrientRateUnit } from '../units/convertRate';

/** A level the site does not have was asked for. */
export class UnknownLevelError extends Error {
  constructor(site: string, factor: string, level: string) {
    super(`${site} has no ${factor} level "${level}".`);
    this.name = 'UnknownLevelError';
  }
}

/**
 * The key of a rate × factor site's levels chart among a report's pictures (the workbook's
 * levelCharts): one chart per site and factor.
 * @example levelChartKey('Larkspur Bottom', 'Timing') // 'Larkspur Bottom\nTiming'
 */
export function levelChartKey(site: string, factor: string): string {
  return `${site}\n${factor}`;
}

/** A plot the chart can place: kept in the fits, with a rate and a yield. */
function drawable(p: LevelReport['report']['plots'][number]): boolean {
  return p.excluded === null && p.rateKgHa !== null && p.yieldKgHa !== null;
}

/**
 * Describes the levels chart of one rate × factor site.
 * @param report - the report (display units, crop)
 * @param site - the site's levels (report.levels[i])
 * @param shown - one level to draw alone, or null for every level overlaid
 * @returns a one-panel chart: per level its leading curve and fertilized plots, the shared
 *   checks once; with one level also its recommended rate and interval
 * @throws {UnknownLevelError} when `shown` names no level of the site
 * @example
 * levelCurvesChart(report, report.levels[0], null).panels[0].layers.map((l) => l.name)
 * // ['At planting (Quadratic-plateau)', 'Split (V6) (Quadratic-plateau)', 'At planting plots',
 * //  'Split (V6) plots', 'Shared check plots (0 N)']
 */
export function levelCurvesChart(
  report: TrialReport,
  site: SiteLevelsReport,
  shown: string | null,
): ChartSpec {
  if (shown !== null && !site.levels.some((l) => l.level === shown))
    throw new UnknownLevelError(site.site, site.factor, shown);
  const u = unitScale(report.settings.units, report.crop);
  const rateUnit = nutrientRateUnit(report.settings.units.rate);
  const one = shown !== null;
  // Indices into the full list, so a level keeps its color whichever level is picked.
  const drawn = site.levels.map((l, k) => ({ l, k })).filter(({ l }) => !one || l.level === shown);
  const bands: ChartLayer[] = [];
  const curves: ChartLayer[] = [];
  const points: PointLayer[] = [];
  const markers: ChartLayer[] = [];
  for (const { l, k } of drawn) {
    const rec = l.report.recommendation;
    const row = l.report.models.find((m) => m.model === l.report.bestModel);
    if (row && row.curve.rateKgHa.length >= 2) {
      curves.push({
        kind: 'curve',
        name: `${l.level} (${modelLabel(row.model)})`,
        model: row.model,
        role: one ? 'chosen' : 'alternative',
        groupIndex: k,
        x: row.curve.rateKgHa.map(u.rate),
        y: row.curve.yieldKgHa.map(u.yield),
      });
    }
    const own = l.report.plots.filter((p) => drawable(p) && p.rateKgHa! > 0);
    points.push({
      kind: 'points',
      name: `${l.level} plots`,
      groupIndex: k,
      x: own.map((p) => u.rate(p.rateKgHa!)),
      y: own.map((p) => u.yield(p.yieldKgHa!)),
      labels: own.map((p) => `${l.level}, plot ${p.plotLabel ?? p.id}`),
    });
    if (one && rec.ciKgHa) {
      bands.push({
        kind: 'band',
        name: `Interval of the recommended rate (${Math.round(rec.level * 100)} %)`,
        role: 'optimumInterval',
        low: u.rate(rec.ciKgHa[0]),
        high: u.rate(rec.ciKgHa[1]),
      });
    }
    if (one && rec.rateKgHa !== null) {
      const v = u.rate(rec.rateKgHa);
      markers.push({
        kind: 'marker',
        name: 'Recommended rate',
        role: 'optimumRate',
        x: v,
        label: `${l.level}: ${Math.round(v)}`,
      });
    }
  }
  // Every level holds the same checks; drawn once, by plot id.
  const checks = new Map(
    site.levels
      .flatMap((l) => l.report.plots)
      .filter((p) => drawable(p) && p.rateKgHa === 0)
      .map((p) => [p.id, p]),
  );
  const shared = [...checks.values()];
  const checkLayer: PointLayer = {
    kind: 'points',
    name: `Shared check plots (0 N)`,
    groupIndex: site.levels.length,
    x: shared.map((p) => u.rate(p.rateKgHa!)),
    y: shared.map((p) => u.yield(p.yieldKgHa!)),
    labels: shared.map((p) => `Shared check, plot ${p.plotLabel ?? p.id}`),
  };
  const layers = [
    ...bands,
    ...curves,
    ...points.filter((p) => p.x.length > 0),
    ...(shared.length > 0 ? [checkLayer] : []),
    ...markers,
  ];
  const level = drawn.length === 1 ? drawn[0].l : null;
  return {
    title: `${site.site}: yield response to N by ${site.factor.toLowerCase()}`,
    subtitle: level
      ? `${site.factor}: ${level.level} · ${level.report.n} plots, ${level.checkPlots} of them shared checks`
      : `${site.levels.length} ${site.factor.toLowerCase()} levels, ${shared.length} shared check plots`,
    widthPx: 800,
    heightPx: 520,
    note: "Each level's leading curve is fitted to its own plots and the zero-rate check plots every level shares.",
    panels: [
      {
        id: 'levels',
        title: '',
        x: { title: 'N rate', unit: rateUnit, min: 0 },
        y: { title: 'Yield', unit: report.settings.units.yield },
        heightShare: 1,
        layers,
      },
    ],
  };
}
