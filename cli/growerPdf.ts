/**
 * Draws grower pages into one PDF with pdfkit, one page each. The layout
 * comes from shared/report/growerPageLayout; this file only measures and
 * draws. The text face is the chart font (DejaVu or Liberation Sans, embedded
 * as a subset) so any site name prints as typed; without one, pdfkit's
 * standard Helvetica, which encodes only WinAnsi characters, so text then goes
 * through a small substitution first (≈ → ~, − → -).
 */
import { once } from 'node:events';
import { existsSync } from 'node:fs';
import { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import PDFDocument from 'pdfkit';
import { chartFontFiles } from './chartFonts';
import { drawChartScene, type ChartLabelFace } from './pdfChart';
import { chartScene, type ChartScene } from '../shared/report/chartScene';
import type { ChartSpec } from '../shared/report/chartSpec';
import type { GrowerPage } from '../shared/report/growerPage';
import {
  growerPageLayout,
  type PageBlock,
  type PageLayout,
} from '../shared/report/growerPageLayout';

/** Characters outside WinAnsi that the pages use, and what to print instead. */
const substitutes: [RegExp, string][] = [
  [/≈/g, '~'],
  [/−/g, '-'],
  [/×/g, 'x'],
  [/·/g, '·'],
  [/›/g, '>'],
  [/[‘’]/g, "'"],
  [/Δ/g, 'delta '],
];

/** Embedded regular and bold faces, when the machine has them; null = Helvetica. */
let faces: { regular: string; bold: string } | null | undefined;

function embeddedFaces(): { regular: string; bold: string } | null {
  if (faces !== undefined) return faces;
  try {
    const files = chartFontFiles();
    const regular = files.find((f) => !/bold/i.test(f));
    const bold = files.find((f) => /bold/i.test(f)) ?? regular;
    faces = regular && bold && existsSync(regular) ? { regular, bold } : null;
  } catch {
    faces = null;
  }
  return faces;
}

function printable(text: string): string {
  if (embeddedFaces()) return text;
  let t = text;
  for (const [re, s] of substitutes) t = t.replace(re, s);
  return t;
}

function font(doc: PDFKit.PDFDocument, bold: boolean): void {
  const f = embeddedFaces();
  doc.font(f ? (bold ? f.bold : f.regular) : bold ? 'Helvetica-Bold' : 'Helvetica');
}

/** The charts' labels in the page's own faces. */
const labelFace: ChartLabelFace = { setFont: font, printable };

/** Heights already measured, by face, size, width and text: every page repeats most lines. */
const measured = new Map<string, number>();
/** Measured heights kept at most (a long run's site names would otherwise pile up). */
const MEASURED_KEPT = 20_000;

/**
 * Height of text wrapped to a width, pt: pdfkit lays the text out word by word, so a line seen
 * before (the cautions, the notes, the labels) is measured once per run. Leaves the face and
 * size set, as the caller draws next.
 */
function textHeight(
  doc: PDFKit.PDFDocument,
  text: string,
  bold: boolean,
  sizePt: number,
  width: number,
): number {
  font(doc, bold);
  doc.fontSize(sizePt);
  const key = `${bold ? 'b' : 'r'}${sizePt}|${width}|${text}`;
  let h = measured.get(key);
  if (h === undefined) {
    h = doc.heightOfString(text, { width });
    if (measured.size >= MEASURED_KEPT) measured.clear();
    measured.set(key, h);
  }
  return h;
}

/** Height of a block at a scale, pt (pdfkit measures wrapped text). */
function blockHeight(
  doc: PDFKit.PDFDocument,
  b: PageBlock,
  width: number,
  s: number,
  chartAspect: number | null,
): number {
  switch (b.kind) {
    case 'text':
      return (
        (b.text ? textHeight(doc, printable(b.text), b.bold, b.sizePt * s, width) : b.sizePt * s) +
        b.gapAfterPt * s
      );
    case 'facts': {
      let h = 0;
      for (const r of b.rows) h += factRowHeight(doc, r, b.sizePt * s, width) + 2 * s;
      return h + b.gapAfterPt * s;
    }
    case 'box': {
      let h = textHeight(doc, b.title, true, (b.sizePt + 1) * s, width - 16) + 4 * s;
      for (const l of b.lines)
        h += textHeight(doc, printable(`• ${l}`), false, b.sizePt * s, width - 16) + 2 * s;
      return h + 16 + b.gapAfterPt * s;
    }
    case 'chart':
      return chartAspect === null
        ? 0
        : Math.min(b.maxHeightPt * s, width * chartAspect) + b.gapAfterPt * s;
  }
}

/** A facts row's height: its label (bold) and its value side by side, the taller. */
function factRowHeight(
  doc: PDFKit.PDFDocument,
  r: { label: string; value: string },
  sizePt: number,
  width: number,
): number {
  return Math.max(
    textHeight(doc, printable(r.label), true, sizePt, width * 0.36),
    textHeight(doc, printable(r.value), false, sizePt, width * 0.62),
  );
}

function drawPage(doc: PDFKit.PDFDocument, layout: PageLayout, chart: ChartScene | null): void {
  const aspect = chart ? chart.heightPx / chart.widthPx : null;
  const m = layout.marginPt;
  const width = layout.widthPt - 2 * m;
  const available = layout.heightPt - 2 * m - 20;
  // Shrink everything together until the page fits: one page per recommendation, always.
  let s = 1;
  const total = (k: number): number =>
    layout.blocks.reduce((h, b) => h + blockHeight(doc, b, width, k, aspect), 0);
  while (s > 0.5 && total(s) > available) s -= 0.04;
  let y = m;
  for (const b of layout.blocks) {
    if (b.kind === 'text') {
      font(doc, b.bold);
      doc.fontSize(b.sizePt * s).fillColor(b.color);
      if (b.text) doc.text(printable(b.text), m, y, { width });
      y += blockHeight(doc, b, width, s, null);
    } else if (b.kind === 'facts') {
      for (const r of b.rows) {
        doc.fontSize(b.sizePt * s).fillColor('#111111');
        font(doc, true);
        doc.text(printable(r.label), m, y, { width: width * 0.36 });
        font(doc, false);
        doc.text(printable(r.value), m + width * 0.38, y, { width: width * 0.62 });
        y += factRowHeight(doc, r, b.sizePt * s, width) + 2 * s;
      }
      y += b.gapAfterPt * s;
    } else if (b.kind === 'box') {
      const h = blockHeight(doc, b, width, s, null) - b.gapAfterPt * s;
      doc.save().rect(m, y, width, h).fillAndStroke(b.fill, b.stroke).restore();
      let yy = y + 8;
      font(doc, true);
      doc.fontSize((b.sizePt + 1) * s).fillColor('#111111');
      doc.text(b.title, m + 8, yy, { width: width - 16 });
      yy += textHeight(doc, b.title, true, (b.sizePt + 1) * s, width - 16) + 4 * s;
      for (const l of b.lines) {
        const line = printable(`• ${l}`);
        // Measured first: that also sets the regular face and size the line is drawn in.
        const lineHeight = textHeight(doc, line, false, b.sizePt * s, width - 16);
        doc.text(line, m + 8, yy, { width: width - 16 });
        yy += lineHeight + 2 * s;
      }
      y += h + b.gapAfterPt * s;
    } else if (chart && aspect) {
      const h = Math.min(b.maxHeightPt * s, width * aspect);
      const w = h / aspect;
      drawChartScene(doc, chart, { x: m + (width - w) / 2, y, widthPt: w }, labelFace);
      y += h + b.gapAfterPt * s;
    }
  }
  font(doc, false);
  doc.fontSize(7.5).fillColor('#777777');
  // Footer inside the bottom margin; lineBreak off so pdfkit never starts a new page for it.
  doc.text(printable(layout.footer), m, layout.heightPt - m + 14, {
    width,
    lineBreak: false,
    height: 10,
  });
}

/**
 * Writes grower pages as a PDF into a stream, one page each: pdfkit writes each page out when
 * the next begins, so a report of thousands of pages is never held whole.
 * @param out - where the PDF bytes go (the caller's temporary file); ended when done
 * @param pages - the structured pages (paper from each page's units)
 * @param charts - each page's chart by page id (a site's name, "region", a group's page id), drawn as vectors
 * @param createdAt - the document's creation time (the analysis time, so reruns match)
 * @returns when the last byte is handed to `out` and `out` has finished
 * @throws {RangeError} when there are no pages
 * @example
 * await streamGrowerPdf(createWriteStream('r.pdf'), pages, charts, new Date(report.createdAt));
 */
export async function streamGrowerPdf(
  out: Writable,
  pages: readonly GrowerPage[],
  charts: Record<string, ChartSpec> = {},
  createdAt: Date = new Date(),
): Promise<void> {
  if (pages.length === 0) throw new RangeError('growerPdf: there are no pages to write.');
  const first = growerPageLayout(pages[0], false);
  const doc = new PDFDocument({
    size: [first.widthPt, first.heightPt],
    margin: 0,
    autoFirstPage: false,
    info: {
      Title: 'Nitrogen rate recommendations',
      Creator: pages[0].footer.split(' · ')[0],
      CreationDate: createdAt,
    },
  });
  // pipeline ends `out` after the document and rejects if either side fails; awaited at the
  // end, caught here too so a failure while drawing is not also an unhandled rejection.
  const written = pipeline(doc, out);
  written.catch(() => undefined);
  for (const page of pages) {
    const spec = Object.hasOwn(charts, page.id) ? charts[page.id] : null;
    const chart = spec ? chartScene(spec) : null;
    const layout = growerPageLayout(page, chart !== null);
    doc.addPage({ size: [layout.widthPt, layout.heightPt], margin: 0 });
    drawPage(doc, layout, chart);
    // Let the finished page reach the file before drawing the next one.
    while (doc.readableLength > PAGE_BACKLOG_BYTES && !doc.destroyed) await once(doc, 'data');
  }
  doc.end();
  await written;
}

/** Bytes of pages waiting for the file before drawing pauses. */
const PAGE_BACKLOG_BYTES = 4 << 20;

/**
 * Writes grower pages as a PDF, one page each, in memory (tests and small documents; the
 * command line streams with {@link streamGrowerPdf}).
 * @param pages - the structured pages (paper from each page's units)
 * @param charts - each page's chart by page id (a site's name, "region", a group's page id), drawn as vectors
 * @param createdAt - the document's creation time (the analysis time, so reruns match)
 * @returns PDF bytes
 */
export async function growerPdf(
  pages: GrowerPage[],
  charts: Record<string, ChartSpec> = {},
  createdAt: Date = new Date(),
): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      chunks.push(chunk);
      done();
    },
  });
  await streamGrowerPdf(sink, pages, charts, createdAt);
  return new Uint8Array(Buffer.concat(chunks));
}
