// Checks the PDF chart painter against the SVG one: the same chart laid out once, written as
// SVG and drawn by resvg, and painted into a PDF and drawn by poppler's pdftoppm (two
// independent rasterizers), must put every shape in the same place.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Resvg } from '@resvg/resvg-js';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { chartFontFiles } from '../cli/chartFonts';
import { drawChartScene, type ChartLabelFace } from '../cli/pdfChart';
import { chartScene } from '../shared/report/chartScene';
import { chartPalette, type ChartSpec } from '../shared/report/chartSpec';
import { sceneSvg } from '../shared/report/svgChart';
import { onePanelChart } from './chartSpec.fixture';

const spec: ChartSpec = onePanelChart(
  'Cedar Bend 2025',
  [
    { kind: 'band', name: 'Interval', role: 'optimumInterval', low: 120, high: 160 },
    {
      kind: 'curve',
      name: 'Fitted',
      model: null,
      role: 'chosen',
      x: [0, 50, 100, 150, 200],
      y: [2, 5, 7, 8, 8],
    },
    { kind: 'points', name: 'Block 1', groupIndex: 0, x: [100], y: [5] },
    { kind: 'marker', name: 'Optimum', role: 'optimumRate', x: 140, label: 'EONR 140' },
  ],
  'Quadratic-plateau chosen',
);

interface Raster {
  data: Uint8Array;
  width: number;
  height: number;
  channels: number;
}

function svgRaster(): Raster {
  const fonts = chartFontFiles();
  const img = new Resvg(sceneSvg(chartScene(spec)), {
    font: { loadSystemFonts: false, fontFiles: fonts, defaultFontFamily: 'DejaVu Sans' },
  }).render();
  return { data: img.pixels, width: img.width, height: img.height, channels: 4 };
}

async function pdfRaster(): Promise<Raster> {
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-pdfchart-'));
  const [regular, bold] = [
    chartFontFiles().find((f) => !/bold/i.test(f))!,
    chartFontFiles().find((f) => /bold/i.test(f)) ?? chartFontFiles()[0],
  ];
  const face: ChartLabelFace = {
    setFont: (doc, b) => doc.font(b ? bold : regular),
    printable: (t) => t,
  };
  const doc = new PDFDocument({ size: [600, 400], margin: 0 });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const ended = new Promise((resolve) => doc.on('end', resolve));
  drawChartScene(doc, chartScene(spec), { x: 0, y: 0, widthPt: 600 }, face);
  doc.end();
  await ended;
  const pdf = path.join(dir, 'chart.pdf');
  writeFileSync(pdf, Buffer.concat(chunks));
  // 72 dpi: one pixel per point, the chart's own pixel grid.
  const r = spawnSync('/usr/bin/pdftoppm', ['-r', '72', '-singlefile', pdf, path.join(dir, 'p')]);
  expect(r.status, String(r.stderr)).toBe(0);
  // Binary PPM (P6): "P6\n<w> <h>\n255\n" then RGB bytes (Netpbm's PPM format).
  const ppm = readFileSync(path.join(dir, 'p.ppm'));
  const head = /^P6\s+(\d+)\s+(\d+)\s+255\s/.exec(ppm.subarray(0, 32).toString('latin1'))!;
  return {
    data: ppm.subarray(head[0].length),
    width: Number(head[1]),
    height: Number(head[2]),
    channels: 3,
  };
}

/** The panel's plotting area, chart pixels. */
function panelFrame(): { x: number; y: number; w: number; h: number } {
  // The frame: the one unfilled rectangle drawn in the axis color.
  const frame = chartScene(spec).shapes.find(
    (s) => s.kind === 'rect' && s.paint.fill === null && s.paint.stroke === chartPalette.axis,
  );
  if (frame?.kind !== 'rect') throw new Error('The chart has no panel.');
  return frame;
}

/** Center of the dark ink (the chosen curve's) in one pixel column of the panel, weighted. */
function columnInk(r: Raster, x: number, frame: { y: number; h: number }): number {
  let sy = 0;
  let sw = 0;
  for (let y = Math.ceil(frame.y + 2); y < frame.y + frame.h - 2; y++) {
    const i = (y * r.width + x) * r.channels;
    const darkest = Math.min(r.data[i], r.data[i + 1], r.data[i + 2]);
    const w = Math.max(0, 160 - darkest);
    sy += w * y;
    sw += w;
  }
  return sy / sw;
}

/**
 * Center and amount of a color's ink inside the panel's frame (so the labels around it, placed
 * by each writer's own text widths, stay out). Each pixel counts by how far it goes from
 * white toward the color (its coverage: an edge pixel that the rasterizer smoothed counts for
 * part), and only when it lies on that line from white, so other colors do not count.
 */
function centroid(r: Raster, hex: string, alpha = 1): { x: number; y: number; count: number } {
  const ink = [1, 3, 5].map((i) => alpha * (255 - parseInt(hex.slice(i, i + 2), 16)));
  const norm = ink.reduce((s, v) => s + v * v, 0);
  let sx = 0;
  let sy = 0;
  let count = 0;
  const frame = panelFrame();
  for (let y = Math.ceil(frame.y + 2); y < frame.y + frame.h - 2; y++) {
    for (let x = Math.ceil(frame.x + 2); x < frame.x + frame.w - 2; x++) {
      const i = (y * r.width + x) * r.channels;
      const v = [0, 1, 2].map((k) => 255 - r.data[i + k]);
      const c = v.reduce((s, vk, k) => s + vk * ink[k], 0) / norm;
      const off = Math.hypot(...v.map((vk, k) => vk - c * ink[k]));
      if (c > 0.3 && c < 1.2 && off < 0.1 * c * Math.sqrt(norm)) {
        sx += c * x;
        sy += c * y;
        count += c;
      }
    }
  }
  return { x: sx / count, y: sy / count, count };
}

describe('drawChartScene (the grower PDF’s vector charts)', () => {
  it('puts the points, the optimum line and the curve where the SVG writer puts them', async () => {
    const a = svgRaster();
    const b = await pdfRaster();
    expect([b.width, b.height]).toEqual([a.width, a.height]);
    // Block 1's marker (drawn at 85 % opacity) and the optimum's dashed line with its label:
    // each the same place in both, to a pixel.
    for (const [color, alpha] of [
      [chartPalette.groups[0], 0.85],
      [chartPalette.optimumRate, 1],
    ] as const) {
      const p = centroid(a, color, alpha);
      const q = centroid(b, color, alpha);
      expect(p.count, color).toBeGreaterThan(10);
      expect(q.count / p.count, color).toBeGreaterThan(0.5);
      expect(q.count / p.count, color).toBeLessThan(2);
      expect(Math.abs(p.x - q.x), color).toBeLessThan(1.5);
      expect(Math.abs(p.y - q.y), color).toBeLessThan(1.5);
    }
    // The chosen curve: its height in the columns of rates 25, 75, 125 and 175 (between the
    // grid lines), read as the center of the dark ink in each column.
    const frame = panelFrame();
    for (const rate of [25, 75, 125, 175]) {
      const x = Math.round(frame.x + (rate / 200) * frame.w);
      const [p, q] = [a, b].map((r) => columnInk(r, x, frame));
      expect(Math.abs(p - q), `rate ${rate}`).toBeLessThan(1);
    }
  });

  it('paints the interval band with its transparency, not as a solid block', async () => {
    // The panel's frame from the scene: rate 130 (inside the 120–160 band, off every grid line
    // and the optimum's line) and yield 5 (between grid lines) land at one pixel.
    const frame = panelFrame();
    const x = Math.round(frame.x + (130 / 200) * frame.w);
    const y = Math.round(frame.y + frame.h / 2);
    const at = (r: Raster): number[] =>
      Array.from(
        r.data.subarray((y * r.width + x) * r.channels, (y * r.width + x) * r.channels + 3),
      );
    // rgba(217, 115, 26, 0.18) over white: 255 − 0.18 × (255 − c) per channel = (248, 230, 214).
    const expected = [217, 115, 26].map((c) => 255 - 0.18 * (255 - c));
    for (const r of [svgRaster(), await pdfRaster()]) {
      at(r).forEach((v, k) => expect(Math.abs(v - expected[k])).toBeLessThan(3));
    }
  });
});
