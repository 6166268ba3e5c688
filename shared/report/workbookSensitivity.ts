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
import { nutrientRateUnit } from '../units/convertRate';

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
  const rN = nutrientRateUnit(ru);
  const money = `${report.settings.currency}/${u.areaName}`;
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
  /** One recommendation's two tables: the rate at each ratio, then each rate's risk. */
  const section = (
    at: number,
    t: { title: string; rateWord: string; rangeWord: string; riskTitle: string; mark: string },
    rows: SensitivitySummaryRow[],
    risk: ShortfallSummary | null,
  ): number => {
    let row = tableHeading(
      ws,
      at + 1,
      t.title,
      [
        'Multiple of the price ratio',
        `Price ratio (${prUnit})`,
        `${t.rateWord} (${rN})`,
        `${t.rangeWord} low (${rN})`,
        `${t.rangeWord} high (${rN})`,
      ],
      titles,
    );
    const ratioValues = rows.map((x) => {
      const pair = x.ciKgHa ?? x.profitableRangeKgHa;
      return [
        x.ratioMultiplier,
        quoted(x.priceRatioKgPerKg),
        x.rateKgHa === null || !Number.isFinite(x.rateKgHa) ? null : u.rate(x.rateKgHa),
        pair ? u.rate(pair[0]) : null,
        pair ? u.rate(pair[1]) : null,
      ];
    });
    row = body(ws, row, ratioValues, ['General"×"', '0.0000', rf, rf, rf]);
    if (!risk) return row;
    const whose = risk.of === 'sites' ? 'sites' : 'resamples';
    row = tableHeading(
      ws,
      row + 1,
      t.riskTitle,
      [`Rate (${rN})`, `Share of ${whose} short`, ''],
      titles,
    );
    const riskValues = risk.rows.map((x) => [
      u.rate(x.rateKgHa),
      x.share,
      x.recommended ? t.mark : '',
    ]);
    return body(ws, row, riskValues, [rf, '0%', null]);
  };
  const a = report.acrossSites;
  if (a) {
    r = section(
      r,
      {
        title: 'Across sites: the regional rate at other price ratios',
        rateWord: 'Regional rate',
        rangeWord: 'Profitable range',
        riskTitle: `Across sites: share of the ${a.shortfallRisk?.count} sites each rate leaves short`,
        mark: 'regional rate',
      },
      a.priceRatioSensitivity,
      a.shortfallRisk,
    );
  }
  for (const s of report.sites) {
    if (s.priceRatioSensitivity.length === 0) continue;
    r = section(
      r,
      {
        title: `${s.site}: the recommended rate at other price ratios`,
        rateWord: 'Recommended rate',
        rangeWord: `${Math.round(s.recommendation.level * 100)} % interval`,
        riskTitle: `${s.site}: share of the ${s.shortfallRisk?.count} resamples in which each rate falls short`,
        mark: 'recommended rate',
      },
      s.priceRatioSensitivity,
      s.shortfallRisk,
    );
  }
  fitColumns(ws, 10, 28, titles);
  ws.pageSetup.printArea = `A1:E${r}`;
  setupPage(ws, paper, 'portrait');
  return ws;
}
