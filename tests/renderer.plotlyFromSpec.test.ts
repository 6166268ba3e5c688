import { describe, expect, it } from 'vitest';
import { chartPalette, type ChartSpec } from '../shared/report/chartSpec';
import { plotlyFromSpec } from '../renderer/src/lib/plotlyFromSpec';

function spec(): ChartSpec {
  return {
    title: 'Ashgrove: yield response to N',
    subtitle: 'Quadratic-plateau',
    widthPx: 800,
    heightPx: 500,
    note: '',
    panels: [
      {
        id: 'response',
        title: '',
        x: { title: 'N rate', unit: 'kg N/ha' },
        y: { title: 'Yield', unit: 't/ha' },
        heightShare: 3,
        layers: [
          { kind: 'band', name: 'Optimum interval', role: 'optimumInterval', low: 120, high: 170 },
          {
            kind: 'curve',
            name: 'Quadratic-plateau',
            model: 'quadraticPlateau',
            role: 'chosen',
            x: [0, 100, 200],
            y: [8, 11, 11.5],
          },
          { kind: 'points', name: 'Block 1', groupIndex: 0, x: [0, 200], y: [8.1, 11.4] },
          { kind: 'points', name: 'Block 2', groupIndex: 1, x: [0, 200], y: [7.9, 11.6] },
          {
            kind: 'points',
            name: 'Excluded',
            groupIndex: 0,
            x: [100],
            y: [3],
            excluded: true,
          },
          { kind: 'marker', name: 'Optimum', role: 'optimumRate', x: 148, label: 'Optimum 148' },
        ],
      },
      {
        id: 'residuals',
        title: 'Residuals',
        x: { title: 'N rate', unit: 'kg N/ha' },
        y: { title: 'Residual', unit: 't/ha', zeroLine: true },
        heightShare: 1,
        layers: [{ kind: 'points', name: 'Block 1', groupIndex: 0, x: [0], y: [0.1] }],
      },
    ],
  };
}

describe('plotlyFromSpec', () => {
  it('gives each panel its own axes, stacked by height share with titles carrying units', () => {
    const { layout } = plotlyFromSpec(spec());
    const y = layout.yaxis as { domain: number[]; title: { text: string } };
    const y2 = layout.yaxis2 as { domain: number[]; zeroline: boolean; anchor: string };
    expect(y.title.text).toBe('Yield (t/ha)');
    // Same rates below: one x title at the bottom, and the axes zoom together.
    expect((layout.xaxis as { title: { text: string } }).title.text).toBe('');
    expect(layout.xaxis2).toMatchObject({ title: { text: 'N rate (kg N/ha)' }, matches: 'x' });
    expect(y.domain[1]).toBe(1);
    expect(y2.domain[0]).toBe(0);
    // 3 : 1 height after the gap
    const h1 = y.domain[1] - y.domain[0];
    const h2 = y2.domain[1] - y2.domain[0];
    expect(h1 / h2).toBeCloseTo(3, 10);
    expect(y.domain[0]).toBeGreaterThan(y2.domain[1]);
    expect(y2.zeroline).toBe(true);
    expect(y2.anchor).toBe('x2');
  });

  it('draws points per block with their own shape and color, excluded ones hollow grey', () => {
    const { data } = plotlyFromSpec(spec());
    const points = data.filter((d) => d.mode === 'markers');
    expect(points.map((p) => p.name)).toEqual(['Block 1', 'Block 2', 'Excluded', 'Block 1']);
    const [b1, b2, ex, residual] = points.map((p) => p.marker as { symbol: string; color: string });
    expect(b1.symbol).not.toBe(b2.symbol);
    expect(b1.color).toBe(chartPalette.groups[0]);
    expect(b2.color).toBe(chartPalette.groups[1]);
    expect(ex).toMatchObject({ symbol: 'x-open', color: chartPalette.excluded });
    expect(points[3].yaxis).toBe('y2');
    expect(residual.symbol).toBe(b1.symbol);
    // The residual panel repeats blocks without repeating legend entries.
    expect(points[3].showlegend).toBe(false);
  });

  it('turns the interval into a band and the optimum into a labelled line on the right axes', () => {
    const { layout } = plotlyFromSpec(spec());
    const shapes = layout.shapes as Record<string, unknown>[];
    expect(shapes[0]).toMatchObject({
      type: 'rect',
      x0: 120,
      x1: 170,
      xref: 'x',
      yref: 'y domain',
    });
    expect(shapes[1]).toMatchObject({ type: 'line', x0: 148, x1: 148 });
    const labels = (layout.annotations as { text: string }[]).map((a) => a.text);
    expect(labels).toContain('Optimum 148');
    expect(labels).toContain('<b>Residuals</b>');
  });

  it('draws the chosen curve bold and keeps the subtitle under the title', () => {
    const { data, layout } = plotlyFromSpec(spec());
    const curve = data.find((d) => d.mode === 'lines')!;
    expect((curve.line as { width: number }).width).toBe(3);
    expect((layout.title as { text: string }).text).toBe(
      'Ashgrove: yield response to N<br><sub>Quadratic-plateau</sub>',
    );
  });
});

describe('plotlyFromSpec options', () => {
  it('colorCurves gives each alternative curve its own palette color', () => {
    const base = spec();
    const curve = (name: string) => ({
      kind: 'curve' as const,
      name,
      model: 'quadratic' as const,
      role: 'alternative' as const,
      x: [0, 1],
      y: [1, 2],
    });
    base.panels[0].layers = [curve('Site A'), curve('Site B')];
    const colors = (fig: ReturnType<typeof plotlyFromSpec>) =>
      fig.data.filter((d) => d.mode === 'lines').map((d) => (d.line as { color: string }).color);
    expect(colors(plotlyFromSpec(base, { colorCurves: true }))).toEqual([
      chartPalette.groups[0],
      chartPalette.groups[1],
    ]);
    expect(colors(plotlyFromSpec(base))).toEqual([
      chartPalette.alternative,
      chartPalette.alternative,
    ]);
  });
});
