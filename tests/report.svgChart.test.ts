// Checks the SVG chart renderer by drawing it with resvg (an independent SVG
// rasteriser) and reading the pixels back: the size, the place a point lands
// at, and that the labels were drawn with a real font.
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { chartFontFiles } from '../cli/chartFonts';
import { chartPng, chartPngs } from '../cli/chartPng';
import { chartPalette, type ChartSpec } from '../shared/report/chartSpec';
import { niceTicks } from '../shared/report/niceTicks';
import { renderChartSvg } from '../shared/report/svgChart';
import { onePanelChart } from './chartSpec.fixture';

function spec(title: string, point: [number, number]): ChartSpec {
  return onePanelChart(title, [
    { kind: 'points', name: 'Block 1', groupIndex: 0, x: [point[0]], y: [point[1]] },
  ]);
}

function pixels(svg: string): { data: Buffer; width: number; height: number } {
  const img = new Resvg(svg, {
    font: { loadSystemFonts: false, fontFiles: chartFontFiles(), defaultFontFamily: 'DejaVu Sans' },
  }).render();
  return { data: img.pixels, width: img.width, height: img.height };
}

function rgb(hex: string): [number, number, number] {
  return [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}

describe('niceTicks', () => {
  it('widens a range to whole steps of 1, 2, 2.5 or 5 × 10^k', () => {
    expect(niceTicks(3, 187).ticks).toEqual([0, 50, 100, 150, 200]);
    expect(niceTicks(0.31, 0.79, 5).ticks).toEqual([0.3, 0.4, 0.5, 0.6, 0.7, 0.8]);
    const t = niceTicks(0, 1, 4);
    expect(t.step).toBe(0.25);
    expect(t.decimals).toBe(2);
  });
  it('gives a flat series an axis around its value', () => {
    const t = niceTicks(5, 5);
    expect(t.min).toBeLessThan(5);
    expect(t.max).toBeGreaterThan(5);
  });
});

describe('renderChartSvg', () => {
  it('places a point where its axis values say, inside the drawn frame', () => {
    const { data, width, height } = pixels(renderChartSvg(spec('', [100, 5])));
    expect([width, height]).toEqual([600, 400]);
    const [br, bg, bb] = rgb(chartPalette.groups[0]);
    let sx = 0;
    let sy = 0;
    let count = 0;
    // Below the legend, whose Block 1 swatch has the same color.
    for (let y = 60; y < height; y++) {
      for (let x = 0; x < width; x++) {
        const i = (y * width + x) * 4;
        const d = Math.abs(data[i] - br) + Math.abs(data[i + 1] - bg) + Math.abs(data[i + 2] - bb);
        // Block 1 markers are drawn at 85 % opacity on white; allow that blend.
        if (d < 90 && data[i] < 120) {
          sx += x;
          sy += y;
          count++;
        }
      }
    }
    expect(count).toBeGreaterThan(10);
    // The frame: the first dark (axis-colored) pixel met walking out from the point.
    const dark = (x: number, y: number): boolean => {
      const i = (y * width + x) * 4;
      return data[i] < 200 && data[i + 1] < 200 && data[i + 2] < 200;
    };
    const cx = Math.round(sx / count);
    const cy = Math.round(sy / count);
    const walk = (dx: number, dy: number): number => {
      let x = cx + dx * 12;
      let y = cy + dy * 12;
      while (x > 0 && y > 0 && x < width - 1 && y < height - 1 && !dark(x, y)) {
        x += dx;
        y += dy;
      }
      return dx !== 0 ? x : y;
    };
    const left = walk(-1, 0);
    const right = walk(1, 0);
    const top = walk(0, -1);
    const bottom = walk(0, 1);
    expect(right - left).toBeGreaterThan(400);
    // x = 100 is half of 0–200 and y = 5 half of 0–10: the center of the frame, to 2 px.
    expect(Math.abs(sx / count - (left + right) / 2)).toBeLessThan(2);
    expect(Math.abs(sy / count - (top + bottom) / 2)).toBeLessThan(2);
  });

  it('draws the title text with a loaded font', () => {
    const a = pixels(renderChartSvg(spec('', [100, 5])));
    const b = pixels(renderChartSvg(spec('Cedar Bend 2025', [100, 5])));
    // Without a font resvg silently draws no glyphs: the two would be identical.
    let differing = 0;
    for (let y = 0; y < 30; y++) {
      for (let x = 0; x < a.width; x++) {
        const i = (y * a.width + x) * 4;
        if (Math.abs(a.data[i] - b.data[i]) > 100) differing++;
      }
    }
    expect(differing).toBeGreaterThan(200);
  });

  it('escapes text so a site name with & or < stays valid XML', () => {
    const svg = renderChartSvg(spec('Smith & Sons <north>', [100, 5]));
    expect(svg).toContain('Smith &amp; Sons &lt;north&gt;');
    expect(() => pixels(svg)).not.toThrow();
  });

  it('refuses a spec with no panels', () => {
    expect(() => renderChartSvg({ ...spec('', [0, 0]), panels: [] })).toThrow(/at least one panel/);
  });
});

describe('chartPng', () => {
  it('draws labels as glyph outlines where resvg would set the text itself', () => {
    // The same chart with its labels as text (laid out by resvg) and as outlines (laid out by
    // fontkit, chartPng's way): the title's ink must cover the same span at the same height.
    const s = spec('Cedar Bend 2025: yield response to N', [100, 5]);
    const asText = pixels(renderChartSvg(s));
    const png = `data:image/png;base64,${Buffer.from(chartPng(s, 1)).toString('base64')}`;
    const asOutlines = pixels(
      `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="400"><image width="600" height="400" href="${png}"/></svg>`,
    );
    const ink = (p: { data: Buffer; width: number }) => {
      let [left, right, top, bottom, amount] = [Infinity, -1, Infinity, -1, 0];
      for (let y = 0; y < 32; y++) {
        for (let x = 0; x < p.width; x++) {
          const v = 255 - p.data[(y * p.width + x) * 4];
          if (v < 60) continue;
          amount += v;
          [left, right] = [Math.min(left, x), Math.max(right, x)];
          [top, bottom] = [Math.min(top, y), Math.max(bottom, y)];
        }
      }
      return { left, right, top, bottom, amount };
    };
    const a = ink(asText);
    const b = ink(asOutlines);
    expect(a.right - a.left).toBeGreaterThan(200);
    for (const k of ['left', 'right', 'top', 'bottom'] as const)
      expect(Math.abs(a[k] - b[k]), k).toBeLessThanOrEqual(2);
    expect(Math.abs(b.amount / a.amount - 1)).toBeLessThan(0.1);
  });

  it('writes a PNG at twice the CSS size', () => {
    const png = chartPng(spec('Test', [50, 2]));
    expect(Buffer.from(png.subarray(1, 4)).toString('ascii')).toBe('PNG');
    // IHDR width and height, big-endian at bytes 16–23 (PNG specification, section 11.2.2).
    const view = new DataView(png.buffer, png.byteOffset);
    expect(view.getUint32(16)).toBe(1200);
    expect(view.getUint32(20)).toBe(800);
  });
});

describe('chartPngs', () => {
  it('draws many charts in worker batches, in order, each the same as one drawn alone', async () => {
    const specs = Array.from({ length: 30 }, (_, i) => spec(`Chart ${i}`, [i * 5, 5]));
    const pngs = await chartPngs(specs, 1);
    expect(pngs).toHaveLength(30);
    // The same renderer with the same fonts gives the same bytes (checked for a chart past the first batch).
    expect(Buffer.from(pngs[27]).equals(Buffer.from(chartPng(specs[27], 1)))).toBe(true);
    expect(Buffer.from(pngs[0]).equals(Buffer.from(pngs[1]))).toBe(false);
  });
});
