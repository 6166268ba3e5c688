/**
 * Draws a {@link ChartSpec} as a standalone SVG document, with no DOM: the
 * reports turn it into PNG (cli/, through resvg) for the workbook and the PDF.
 * Text widths are estimated from the font size (an average glyph of about
 * 0.56 em for a sans face) because there is no layout engine here; the
 * estimate only places legends and labels, so a few pixels off is harmless.
 */
import { MODEL_CURVES } from '../models/curves';
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
import { niceTicks, type NiceTicks } from './niceTicks';

/** Options for {@link renderChartSvg}. */
export interface SvgChartOptions {
  /** CSS font-family list; the PNG step must have one of these fonts loaded. */
  fontFamily?: string;
  /** Base font size, px. */
  fontSizePx?: number;
}

const defaultFont = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";
const glyphEm = 0.56;

/** XML-escapes text for an SVG text node or attribute. */
function esc(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;');
}

/** Coordinates rounded to 0.01 px keep the document small and stable. */
function n(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}

function textWidthPx(text: string, sizePx: number): number {
  return text.length * sizePx * glyphEm;
}

function formatTick(v: number, decimals: number): string {
  const t = v.toLocaleString('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  });
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

function marker(symbol: ChartSymbol, cx: number, cy: number, r: number, style: string): string {
  switch (symbol) {
    case 'circle':
      return `<circle cx="${n(cx)}" cy="${n(cy)}" r="${n(r)}" ${style}/>`;
    case 'square':
      return `<rect x="${n(cx - r * 0.9)}" y="${n(cy - r * 0.9)}" width="${n(r * 1.8)}" height="${n(r * 1.8)}" ${style}/>`;
    case 'triangle':
      return `<path d="M${n(cx)},${n(cy - r * 1.15)}L${n(cx + r)},${n(cy + r * 0.75)}L${n(cx - r)},${n(cy + r * 0.75)}Z" ${style}/>`;
    case 'diamond':
      return `<path d="M${n(cx)},${n(cy - r * 1.2)}L${n(cx + r)},${n(cy)}L${n(cx)},${n(cy + r * 1.2)}L${n(cx - r)},${n(cy)}Z" ${style}/>`;
    case 'cross': {
      const a = r * 0.35;
      return `<path d="M${n(cx - a)},${n(cy - r)}h${n(2 * a)}v${n(r - a)}h${n(r - a)}v${n(2 * a)}h${n(a - r)}v${n(r - a)}h${n(-2 * a)}v${n(a - r)}h${n(a - r)}v${n(-2 * a)}h${n(r - a)}Z" ${style}/>`;
    }
    case 'star': {
      let d = '';
      for (let i = 0; i < 10; i++) {
        const rr = i % 2 === 0 ? r * 1.2 : r * 0.5;
        const ang = -Math.PI / 2 + (i * Math.PI) / 5;
        d += `${i === 0 ? 'M' : 'L'}${n(cx + rr * Math.cos(ang))},${n(cy + rr * Math.sin(ang))}`;
      }
      return `<path d="${d}Z" ${style}/>`;
    }
  }
}

function pointStyle(layer: PointLayer): { symbol: ChartSymbol; style: string } {
  if (layer.corrected)
    return {
      symbol: 'circle',
      style: `fill="none" stroke="${chartPalette.corrected}" stroke-width="1.8"`,
    };
  const symbol = chartPalette.symbols[layer.groupIndex % chartPalette.symbols.length];
  if (layer.excluded) {
    return {
      symbol,
      style: `fill="#ffffff" stroke="${chartPalette.excluded}" stroke-width="1.4"`,
    };
  }
  const color = chartPalette.groups[layer.groupIndex % chartPalette.groups.length];
  return {
    symbol,
    style: `fill="${color}" fill-opacity="0.85" stroke="#ffffff" stroke-width="0.6"`,
  };
}

function curveStyle(layer: CurveLayer, index: number): string {
  if (layer.role === 'chosen') return `stroke="${chartPalette.chosen}" stroke-width="2.6"`;
  if (layer.role === 'return') return `stroke="${chartPalette.return}" stroke-width="2.4"`;
  if (layer.role === 'risk') return `stroke="${chartPalette.risk}" stroke-width="2.2"`;
  // Alternatives differ by dash so they stay apart in greyscale print: a model's
  // curve has its own (its curve entry's, as on the screen), any other curve one by order.
  const dash = layer.model
    ? MODEL_CURVES[layer.model].dash
    : OTHER_DASHES[index % OTHER_DASHES.length];
  const color =
    layer.groupIndex === undefined
      ? chartPalette.alternative
      : chartPalette.groups[layer.groupIndex % chartPalette.groups.length];
  return `stroke="${color}" stroke-width="1.4" stroke-dasharray="${dash}"`;
}

const OTHER_DASHES = ['6 3', '2 3', '8 3 2 3', '4 4', '1 2'];

interface LegendItem {
  swatch: string;
  text: string;
}

function legendItems(panel: ChartPanel, size: number): LegendItem[] {
  const items: LegendItem[] = [];
  let alt = 0;
  for (const l of panel.layers) {
    if (l.kind === 'points') {
      const { symbol, style } = pointStyle(l);
      items.push({ swatch: marker(symbol, 6, -size * 0.35, size * 0.33, style), text: l.name });
    } else if (l.kind === 'curve') {
      const style = curveStyle(l, l.role === 'alternative' ? alt++ : 0);
      items.push({
        swatch: `<line x1="0" y1="${n(-size * 0.35)}" x2="16" y2="${n(-size * 0.35)}" ${style} fill="none"/>`,
        text: l.name,
      });
    } else if (l.kind === 'band' || l.kind === 'ribbon') {
      items.push({
        swatch: `<rect x="0" y="${n(-size * 0.8)}" width="16" height="${n(size * 0.9)}" fill="${chartPalette[l.role]}"/>`,
        text: l.name,
      });
    } else {
      items.push({
        swatch: `<line x1="8" y1="${n(-size * 0.9)}" x2="8" y2="${n(size * 0.15)}" stroke="${chartPalette[l.role]}" stroke-width="1.8" stroke-dasharray="4 2"/>`,
        text: l.name,
      });
    }
  }
  return items;
}

/** Lays legend items in rows no wider than `width`; returns the SVG and its height. */
function legend(items: LegendItem[], x0: number, y0: number, width: number, size: number) {
  const rowH = size * 1.45;
  let x = 0;
  let row = 0;
  const parts: string[] = [];
  for (const it of items) {
    const w = 22 + textWidthPx(it.text, size) + 14;
    if (x > 0 && x + w > width) {
      x = 0;
      row++;
    }
    const tx = x0 + x;
    const ty = y0 + row * rowH + size;
    parts.push(
      `<g transform="translate(${n(tx)},${n(ty)})">${it.swatch}<text x="22" y="0" font-size="${n(size)}">${esc(it.text)}</text></g>`,
    );
    x += w;
  }
  return { svg: parts.join(''), height: items.length ? (row + 1) * rowH : 0 };
}

function drawPanel(
  panel: ChartPanel,
  box: { x: number; y: number; w: number; h: number },
  size: number,
  clipId: string,
): string {
  const out: string[] = [];
  const xt = axisTicks(panel.x, panel.layers, 'x');
  const yt = axisTicks(panel.y, panel.layers, 'y');
  const sx = (v: number): number => box.x + ((v - xt.min) / (xt.max - xt.min)) * box.w;
  const sy = (v: number): number => box.y + box.h - ((v - yt.min) / (yt.max - yt.min)) * box.h;

  // One grid line from (x1, y1) to (x2, y2) and its tick label at `at`.
  const tick = (
    line: [number, number, number, number],
    at: [number, number],
    anchor: 'end' | 'middle',
    label: string,
  ): void => {
    const [x1, y1, x2, y2] = line;
    out.push(
      `<line x1="${n(x1)}" y1="${n(y1)}" x2="${n(x2)}" y2="${n(y2)}" stroke="${chartPalette.grid}" stroke-width="1"/>`,
      `<text x="${n(at[0])}" y="${n(at[1])}" font-size="${n(size * 0.9)}" text-anchor="${anchor}">${esc(label)}</text>`,
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
    out.push(
      `<line x1="${n(box.x)}" y1="${n(sy(0))}" x2="${n(box.x + box.w)}" y2="${n(sy(0))}" stroke="${chartPalette.axis}" stroke-width="1"/>`,
    );
  }
  out.push(
    `<text x="${n(box.x + box.w / 2)}" y="${n(box.y + box.h + size * 2.5)}" font-size="${n(size)}" text-anchor="middle">${esc(axisLabel(panel.x))}</text>`,
  );
  const yx =
    box.x -
    16 -
    size * 0.9 * glyphEm * Math.max(...yt.ticks.map((t) => formatTick(t, yt.decimals).length));
  out.push(
    `<text transform="translate(${n(yx)},${n(box.y + box.h / 2)}) rotate(-90)" font-size="${n(size)}" text-anchor="middle">${esc(axisLabel(panel.y))}</text>`,
  );
  if (panel.title) {
    out.push(
      `<text x="${n(box.x)}" y="${n(box.y - 6)}" font-size="${n(size)}" font-weight="bold">${esc(panel.title)}</text>`,
    );
  }

  out.push(`<g clip-path="url(#${clipId})">`);
  let alt = 0;
  for (const l of panel.layers) {
    if (l.kind === 'band') {
      const x1 = sx(Math.min(l.low, l.high));
      const x2 = sx(Math.max(l.low, l.high));
      out.push(
        `<rect x="${n(x1)}" y="${n(box.y)}" width="${n(Math.max(1, x2 - x1))}" height="${n(box.h)}" fill="${chartPalette[l.role]}"/>`,
      );
    } else if (l.kind === 'ribbon') {
      const upper: string[] = [];
      const lower: string[] = [];
      l.x.forEach((xv, i) => {
        if (!(Number.isFinite(xv) && Number.isFinite(l.low[i]) && Number.isFinite(l.high[i])))
          return;
        upper.push(`${n(sx(xv))},${n(sy(l.high[i]))}`);
        lower.push(`${n(sx(xv))},${n(sy(l.low[i]))}`);
      });
      if (upper.length > 1)
        out.push(
          `<polygon points="${[...upper, ...lower.reverse()].join(' ')}" fill="${chartPalette[l.role]}" stroke="none"/>`,
        );
    } else if (l.kind === 'curve') {
      const pts: string[] = [];
      l.x.forEach((xv, i) => {
        const yv = l.y[i];
        if (Number.isFinite(xv) && Number.isFinite(yv)) pts.push(`${n(sx(xv))},${n(sy(yv))}`);
      });
      const style = curveStyle(l, l.role === 'alternative' ? alt++ : 0);
      if (pts.length > 1)
        out.push(
          `<polyline points="${pts.join(' ')}" fill="none" ${style} stroke-linejoin="round"/>`,
        );
    } else if (l.kind === 'marker') {
      const x = sx(l.x);
      out.push(
        `<line x1="${n(x)}" y1="${n(box.y)}" x2="${n(x)}" y2="${n(box.y + box.h)}" stroke="${chartPalette[l.role]}" stroke-width="1.8" stroke-dasharray="5 3"/>`,
      );
    }
  }
  out.push('</g>');
  // The frame goes over gridlines and bands so its edges stay unbroken.
  out.push(
    `<rect x="${n(box.x)}" y="${n(box.y)}" width="${n(box.w)}" height="${n(box.h)}" fill="none" stroke="${chartPalette.axis}" stroke-width="1"/>`,
  );
  // Points are not clipped: a plot at the lowest or highest rate sits on the frame and must show whole.
  for (const l of panel.layers) {
    if (l.kind !== 'points') continue;
    const { symbol, style } = pointStyle(l);
    l.x.forEach((xv, i) => {
      const yv = l.y[i];
      if (Number.isFinite(xv) && Number.isFinite(yv)) {
        out.push(marker(symbol, sx(xv), sy(yv), size * (l.corrected ? 0.7 : 0.36), style));
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
      `<text x="${n(right ? x + 4 : x - 4)}" y="${n(box.y + size * 1.1)}" font-size="${n(size * 0.9)}" fill="${chartPalette[l.role]}" text-anchor="${right ? 'start' : 'end'}" font-weight="bold">${esc(l.label)}</text>`,
    );
  }
  return out.join('\n');
}

/**
 * Renders a chart description as an SVG document.
 * @param spec - the chart; all numbers in its axes' units
 * @param options - font family and base font size (px)
 * @returns SVG text, `spec.widthPx` × `spec.heightPx` CSS pixels
 * @throws {RangeError} when the spec has no panels or a non-positive size
 * @example
 * renderChartSvg(spec).startsWith('<svg') // true
 */
export function renderChartSvg(spec: ChartSpec, options: SvgChartOptions = {}): string {
  if (!(spec.widthPx > 0 && spec.heightPx > 0)) {
    throw new RangeError(
      `A chart needs a positive size; got ${spec.widthPx} × ${spec.heightPx} px.`,
    );
  }
  if (spec.panels.length === 0) throw new RangeError('A chart needs at least one panel.');
  const size = options.fontSizePx ?? 13;
  const W = spec.widthPx;
  const H = spec.heightPx;
  const left = 24 + size * 4.6;
  // Room for half of the last x tick label.
  const right = size * 2.2;
  const parts: string[] = [];
  let y = 10;
  if (spec.title) {
    y += size * 1.35;
    parts.push(
      `<text x="${n(left)}" y="${n(y)}" font-size="${n(size * 1.3)}" font-weight="bold">${esc(spec.title)}</text>`,
    );
  }
  if (spec.subtitle) {
    y += size * 1.3;
    parts.push(
      `<text x="${n(left)}" y="${n(y)}" font-size="${n(size)}" fill="#444444">${esc(spec.subtitle)}</text>`,
    );
  }
  y += 6;
  const allItems = spec.panels.flatMap((p) => legendItems(p, size * 0.9));
  // One legend for the whole chart, without repeats (residual panels reuse block names).
  const seen = new Set<string>();
  const items = allItems.filter((it) => (seen.has(it.text) ? false : (seen.add(it.text), true)));
  const lg = legend(items, left, y, W - left - right, size * 0.9);
  parts.push(lg.svg);
  y += lg.height + 8;

  const noteH = spec.note ? size * 1.6 : 0;
  const axisH = size * 3.1;
  const titleH = (p: ChartPanel): number => (p.title ? size * 1.4 : 0);
  const fixed = spec.panels.reduce((s, p) => s + axisH + titleH(p), 0);
  const avail = Math.max(40, H - y - fixed - noteH - 4);
  const shares = spec.panels.reduce((s, p) => s + Math.max(0.05, p.heightShare), 0);
  const defs: string[] = [];
  spec.panels.forEach((p, i) => {
    y += titleH(p);
    const h = (avail * Math.max(0.05, p.heightShare)) / shares;
    const box = { x: left, y, w: W - left - right, h };
    const clipId = `clip${i}`;
    defs.push(
      `<clipPath id="${clipId}"><rect x="${n(box.x)}" y="${n(box.y)}" width="${n(box.w)}" height="${n(box.h)}"/></clipPath>`,
    );
    parts.push(drawPanel(p, box, size, clipId));
    y += h + axisH;
  });
  if (spec.note) {
    parts.push(
      `<text x="${n(left)}" y="${n(H - size * 0.6)}" font-size="${n(size * 0.85)}" fill="#444444">${esc(spec.note)}</text>`,
    );
  }
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="${esc(options.fontFamily ?? defaultFont)}" fill="#111111">`,
    `<defs>${defs.join('')}</defs>`,
    `<rect width="${W}" height="${H}" fill="#ffffff"/>`,
    ...parts,
    '</svg>',
  ].join('\n');
}
