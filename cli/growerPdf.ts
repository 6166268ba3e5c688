/**
 * Draws grower pages into one PDF with pdfkit, one page each. The layout
 * comes from shared/report/growerPageLayout; this file only measures and
 * draws. The text face is the chart font (DejaVu or Liberation Sans, embedded
 * as a subset) so any site name prints as typed; without one, pdfkit's
 * standard Helvetica, which encodes only WinAnsi characters, so text then goes
 * through a small substitution first (≈ → ~, − → -).
 */
import { existsSync } from 'node:fs';
import PDFDocument from 'pdfkit';
import { chartFontFiles } from './chartPng';
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
      font(doc, b.bold);
      doc.fontSize(b.sizePt * s);
      return (
        (b.text ? doc.heightOfString(printable(b.text), { width }) : b.sizePt * s) +
        b.gapAfterPt * s
      );
    case 'facts': {
      let h = 0;
      for (const r of b.rows) {
        font(doc, false);
        doc.fontSize(b.sizePt * s);
        h +=
          Math.max(
            doc.heightOfString(printable(r.value), { width: width * 0.62 }),
            doc.heightOfString(printable(r.label), { width: width * 0.36 }),
          ) +
          2 * s;
      }
      return h + b.gapAfterPt * s;
    }
    case 'box': {
      font(doc, true);
      doc.fontSize((b.sizePt + 1) * s);
      let h = doc.heightOfString(b.title, { width: width - 16 }) + 4 * s;
      font(doc, false);
      doc.fontSize(b.sizePt * s);
      for (const l of b.lines)
        h += doc.heightOfString(printable(`• ${l}`), { width: width - 16 }) + 2 * s;
      return h + 16 + b.gapAfterPt * s;
    }
    case 'chart':
      return chartAspect === null
        ? 0
        : Math.min(b.maxHeightPt * s, width * chartAspect) + b.gapAfterPt * s;
  }
}

function drawPage(
  doc: PDFKit.PDFDocument,
  layout: PageLayout,
  chart: { png: Uint8Array; aspect: number } | null,
): void {
  const m = layout.marginPt;
  const width = layout.widthPt - 2 * m;
  const available = layout.heightPt - 2 * m - 20;
  // Shrink everything together until the page fits: one page per recommendation, always.
  let s = 1;
  const total = (k: number): number =>
    layout.blocks.reduce((h, b) => h + blockHeight(doc, b, width, k, chart?.aspect ?? null), 0);
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
        const hl = doc.heightOfString(printable(r.label), { width: width * 0.36 });
        font(doc, false);
        doc.text(printable(r.value), m + width * 0.38, y, { width: width * 0.62 });
        const hv = doc.heightOfString(printable(r.value), { width: width * 0.62 });
        y += Math.max(hl, hv) + 2 * s;
      }
      y += b.gapAfterPt * s;
    } else if (b.kind === 'box') {
      const h = blockHeight(doc, b, width, s, null) - b.gapAfterPt * s;
      doc.save().rect(m, y, width, h).fillAndStroke(b.fill, b.stroke).restore();
      let yy = y + 8;
      font(doc, true);
      doc.fontSize((b.sizePt + 1) * s).fillColor('#111111');
      doc.text(b.title, m + 8, yy, { width: width - 16 });
      yy += doc.heightOfString(b.title, { width: width - 16 }) + 4 * s;
      font(doc, false);
      doc.fontSize(b.sizePt * s);
      for (const l of b.lines) {
        doc.text(printable(`• ${l}`), m + 8, yy, { width: width - 16 });
        yy += doc.heightOfString(printable(`• ${l}`), { width: width - 16 }) + 2 * s;
      }
      y += h + b.gapAfterPt * s;
    } else if (chart) {
      const h = Math.min(b.maxHeightPt * s, width * chart.aspect);
      const w = h / chart.aspect;
      doc.image(Buffer.from(chart.png), m + (width - w) / 2, y, { width: w, height: h });
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
 * Writes grower pages as a PDF, one page each.
 * @param pages - the structured pages (paper from each page's units)
 * @param charts - chart pictures by page subject (site name), PNG bytes and height/width ratio
 * @param createdAt - the document's creation time (the analysis time, so reruns match)
 * @returns PDF bytes
 */
export async function growerPdf(
  pages: GrowerPage[],
  charts: Record<string, { png: Uint8Array; aspect: number }> = {},
  createdAt: Date = new Date(),
): Promise<Uint8Array> {
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
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    doc.on('end', () => resolve());
    doc.on('error', reject);
  });
  for (const page of pages) {
    const chart = charts[page.subject] ?? null;
    const layout = growerPageLayout(page, chart !== null);
    doc.addPage({ size: [layout.widthPt, layout.heightPt], margin: 0 });
    drawPage(doc, layout, chart);
  }
  doc.end();
  await done;
  return new Uint8Array(Buffer.concat(chunks));
}
