/**
 * The "Regional model" sheet: the regional quadratic fitted as a mixed model over the
 * site-years (shared/analysis/regionalMixedModel), its optimum at the report's prices with the
 * delta-method interval, the variance components and each site-year's own curve, all in the
 * report's units, with the cautions. Figures only; nothing is fitted here.
 */
import type ExcelJS from 'exceljs';
import { recommendationCautions } from '../economics/recommendationCautions';
import { mixedModelSentence, type MixedModelSentenceFormat } from '../economics/mixedModelSentence';
import { favouredFormRateSentence } from '../economics/mixedModelFormsSentence';
import { RATE_DECIMALS, shownRate } from '../units/rateRounding';
import { profileIntervalText } from './modelNotes';
import type { TrialReport } from './trialReport';
import { mixedFormParamModel, type UnitScale } from './unitScale';
import { fitColumns, rateFormat, setupPage, styleTitle, tableHeading } from './workbookFormat';
import { modelLabel } from '../models/curves';
import { nutrientRateUnit } from '../units/convertRate';

const COEFFICIENTS = ['a', 'b', 'c'] as const;

/**
 * Adds the regional model sheet (or a sheet saying why there is none).
 * @param wb - the workbook
 * @param report - the analysis
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookRegionalModel(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Regional model');
  const ru = u.units.rate;
  const rN = nutrientRateUnit(ru);
  ws.getCell('A1').value = 'Regional model: one quadratic for the region, a curve per site-year';
  styleTitle(ws.getCell('A1'), 14);
  const titles = new Set<number>([1, 2]);
  const m = report.acrossSites?.mixed ?? null;
  if (!m) {
    ws.getCell('A3').value =
      'Not computed: it needs at least 4 site-years with plots and 3 distinct rates.';
    return ws;
  }
  const rateWords = (kgHa: number) => shownRate(u.rate(kgHa), ru).toFixed(RATE_DECIMALS[ru]);
  const sentenceFormat = {
    rateWords,
    rate: (kgHa: number) => `${rateWords(kgHa)} ${rN}`,
    interval: (i: Parameters<typeof profileIntervalText>[0]) =>
      `${profileIntervalText(i, rateWords)} ${rN}`,
  };
  ws.getCell('A2').value = mixedModelSentence(m.fit.siteYears, m.optimum, sentenceFormat);
  let r = 4;
  const interval = m.optimum.interval;
  const facts: [string, number | string, string | null][] = [
    [`Regional optimum rate (${rN})`, u.rate(m.optimum.rateKgHa), rateFormat(ru)],
    [`Interval low (${rN})`, interval ? u.rate(interval.lowKgHa) : '–', rateFormat(ru)],
    [`Interval high (${rN})`, interval ? u.rate(interval.highKgHa) : '–', rateFormat(ru)],
    ['Interval level', m.optimum.level, '0%'],
    ['Interval method', m.optimum.method, null],
    ['Site-years', m.fit.siteYears, '0'],
    ['Plots (less one per block contrast)', m.fit.observations, '0'],
    ['Block offsets', m.fit.blockOffsets ? 'fixed, nested in site-year' : 'none', null],
    ['Site-year covariance', m.fit.structure, null],
    ['Log-likelihood, REML (kg/ha)', m.fit.logLikelihoodReml, '0.000'],
    ['Log-likelihood, ML (kg/ha)', m.fit.logLikelihoodMl, '0.000'],
    ['AIC, ML (kg/ha)', m.fit.aic, '0.000'],
  ];
  for (const [label, value, numFmt] of facts) {
    ws.getCell(r, 1).value = label;
    ws.getCell(r, 2).value = value;
    if (numFmt && typeof value === 'number') ws.getCell(r, 2).numFmt = numFmt;
    r++;
  }
  r++;
  r = tableHeading(
    ws,
    r,
    'Regional curve y = a + b·x + c·x² (REML; rates divided by the highest tested rate to fit, reported back in these units)',
    ['Coefficient', 'Estimate', 'Std. error', 'Unit'],
    titles,
  );
  for (const k of COEFFICIENTS) {
    ws.getRow(r++).values = [
      k,
      u.param('quadratic', k, m.fit.fixed[k]),
      u.param('quadratic', k, m.fit.stdErrors[k]),
      u.paramUnit('quadratic', k),
    ];
  }
  r++;
  r = tableHeading(
    ws,
    r,
    'How site-years differ: covariance of their departures from a, b and c; plot error variance below',
    ['', 'a', 'b', 'c'],
    titles,
  );
  const f = COEFFICIENTS.map((k) => u.param('quadratic', k, 1));
  m.fit.siteCovariance.forEach((row, i) => {
    ws.getRow(r++).values = [COEFFICIENTS[i], ...row.map((v, j) => v * f[i] * f[j])];
  });
  ws.getRow(r++).values = [
    `Plot error variance ((${u.units.yield})²)`,
    m.fit.residualVariance * u.yield(1) ** 2,
  ];
  r++;
  r = tableHeading(
    ws,
    r,
    'Each site-year’s own curve (the regional curve plus its predicted departure)',
    ['Site-year', 'a', 'b', 'c'],
    titles,
  );
  for (const s of m.siteCurves) {
    ws.getRow(r++).values = [
      s.site,
      u.param('quadratic', 'a', s.aKgHa),
      u.param('quadratic', 'b', s.bKgPerKg),
      u.param('quadratic', 'c', s.cKgHaPerKgHa2),
    ];
  }
  r++;
  r = mixedModelFormsTable(ws, r, report, u, sentenceFormat, rN, titles);
  r++;
  for (const c of recommendationCautions) {
    ws.getCell(r, 1).value = c;
    titles.add(r++);
  }
  fitColumns(ws, 4, 40, titles);
  ws.pageSetup.printArea = `A1:G${Math.max(r, 30)}`;
  setupPage(ws, paper, 'portrait');
  return ws;
}

/**
 * The forms compared: the quadratic, the quadratic-plateau and the linear-plateau, each fitted
 * by ML to the same site-years, with its AIC (kg/ha, as the facts above), its optimum at the
 * report's prices and its population curve in the report's units, and which the AIC favours.
 */
function mixedModelFormsTable(
  ws: ExcelJS.Worksheet,
  row: number,
  report: TrialReport,
  u: UnitScale,
  format: MixedModelSentenceFormat & { rateWords: (kgHa: number) => string },
  rN: string,
  titles: Set<number>,
): number {
  const { rateWords } = format;
  const forms = report.acrossSites?.mixedModels ?? [];
  if (forms.length === 0) return row;
  let r = tableHeading(
    ws,
    row,
    'Forms of the regional model compared (ML, the same site-years; the lower AIC is better supported)',
    [
      'Form',
      'AIC, ML (kg/ha)',
      'Log-likelihood, ML (kg/ha)',
      'Converged',
      `Optimum (${rN})`,
      `Interval (${rN})`,
      'Population curve',
    ],
    titles,
  );
  for (const f of forms) {
    const unitModel = (name: string) => mixedFormParamModel(f.model, name);
    // Four significant digits, small coefficients (c) in exponent form, so text carries no noise.
    const shown = (v: number) =>
      Math.abs(v) < 0.01 && v !== 0 ? v.toExponential(3) : v.toPrecision(4);
    const curve = Object.entries(f.fixed)
      .map(
        ([k, v]) => `${k} = ${shown(u.param(unitModel(k), k, v))} ${u.paramUnit(unitModel(k), k)}`,
      )
      .join('; ');
    const i = f.optimum.interval;
    ws.getRow(r++).values = [
      modelLabel(f.model),
      f.aic,
      f.logLikelihoodMl,
      f.converged ? 'yes' : f.settled ? 'cycles within 0.1 %' : 'no',
      u.rate(f.optimum.rateKgHa),
      i ? profileIntervalText(i, rateWords) : '–',
      curve,
    ];
    for (const c of [2, 3]) ws.getCell(r - 1, c).numFmt = '0.000';
    ws.getCell(r - 1, 5).numFmt = rateFormat(u.units.rate);
  }
  if (report.acrossSites!.mixedModelsSentence) {
    const favoured = favouredFormRateSentence(report.acrossSites!.mixedModels, format);
    ws.getCell(r, 1).value = [report.acrossSites!.mixedModelsSentence, favoured]
      .filter((t) => t !== '')
      .join(' ');
    titles.add(r++);
  }
  for (const f of forms) {
    if (f.note === '') continue;
    ws.getCell(r, 1).value = `${modelLabel(f.model)}: ${f.note}`;
    titles.add(r++);
  }
  const plateaus = forms.filter((f) => f.siteCurves.length > 0);
  if (plateaus.length === 0) return r;
  r++;
  const ru = u.units.rate.replace('/', ' N/');
  r = tableHeading(
    ws,
    r,
    'Each site-year’s own plateau and join in the plateau forms (the population curve plus its predicted departure)',
    [
      'Site-year',
      ...plateaus.flatMap((f) => [
        `${modelLabel(f.model)}: plateau (${u.units.yield})`,
        `${modelLabel(f.model)}: join (${ru})`,
      ]),
    ],
    titles,
  );
  plateaus[0].siteCurves.forEach((c, i) => {
    ws.getRow(r++).values = [
      c.site,
      ...plateaus.flatMap((f) => [
        u.yield(f.siteCurves[i].plateauKgHa),
        u.rate(f.siteCurves[i].joinKgHa),
      ]),
    ];
  });
  return r;
}
