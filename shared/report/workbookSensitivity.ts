/**
 * The "Price ratio and risk" sheet: how each recommendation (the regional rate first, then
 * every site's) moves when the price ratio is halved or doubled, and for the tested rates and
 * the recommended rate the share of resamples (a site) or of sites (the region) in which the
 * rate returns clearly less than the best. The cautions head the sheet, as every rate carries
 * them.
 */
import type ExcelJS from 'exceljs';
import { priceRatioQuote } from '../economics/priceQuote';
import { recommendationCautions } from '../economics/recommendationCautions';
import type { SensitivitySummaryRow, ShortfallSummary, TrialReport } from './trialReport';
import type { UnitScale } from './unitScale';
import { fitColumns, rateFormat, setupPage, styleTitle, tableHeading } from './workbookFormat';

/** The sheet's name (the workbook keeps it out of the site sheets' names). */
export const SENSITIVITY_SHEET = 'Price ratio and risk';

/** Writes rows of cells from `r` on, with a number format per column; returns the next row. */
function body(
  ws: ExcelJS.Worksheet,
  r: number,
  rows: (string | number | null)[][],
  formats: (string | null)[],
): number {
  for (const values of rows) {
    const row = ws.getRow(r++);
    row.values = values;
    formats.forEach((f, c) => {
      if (f) row.getCell(c + 1).numFmt = f;
    });
  }
  return r;
}

/**
 * Adds the price-ratio and risk sheet.
 * @param wb - the workbook
 * @param report - the analysis
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookSensitivity(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(SENSITIVITY_SHEET);
  const ru = u.units.rate;
  const rN = ru.replace('/', ' N/');
  const money = `currency/${u.areaName}`;
  const prUnit = report.prices.priceRatioUnit;
  const quoted = (kgPerKg: number) =>
    priceRatioQuote(kgPerKg, report.settings.units, report.crop).value;
  const rf = rateFormat(ru);
  const titles = new Set<number>();
  ws.getCell('A1').value = 'Price ratio and risk';
  styleTitle(ws.getCell('A1'), 14);
  titles.add(1);
  let r = 3;
  ws.getCell(r, 1).value = 'Cautions';
  styleTitle(ws.getCell(r, 1));
  titles.add(r++);
  for (const c of recommendationCautions) {
    ws.getCell(r, 1).value = `• ${c}`;
    titles.add(r++);
  }
  const tol = report.settings.shortfallTolerance;
  const notes = [
    'Each price-ratio row repeats the recommendation with the nitrogen price scaled so that the price ratio is the multiple shown; the grain price and any application cost stay as given.',
    `A rate falls short when it returns less than the best rate by more than ${u.perArea(tol.perHa).toFixed(2)} ${money}` +
      (tol.isDefault ? ' (the default: the cost of 10 kg N/ha at these prices).' : ' (as set).'),
    "Site: the share of the bootstrap resamples in which the rate falls short of that resample's own best rate. Region: the share of the sites at which the rate falls short of the site's own best, from each site's fitted curve — a risk between sites, not an uncertainty of any one curve.",
  ];
  r++;
  for (const n of notes) {
    ws.getCell(r, 1).value = n;
    titles.add(r++);
  }
  const ratioRows = (rows: SensitivitySummaryRow[], region: boolean) =>
    rows.map((x) => {
      const pair = region ? x.profitableRangeKgHa : x.ciKgHa;
      return [
        x.ratioMultiplier,
        quoted(x.priceRatioKgPerKg),
        x.rateKgHa === null || !Number.isFinite(x.rateKgHa) ? null : u.rate(x.rateKgHa),
        pair ? u.rate(pair[0]) : null,
        pair ? u.rate(pair[1]) : null,
      ];
    });
  const riskRows = (risk: ShortfallSummary, mark: string) =>
    risk.rows.map((x) => [u.rate(x.rateKgHa), x.share, x.recommended ? mark : '']);
  const ratioFormats = ['0.00"×"', '0.0000', rf, rf, rf];
  const riskFormats = [rf, '0%', null];
  const a = report.acrossSites;
  if (a) {
    r++;
    r = tableHeading(
      ws,
      r,
      'Across sites: the regional rate at other price ratios',
      [
        'Multiple of the price ratio',
        `Price ratio (${prUnit})`,
        `Regional rate (${rN})`,
        `Profitable range low (${rN})`,
        `Profitable range high (${rN})`,
      ],
      titles,
    );
    r = body(ws, r, ratioRows(a.priceRatioSensitivity, true), ratioFormats);
    if (a.shortfallRisk) {
      r++;
      r = tableHeading(
        ws,
        r,
        `Across sites: share of the ${a.shortfallRisk.count} sites each rate leaves short`,
        [`Rate (${rN})`, 'Share of sites short', ''],
        titles,
      );
      r = body(ws, r, riskRows(a.shortfallRisk, 'regional rate'), riskFormats);
    }
  }
  for (const s of report.sites) {
    if (s.priceRatioSensitivity.length === 0) continue;
    r++;
    const level = Math.round(s.recommendation.level * 100);
    r = tableHeading(
      ws,
      r,
      `${s.site}: the recommended rate at other price ratios`,
      [
        'Multiple of the price ratio',
        `Price ratio (${prUnit})`,
        `Recommended rate (${rN})`,
        `${level} % interval low (${rN})`,
        `${level} % interval high (${rN})`,
      ],
      titles,
    );
    r = body(ws, r, ratioRows(s.priceRatioSensitivity, false), ratioFormats);
    if (s.shortfallRisk) {
      r++;
      r = tableHeading(
        ws,
        r,
        `${s.site}: share of the ${s.shortfallRisk.count} resamples in which each rate falls short`,
        [`Rate (${rN})`, 'Share of resamples short', ''],
        titles,
      );
      r = body(ws, r, riskRows(s.shortfallRisk, 'recommended rate'), riskFormats);
    }
  }
  fitColumns(ws, 10, 28, titles);
  ws.pageSetup.printArea = `A1:E${r}`;
  setupPage(ws, paper, 'portrait');
  return ws;
}
