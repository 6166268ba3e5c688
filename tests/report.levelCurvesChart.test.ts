// levelCurvesChart on the demo rate × timing file (shared/demo/demoTiming, the seeded generator),
// run through the command line's path (tests/report.pipeline): the chart's points are checked
// against the CSV's own rows converted by the unit definitions (NIST SP 811: 1 lb = 0.45359237 kg,
// 1 acre = 4046.8564224 m²; a corn bushel is 56 lb, the USDA standard weight), and each curve
// against its model's formula written out here from the fitted parameters.
import { beforeAll, describe, expect, it } from 'vitest';
import { demoTimingCsv } from '../shared/demo/demoTiming';
import { importFiles } from '../shared/import/importFiles';
import type { CurveLayer, PointLayer } from '../shared/report/chartSpec';
import { chartPalette } from '../shared/report/chartSpec';
import { levelCurvesChart, UnknownLevelError } from '../shared/report/levelCurvesChart';
import { renderChartSvg } from '../shared/report/svgChart';
import type { SiteLevelsReport, TrialReport } from '../shared/report/trialReport';
import { plotlyFromSpec } from '../renderer/src/lib/plotlyFromSpec';
import { reportOf } from './report.pipeline';

const KG_HA_PER_LB_AC = 0.45359237 / (4046.8564224 / 10_000);
const KG_HA_PER_BU_AC = 56 * KG_HA_PER_LB_AC;

let report: TrialReport;
let site: SiteLevelsReport;
/** The CSV's rows of Larkspur Bottom: timing, rate kg/ha, yield kg/ha. */
let rows: { timing: string; rateKgHa: number; yieldKgHa: number }[];

beforeAll(async () => {
  const csv = demoTimingCsv();
  rows = csv
    .trim()
    .split('\n')
    .slice(1)
    .map((l) => l.split(','))
    .filter((c) => c[0] === 'Larkspur Bottom')
    .map((c) => ({ timing: c[3], rateKgHa: Number(c[4]), yieldKgHa: Number(c[5]) * 1000 }));
  const { table, mapping } = await importFiles(
    [{ name: 'wrenhollow-timing-2025.csv', bytes: new TextEncoder().encode(csv) }],
    { crop: 'corn', overrides: [] },
  );
  report = reportOf(
    table,
    {
      units: { rate: 'lb/ac', yield: 'bu/ac' },
      unitSystem: 'us',
      currency: 'USD',
      crop: 'corn',
      prices: { grainPrice: 4.5, nutrientPrice: 0.6, product: null, defaulted: false },
      boot: 60,
      seed: 3,
      blocks: 'fixed',
      intervalLevel: 0.9,
    },
    { tool: { name: 'Plotrate', version: '0.1.0' }, createdAt: '2026-03-01T12:00:00Z', mapping },
  );
  site = report.levels.find((l) => l.site === 'Larkspur Bottom')!;
});

const sorted = (a: number[]) => [...a].sort((x, y) => x - y);

/** The quadratic-plateau written out: y = P + c·min(x − x0, 0)² (kg/ha). */
const quadraticPlateau = (p: Record<string, number>, x: number) =>
  p.P + p.c * Math.min(x - p.x0, 0) ** 2;

describe('levelCurvesChart', () => {
  it('overlays one curve per timing over its own plots, with the shared checks drawn once', () => {
    const layers = levelCurvesChart(report, site, null).panels[0].layers;
    const curves = layers.filter((l): l is CurveLayer => l.kind === 'curve');
    const points = layers.filter((l): l is PointLayer => l.kind === 'points');
    expect(curves.map((c) => c.name)).toEqual([
      'At planting (Quadratic-plateau)',
      'Split (V6) (Quadratic-plateau)',
    ]);
    expect(points.map((p) => p.name)).toEqual([
      'At planting plots',
      'Split (V6) plots',
      'Shared check plots (0 N)',
    ]);
    // A level's curve and its plots share a color group; the checks take the next one.
    expect(curves.map((c) => c.groupIndex)).toEqual([0, 1]);
    expect(points.map((p) => p.groupIndex)).toEqual([0, 1, 2]);
    expect(layers.some((l) => l.kind === 'marker' || l.kind === 'band')).toBe(false);
    // Every fertilized plot of a timing, from the CSV, in lb N/ac and bu/ac.
    for (const [k, timing] of ['At planting', 'Split (V6)'].entries()) {
      const own = rows.filter((r) => r.timing === timing && r.rateKgHa > 0);
      expect(own).toHaveLength(20);
      expect(sorted(points[k].x)).toEqual(
        sorted(own.map((r) => r.rateKgHa / KG_HA_PER_LB_AC)).map((v) => expect.closeTo(v, 9)),
      );
      expect(sorted(points[k].y)).toEqual(
        sorted(own.map((r) => r.yieldKgHa / KG_HA_PER_BU_AC)).map((v) => expect.closeTo(v, 6)),
      );
    }
    // The zero-rate checks: one per block in the CSV, shared by both timings, drawn once.
    const checks = rows.filter((r) => r.rateKgHa === 0);
    expect(checks).toHaveLength(4);
    expect(points[2].x).toEqual([0, 0, 0, 0]);
    expect(sorted(points[2].y)).toEqual(
      sorted(checks.map((r) => r.yieldKgHa / KG_HA_PER_BU_AC)).map((v) => expect.closeTo(v, 6)),
    );
  });

  it("draws each timing's curve on its quadratic-plateau's formula", () => {
    const curves = levelCurvesChart(report, site, null).panels[0].layers.filter(
      (l): l is CurveLayer => l.kind === 'curve',
    );
    for (const [k, l] of site.levels.entries()) {
      const row = l.report.models.find((m) => m.model === 'quadraticPlateau')!;
      expect(l.report.bestModel).toBe('quadraticPlateau');
      const c = curves[k];
      expect(c.x.length).toBeGreaterThan(10);
      c.x.forEach((xLbAc, i) => {
        const yKgHa = quadraticPlateau(row.params, xLbAc * KG_HA_PER_LB_AC);
        expect(c.y[i]).toBeCloseTo(yKgHa / KG_HA_PER_BU_AC, 6);
      });
      // The curve reaches its plateau P at the join.
      expect(Math.max(...c.y)).toBeCloseTo(row.params.P / KG_HA_PER_BU_AC, 6);
    }
  });

  it('draws one timing alone with its recommended rate at the closed-form optimum and its interval', () => {
    // Price ratio: 0.60 $/lb N over 4.50 $/bu of 56 lb = 0.6·56/4.5 kg grain per kg N.
    const ratio = (0.6 * 56) / 4.5;
    const l = site.levels[1];
    const p = l.report.models.find((m) => m.model === 'quadraticPlateau')!.params;
    const layers = levelCurvesChart(report, site, 'Split (V6)').panels[0].layers;
    const curves = layers.filter((x): x is CurveLayer => x.kind === 'curve');
    expect(curves.map((c) => [c.name, c.role, c.groupIndex])).toEqual([
      ['Split (V6) (Quadratic-plateau)', 'chosen', 1],
    ]);
    const names = layers.filter((x) => x.kind === 'points').map((x) => x.name);
    expect(names).toEqual(['Split (V6) plots', 'Shared check plots (0 N)']);
    const marker = layers.find((x) => x.kind === 'marker')!;
    if (marker.kind !== 'marker') throw new Error('no marker');
    // y' = 2c(x − x0) = ratio at x* = x0 + ratio/(2c).
    expect(marker.x).toBeCloseTo((p.x0 + ratio / (2 * p.c)) / KG_HA_PER_LB_AC, 6);
    const band = layers.find((x) => x.kind === 'band')!;
    if (band.kind !== 'band') throw new Error('no band');
    const ci = l.report.recommendation.ciKgHa!;
    expect([band.low, band.high]).toEqual([
      expect.closeTo(ci[0] / KG_HA_PER_LB_AC, 9),
      expect.closeTo(ci[1] / KG_HA_PER_LB_AC, 9),
    ]);
    expect(band.low).toBeLessThan(marker.x);
    expect(band.high).toBeGreaterThan(marker.x);
  });

  it('refuses a level the site does not have, naming it', () => {
    expect(() => levelCurvesChart(report, site, 'Side-dress')).toThrow(UnknownLevelError);
    expect(() => levelCurvesChart(report, site, 'Side-dress')).toThrow(
      'Larkspur Bottom has no Timing level "Side-dress".',
    );
  });

  it("is drawn with each timing's curve in its own plots' color", () => {
    const { data } = plotlyFromSpec(levelCurvesChart(report, site, null));
    const color = (name: string) => {
      const t = data.find((d) => d.name === name)!;
      return ((t.line ?? t.marker) as { color: string }).color;
    };
    expect(color('At planting (Quadratic-plateau)')).toBe(color('At planting plots'));
    expect(color('Split (V6) (Quadratic-plateau)')).toBe(color('Split (V6) plots'));
    expect(color('At planting plots')).not.toBe(color('Split (V6) plots'));
    expect(color('Shared check plots (0 N)')).not.toBe(color('At planting plots'));
  });

  it("is printed (SVG) with each timing's curve stroked in its group's color", () => {
    const svg = renderChartSvg(levelCurvesChart(report, site, null));
    // Curves are the dashed polylines; each level's stroke is its group's palette color.
    const strokes = [
      ...svg.matchAll(/<polyline[^>]*stroke="(#[0-9a-f]{6})"[^>]*stroke-dasharray/g),
    ];
    expect(new Set(strokes.map((m) => m[1]))).toEqual(
      new Set([chartPalette.groups[0], chartPalette.groups[1]]),
    );
  });
});
