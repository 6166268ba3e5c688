// The one-site chart at a new price: Plotly.react recomputes every trace whose data arrays are new
// objects, so the arrays that do not depend on prices (curves, plots, residuals) must be the same
// objects from one price to the next, while the optimum's marker and band move and a change of
// units gives new arrays; and the axes must carry their ranges, which Plotly leaves at its
// default when only the layout changed. Invented sites from the project's seeded generator.
import { describe, expect, it } from 'vitest';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { analyzeTable, siteViews } from '../renderer/src/analysis/siteAnalysis';
import { siteChartSpec, type ChartUnits } from '../renderer/src/analysis/siteChart';
import { plotlyFromSpec } from '../renderer/src/lib/plotlyFromSpec';

const metric: ChartUnits = { rate: 'kg/ha', yield: 't/ha', crop: 'corn', currency: 'USD' };
const us: ChartUnits = { rate: 'lb/ac', yield: 'bu/ac', crop: 'corn', currency: 'USD' };

describe('the one-site chart across price changes', () => {
  it('keeps its price-free data arrays and moves only the optimum', async () => {
    const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };
    const out = await analyzeTable(
      {
        table: syntheticPlotTable({ sites: 1 }),
        settings: analysisSettings({ prices, resamples: 0 }),
      },
      async () => {},
    );
    const [site] = siteViews(out);
    const lead = site.recommended!;
    const fit = site.fits[lead]!;
    const chart = (nutrientPricePerKg: number, units: ChartUnits) =>
      plotlyFromSpec(
        siteChartSpec(
          site,
          lead,
          economicOptimum(fit, { ...prices, nutrientPricePerKg }),
          [90, 150],
          [],
          units,
        ),
      );
    const cheap = chart(0.8, metric);
    const dear = chart(1.6, metric);
    expect(dear.data.length).toBe(cheap.data.length);
    dear.data.forEach((trace, i) => {
      expect(trace.x).toBe(cheap.data[i].x);
      expect(trace.y).toBe(cheap.data[i].y);
    });
    // The optimum is a layout shape, and it moved.
    expect(dear.layout.shapes).not.toEqual(cheap.layout.shapes);
    // The axes carry their ranges (Plotly does not recompute an autorange on a change of layout
    // alone), the same at both prices, and they hold every point and the optimum.
    for (const axis of ['xaxis', 'yaxis', 'xaxis2', 'yaxis2']) {
      expect((cheap.layout[axis] as { range?: number[] }).range).toHaveLength(2);
      expect(dear.layout[axis]).toEqual(cheap.layout[axis]);
    }
    const [x0, x1] = (dear.layout.xaxis as { range: number[] }).range;
    for (const shape of dear.layout.shapes as { x0: number; x1: number }[]) {
      expect(shape.x0).toBeGreaterThanOrEqual(x0);
      expect(shape.x1).toBeLessThanOrEqual(x1);
    }
    for (const trace of dear.data) {
      for (const x of trace.x as number[]) expect(x >= x0 && x <= x1).toBe(true);
    }
    // Other units: new arrays, converted. 1 kg/ha = 0.892179 lb/ac from the exact definitions
    // 1 lb = 0.45359237 kg and 1 acre = 4,046.8564224 m² (NIST SP 811, 2008, Appendix B).
    const inUs = chart(0.8, us);
    expect(inUs.data[0].x).not.toBe(cheap.data[0].x);
    const last = (cheap.data[0].x as number[]).at(-1)!;
    expect((inUs.data[0].x as number[]).at(-1)).toBeCloseTo(last * 0.892179, 4);
  });
});
