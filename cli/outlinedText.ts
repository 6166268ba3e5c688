/**
 * Chart labels written as glyph outlines instead of SVG text, for the
 * workbook's PNG charts. resvg lays out every text element of every document
 * anew (about 0.6 ms a label here: 24 of the 48 ms a chart took at 1×); here
 * each label is laid out once with fontkit (the PDF's own font engine) and
 * written as one path of its glyphs' outlines, each placed at its pen
 * position, so resvg only fills paths. One path per label, not one per glyph:
 * resvg pays about 55 µs for every path element at 2× whatever its size, so a
 * chart's 400-odd glyphs drawn one by one cost 14 ms more than its 40 labels.
 * The outlines come from the same font files, so the labels look as before;
 * anchors use the face's real advance widths.
 */
import { openSync, type Font } from 'fontkit';
import { chartFontFiles } from './chartFonts';
import type { ChartText } from '../shared/report/chartScene';
import type { SvgTextWriter } from '../shared/report/svgChart';

/** A label laid out in font units: its glyphs' outlines at their pen positions, and its advance. */
interface LaidOut {
  /** SVG path data, font units, y up. */
  outline: string;
  advance: number;
}

/** The chart faces (regular, bold) with their laid-out labels, kept for the run. */
class OutlineFaces {
  private readonly fonts: [Font, Font];
  private readonly laidOut = new Map<string, LaidOut>();

  constructor(files: string[]) {
    const regular = files.find((f) => !/bold/i.test(f)) ?? files[0];
    const bold = files.find((f) => /bold/i.test(f)) ?? regular;
    this.fonts = [openSync(regular), openSync(bold)];
  }

  font(bold: boolean): Font {
    return this.fonts[bold ? 1 : 0];
  }

  layout(text: string, bold: boolean): LaidOut {
    const key = `${bold ? 1 : 0}${text}`;
    let out = this.laidOut.get(key);
    if (!out) {
      const run = this.font(bold).layout(text);
      let x = 0;
      const outline = run.glyphs.map((g, i) => {
        const p = run.positions[i];
        const placed = g.path.translate(x + p.xOffset, p.yOffset).toSVG();
        x += p.xAdvance;
        return placed;
      });
      out = { outline: outline.join(''), advance: x };
      this.laidOut.set(key, out);
    }
    return out;
  }
}

let faces: OutlineFaces | null = null;

/** Coordinates rounded to 0.01 keep the document small and stable. */
function n(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}

/**
 * A text writer for one chart document: each label as one path of glyph outlines.
 * @returns the writer (see {@link SvgTextWriter})
 * @throws {Error} when no font can be found (see {@link chartFontFiles})
 */
export function outlinedTextWriter(): SvgTextWriter {
  faces ??= new OutlineFaces(chartFontFiles());
  const f = faces;
  return {
    text(t: ChartText): string {
      const run = f.layout(t.text, t.bold);
      const k = t.sizePx / f.font(t.bold).unitsPerEm;
      const width = run.advance * k;
      const dx = t.anchor === 'start' ? 0 : t.anchor === 'middle' ? -width / 2 : -width;
      const place = t.vertical
        ? `translate(${n(t.x)},${n(t.y)}) rotate(-90) translate(${n(dx)},0)`
        : `translate(${n(t.x + dx)},${n(t.y)})`;
      // Font units have y up (a positive y offset raises a glyph): the path is flipped about
      // the baseline, so outlines and offsets are written as the font gives them.
      return `<path transform="${place} scale(${k},${-k})" fill="${t.color}" d="${run.outline}"/>`;
    },
  };
}
