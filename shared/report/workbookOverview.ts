/**
 * The workbook's first sheet: one row per site (chosen model, optimum with its
 * interval, yield at the optimum, intercept verdict, CV, warnings), the
 * regional rate when there is one, and the cautions above everything.
 */
import type ExcelJS from 'exceljs';
import { recommendationCautions } from '../economics/recommendationCautions';
import type { TrialReport } from './trialReport';
import type { UnitScale } from './unitScale';
import {
  P_VALUE_FORMAT,
  fitColumns,
  optimumHeaders,
  rateFormat,
  setupPage,
  styleHeaderRow,
  styleTitle,
  yieldFormat,
} from './workbookFormat';
import { nutrientRateUnit } from '../units/convertRate';

/**
 * Adds the overview sheet.
 * @param wb - the workbook
 * @param report - the analysis
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookOverview(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Overview');
  const ru = u.units.rate;
  // "lb N/ac": the rate is of nutrient, written the way agronomists write it.
  const rN = nutrientRateUnit(ru);
  const yu = u.units.yield;
  ws.getCell('A1').value = 'Nitrogen rate trial report';
  styleTitle(ws.getCell('A1'), 14);
  ws.getCell('A2').value =
    `${report.tool.name} ${report.tool.version} · ${report.createdAt} · ${report.sites.length} site(s) · rates in ${ru} of N, yields in ${yu}`;
  ws.getCell('A3').value = 'Cautions';
  styleTitle(ws.getCell('A3'));
  const wide = new Set<number>([1, 2, 3]);
  let r = 4;
  for (const c of recommendationCautions) {
    ws.mergeCells(r, 1, r, 11);
    const cell = ws.getCell(r, 1);
    cell.value = `• ${c}`;
    cell.alignment = { wrapText: true, vertical: 'top' };
    wide.add(r);
    r++;
  }
  for (const w of report.warnings) {
    ws.mergeCells(r, 1, r, 11);
    const cell = ws.getCell(r, 1);
    cell.value = `Note: ${w}`;
    cell.font = { bold: true, color: { argb: 'FF9C4A00' } };
    cell.alignment = { wrapText: true };
    wide.add(r);
    r++;
  }
  r++;
  const headerRow = r;
  const header = ws.getRow(r);
  header.values = [
    'Site',
    'Plots used',
    'Chosen model',
    ...optimumHeaders(rN, yu),
    'Intercept needed?',
    'Intercept p',
    'CV (%)',
    'Warnings',
  ];
  styleHeaderRow(header);
  r++;
  for (const s of report.sites) {
    const best = s.models.find((m) => m.model === s.bestModel) ?? null;
    const ci = s.bootstrap?.ciKgHa ?? null;
    const row = ws.getRow(r++);
    row.values = [
      s.site,
      s.n,
      best ? best.label : 'none',
      best?.optimumRateKgHa != null ? u.rate(best.optimumRateKgHa) : null,
      ci ? u.rate(ci[0]) : null,
      ci ? u.rate(ci[1]) : null,
      best?.yieldAtOptimumKgHa != null ? u.yield(best.yieldAtOptimumKgHa) : null,
      s.interceptTest ? (s.interceptTest.interceptNeeded ? 'yes' : 'no') : 'not tested',
      s.interceptTest ? s.interceptTest.p : null,
      s.anova?.cvPercent ?? null,
      s.warnings.join(' '),
    ];
    row.getCell(4).numFmt = rateFormat(ru);
    row.getCell(5).numFmt = rateFormat(ru);
    row.getCell(6).numFmt = rateFormat(ru);
    row.getCell(7).numFmt = yieldFormat(yu);
    row.getCell(9).numFmt = P_VALUE_FORMAT;
    row.getCell(10).numFmt = '0.0';
    row.getCell(11).alignment = { wrapText: true, vertical: 'top' };
  }
  const lastRow = r - 1;
  if (report.acrossSites) {
    r++;
    const a = report.acrossSites;
    ws.getCell(r, 1).value = 'Across sites';
    styleTitle(ws.getCell(r, 1));
    wide.add(r);
    r++;
    const row = ws.getRow(r++);
    row.values = [
      `Regional rate (${rN})`,
      u.rate(a.bestRateKgHa),
      'Profitable range',
      u.rate(a.profitableRangeKgHa[0]),
      u.rate(a.profitableRangeKgHa[1]),
    ];
    for (const c of [2, 4, 5]) row.getCell(c).numFmt = rateFormat(ru);
  }
  fitColumns(ws, 8, 40, wide);
  ws.getColumn(11).width = 60;
  ws.getColumn(1).width = Math.max(ws.getColumn(1).width ?? 10, 22);
  ws.views = [{ state: 'frozen', ySplit: headerRow, xSplit: 1 }];
  ws.pageSetup.printArea = `A1:K${Math.max(lastRow, r)}`;
  ws.pageSetup.printTitlesRow = `${headerRow}:${headerRow}`;
  setupPage(ws, paper, 'landscape');
  // Merged caution rows need height for wrapped text (Excel does not grow merged rows itself).
  for (const row of wide) if (row >= 4 && row < headerRow) ws.getRow(row).height = 30;
  return ws;
}
