/**
 * The "Gain over the check" table of a site sheet: the slope of the yield gains
 * over the zero-rate plot of the same block (line through the origin) with its
 * interval, the test of a gain at rate zero and the test of a bend, all contrasts
 * of the rate means tested with the rate + block model's error df
 * (shared/analysis/siteResponseOverCheck), and what they read as. The slope is
 * written in the unit the trade quotes the price ratio in (bu/lb N, kg/kg N), so
 * the two can be read side by side.
 */
import type ExcelJS from 'exceljs';
import { priceRatioQuote } from '../economics/priceQuote';
import type { SiteReport, TrialReport } from './trialReport';
import type { UnitScale } from './unitScale';
import {
  P_VALUE_FORMAT,
  headerRow,
  magnitudeFormat,
  titleRow,
  yieldFormat,
} from './workbookFormat';

/** What the gains read as, in the table's last column. */
const READINGS = {
  'from-zero': 'start from zero',
  'gain-at-zero': 'do not start from zero',
  bends: 'bend: a response that levels off',
} as const;

/**
 * Writes the table from row r down.
 * @param ws - the site's sheet
 * @param r - the 1-based row of the table's title
 * @param site - the site's results (canonical units)
 * @param report - the whole analysis (display units, crop)
 * @param u - display-unit converters
 * @param titles - the sheet's title rows, to which the title is added
 * @returns the first row after the table
 */
export function workbookGainOverCheck(
  ws: ExcelJS.Worksheet,
  r: number,
  site: SiteReport,
  report: TrialReport,
  u: UnitScale,
  titles: Set<number>,
): number {
  titleRow(
    ws,
    r++,
    'Gain over the check (yield gain over the zero-rate plot of the same block, fitted through the origin)',
    titles,
  );
  const g = site.responseOverCheck;
  if (!g.available) {
    ws.getCell(r++, 1).value = `Not available: ${g.message}`;
    return r;
  }
  const yu = u.units.yield;
  const slope = (kgPerKg: number) => priceRatioQuote(kgPerKg, report.settings.units, report.crop);
  const su = slope(1).unit;
  const level = Math.round(g.confidenceLevel * 100);
  headerRow(ws, r++, [
    `Slope (${su})`,
    `${level} % low (${su})`,
    `${level} % high (${su})`,
    `Gain at rate 0 (${yu})`,
    `SE (${yu})`,
    't',
    'df',
    'p',
    'Bend F',
    'df1',
    'df2',
    'Bend p',
    'Reading',
  ]);
  const row = ws.getRow(r++);
  const shown = [g.slopeKgPerKg, ...g.slopeCiKgPerKg].map((v) => slope(v).value);
  const c = g.curvature;
  row.values = [
    ...shown,
    u.yield(g.gainAtZeroKgHa),
    u.yield(g.gainAtZeroSeKgHa),
    g.t,
    g.df2,
    g.p,
    c ? c.F : null,
    c ? c.df1 : null,
    c ? c.df2 : null,
    c ? c.p : null,
    READINGS[g.reading],
  ];
  const slopeFormat = magnitudeFormat(Math.max(...shown.map(Math.abs)));
  for (const k of [1, 2, 3]) row.getCell(k).numFmt = slopeFormat;
  row.getCell(4).numFmt = yieldFormat(yu);
  row.getCell(5).numFmt = yieldFormat(yu);
  row.getCell(6).numFmt = '0.00';
  row.getCell(8).numFmt = P_VALUE_FORMAT;
  row.getCell(9).numFmt = '0.00';
  row.getCell(12).numFmt = P_VALUE_FORMAT;
  ws.getCell(r++, 1).value =
    `${g.gains} fertilized plots, each measured against the zero-rate plot of its own block; the slope, the gain at rate 0 and the bend are contrasts of the rate means, tested with the rate and block ANOVA's error mean square.`;
  return r;
}
