/**
 * Chart labels written as glyph outlines instead of SVG text, for the
 * workbook's PNG charts. resvg lays out every text element of every document
 * anew (about 0.6 ms a label here: 24 of the 48 ms a chart took at 1×); here
 * each label is laid out once with fontkit (the PDF's own font engine) and
 * each glyph's outline is written once per chart and reused, so resvg only
 * fills paths. The outlines come from the same font files, so the labels look
 * as before; anchors use the face's real advance widths.
 */
import { openSync, type Font } from 'fontkit';
import { chartFontFiles } from './chartFonts';
import type { ChartText } from '../shared/report/chartScene';
import { svgNumber, type SvgTextWriter } from '../shared/report/svgChart';

/** A label laid out in font units: each glyph's id and x, and the whole advance. */
interface LaidOut {
  glyphs: { id: number; x: number; y: number }[];
  advance: number;
}

/** The chart faces (regular, bold) with their laid-out labels and glyph outlines, kept. */
class OutlineFaces {
  private readonly fonts: [Font, Font];
  private readonly laidOut = new Map<string, LaidOut>();
  private readonly outlines = new Map<string, string>();

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
      const glyphs = run.glyphs.map((g, i) => {
        const p = run.positions[i];
        const at = { id: g.id, x: x + p.xOffset, y: p.yOffset };
        x += p.xAdvance;
        if (!this.outlines.has(glyphKey(bold, g.id)))
          this.outlines.set(glyphKey(bold, g.id), g.path.toSVG());
        return at;
      });
      out = { glyphs, advance: x };
      this.laidOut.set(key, out);
    }
    return out;
  }

  outline(key: string): string {
    return this.outlines.get(key) ?? '';
  }
}

function glyphKey(bold: boolean, id: number): string {
  return `${bold ? 'b' : 'r'}${id}`;
}

let faces: OutlineFaces | null = null;

// Written as the rest of the document is (0.01 px).
const n = svgNumber;

/**
 * A text writer for one chart document: labels as outlines, each glyph defined once.
 * @returns the writer (see {@link SvgTextWriter})
 * @throws {Error} when no font can be found (see {@link chartFontFiles})
 */
export function outlinedTextWriter(): SvgTextWriter {
  faces ??= new OutlineFaces(chartFontFiles());
  const f = faces;
  const used = new Set<string>();
  return {
    text(t: ChartText): string {
      const run = f.layout(t.text, t.bold);
      const k = t.sizePx / f.font(t.bold).unitsPerEm;
      const width = run.advance * k;
      const dx = t.anchor === 'start' ? 0 : t.anchor === 'middle' ? -width / 2 : -width;
      const place = t.vertical
        ? `translate(${n(t.x)},${n(t.y)}) rotate(-90) translate(${n(dx)},0)`
        : `translate(${n(t.x + dx)},${n(t.y)})`;
      const glyphs = run.glyphs.map((g) => {
        const key = glyphKey(t.bold, g.id);
        used.add(key);
        return `<use href="#${key}" x="${n(g.x)}" y="${n(g.y)}"/>`;
      });
      // Font units have y up (a positive y offset raises a glyph): the group is flipped about
      // the baseline, so outlines and offsets are written as the font gives them.
      return `<g transform="${place} scale(${k},${-k})" fill="${t.color}">${glyphs.join('')}</g>`;
    },
    defs(): string {
      return [...used].map((key) => `<path id="${key}" d="${f.outline(key)}"/>`).join('');
    },
  };
}
