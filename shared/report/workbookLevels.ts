/**
 * The sheet of one treatment factor (source, timing…): for every rate × factor site, whether its
 * levels respond differently (the nested F tests of shared/analysis/levelResponseTest), each
 * level's recommendation from its own plots and the shared checks at its own N price, and which
 * level returns the most, with every other level's difference in optimum and in return and their
 * intervals from the paired resamples (shared/analysis/priceLevels); then, across the site-years,
 * the regional quadratic by level (shared/analysis/regionalLevelMixedModel) with its tests and
 * each level's regional optimum at its own price. Figures only; nothing is
 * fitted here. Each level's full site report (models, ANOVA) is the site's, under its own name,
 * in the results JSON and on screen.
 */
import type ExcelJS from 'exceljs';
import { recommendationCautions } from '../economics/recommendationCautions';
import { KG_PER_LB } from '../units/unitConstants';
import { levelChartKey } from './levelCurvesChart';
import { levelMixedSentence, levelTestSentence } from './levelSentences';
import type { LevelMixedReport, SiteLevelsReport, TrialReport } from './trialReport';
import { nutrientRateUnit } from '../units/convertRate';
import type { UnitScale } from './unitScale';
import type { SheetImage } from './workbookSite';
import {
  P_VALUE_FORMAT,
  fitColumns,
  rateFormat,
  setupPage,
  styleTitle,
  tableHeading,
} from './workbookFormat';

/**
 * The sheet's name wanted for a factor (sheetName makes it unique and legal).
 * @example levelsSheetTitle('Timing') // 'Levels by Timing'
 */
export function levelsSheetTitle(factor: string): string {
  return `Levels by ${factor}`;
}

/** The levels chart's width on the sheet, px (print-sharp from a 2× picture). */
const CHART_WIDTH_PX = 560;
/** exceljs's default row height, 15 pt, in px: how many rows a picture covers. */
const ROW_PX = 20;

function siteBlock(
  wb: ExcelJS.Workbook,
  ws: ExcelJS.Worksheet,
  r: number,
  f: SiteLevelsReport,
  u: UnitScale,
  titles: Set<number>,
  chart: SheetImage | null,
): number {
  const start = r;
  const ru = u.units.rate;
  const rN = nutrientRateUnit(ru);
  const money = `money/${u.areaName}`;
  // An N price is quoted per lb of N with lb/ac rates, per kg of N otherwise.
  const perN = ru === 'lb/ac' ? KG_PER_LB : 1;
  ws.getCell(r, 1).value = f.site;
  styleTitle(ws.getCell(r, 1), 13);
  titles.add(r++);
  ws.getCell(r, 1).value = levelTestSentence(f);
  titles.add(r++);
  // Another factor at the same site: how it meets this one, and (crossed) the adjusted test.
  for (const c of f.test.crossings ?? []) {
    ws.getCell(r, 1).value = c.message;
    titles.add(r++);
    if (c.adjusted) {
      ws.getCell(r, 1).value = c.adjusted.sentence;
      titles.add(r++);
    }
  }
  r = tableHeading(
    ws,
    r,
    'Do the levels respond differently? One curve per level against one for all, the zero-rate check shared (weighted by 1/fitted yield²; plateau joins profiled)',
    ['Curve', 'F', 'df1', 'df2', 'p', 'Reading'],
    titles,
  );
  // Analyses saved before the plateau tests existed have only the first two.
  const tests = [f.test.quadratic, f.test.linear, f.test.quadraticPlateau, f.test.linearPlateau];
  for (const t of tests.filter((x) => x !== undefined)) {
    const res = t.result;
    ws.getRow(r).values =
      res.kind === 'f-test'
        ? [t.model, res.f, res.df1, res.df2, res.p, t.sentence]
        : [t.model, '–', '–', '–', '–', t.sentence];
    if (res.kind === 'f-test') {
      ws.getCell(r, 2).numFmt = '0.000';
      ws.getCell(r, 5).numFmt = P_VALUE_FORMAT;
    }
    r++;
  }
  r++;
  const level = `${Math.round(f.comparison.level * 100)} %`;
  r = tableHeading(
    ws,
    r,
    `Each level: its own plots and the shared checks, priced at its own N price`,
    [
      f.factor,
      'Plots (shared checks)',
      `N price (per ${ru === 'lb/ac' ? 'lb' : 'kg'} N)`,
      'Model',
      `Recommended rate (${rN})`,
      `${level} interval low`,
      `${level} interval high`,
      `Net return at that rate (${money})`,
    ],
    titles,
  );
  for (const l of f.levels) {
    const rec = l.report.recommendation;
    ws.getRow(r).values = [
      l.level + (l.level === f.comparison.best ? ' (returns most)' : ''),
      `${l.report.n} (${l.checkPlots})`,
      l.nutrientPricePerKg * perN,
      rec.model ?? '–',
      rec.rateKgHa === null ? '–' : u.rate(rec.rateKgHa),
      rec.ciKgHa ? u.rate(rec.ciKgHa[0]) : '–',
      rec.ciKgHa ? u.rate(rec.ciKgHa[1]) : '–',
      l.returnAtOptimumPerHa === null ? '–' : u.perArea(l.returnAtOptimumPerHa),
    ];
    ws.getCell(r, 3).numFmt = '0.00';
    for (const c of [5, 6, 7]) ws.getCell(r, c).numFmt = rateFormat(ru);
    ws.getCell(r, 8).numFmt = '0.00';
    r++;
  }
  r++;
  const c = f.comparison;
  r = tableHeading(
    ws,
    r,
    `Set against ${c.best ?? 'the best level'}: differences (this level − the best) from ${c.resamplesCompared} paired resamples${c.bestShare === null ? '' : `; ${c.best} returned the most in ${Math.round(c.bestShare * 100)} % of them`}`,
    [
      f.factor,
      `Optimum difference (${rN})`,
      `${level} low`,
      `${level} high`,
      `Return difference (${money})`,
      `${level} low`,
      `${level} high`,
    ],
    titles,
  );
  for (const d of c.differences) {
    const oi = d.optimumDifferenceIntervalKgHa;
    const ri = d.returnDifferenceIntervalPerHa;
    ws.getRow(r).values = [
      d.level,
      d.optimumDifferenceKgHa === null ? '–' : u.rate(d.optimumDifferenceKgHa),
      oi ? u.rate(oi[0]) : '–',
      oi ? u.rate(oi[1]) : '–',
      d.returnDifferencePerHa === null ? '–' : u.perArea(d.returnDifferencePerHa),
      ri ? u.perArea(ri[0]) : '–',
      ri ? u.perArea(ri[1]) : '–',
    ];
    for (const k of [2, 3, 4]) ws.getCell(r, k).numFmt = rateFormat(ru);
    for (const k of [5, 6, 7]) ws.getCell(r, k).numFmt = '0.00';
    r++;
  }
  if (chart) {
    // The levels' curves with the shared check (levelCurvesChart), right of the site's tables;
    // the block is made as tall as the picture so the next site's picture does not overlap it.
    const id = wb.addImage({ buffer: chart.png as never, extension: 'png' });
    const height = (CHART_WIDTH_PX * chart.heightPx) / chart.widthPx;
    ws.addImage(id, {
      tl: { col: 9.2, row: start - 1 },
      ext: { width: CHART_WIDTH_PX, height },
    });
    r = Math.max(r, start + Math.ceil(height / ROW_PX));
  }
  return r + 1;
}

/** Across the site-years: the regional quadratic by level, its tests and each level's optimum. */
function regionalBlock(
  ws: ExcelJS.Worksheet,
  r: number,
  m: LevelMixedReport,
  u: UnitScale,
  titles: Set<number>,
): number {
  const ru = u.units.rate;
  const rN = nutrientRateUnit(ru);
  ws.getCell(r, 1).value = `Across site-years: the regional curve by ${m.factor}`;
  styleTitle(ws.getCell(r, 1), 13);
  titles.add(r++);
  ws.getCell(r, 1).value = levelMixedSentence(m, {
    rate: (kgHa) => `${Math.round(u.rate(kgHa))} ${ru}`,
  });
  titles.add(r++);
  const fit = m.fit;
  if (fit === null) return r + 1;
  r = tableHeading(
    ws,
    r,
    'Do the levels share one regional curve? One intercept (the shared check), a curve per level against one for all; random site-year effects on a, b, c',
    ['Test', 'χ²', 'df', 'p', 'Fitted by'],
    titles,
  );
  for (const [name, t, by] of [
    ['Likelihood ratio', fit.likelihoodRatio, 'maximum likelihood'],
    ['Wald', fit.wald, 'REML'],
  ] as const) {
    ws.getRow(r).values = [name, t.statistic, t.df, t.p, by];
    ws.getCell(r, 2).numFmt = '0.000';
    ws.getCell(r, 4).numFmt = P_VALUE_FORMAT;
    r++;
  }
  r++;
  const level = m.levels[0] ? `${Math.round(m.levels[0].optimum.level * 100)} %` : '';
  const yieldUnit = u.units.yield;
  r = tableHeading(
    ws,
    r,
    `Each level's regional curve y = a + b·N + c·N² (${yieldUnit}) and its optimum at its own price ratio (delta method, site-years − 3 df)`,
    [
      m.factor,
      'Site-years',
      'a',
      'b',
      'c',
      'Price ratio (kg grain per kg N)',
      `Regional rate (${rN})`,
      `${level} interval low`,
      `${level} interval high`,
    ],
    titles,
  );
  const f = (['a', 'b', 'c'] as const).map((k) => u.param('quadratic', k, 1));
  fit.levels.forEach((c, k) => {
    const o = m.levels[k]?.optimum;
    ws.getRow(r).values = [
      c.level,
      c.siteYears,
      c.fixed.a * f[0],
      c.fixed.b * f[1],
      c.fixed.c * f[2],
      m.levels[k]?.priceRatio ?? '–',
      o ? u.rate(o.rateKgHa) : '–',
      o?.interval ? u.rate(o.interval.lowKgHa) : '–',
      o?.interval ? u.rate(o.interval.highKgHa) : '–',
    ];
    for (const col of [3, 4, 5]) ws.getCell(r, col).numFmt = '0.000E+00';
    ws.getCell(r, 6).numFmt = '0.00';
    for (const col of [7, 8, 9]) ws.getCell(r, col).numFmt = rateFormat(ru);
    r++;
  });
  return r + 1;
}

/**
 * Adds the sheet of one factor.
 * @param wb - the workbook
 * @param name - the sheet's name (sheetName of levelsSheetTitle)
 * @param factor - the factor's column header
 * @param report - the analysis (its `levels`)
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @param charts - each site's levels chart by levelChartKey (PNG drawn by the caller); none: no pictures
 * @returns the sheet
 */
export function workbookLevels(
  wb: ExcelJS.Workbook,
  name: string,
  factor: string,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
  charts: Readonly<Record<string, SheetImage>> = {},
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name);
  ws.getCell('A1').value =
    `Rate × ${factor}: one response curve per level, the zero-rate check shared`;
  styleTitle(ws.getCell('A1'), 14);
  const titles = new Set<number>([1]);
  let r = 3;
  for (const f of report.levels.filter((l) => l.factor === factor))
    r = siteBlock(wb, ws, r, f, u, titles, charts[levelChartKey(f.site, factor)] ?? null);
  for (const m of (report.levelMixed ?? []).filter((l) => l.factor === factor))
    r = regionalBlock(ws, r, m, u, titles);
  for (const c of recommendationCautions) {
    ws.getCell(r, 1).value = c;
    titles.add(r++);
  }
  fitColumns(ws, 8, 36, titles);
  setupPage(ws, paper, 'landscape');
  return ws;
}
