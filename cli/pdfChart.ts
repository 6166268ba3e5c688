/**
 * Paints a laid-out chart (shared/report/chartScene.ts) into a pdfkit page as
 * vectors: lines, shapes and text in the page's own font, sharp at any zoom
 * and with no picture to rasterize, decode and recompress. The grower PDF draws its
 * charts this way; the workbook, which can only hold pictures, gets PNGs of
 * the same scene (chartPng.ts).
 */
import type { ChartScene, ChartShape, ShapePaint } from '../shared/report/chartScene';

/** A CSS color as pdfkit takes it: hex and an opacity (pdfkit reads no rgba()). */
function pdfColor(css: string): { hex: string; alpha: number } {
  const m = /^rgba?\(\s*(\d+)\s*,\s*(\d+)\s*,\s*(\d+)\s*(?:,\s*([\d.]+)\s*)?\)$/.exec(css);
  if (!m) return { hex: css, alpha: 1 };
  const hex = [m[1], m[2], m[3]].map((v) => Number(v).toString(16).padStart(2, '0')).join('');
  return { hex: `#${hex}`, alpha: m[4] === undefined ? 1 : Number(m[4]) };
}

/** Fills and strokes the path just traced, as the paint says. */
function paint(doc: PDFKit.PDFDocument, p: ShapePaint): void {
  if (p.fill) {
    const f = pdfColor(p.fill);
    doc.fillColor(f.hex).fillOpacity(f.alpha * (p.fillOpacity ?? 1));
  }
  if (p.stroke) {
    const s = pdfColor(p.stroke);
    doc
      .strokeColor(s.hex)
      .strokeOpacity(s.alpha)
      .lineWidth(p.strokeWidth ?? 1)
      .lineJoin(p.roundJoin ? 'round' : 'miter');
    // pdfkit takes a whole pattern as an array (its typings know only length and space).
    if (p.dash) doc.dash([...p.dash] as unknown as number, {});
    else doc.undash();
  }
  if (p.fill && p.stroke) doc.fillAndStroke();
  else if (p.fill) doc.fill();
  else if (p.stroke) doc.stroke();
}

/** How the PDF writes labels: its face (embedded regular or bold) and the text it can print. */
export interface ChartLabelFace {
  setFont: (doc: PDFKit.PDFDocument, bold: boolean) => void;
  /** The text as the face can print it (substitutes for characters a standard face lacks). */
  printable: (text: string) => string;
}

/**
 * A chart coordinate to 0.01 px, as the SVG writer keeps it: pdfkit would write six decimals,
 * which made the content streams longer to write and to compress for no visible difference.
 */
function c(v: number): number {
  return Math.round(v * 100) / 100;
}

function drawShape(doc: PDFKit.PDFDocument, s: ChartShape, face: ChartLabelFace): void {
  switch (s.kind) {
    case 'line':
      doc.moveTo(c(s.x1), c(s.y1)).lineTo(c(s.x2), c(s.y2));
      paint(doc, s.paint);
      return;
    case 'rect':
      doc.rect(c(s.x), c(s.y), c(s.w), c(s.h));
      paint(doc, s.paint);
      return;
    case 'circle':
      doc.circle(c(s.cx), c(s.cy), c(s.r));
      paint(doc, s.paint);
      return;
    case 'poly': {
      doc.moveTo(c(s.points[0]), c(s.points[1]));
      for (let i = 2; i + 1 < s.points.length; i += 2)
        doc.lineTo(c(s.points[i]), c(s.points[i + 1]));
      if (s.closed) doc.closePath();
      paint(doc, s.paint);
      return;
    }
    case 'text': {
      face.setFont(doc, s.bold);
      doc.fontSize(s.sizePx).fillColor(pdfColor(s.color).hex).fillOpacity(1);
      const label = face.printable(s.text);
      // The anchor is placed with the face's real width (the scene only estimated it).
      const w = doc.widthOfString(label);
      const dx = s.anchor === 'start' ? 0 : s.anchor === 'middle' ? -w / 2 : -w;
      doc.save();
      if (s.vertical) doc.rotate(-90, { origin: [c(s.x), c(s.y)] });
      // No width and no line break: pdfkit then never wraps nor starts a page for a label.
      doc.text(label, c(s.x + dx), c(s.y), { baseline: 'alphabetic', lineBreak: false });
      doc.restore();
      return;
    }
  }
}

/**
 * Draws a chart into the current page, scaled to a width.
 * @param doc - the PDF being written
 * @param scene - the chart laid out in its own pixels
 * @param at - top left corner and width on the page, pt (the height follows the chart's aspect)
 * @param face - the labels' face
 * @example
 * drawChartScene(doc, chartScene(spec), { x: 36, y: 200, widthPt: 540 }, face);
 */
export function drawChartScene(
  doc: PDFKit.PDFDocument,
  scene: ChartScene,
  at: { x: number; y: number; widthPt: number },
  face: ChartLabelFace,
): void {
  const k = at.widthPt / scene.widthPx;
  doc.save();
  doc.translate(at.x, at.y).scale(k);
  doc.rect(0, 0, scene.widthPx, scene.heightPx).fillColor('#ffffff').fillOpacity(1).fill();
  for (const s of scene.shapes) drawShape(doc, s, face);
  doc.restore();
  // pdfkit's text moved its cursor; the page's own text is placed explicitly, so leave no trace.
  doc.fillOpacity(1).strokeOpacity(1).undash();
}
