/**
 * The print-ready recommendation sheet: every grower page one after another,
 * a page break between them, portrait, one recommendation per sheet of paper.
 * Two columns (a label, then the text wrapped in a wide column) instead of
 * merged cells: exceljs checks every new merge against all earlier ones, which
 * made a thousand-site workbook take most of a minute on this sheet alone.
 */
import type ExcelJS from 'exceljs';
import type { GrowerPage } from './growerPage';
import { setupPage } from './workbookFormat';

/**
 * Adds the recommendations sheet.
 * @param wb - the workbook
 * @param pages - the grower pages, in print order
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookGrowerSheet(
  wb: ExcelJS.Workbook,
  pages: GrowerPage[],
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Recommendations');
  ws.getColumn(1).width = 26;
  ws.getColumn(2).width = 78;
  let r = 1;
  /** A label (bold) and a wrapped text beside it; the row grows for long text. */
  const line = (label: string, text: string, font: Partial<ExcelJS.Font> = {}): void => {
    const a = ws.getCell(r, 1);
    a.value = label;
    a.font = { bold: true };
    a.alignment = { vertical: 'top', wrapText: true };
    const b = ws.getCell(r, 2);
    b.value = text;
    b.font = font;
    b.alignment = { wrapText: true, vertical: 'top' };
    // Excel does not grow a row for wrapped text written by a program: about 78 characters a line.
    const lines = Math.max(1, Math.ceil(text.length / 78));
    ws.getRow(r).height = Math.max(15, 15 * lines * ((font.size ?? 11) / 11));
    r++;
  };
  pages.forEach((p, i) => {
    if (i > 0) ws.getRow(r - 1).addPageBreak();
    const title = ws.getCell(r, 1);
    title.value = `${p.heading}: ${p.subject}`;
    title.font = { bold: true, size: 16 };
    ws.getRow(r).height = 24;
    r++;
    ws.getCell(r, 1).value = p.cropLabel;
    ws.getCell(r, 1).font = { color: { argb: 'FF555555' } };
    r += 2;
    line('Recommendation', p.recommendation, { bold: true, size: 16 });
    if (p.productRecommendation) line('As product', p.productRecommendation);
    for (const f of p.facts) line(f.label, f.value);
    r++;
    line('How sure is this?', p.certainty.text);
    r++;
    for (const f of p.prices) line(f.label, f.value);
    r++;
    p.basis.forEach((b, k) => line(k === 0 ? 'What this rests on' : '', b));
    if (p.warnings.length) {
      r++;
      p.warnings.forEach((w, k) =>
        line(k === 0 ? 'Please note' : '', w, { color: { argb: 'FF9C4A00' } }),
      );
    }
    r++;
    p.cautions.forEach((c, k) => line(k === 0 ? 'Cautions' : '', `• ${c}`));
    r++;
    ws.getCell(r, 1).value = p.footer;
    ws.getCell(r, 1).font = { size: 8, color: { argb: 'FF777777' } };
    r += 2;
  });
  ws.pageSetup.printArea = `A1:B${Math.max(1, r - 1)}`;
  setupPage(ws, paper, 'portrait');
  return ws;
}
