// The regional chart (shared/report/regionalReturnChart): one description for the screen, the
// workbook and the page. Checked against what it draws from: the regional return's own curve and
// the resampled site-years' band and shares (their numbers are checked in
// analysis.regionalRateInterval.test.ts against the exact resampling distribution). Invented
// gain curves.
import { describe, expect, it } from 'vitest';
import { prepareRegionalReturn } from '../shared/analysis/regionalReturn';
import { regionalAtPrices } from '../shared/analysis/regionalAnalysis';
import { rateGrid } from '../shared/analysis/rateGrid';
import { resampleRegionalGains } from '../shared/analysis/regionalRateInterval';
import { regionalChartData, regionalReturnChart } from '../shared/report/regionalReturnChart';
import { renderChartSvg } from '../shared/report/svgChart';

const grid = rateGrid(0, 500, 1);
const curves = Array.from({ length: 8 }, (_, i) => ({
  site: `S${i}`,
  gainKgHa: (x: number) => (30 + 2 * i) * x - (0.09 + 0.005 * i) * x * x,
}));
const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 };
const prepared = prepareRegionalReturn(curves, grid);
const atTestedRates = prepareRegionalReturn(curves, Float64Array.of(0, 100, 200));
const how = {
  units: { rate: 'kg/ha', yield: 't/ha' } as const,
  crop: 'corn' as const,
  currency: 'EUR',
  toleranceText: '€12.00/ha',
};

describe('regionalReturnChart', () => {
  it('draws the mean, a ribbon from the resamples and the chance of falling short beneath', () => {
    const resampled = resampleRegionalGains(prepared, 300, 5, 0.9);
    const priced = regionalAtPrices({ prepared, atTestedRates, resampled }, prices, 12);
    const data = regionalChartData(priced.regional, priced.rateInterval);
    // 501 grid rates thinned to every second one: at most about 200 points, the ends kept in order.
    expect(data.rateKgHa.length).toBeLessThanOrEqual(260);
    expect(data.rateKgHa[0]).toBe(0);
    expect(data.returnPerHa[0]).toBeCloseTo(priced.regional.meanReturnPerHa[0], 12);
    expect(data.tolerancePerHa).toBe(12);
    const r = data.resampled!;
    expect(r.lowPerHa.length).toBe(data.rateKgHa.length);
    r.lowPerHa.forEach((low, i) => expect(low).toBeLessThanOrEqual(r.highPerHa[i]));
    // At the regional rate the average rarely falls short; far above it, almost always.
    const at = (x: number) => data.rateKgHa.findIndex((v) => v >= x);
    expect(r.shortShare[at(data.bestRateKgHa)]).toBeLessThan(0.5);
    expect(r.shortShare[at(480)]).toBeGreaterThan(0.9);
    const spec = regionalReturnChart(data, how);
    expect(spec.panels.map((p) => p.id)).toEqual(['return', 'risk']);
    expect(spec.panels[0].y.unit).toBe('EUR/ha');
    expect(spec.panels[0].layers.map((l) => l.kind)).toEqual(['band', 'ribbon', 'curve', 'marker']);
    const svg = renderChartSvg(spec);
    expect(svg).toContain('<polygon');
    expect(svg).toContain('Within €12.00/ha of the best');
  });

  it('draws the mean alone without resamples, and says how to get the ribbon', () => {
    const priced = regionalAtPrices({ prepared, atTestedRates, resampled: null }, prices, 12);
    const data = regionalChartData(priced.regional, priced.rateInterval);
    expect(data.resampled).toBeNull();
    const spec = regionalReturnChart(data, how);
    expect(spec.panels.map((p) => p.id)).toEqual(['return']);
    expect(spec.note).toMatch(/Resample the site-years/);
    expect(renderChartSvg(spec)).not.toContain('<polygon');
  });
});
