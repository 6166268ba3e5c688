/**
 * Writes a chart as a standalone SVG document, with no DOM: the layout comes
 * from chartScene.ts and this file only spells its shapes in SVG. The
 * workbook's pictures are this SVG drawn as PNG (cli/, through resvg) and the
 * workspace prints it on grower pages.
 */
import type { ChartSpec } from './chartSpec';
import {
  CHART_TEXT_COLOR,
  chartScene,
  type ChartScene,
  type ChartShape,
  type ChartText,
  type ShapePaint,
} from './chartScene';

/** Options for {@link renderChartSvg}. */
export interface SvgChartOptions {
  /** CSS font-family list; the PNG step must have one of these fonts loaded. */
  fontFamily?: string;
  /** Base font size, px. */
  fontSizePx?: number;
}

const defaultFont = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";

/** XML-escapes text for an SVG text node or attribute. */
function esc(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;');
}

/**
 * A number as the chart documents write it: rounded to 0.01 px, which keeps them small and stable.
 * @param v - a coordinate or size, px
 * @returns its text, e.g. "12.35"
 * @example
 * svgNumber(12.3456) // "12.35"
 */
export function svgNumber(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}
const n = svgNumber;

function paintAttributes(p: ShapePaint): string {
  const a = [`fill="${p.fill ?? 'none'}"`];
  if (p.fill && p.fillOpacity !== undefined) a.push(`fill-opacity="${p.fillOpacity}"`);
  a.push(`stroke="${p.stroke ?? 'none'}"`);
  if (p.stroke) {
    if (p.strokeWidth !== undefined) a.push(`stroke-width="${p.strokeWidth}"`);
    if (p.dash) a.push(`stroke-dasharray="${p.dash.join(' ')}"`);
    if (p.roundJoin) a.push('stroke-linejoin="round"');
  }
  return a.join(' ');
}

function pointList(points: readonly number[]): string {
  const pairs: string[] = [];
  for (let i = 0; i + 1 < points.length; i += 2) pairs.push(`${n(points[i])},${n(points[i + 1])}`);
  return pairs.join(' ');
}

/**
 * Writes a chart's labels another way than as SVG text elements (the command line writes them as
 * glyph outlines). One per document: `defs` gives what the labels written so far refer to.
 */
export interface SvgTextWriter {
  /** The label as SVG markup, placed as the scene says. */
  text(t: ChartText): string;
  /** Definitions the labels refer to, for the document's defs. */
  defs(): string;
}

function shapeSvg(s: ChartShape, textWriter: SvgTextWriter | null): string {
  switch (s.kind) {
    case 'line':
      return `<line x1="${n(s.x1)}" y1="${n(s.y1)}" x2="${n(s.x2)}" y2="${n(s.y2)}" ${paintAttributes(s.paint)}/>`;
    case 'rect':
      return `<rect x="${n(s.x)}" y="${n(s.y)}" width="${n(s.w)}" height="${n(s.h)}" ${paintAttributes(s.paint)}/>`;
    case 'circle':
      return `<circle cx="${n(s.cx)}" cy="${n(s.cy)}" r="${n(s.r)}" ${paintAttributes(s.paint)}/>`;
    case 'poly':
      return `<${s.closed ? 'polygon' : 'polyline'} points="${pointList(s.points)}" ${paintAttributes(s.paint)}/>`;
    case 'text': {
      if (textWriter) return textWriter.text(s);
      const place = s.vertical
        ? `transform="translate(${n(s.x)},${n(s.y)}) rotate(-90)"`
        : `x="${n(s.x)}" y="${n(s.y)}"`;
      const more = [
        s.anchor === 'start' ? '' : ` text-anchor="${s.anchor}"`,
        s.bold ? ' font-weight="bold"' : '',
        s.color === CHART_TEXT_COLOR ? '' : ` fill="${s.color}"`,
      ].join('');
      return `<text ${place} font-size="${n(s.sizePx)}"${more}>${esc(s.text)}</text>`;
    }
  }
}

/**
 * Writes a laid-out chart as SVG.
 * @param scene - the chart's shapes (see {@link chartScene})
 * @param fontFamily - CSS font-family list for every label
 * @param textWriter - writes the labels instead of SVG text elements; omitted = text elements
 * @returns SVG text, `scene.widthPx` × `scene.heightPx` CSS pixels on white
 */
export function sceneSvg(
  scene: ChartScene,
  fontFamily = defaultFont,
  textWriter: SvgTextWriter | null = null,
): string {
  const W = scene.widthPx;
  const H = scene.heightPx;
  const body = scene.shapes.map((s) => shapeSvg(s, textWriter));
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="${esc(fontFamily)}" fill="${CHART_TEXT_COLOR}">`,
    `<defs>${textWriter ? textWriter.defs() : ''}</defs>`,
    `<rect width="${W}" height="${H}" fill="#ffffff"/>`,
    ...body,
    '</svg>',
  ].join('\n');
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
  return sceneSvg(chartScene(spec, options.fontSizePx), options.fontFamily);
}
