/**
 * Lays a {@link ChartSpec} out as a scene: the lines, shapes and text the
 * chart is drawn with, in the chart's own pixels (origin top left, y down),
 * with no output format in it. Two writers read a scene: svgChart.ts writes
 * it as SVG (the workbook's pictures, through resvg, and the workspace's
 * printed pages) and the command line paints it into the grower PDF as
 * vectors (cli/pdfChart.ts), so a chart is laid out in one place.
 *
 * Text widths are estimated from the font size (an average glyph of about
 * 0.56 em for a sans face) because there is no layout engine here; the
 * estimate only places legends and labels, so a few pixels off is harmless.
 */
import { MODEL_CURVES } from '../models/curves';
import { numberFormat } from '../units/numberFormat';
import {
  axisLabel,
  chartPalette,
  type ChartAxis,
  type ChartLayer,
  type CurveLayer,
  type ChartPanel,
  type ChartSpec,
  type ChartSymbol,
  type PointLayer,
} from './chartSpec';
import { clipPolygon, clipPolyline } from './clipToBox';
import { niceTicks, type NiceTicks } from './niceTicks';

/** How a shape is filled and outlined. Colors are CSS colors (hex or rgba()); null = none. */
export interface ShapePaint {
  fill: string | null;
  /** 0–1; omitted = opaque. */
  fillOpacity?: number;
  stroke: string | null;
  /** px. */
  strokeWidth?: number;
  /** Dash and gap lengths, px; omitted = solid. */
  dash?: readonly number[];
  /** Round line joins (curves), else the writer's default (miter). */
  roundJoin?: boolean;
}

/** One thing drawn, chart pixels. */
export type ChartShape =
  | { kind: 'line'; x1: number; y1: number; x2: number; y2: number; paint: ShapePaint }
  | { kind: 'rect'; x: number; y: number; w: number; h: number; paint: ShapePaint }
  | { kind: 'circle'; cx: number; cy: number; r: number; paint: ShapePaint }
  /** Points as x0, y0, x1, y1, …; closed = a polygon, open = a polyline. */
  | { kind: 'poly'; points: readonly number[]; closed: boolean; paint: ShapePaint }
  | ChartText;

/** A line of text; (x, y) is its baseline point at the anchor. */
export interface ChartText {
  kind: 'text';
  x: number;
  y: number;
  text: string;
  sizePx: number;
  anchor: 'start' | 'middle' | 'end';
  bold: boolean;
  color: string;
  /** Turned a quarter counter-clockwise about (x, y) (a y-axis title). */
  vertical: boolean;
}

/** A chart ready to write: its size and its shapes in drawing order. */
export interface ChartScene {
  widthPx: number;
  heightPx: number;
  shapes: ChartShape[];
}

/** Text color when none is said. */
export const CHART_TEXT_COLOR = '#111111';
const NOTE_COLOR = '#444444';
const glyphEm = 0.56;

function textWidthPx(text: string, sizePx: number): number {
  return text.length * sizePx * glyphEm;
}

function text(
  x: number,
  y: number,
  body: string,
  sizePx: number,
  more: Partial<Pick<ChartText, 'anchor' | 'bold' | 'color' | 'vertical'>> = {},
): ChartText {
  return {
    kind: 'text',
    x,
    y,
    text: body,
    sizePx,
    anchor: more.anchor ?? 'start',
    bold: more.bold ?? false,
    color: more.color ?? CHART_TEXT_COLOR,
    vertical: more.vertical ?? false,
  };
}

function formatTick(v: number, decimals: number): string {
  const t = numberFormat('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  }).format(v);
  return /^-0(\.0+)?$/.test(t) ? t.slice(1) : t;
}

/** Data extent of a panel along one axis, including bands and markers on x. */
function extent(layers: ChartLayer[], axis: 'x' | 'y'): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number): void => {
    if (Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  };
  for (const l of layers) {
    if (l.kind === 'points' || l.kind === 'curve') l[axis].forEach(take);
    else if (l.kind === 'ribbon') {
      if (axis === 'x') l.x.forEach(take);
      else {
        l.low.forEach(take);
        l.high.forEach(take);
      }
    } else if (axis === 'x' && l.kind === 'band') {
      take(l.low);
      take(l.high);
    } else if (axis === 'x' && l.kind === 'marker') take(l.x);
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

function axisTicks(axis: ChartAxis, layers: ChartLayer[], which: 'x' | 'y'): NiceTicks {
  const [lo, hi] = extent(layers, which);
  const t = niceTicks(axis.min ?? lo, axis.max ?? hi, which === 'x' ? 6 : 5);
  if (axis.zeroLine && which === 'y') {
    // Residuals read best around a centered zero.
    const m = Math.max(Math.abs(t.min), Math.abs(t.max));
    return niceTicks(-m, m, 4);
  }
  return t;
}

function marker(
  symbol: ChartSymbol,
  cx: number,
  cy: number,
  r: number,
  paint: ShapePaint,
): ChartShape {
  const poly = (points: number[]): ChartShape => ({ kind: 'poly', points, closed: true, paint });
  switch (symbol) {
    case 'circle':
      return { kind: 'circle', cx, cy, r, paint };
    case 'square':
      return { kind: 'rect', x: cx - r * 0.9, y: cy - r * 0.9, w: r * 1.8, h: r * 1.8, paint };
    case 'triangle':
      return poly([cx, cy - r * 1.15, cx + r, cy + r * 0.75, cx - r, cy + r * 0.75]);
    case 'diamond':
      return poly([cx, cy - r * 1.2, cx + r, cy, cx, cy + r * 1.2, cx - r, cy]);
    case 'cross': {
      // A plus sign whose arms are 0.7 r wide, walked clockwise from the top arm's left corner.
      const a = r * 0.35;
      const steps = [
        [2 * a, 0],
        [0, r - a],
        [r - a, 0],
        [0, 2 * a],
        [a - r, 0],
        [0, r - a],
        [-2 * a, 0],
        [0, a - r],
        [a - r, 0],
        [0, -2 * a],
        [r - a, 0],
      ];
      const points = [cx - a, cy - r];
      for (const [dx, dy] of steps)
        points.push(points[points.length - 2] + dx, points[points.length - 1] + dy);
      return poly(points);
    }
    case 'star': {
      const points: number[] = [];
      for (let i = 0; i < 10; i++) {
        const rr = i % 2 === 0 ? r * 1.2 : r * 0.5;
        const ang = -Math.PI / 2 + (i * Math.PI) / 5;
        points.push(cx + rr * Math.cos(ang), cy + rr * Math.sin(ang));
      }
      return poly(points);
    }
  }
}

function pointStyle(layer: PointLayer): { symbol: ChartSymbol; paint: ShapePaint } {
  if (layer.corrected)
    return {
      symbol: 'circle',
      paint: { fill: null, stroke: chartPalette.corrected, strokeWidth: 1.8 },
    };
  const symbol = chartPalette.symbols[layer.groupIndex % chartPalette.symbols.length];
  if (layer.excluded) {
    return {
      symbol,
      paint: { fill: '#ffffff', stroke: chartPalette.excluded, strokeWidth: 1.4 },
    };
  }
  const color = chartPalette.groups[layer.groupIndex % chartPalette.groups.length];
  return {
    symbol,
    paint: { fill: color, fillOpacity: 0.85, stroke: '#ffffff', strokeWidth: 0.6 },
  };
}

/** A dash pattern written as in SVG ("6 3") as numbers. */
function dashLengths(pattern: string): number[] {
  return pattern
    .trim()
    .split(/[\s,]+/)
    .map(Number);
}

function curvePaint(layer: CurveLayer, index: number): ShapePaint {
  if (layer.role === 'chosen') return { fill: null, stroke: chartPalette.chosen, strokeWidth: 2.6 };
  if (layer.role === 'return') return { fill: null, stroke: chartPalette.return, strokeWidth: 2.4 };
  if (layer.role === 'risk') return { fill: null, stroke: chartPalette.risk, strokeWidth: 2.2 };
  // Alternatives differ by dash so they stay apart in greyscale print: a model's
  // curve has its own (its curve entry's, as on the screen), any other curve one by order.
  const dash = layer.model
    ? MODEL_CURVES[layer.model].dash
    : OTHER_DASHES[index % OTHER_DASHES.length];
  const color =
    layer.groupIndex === undefined
      ? chartPalette.alternative
      : chartPalette.groups[layer.groupIndex % chartPalette.groups.length];
  return { fill: null, stroke: color, strokeWidth: 1.4, dash: dashLengths(dash) };
}

const OTHER_DASHES = ['6 3', '2 3', '8 3 2 3', '4 4', '1 2'];

/** A legend entry: its swatch drawn about (0, 0), the baseline of its text at (22, 0). */
interface LegendItem {
  swatch: ChartShape;
  text: string;
}

function legendItems(panel: ChartPanel, size: number): LegendItem[] {
  const items: LegendItem[] = [];
  let alt = 0;
  for (const l of panel.layers) {
    if (l.kind === 'points') {
      const { symbol, paint } = pointStyle(l);
      items.push({ swatch: marker(symbol, 6, -size * 0.35, size * 0.33, paint), text: l.name });
    } else if (l.kind === 'curve') {
      const paint = curvePaint(l, l.role === 'alternative' ? alt++ : 0);
      const y = -size * 0.35;
      items.push({ swatch: { kind: 'line', x1: 0, y1: y, x2: 16, y2: y, paint }, text: l.name });
    } else if (l.kind === 'band' || l.kind === 'ribbon') {
      const paint = { fill: chartPalette[l.role], stroke: null };
      items.push({
        swatch: { kind: 'rect', x: 0, y: -size * 0.8, w: 16, h: size * 0.9, paint },
        text: l.name,
      });
    } else {
      const paint = { fill: null, stroke: chartPalette[l.role], strokeWidth: 1.8, dash: [4, 2] };
      items.push({
        swatch: { kind: 'line', x1: 8, y1: -size * 0.9, x2: 8, y2: size * 0.15, paint },
        text: l.name,
      });
    }
  }
  return items;
}

/** The shape moved by (dx, dy). */
function moved(s: ChartShape, dx: number, dy: number): ChartShape {
  switch (s.kind) {
    case 'line':
      return { ...s, x1: s.x1 + dx, y1: s.y1 + dy, x2: s.x2 + dx, y2: s.y2 + dy };
    case 'rect':
    case 'text':
      return { ...s, x: s.x + dx, y: s.y + dy };
    case 'circle':
      return { ...s, cx: s.cx + dx, cy: s.cy + dy };
    case 'poly':
      return { ...s, points: s.points.map((v, i) => v + (i % 2 === 0 ? dx : dy)) };
  }
}

/** Lays legend items in rows no wider than `width`; returns the shapes and their height. */
function legend(items: LegendItem[], x0: number, y0: number, width: number, size: number) {
  const rowH = size * 1.45;
  let x = 0;
  let row = 0;
  const shapes: ChartShape[] = [];
  for (const it of items) {
    const w = 22 + textWidthPx(it.text, size) + 14;
    if (x > 0 && x + w > width) {
      x = 0;
      row++;
    }
    const tx = x0 + x;
    const ty = y0 + row * rowH + size;
    shapes.push(moved(it.swatch, tx, ty), text(tx + 22, ty, it.text, size));
    x += w;
  }
  return { shapes, height: items.length ? (row + 1) * rowH : 0 };
}

function panelShapes(
  panel: ChartPanel,
  box: { x: number; y: number; w: number; h: number },
  size: number,
): ChartShape[] {
  const out: ChartShape[] = [];
  const xt = axisTicks(panel.x, panel.layers, 'x');
  const yt = axisTicks(panel.y, panel.layers, 'y');
  const sx = (v: number): number => box.x + ((v - xt.min) / (xt.max - xt.min)) * box.w;
  const sy = (v: number): number => box.y + box.h - ((v - yt.min) / (yt.max - yt.min)) * box.h;
  const gridPaint: ShapePaint = { fill: null, stroke: chartPalette.grid, strokeWidth: 1 };
  const axisPaint: ShapePaint = { fill: null, stroke: chartPalette.axis, strokeWidth: 1 };

  // One grid line from (x1, y1) to (x2, y2) and its tick label at `at`.
  const tick = (
    line: [number, number, number, number],
    at: [number, number],
    anchor: 'end' | 'middle',
    label: string,
  ): void => {
    const [x1, y1, x2, y2] = line;
    out.push(
      { kind: 'line', x1, y1, x2, y2, paint: gridPaint },
      text(at[0], at[1], label, size * 0.9, { anchor }),
    );
  };
  for (const t of yt.ticks) {
    const y = sy(t);
    tick(
      [box.x, y, box.x + box.w, y],
      [box.x - 6, y + size * 0.35],
      'end',
      formatTick(t, yt.decimals),
    );
  }
  for (const t of xt.ticks) {
    const x = sx(t);
    const label = formatTick(t, xt.decimals);
    tick([x, box.y, x, box.y + box.h], [x, box.y + box.h + size * 1.2], 'middle', label);
  }
  if (panel.y.zeroLine) {
    const y = sy(0);
    out.push({ kind: 'line', x1: box.x, y1: y, x2: box.x + box.w, y2: y, paint: axisPaint });
  }
  out.push(
    text(box.x + box.w / 2, box.y + box.h + size * 2.5, axisLabel(panel.x), size, {
      anchor: 'middle',
    }),
  );
  const yx =
    box.x -
    16 -
    size * 0.9 * glyphEm * Math.max(...yt.ticks.map((t) => formatTick(t, yt.decimals).length));
  out.push(
    text(yx, box.y + box.h / 2, axisLabel(panel.y), size, { anchor: 'middle', vertical: true }),
  );
  if (panel.title) out.push(text(box.x, box.y - 6, panel.title, size, { bold: true }));

  // What lies in the plotting area is cut to it here, in the scene's own coordinates (clipToBox),
  // so no writer needs a clip path: a band to its part of the rates, a curve that leaves the
  // yield range (a straight line past the top) to the runs inside.
  let alt = 0;
  for (const l of panel.layers) {
    if (l.kind === 'band') {
      const x1 = Math.max(box.x, sx(Math.min(l.low, l.high)));
      const x2 = Math.min(box.x + box.w, sx(Math.max(l.low, l.high)));
      if (x2 < box.x || x1 > box.x + box.w) continue;
      out.push({
        kind: 'rect',
        x: x1,
        y: box.y,
        w: Math.max(1, x2 - x1),
        h: box.h,
        paint: { fill: chartPalette[l.role], stroke: null },
      });
    } else if (l.kind === 'ribbon') {
      const upper: number[] = [];
      const lower: number[] = [];
      l.x.forEach((xv, i) => {
        if (!(Number.isFinite(xv) && Number.isFinite(l.low[i]) && Number.isFinite(l.high[i])))
          return;
        upper.push(sx(xv), sy(l.high[i]));
        lower.push(sx(xv), sy(l.low[i]));
      });
      // The lower edge walked back from the right, so the outline closes on itself.
      const back: number[] = [];
      for (let i = lower.length - 2; i >= 0; i -= 2) back.push(lower[i], lower[i + 1]);
      const points = upper.length > 2 ? clipPolygon([...upper, ...back], box) : [];
      if (points.length > 4)
        out.push({
          kind: 'poly',
          points,
          closed: true,
          paint: { fill: chartPalette[l.role], stroke: null },
        });
    } else if (l.kind === 'curve') {
      const points: number[] = [];
      l.x.forEach((xv, i) => {
        const yv = l.y[i];
        if (Number.isFinite(xv) && Number.isFinite(yv)) points.push(sx(xv), sy(yv));
      });
      const paint = { ...curvePaint(l, l.role === 'alternative' ? alt++ : 0), roundJoin: true };
      for (const run of clipPolyline(points, box))
        out.push({ kind: 'poly', points: run, closed: false, paint });
    } else if (l.kind === 'marker') {
      const x = sx(l.x);
      if (x < box.x || x > box.x + box.w) continue;
      out.push({
        kind: 'line',
        x1: x,
        y1: box.y,
        x2: x,
        y2: box.y + box.h,
        paint: { fill: null, stroke: chartPalette[l.role], strokeWidth: 1.8, dash: [5, 3] },
      });
    }
  }
  // The frame goes over gridlines and bands so its edges stay unbroken.
  out.push({ kind: 'rect', ...box, paint: axisPaint });
  // Points are not clipped: a plot at the lowest or highest rate sits on the frame and must show whole.
  for (const l of panel.layers) {
    if (l.kind !== 'points') continue;
    const { symbol, paint } = pointStyle(l);
    l.x.forEach((xv, i) => {
      const yv = l.y[i];
      if (Number.isFinite(xv) && Number.isFinite(yv)) {
        out.push(marker(symbol, sx(xv), sy(yv), size * (l.corrected ? 0.7 : 0.36), paint));
      }
    });
  }
  // Marker labels sit outside the clip so they can never be cut off.
  for (const l of panel.layers) {
    if (l.kind !== 'marker' || !l.label) continue;
    const x = sx(l.x);
    const w = textWidthPx(l.label, size * 0.9);
    const right = x + 4 + w < box.x + box.w;
    out.push(
      text(right ? x + 4 : x - 4, box.y + size * 1.1, l.label, size * 0.9, {
        anchor: right ? 'start' : 'end',
        bold: true,
        color: chartPalette[l.role],
      }),
    );
  }
  return out;
}

/**
 * Lays a chart description out as shapes and text.
 * @param spec - the chart; all numbers in its axes' units
 * @param fontSizePx - base font size, px
 * @returns the scene, `spec.widthPx` × `spec.heightPx` px, white background not included
 * @throws {RangeError} when the spec has no panels or a non-positive size
 * @example
 * chartScene(spec).shapes.filter((s) => s.kind === 'text') // every label
 */
export function chartScene(spec: ChartSpec, fontSizePx = 13): ChartScene {
  if (!(spec.widthPx > 0 && spec.heightPx > 0)) {
    throw new RangeError(
      `A chart needs a positive size; got ${spec.widthPx} × ${spec.heightPx} px.`,
    );
  }
  if (spec.panels.length === 0) throw new RangeError('A chart needs at least one panel.');
  const size = fontSizePx;
  const W = spec.widthPx;
  const H = spec.heightPx;
  const left = 24 + size * 4.6;
  // Room for half of the last x tick label.
  const right = size * 2.2;
  const shapes: ChartShape[] = [];
  let y = 10;
  if (spec.title) {
    y += size * 1.35;
    shapes.push(text(left, y, spec.title, size * 1.3, { bold: true }));
  }
  if (spec.subtitle) {
    y += size * 1.3;
    shapes.push(text(left, y, spec.subtitle, size, { color: NOTE_COLOR }));
  }
  y += 6;
  const allItems = spec.panels.flatMap((p) => legendItems(p, size * 0.9));
  // One legend for the whole chart, without repeats (residual panels reuse block names).
  const seen = new Set<string>();
  const items = allItems.filter((it) => (seen.has(it.text) ? false : (seen.add(it.text), true)));
  const lg = legend(items, left, y, W - left - right, size * 0.9);
  shapes.push(...lg.shapes);
  y += lg.height + 8;

  const noteH = spec.note ? size * 1.6 : 0;
  const axisH = size * 3.1;
  const titleH = (p: ChartPanel): number => (p.title ? size * 1.4 : 0);
  const fixed = spec.panels.reduce((s, p) => s + axisH + titleH(p), 0);
  const avail = Math.max(40, H - y - fixed - noteH - 4);
  const shares = spec.panels.reduce((s, p) => s + Math.max(0.05, p.heightShare), 0);
  for (const p of spec.panels) {
    y += titleH(p);
    const h = (avail * Math.max(0.05, p.heightShare)) / shares;
    shapes.push(...panelShapes(p, { x: left, y, w: W - left - right, h }, size));
    y += h + axisH;
  }
  if (spec.note)
    shapes.push(text(left, H - size * 0.6, spec.note, size * 0.85, { color: NOTE_COLOR }));
  return { widthPx: W, heightPx: H, shapes };
}
