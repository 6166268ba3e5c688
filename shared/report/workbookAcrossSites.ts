/**
 * The across-site sheet: the regional rate and its profitable range, each
 * site's own best rate, the pooling tests, the regional rate per group of sites, the years
 * of each site seen in several years compared, and the regional return curve.
 */
import type ExcelJS from 'exceljs';
import type { TrialReport } from './trialReport';
import type { UnitScale } from './unitScale';
import type { SheetImage } from './workbookSite';
import {
  P_VALUE_FORMAT,
  fitColumns,
  rateFormat,
  setupPage,
  tableHeading,
  styleTitle,
  yieldFormat,
} from './workbookFormat';
import { nutrientRateUnit } from '../units/convertRate';

/**
 * Adds the across-site sheet (or a sheet saying why there is none).
 * @param wb - the workbook
 * @param report - the analysis
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @param chart - the regional return chart picture, or null
 * @returns the sheet
 */
export function workbookAcrossSites(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
  chart: SheetImage | null,
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Across sites');
  const ru = u.units.rate;
  // "lb N/ac": the rate is of nutrient, written the way agronomists write it.
  const rN = nutrientRateUnit(ru);
  const money = `${report.settings.currency}/${u.areaName}`;
  ws.getCell('A1').value = 'Across sites: one rate for the region';
  styleTitle(ws.getCell('A1'), 14);
  const a = report.acrossSites;
  const titles = new Set<number>([1, 2]);
  if (!a) {
    ws.getCell('A3').value =
      'Not computed: it needs at least two sites with a usable response curve.';
    yearsTable(ws, 5, report, titles);
    return ws;
  }
  ws.getCell('A2').value =
    'Mean net return over the zero-N check across the sites’ fitted curves; the profitable range is every rate within the band of the best.';
  let r = 4;
  const facts: [string, number, string][] = [
    [`Regional rate (${rN})`, u.rate(a.bestRateKgHa), rateFormat(ru)],
    [`Profitable range low (${rN})`, u.rate(a.profitableRangeKgHa[0]), rateFormat(ru)],
    [`Profitable range high (${rN})`, u.rate(a.profitableRangeKgHa[1]), rateFormat(ru)],
    [`Band below the best return (${money})`, u.perArea(a.bandPerHa), '0.00'],
    [
      `Mean net return at the regional rate (${money})`,
      u.perArea(a.bestMeanReturnPerHa),
      '#,##0.00',
    ],
    [
      `Mean yield gain at the regional rate (${u.units.yield})`,
      u.yield(a.meanYieldGainAtBestKgHa),
      yieldFormat(u.units.yield),
    ],
  ];
  for (const [label, value, numFmt] of facts) {
    ws.getCell(r, 1).value = label;
    ws.getCell(r, 2).value = value;
    ws.getCell(r, 2).numFmt = numFmt;
    r++;
  }
  r++;
  r = tableHeading(
    ws,
    r,
    'Best rate at each site',
    ['Site', `Best rate (${rN})`, `Net return there (${money})`],
    titles,
  );
  for (const o of a.siteOptima) {
    const row = ws.getRow(r++);
    row.values = [o.site, u.rate(o.rateKgHa), u.perArea(o.returnPerHa)];
    row.getCell(2).numFmt = rateFormat(ru);
    row.getCell(3).numFmt = '#,##0.00';
  }
  if (a.tests.length) {
    r++;
    r = tableHeading(
      ws,
      r,
      'Does one response describe every site? (extra-sum-of-squares F-tests)',
      ['Question', 'F', 'df1', 'df2', 'p', 'Verdict'],
      titles,
    );
    for (const t of a.tests) {
      const row = ws.getRow(r++);
      row.values = [t.question, t.F, t.df1, t.df2, t.p, t.verdict];
      row.getCell(2).numFmt = '0.00';
      row.getCell(5).numFmt = P_VALUE_FORMAT;
    }
  }
  for (const n of a.notes) {
    ws.getCell(r, 1).value = n;
    titles.add(r++);
  }
  r = groupsTable(ws, r + 1, a.groups, u, titles);
  r = yearsTable(ws, r + 1, report, titles);
  fitColumns(ws, 8, 50, titles);
  if (chart) {
    const id = wb.addImage({ buffer: chart.png as never, extension: 'png' });
    ws.addImage(id, {
      tl: { col: 4.2, row: 3 },
      ext: { width: 600, height: (600 * chart.heightPx) / chart.widthPx },
    });
  }
  ws.pageSetup.printArea = `A1:M${Math.max(r, 30)}`;
  setupPage(ws, paper, 'landscape');
  return ws;
}

/** Each group's regional rate and the test between groups, from row r; the next free row. */
function groupsTable(
  ws: ExcelJS.Worksheet,
  r: number,
  groups: NonNullable<TrialReport['acrossSites']>['groups'],
  u: UnitScale,
  titles: Set<number>,
): number {
  if (groups.length === 0) return r;
  const ru = u.units.rate;
  const rN = nutrientRateUnit(ru);
  r = tableHeading(
    ws,
    r,
    'The regional rate per group of sites (each group averaged on its own; a group of two or more sites has its own grower page)',
    [
      'Grouped by',
      'Group',
      'Sites',
      `Regional rate (${rN})`,
      `Profitable low (${rN})`,
      `Profitable high (${rN})`,
      `Rate interval low (${rN})`,
      `Rate interval high (${rN})`,
    ],
    titles,
  );
  const rate = (kgHa: number | null | undefined) => (kgHa == null ? null : u.rate(kgHa));
  for (const g of groups) {
    for (const v of g.values) {
      const row = ws.getRow(r++);
      row.values = [
        g.key,
        v.value,
        v.sites.join(', '),
        rate(v.bestRateKgHa),
        rate(v.profitableRangeKgHa?.[0]),
        rate(v.profitableRangeKgHa?.[1]),
        rate(v.bestRateIntervalKgHa?.[0]),
        rate(v.bestRateIntervalKgHa?.[1]),
      ];
      for (let c = 4; c <= 8; c++) row.getCell(c).numFmt = rateFormat(ru);
    }
    if (g.differ) {
      ws.getCell(r, 1).value = g.differ.sentence;
      titles.add(r++);
    }
  }
  return r;
}

/** The years-compared table from row r (nothing without a site of several years); the next free row. */
function yearsTable(
  ws: ExcelJS.Worksheet,
  r: number,
  report: TrialReport,
  titles: Set<number>,
): number {
  if (report.yearsCompared.length === 0) return r;
  r = tableHeading(
    ws,
    r,
    'Does the response differ by year? (quadratic, each year its own level; extra-sum-of-squares F-tests)',
    ['Site', 'Years', 'Response F', 'df1', 'df2', 'p', 'Level F', 'p (level)', 'In words'],
    titles,
  );
  for (const c of report.yearsCompared) {
    const row = ws.getRow(r++);
    row.values = [
      c.site,
      c.years.map((y) => y ?? 'no year').join(', '),
      c.response?.F ?? null,
      c.response?.df1 ?? null,
      c.response?.df2 ?? null,
      c.response?.p ?? null,
      c.level?.F ?? null,
      c.level?.p ?? null,
      c.sentence,
    ];
    row.getCell(3).numFmt = '0.00';
    row.getCell(6).numFmt = P_VALUE_FORMAT;
    row.getCell(7).numFmt = '0.00';
    row.getCell(8).numFmt = P_VALUE_FORMAT;
  }
  return r;
}
