/**
 * The print-ready recommendation sheet: every grower page one after another,
 * a page break between them, in a portrait layout that prints one
 * recommendation per sheet of paper.
 */
import type ExcelJS from 'exceljs';
import type { GrowerPage } from './growerPage';
import { setupPage } from './workbookFormat';

const COLS = 6;

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
  ws.getColumn(1).width = 30;
  for (let c = 2; c <= COLS; c++) ws.getColumn(c).width = 14;
  let r = 1;
  const line = (text: string, font: Partial<ExcelJS.Font> = {}, height?: number): void => {
    ws.mergeCells(r, 1, r, COLS);
    const cell = ws.getCell(r, 1);
    cell.value = text;
    cell.font = font;
    cell.alignment = { wrapText: true, vertical: 'top' };
    if (height) ws.getRow(r).height = height;
    r++;
  };
  const pair = (label: string, value: string): void => {
    ws.getCell(r, 1).value = label;
    ws.getCell(r, 1).font = { bold: true };
    ws.mergeCells(r, 2, r, COLS);
    ws.getCell(r, 2).value = value;
    ws.getCell(r, 2).alignment = { wrapText: true };
    r++;
  };
  pages.forEach((p, i) => {
    if (i > 0) {
      ws.getRow(r - 1).addPageBreak();
    }
    line(`${p.heading}: ${p.subject}`, { bold: true, size: 16 }, 24);
    line(p.cropLabel, { size: 11, color: { argb: 'FF555555' } });
    r++;
    line(p.recommendation, { bold: true, size: 20 }, 30);
    if (p.productRecommendation) line(p.productRecommendation, { size: 13 });
    r++;
    for (const f of p.facts) pair(f.label, f.value);
    r++;
    line('How sure is this?', { bold: true, size: 12 });
    line(p.certainty.text, {}, 32);
    r++;
    line('Prices assumed', { bold: true, size: 12 });
    for (const f of p.prices) pair(f.label, f.value);
    r++;
    line('What this rests on', { bold: true, size: 12 });
    for (const b of p.basis) line(b, {}, 30);
    if (p.warnings.length) {
      r++;
      line('Please note', { bold: true, size: 12, color: { argb: 'FF9C4A00' } });
      for (const w of p.warnings) line(w, { color: { argb: 'FF9C4A00' } }, 30);
    }
    r++;
    line('Cautions', { bold: true, size: 12 });
    for (const c of p.cautions) line(`• ${c}`, {}, 30);
    r++;
    line(p.footer, { size: 8, color: { argb: 'FF777777' } });
    r++;
  });
  ws.pageSetup.printArea = `A1:F${Math.max(1, r - 1)}`;
  setupPage(ws, paper, 'portrait');
  // One recommendation per page: fit width only, let page breaks split.
  return ws;
}
