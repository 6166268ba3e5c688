/**
 * One sheet per site: the plot data with exclusions and their reasons and the
 * cell each value came from, treatment means ± SE, the ANOVA, the model table,
 * the gain over the check, the intercept test on raw yields and the chart. Tables run down
 * column A so the sheet prints top to bottom; the chart sits to the right of
 * the plot data.
 */
import { originalRef } from '../table/originalCell';
import { leadingModelLabel } from '../models/curves';
import { intervalBasisText, intervalSharesText } from './intervalShares';
import { joinProfileNote, PROFILE_OPEN_ENDS_LEGEND, profileIntervalText } from './modelNotes';
import type ExcelJS from 'exceljs';
import type { SiteReport, TrialReport } from './trialReport';
import type { UnitScale } from './unitScale';
import { fullResponseSentence } from '../economics/decisionSentences';
import { workbookGainOverCheck } from './workbookGainOverCheck';
import {
  P_VALUE_FORMAT,
  fitColumns,
  magnitudeFormat,
  optimumHeaders,
  rateFormat,
  setupPage,
  headerRow,
  titleRow,
  styleTitle,
  yieldFormat,
} from './workbookFormat';
import { nutrientRateUnit } from '../units/convertRate';

/** Chart pictures for the sheet: PNG bytes and their size in CSS pixels. */
export interface SheetImage {
  png: Uint8Array;
  widthPx: number;
  heightPx: number;
}

/**
 * Adds one site's sheet.
 * @param wb - the workbook
 * @param name - the sheet name (already made valid and unique)
 * @param site - the site's results
 * @param report - the whole analysis (crop, settings)
 * @param u - display-unit converters
 * @param paper - paper for printing
 * @param chart - the site's chart picture, or null
 * @returns the sheet
 */
export function workbookSite(
  wb: ExcelJS.Workbook,
  name: string,
  site: SiteReport,
  report: TrialReport,
  u: UnitScale,
  paper: 'letter' | 'a4',
  chart: SheetImage | null,
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name);
  const ru = u.units.rate;
  // "lb N/ac": the rate is of nutrient, written the way agronomists write it.
  const rN = nutrientRateUnit(ru);
  const yu = u.units.yield;
  const titles = new Set<number>();
  ws.getCell('A1').value = `${site.site}: ${report.crop} nitrogen response`;
  styleTitle(ws.getCell('A1'), 14);
  ws.getCell('A2').value = `${site.n} plots used of ${site.plots.length}; ${site.designText}`;
  titles.add(1).add(2);

  // Plot data.
  let r = 4;
  headerRow(ws, r, [
    'Plot',
    'Block',
    'Treatment',
    `N rate (${rN})`,
    `Yield (${yu})`,
    'Moisture (%)',
    'Used',
    'Exclusion reason',
    'Excluded by',
    'Source cell',
  ]);
  const dataHeader = r;
  r++;
  for (const p of site.plots) {
    const row = ws.getRow(r++);
    const cell = p.original.yield ?? p.original.rate;
    const src = cell ? originalRef(cell) : null;
    row.values = [
      p.plotLabel ?? '',
      p.block ?? '',
      p.treatment ?? '',
      p.rateKgHa === null ? null : u.rate(p.rateKgHa),
      p.yieldKgHa === null ? null : u.yield(p.yieldKgHa),
      p.moisturePct,
      p.excluded ? 'no' : 'yes',
      p.excluded?.reason ?? '',
      p.excluded?.by ?? '',
      src ? `${src.file}${src.sheet ? ` › ${src.sheet}` : ''} ! ${src.cell}` : '',
    ];
    row.getCell(4).numFmt = rateFormat(ru);
    row.getCell(5).numFmt = yieldFormat(yu);
    row.getCell(6).numFmt = '0.0';
    if (p.excluded) row.font = { color: { argb: 'FF8A8A8A' }, italic: true };
  }
  ws.autoFilter = { from: { row: dataHeader, column: 1 }, to: { row: r - 1, column: 10 } };

  // Treatment means ± SE.
  r++;
  titleRow(ws, r++, 'Treatment means ± standard error', titles);
  headerRow(ws, r++, [`N rate (${rN})`, 'Plots', `Mean yield (${yu})`, `SE (${yu})`]);
  for (const m of site.treatmentMeans) {
    const row = ws.getRow(r++);
    row.values = [u.rate(m.rateKgHa), m.n, u.yield(m.meanKgHa), u.yield(m.seKgHa)];
    row.getCell(1).numFmt = rateFormat(ru);
    row.getCell(3).numFmt = yieldFormat(yu);
    row.getCell(4).numFmt = yieldFormat(yu);
  }

  // ANOVA.
  r++;
  if (site.anova) {
    const a = site.anova;
    titleRow(
      ws,
      r++,
      a.design === 'rcbd'
        ? 'Analysis of variance (randomized complete blocks)'
        : 'Analysis of variance (one-way)',
      titles,
    );
    headerRow(ws, r++, [
      'Source',
      'df',
      `Sum of squares ((${yu})²)`,
      `Mean square ((${yu})²)`,
      'F',
      'p',
    ]);
    const f2 = u.yield(1) ** 2;
    const ssFmt = magnitudeFormat(Math.max(...a.rows.map((x) => x.ss * f2)));
    for (const line of a.rows) {
      const row = ws.getRow(r++);
      row.values = [
        line.source,
        line.df,
        line.ss * f2,
        line.ms === null ? null : line.ms * f2,
        line.F,
        line.p,
      ];
      row.getCell(3).numFmt = ssFmt;
      row.getCell(4).numFmt = ssFmt;
      row.getCell(5).numFmt = '0.00';
      row.getCell(6).numFmt = P_VALUE_FORMAT;
    }
    const row = ws.getRow(r++);
    row.values = [
      'CV (%)',
      a.cvPercent,
      `LSD 5 % (${yu})`,
      a.lsdKgHa === null ? 'not one value (unbalanced)' : u.yield(a.lsdKgHa),
    ];
    row.getCell(2).numFmt = '0.0';
    row.getCell(4).numFmt = yieldFormat(yu);
    for (const note of a.notes) {
      ws.getCell(r++, 1).value = note;
    }
    if (a.missingPlots.length) {
      const list = a.missingPlots
        .map((m) => `${formatRate(u.rate(m.rateKgHa))} ${rN} in block ${m.block}`)
        .join('; ');
      ws.getCell(r++, 1).value =
        `Unbalanced: ${a.missingPlots.length} plot${a.missingPlots.length === 1 ? '' : 's'} missing (${list}); the rate sum of squares is adjusted for blocks and the means above are least-squares means.`;
    }
  } else {
    titleRow(ws, r++, 'Analysis of variance', titles);
    ws.getCell(r++, 1).value = 'Not available: fewer than two rates with plots.';
  }

  // Models.
  r++;
  titleRow(ws, r++, 'Response models (ranked by AICc; smaller is better)', titles);
  headerRow(ws, r++, [
    'Model',
    'Status',
    'Parameters',
    'SSE',
    'Residual df',
    'AICc',
    'R²',
    ...optimumHeaders(rN, yu),
    `Join profile low (${rN})`,
    `Join profile high (${rN})`,
    'Note',
  ]);
  const f2 = u.yield(1) ** 2;
  for (const m of site.models) {
    const row = ws.getRow(r++);
    const params = Object.entries(m.params)
      .map(([k, v]) => {
        const d = u.param(m.model, k, v);
        const se = m.stdErrors[k];
        const seText =
          se !== undefined && Number.isFinite(se) ? ` ± ${fmt(u.param(m.model, k, se))}` : '';
        // A parameter a fit at a limit leaves undetermined is blank (NaN): a dash, not "NaN".
        return `${k} = ${Number.isFinite(d) ? fmt(d) : '–'}${seText}`;
      })
      .join('; ');
    row.values = [
      m.model === site.bestModel ? leadingModelLabel(m.model) : m.label,
      m.status,
      params,
      m.sse * f2,
      m.dfResidual,
      Number.isFinite(m.aicc) ? m.aicc + site.n * Math.log(f2) : null,
      Number.isFinite(m.r2) ? m.r2 : null,
      m.optimumRateKgHa === null ? null : u.rate(m.optimumRateKgHa),
      m.optimumCiKgHa ? u.rate(m.optimumCiKgHa[0]) : null,
      m.optimumCiKgHa ? u.rate(m.optimumCiKgHa[1]) : null,
      m.yieldAtOptimumKgHa === null ? null : u.yield(m.yieldAtOptimumKgHa),
      m.joinProfile ? u.rate(m.joinProfile.lowKgHa) : null,
      m.joinProfile ? u.rate(m.joinProfile.highKgHa) : null,
      [m.message, m.optimumNote, m.joinProfile ? joinProfileNote(m.joinProfile) : '']
        .filter(Boolean)
        .join(' '),
    ];
    row.getCell(4).numFmt = magnitudeFormat(m.sse * f2);
    row.getCell(6).numFmt = '0.0';
    row.getCell(7).numFmt = '0.000';
    for (const c of [8, 9, 10, 12, 13]) row.getCell(c).numFmt = rateFormat(ru);
    row.getCell(11).numFmt = yieldFormat(yu);
    if (m.model === site.bestModel) row.font = { bold: true };
  }
  ws.getCell(r++, 1).value = `Chosen: ${site.bestModelReason}.`;
  const rec = site.recommendation;
  if (rec.basis === 'no-response') ws.getCell(r++, 1).value = `Recommendation: ${rec.sentence}`;
  if (rec.basis === 'full-response' && rec.rangeKgHa) {
    const [low, high] = rec.rangeKgHa.map((x) => `${formatRate(u.rate(x))} ${rN}`);
    ws.getCell(r++, 1).value = `Recommendation: ${fullResponseSentence(low, high)}`;
  }
  if (site.bootstrap) {
    const b = site.bootstrap;
    ws.getCell(r++, 1).value =
      `Optimum interval: ${Math.round(b.level * 100)} % percentile bootstrap over ${intervalBasisText(b)}, seed ${b.seed}; counted as ${intervalSharesText(b)}.`;
  }
  const profiled = site.models.find((m) => m.model === site.bestModel)?.optimumProfile;
  if (profiled) {
    const text = profileIntervalText(profiled, (x) => formatRate(u.rate(x)));
    ws.getCell(r++, 1).value =
      `Optimum profile interval (${Math.round(profiled.level * 100)} %, ${profiled.basis === 'join' ? "the join's" : 'from the quadratic in closed form'}): ${text} ${rN}, beside the bootstrap interval.`;
  }
  if (site.models.some((m) => m.joinProfile)) ws.getCell(r++, 1).value = PROFILE_OPEN_ENDS_LEGEND;
  if (site.lackOfFit.available) {
    const l = site.lackOfFit;
    const row = ws.getRow(r++);
    row.values = ['Lack of fit (chosen model)', `F(${l.df1}, ${l.df2})`, l.F, 'p', l.p];
    row.getCell(3).numFmt = '0.00';
    row.getCell(5).numFmt = P_VALUE_FORMAT;
  } else {
    ws.getCell(r++, 1).value = `Lack of fit: ${site.lackOfFit.message}`;
  }

  // Gain over the check first: whether the response starts from zero.
  r = workbookGainOverCheck(ws, r + 1, site, report, u, titles);

  // The intercept test on the raw yields, explained in one sentence.
  r++;
  titleRow(ws, r++, 'On the raw yields: straight line against the line through the origin', titles);
  if (site.interceptTest) {
    const t = site.interceptTest;
    headerRow(ws, r++, [`Intercept (${yu})`, `SE (${yu})`, 't', 'F', 'df1', 'df2', 'p', 'Verdict']);
    const row = ws.getRow(r++);
    row.values = [
      u.yield(t.interceptKgHa),
      u.yield(t.interceptSeKgHa),
      t.t,
      t.F,
      t.df1,
      t.df2,
      t.p,
      t.verdict,
    ];
    row.getCell(1).numFmt = yieldFormat(yu);
    row.getCell(2).numFmt = yieldFormat(yu);
    row.getCell(3).numFmt = '0.00';
    row.getCell(4).numFmt = '0.00';
    row.getCell(7).numFmt = P_VALUE_FORMAT;
    ws.getCell(r++, 1).value =
      'This only asks whether the crop yields something without fertilizer; the gain over the check above says whether the response to it starts from zero.';
  } else {
    ws.getCell(r++, 1).value = 'Not tested: fewer than three plots or a single rate.';
  }
  if (site.warnings.length) {
    r++;
    titleRow(ws, r++, 'Warnings', titles);
    for (const w of site.warnings) ws.getCell(r++, 1).value = w;
  }
  const lastRow = r - 1;

  fitColumns(ws, 7, 34, titles);
  ws.getColumn(3).width = Math.max(ws.getColumn(3).width ?? 10, 12);
  ws.getColumn(10).width = 30;
  if (chart) {
    const id = wb.addImage({ buffer: chart.png as never, extension: 'png' });
    // Right of the plot data, at a print-sharp size of 640 px wide.
    const w = 640;
    ws.addImage(id, {
      tl: { col: 11.2, row: 3 },
      ext: { width: w, height: (w * chart.heightPx) / chart.widthPx },
    });
  }
  ws.views = [{ state: 'frozen', ySplit: dataHeader }];
  ws.pageSetup.printArea = `A1:${chart ? 'T' : 'L'}${lastRow}`;
  ws.pageSetup.printTitlesRow = '1:2';
  setupPage(ws, paper, 'landscape');
  return ws;
}

/** A rate for a sentence: whole units (one decimal below 10). */
function formatRate(v: number): string {
  return Math.abs(v) < 10 ? v.toFixed(1) : String(Math.round(v));
}

/** Four significant digits, no binary noise, for parameters written into text. */
function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  if (v !== 0 && Math.abs(v) < 0.001) return v.toExponential(3);
  return String(Number(v.toPrecision(4)));
}
