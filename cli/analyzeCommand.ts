/**
 * `plotrate analyze`: read the files, call shared/ for everything else, write
 * the outputs asked for. Every output goes through the desktop shell's atomic
 * writer (electron/atomicWrite.ts), so an interrupted run never leaves half a
 * file, and no output may be one of the inputs. The modules behind the
 * workbook (exceljs), the PDF (pdfkit) and the charts (resvg, a worker) are
 * imported where their output is written, so a run that writes only JSON
 * never loads them.
 */
import { checkPriceRatio, priceRatioFarOff } from '../shared/economics/priceRatioCheck';
import type { CropId } from '../shared/table/plotTable';
import { once } from 'node:events';
import { accessSync, constants, realpathSync, statSync } from 'node:fs';
import path from 'node:path';
import { writeFilesAtomic, type PendingOutput } from '../electron/atomicWrite';
import { readCappedFile } from '../electron/readCappedFile';
import { collectGarbage } from './collectGarbage';
import { drawOnThreads, drawWorkerBuilt } from './drawPool';
import { drawThreads } from './drawThreads';
import { OpenFileError } from '../electron/shellErrors';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial, analyzeTrialDrawnBy } from '../shared/analysis/analyzeTrial';
import { priceTrial } from '../shared/analysis/priceTrial';
import { atHighestTestedRate } from '../shared/report/highestTestedRate';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import type { MappingEntry } from '../shared/import/mappingEntries';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { priceTerms, quotePrices, type PriceInput } from '../shared/economics/priceQuote';
import { ImportError } from '../shared/import/importError';
import { importFiles } from '../shared/import/importFiles';
import { formatBytes, importLimits } from '../shared/import/importLimits';
import { describeRef } from '../shared/table/qualityFinding';
import { analyzablePlots } from '../shared/table/plotTable';
import { siteYearsOf } from '../shared/table/siteYear';
import { assembleReport } from '../shared/report/assembleReport';
import { resultsJsonPieces } from '../shared/report/resultsJson';
import type { DisplaySettings } from '../shared/report/reportSettings';
import type { ChartSpec } from '../shared/report/chartSpec';
import { unitScale } from '../shared/report/unitScale';
import type { SiteReport, TrialReport } from '../shared/report/trialReport';
import {
  bestLevelSentence,
  levelMixedSentence,
  levelTestSentence,
} from '../shared/report/levelSentences';
import type { SheetImage } from '../shared/report/workbookSite';
import { displayUnits, type DisplayUnits } from '../shared/units/displayUnits';
import { formatQuantity } from '../shared/units/formatQuantity';
import { KG_PER_LB } from '../shared/units/unitConstants';
import type { AnalyzeArgs } from './parseArgs';
import { UsageError } from './usageError';
import { chartFontFiles } from './chartFonts';
import { chartPictures, NO_CHARTS, reportChartSpecs, type WorkbookCharts } from './reportCharts';
import { formatShownRate } from '../shared/units/rateRounding';

/** Sheets written between full collections while the workbook is streamed (about 200 MB of garbage). */
const GARBAGE_EVERY_SHEETS = 200;

/** Thrown when the analysis ran but produced nothing usable: exit code 1. */
export class AnalysisFailed extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AnalysisFailed';
  }
}

/**
 * The outputs could not be written after the checks before the run passed (a full disk, a
 * folder removed mid-run): none of them was written. Exit code 1, as for an analysis failure.
 */
export class OutputFailed extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'OutputFailed';
  }
}

/** Where the command writes its messages; tests and the demo command pass their own. */
export interface Console2 {
  out: (line: string) => void;
  err: (line: string) => void;
}

function resolved(p: string): string {
  const abs = path.resolve(p);
  try {
    return realpathSync(abs);
  } catch {
    // Not there yet: compare the folder's real path with the name.
    try {
      return path.join(realpathSync(path.dirname(abs)), path.basename(abs));
    } catch {
      return abs;
    }
  }
}

/** Device and inode of a file, to know a hard link of an input by more than its name; null when absent. */
function fileIdentity(p: string): string | null {
  try {
    const st = statSync(p);
    return `${st.dev}:${st.ino}`;
  } catch {
    return null;
  }
}

/**
 * Every output is checked before any work, so a run never fits a thousand sites to fail on a
 * missing folder: the name's extension, its folder exists, is a folder and can be written, the
 * target is not a folder and, when it exists, can be written over; no two outputs share a
 * file and no output is an input (by real path, and by device and inode for hard links).
 */
function checkOutputs(args: AnalyzeArgs): void {
  const inputs = new Map(args.files.map((f) => [resolved(f), f]));
  const inputIds = new Map<string, string>();
  for (const f of args.files) {
    const id = fileIdentity(f);
    if (id) inputIds.set(id, f);
  }
  const outs: [string, string | null, string][] = [
    ['--out', args.out, '.xlsx'],
    ['--pdf', args.pdf, '.pdf'],
    ['--json', args.json, '.json'],
  ];
  const seen = new Map<string, string>();
  for (const [option, p, ext] of outs) {
    if (!p) continue;
    const r = resolved(p);
    const id = fileIdentity(r);
    const input = inputs.get(r) ?? (id ? inputIds.get(id) : undefined);
    if (input !== undefined) {
      throw new UsageError(
        `${option} ${p} is the input file "${input}"; choose another name, an input is never written over.`,
      );
    }
    if (seen.has(r))
      throw new UsageError(
        `${option} ${p} is also given to ${seen.get(r)}; give each output its own file.`,
      );
    seen.set(r, option);
    if (path.extname(p).toLowerCase() !== ext)
      throw new UsageError(`${option} ${p}: name the file with ${ext}.`);
    const folder = path.dirname(path.resolve(p));
    let folderStat;
    try {
      folderStat = statSync(folder);
    } catch {
      throw new UsageError(`${option} ${p}: the folder ${folder} does not exist.`);
    }
    if (!folderStat.isDirectory())
      throw new UsageError(`${option} ${p}: ${folder} is not a folder.`);
    try {
      accessSync(folder, constants.W_OK);
    } catch {
      throw new UsageError(
        `${option} ${p}: the folder ${folder} cannot be written to; choose another folder.`,
      );
    }
    let target;
    try {
      target = statSync(path.resolve(p));
    } catch {
      continue; // a new file
    }
    if (target.isDirectory())
      throw new UsageError(`${option} ${p} is a folder; give a file name ending in ${ext}.`);
    try {
      accessSync(path.resolve(p), constants.W_OK);
    } catch {
      throw new UsageError(
        `${option} ${p} exists and cannot be written over; choose another name.`,
      );
    }
  }
}

/**
 * Reads every input through the one capped reader the desktop shell uses (regular files only,
 * no larger than import's file limit), turning its refusal into a usage error (exit 2).
 */
async function readInputs(files: string[]): Promise<{ name: string; bytes: Uint8Array }[]> {
  const out: { name: string; bytes: Uint8Array }[] = [];
  for (const f of files) {
    try {
      const b = await readCappedFile(
        f,
        importLimits.maxFileBytes,
        (size) =>
          `is ${formatBytes(size)}; trial files above ${formatBytes(importLimits.maxFileBytes)} are not read`,
      );
      out.push({ name: path.basename(f), bytes: new Uint8Array(b.buffer, b.byteOffset, b.length) });
    } catch (e) {
      if (e instanceof OpenFileError) throw new UsageError(`Cannot read ${e.message}.`);
      throw e;
    }
  }
  return out;
}

/** Prices from the options, filling what is missing with the illustrative ones (as the workspace does). */
function pricesFrom(args: AnalyzeArgs, units: DisplayUnits, crop: CropId): PriceInput {
  const illustrative = quotePrices(illustrativePrices(crop), units, crop, true);
  const nutrientGiven = args.nutrientPrice !== null || args.product !== null;
  const product = args.product
    ? args.productPrice !== null
      ? { id: args.product, price: args.productPrice }
      : null
    : nutrientGiven
      ? null
      : illustrative.product;
  return {
    grainPrice: args.grainPrice ?? illustrative.grainPrice,
    nutrientPrice: product ? null : args.nutrientPrice,
    product,
    defaulted: args.grainPrice === null || !nutrientGiven,
  };
}

/** The workbook's chart pictures, to come, with progress for a long run. */
function drawPictures(
  report: TrialReport,
  charts: WorkbookCharts<ChartSpec>,
  log: Console2,
): WorkbookCharts<Promise<SheetImage>> {
  // Print sharpness (2×) for a report someone reads page by page; 1× past 100 sites keeps a big run small.
  const scale = report.sites.length > 100 ? 1 : 2;
  let next = 0;
  return chartPictures(charts, scale, (done, total) => {
    if (total < 50) return;
    if (next === 0) next = Math.ceil(total / 10);
    if (done >= next) {
      log.err(`plotrate: drew ${done}/${total} charts`);
      next += Math.ceil(total / 10);
    }
  });
}

function summary(report: TrialReport): string[] {
  const u = unitScale(report.settings.units, report.crop);
  const ru = report.settings.units.rate;
  const rate = (kgHa: number | null | undefined): string =>
    kgHa == null ? '—' : formatShownRate(u.rate(kgHa), ru);
  const money = (perHa: number): string =>
    `${Math.round(u.perArea(perHa)).toLocaleString('en-US')} per ${u.areaName}`;
  const lines: string[] = [];
  const show = report.sites.slice(0, 20);
  const siteText = (s: SiteReport): string => {
    // The site's recommendation as its decision makes it (no response, full response, a curve).
    const r = s.recommendation;
    const m = s.models.find((x) => x.model === r.model);
    // An interval whose upper end is 0 says that at least its upper percentile of the
    // resamples gave no N: say that, rather than "0 to 0".
    const level = `${Math.round(r.level * 100)} % interval`;
    const upper = Math.round(((1 + r.level) / 2) * 100);
    const ci = !r.ciKgHa
      ? ''
      : r.ciKgHa[1] === 0
        ? ` (${upper} % of the resamples or more give no N)`
        : ` (${level} ${rate(r.ciKgHa[0])} to ${rate(r.ciKgHa[1])})`;
    const y = m?.yieldAtOptimumKgHa;
    const yieldText =
      y != null ? `, yield ${formatQuantity(u.yield(y), report.settings.units.yield)}` : '';
    // A site with curves but no leading model says why in a word (its report says it in full).
    let text = s.bestModel
      ? 'no rate (see the report)'
      : `no rate recommended: ${s.bestModelReason.split(/[;:(]|,? so /)[0].trim()} (see the report)`;
    if (r.basis === 'no-response') text = `no response to N found: no N${ci}`;
    else if (r.basis === 'full-response' && r.rangeKgHa)
      text = `full response by the lowest rate: at most ${rate(r.rangeKgHa[1])}${ci}`;
    else if (m && r.rateKgHa !== null && atHighestTestedRate(r.rateKgHa, s.ratesKgHa.at(-1))) {
      // The trial stopped too low to place the optimum: an interval pinned at the top says nothing more.
      const pinned = r.ciKgHa?.[0] === r.rateKgHa && r.ciKgHa[1] === r.rateKgHa;
      text = `${m.label}, optimum at or above the highest tested rate, ${rate(r.rateKgHa)}${pinned ? '' : ci}${yieldText}`;
    } else if (m && r.rateKgHa !== null)
      text = `${m.label}, optimum ${rate(r.rateKgHa)}${ci}${yieldText}`;
    return text;
  };
  for (const s of show) {
    lines.push(`${s.site}: ${siteText(s)}`);
    // A rate × factor site: each level's recommendation and which level returns most.
    for (const f of report.levels.filter((l) => l.site === s.site)) {
      for (const l of f.levels) lines.push(`  ${f.factor} ${l.level}: ${siteText(l.report)}`);
      lines.push(`  ${levelTestSentence(f)}`);
      for (const c of f.test.crossings ?? []) lines.push(`  ${c.message}`);
      lines.push(`  ${bestLevelSentence(f, { rate: (v) => rate(v), money })}`);
    }
  }
  if (report.sites.length > show.length)
    lines.push(`… ${report.sites.length - show.length} more sites in the report.`);
  const a = report.acrossSites;
  if (a) {
    const units = report.yearsCompared.length > 0 ? 'site-years' : 'sites';
    lines.push(
      `Across ${a.sites.length} ${units}: ${rate(a.bestRateKgHa)}, profitable from ${rate(a.profitableRangeKgHa[0])} to ${rate(a.profitableRangeKgHa[1])}.`,
    );
  }
  // The regional model by level, where some factor has the 4 site-years it needs.
  for (const m of report.levelMixed.filter((l) => l.fit !== null))
    lines.push(levelMixedSentence(m, { rate: (v) => rate(v) }));
  for (const c of report.yearsCompared) lines.push(`Years compared: ${c.sentence}`);
  for (const w of report.warnings) lines.push(`Note: ${w}`);
  // The rates above are recommendations: they go out with the cautions, as on every page.
  if (report.sites.length > 0) {
    lines.push('Before acting on any rate:');
    for (const c of recommendationCautions) lines.push(`- ${c}`);
  }
  return lines;
}

/**
 * Runs the analyze command.
 * @param args - parsed options
 * @param log - where to print the summary (out) and progress (err)
 * @param version - the app version for the reports
 * @param extra - sheets to import (default all), a fixed time stamp and run notes for every
 *   output (the demo's)
 * @returns the report (for the demo command)
 * @throws {UsageError} for bad options or unreadable files; {ImportError} for files that cannot be used;
 *   {AnalysisFailed} when no site could be fitted
 */
export async function analyzeCommand(
  args: AnalyzeArgs,
  log: Console2,
  version: string,
  extra: AnalyzeExtra = {},
): Promise<TrialReport> {
  checkOutputs(args);
  // The analysis (plot table, fits, bootstrap draws) is let go once the report is made: only the
  // report is needed for the outputs, and a run of thousands of sites needs that memory back.
  const report = await analyzedReport(args, log, version, extra);
  const charts = args.out || args.pdf ? reportChartSpecs(report, args.siteChartLimit) : NO_CHARTS;
  // The workbook's pictures are drawn on worker threads while the PDF, which paints its charts
  // as vectors and needs none, is written, and then the workbook, each sheet waiting for its own.
  if (args.out) chartFontFiles(); // no font for the labels: said now, before any output is begun
  const pictures = args.out ? drawPictures(report, charts, log) : NO_CHARTS;
  // Every output goes to a temporary file first and all are renamed together at the end, so a
  // run leaves all of them or none (a failure, or SIGINT/SIGTERM, removes the temporaries). The
  // workbook and the PDF are streamed into theirs, a sheet or a page at a time.
  const outputs: PendingOutput[] = [];
  if (args.pdf) {
    outputs.push({
      target: path.resolve(args.pdf),
      stream: async (out) => {
        const pageCharts: Record<string, ChartSpec> = {
          ...charts.sites,
          ...charts.pages,
          ...charts.groups,
        };
        if (charts.region) pageCharts.region = charts.region;
        const { streamGrowerPdf } = await import('./growerPdf');
        const { reportGrowerPages } = await import('../shared/report/reportGrowerPages');
        await streamGrowerPdf(
          out,
          reportGrowerPages(report),
          pageCharts,
          new Date(report.createdAt),
        );
      },
    });
  }
  if (args.out) {
    outputs.push({
      target: path.resolve(args.out),
      stream: async (out) => {
        const { streamWorkbook } = await import('./streamedWorkbook');
        await streamWorkbook(
          out,
          report,
          {
            siteCharts: pictures.sites,
            acrossChart: pictures.region,
            levelCharts: pictures.levels,
            // Fast deflate for big runs: most bytes are PNGs that do not shrink further.
            zipLevel: report.sites.length > 100 ? 1 : undefined,
          },
          (sheets) => {
            // Each site's sheet leaves about a megabyte of garbage, which V8 would let grow to
            // gigabytes before collecting (see collectGarbage); the sheets after the sites are
            // few and large, so each of them starts clean.
            if (sheets % GARBAGE_EVERY_SHEETS === 0 || sheets > report.sites.length)
              collectGarbage();
          },
        );
      },
    });
  }
  if (args.json) {
    outputs.push({
      target: path.resolve(args.json),
      stream: async (out) => {
        // Pieces gathered to about a megabyte per write: each write is a trip to the disk thread.
        let batch: string[] = [];
        let size = 0;
        const flush = async (): Promise<void> => {
          if (!out.write(batch.join(''))) await once(out, 'drain');
          batch = [];
          size = 0;
        };
        for (const piece of resultsJsonPieces(report)) {
          batch.push(piece);
          size += piece.length;
          if (size >= 1 << 20) await flush();
        }
        if (size > 0) await flush();
        out.end();
      },
    });
  }
  try {
    const given = new Map(
      [args.out, args.pdf, args.json].flatMap((p) => (p ? [[path.resolve(p), p] as const] : [])),
    );
    await writeFilesAtomic(outputs, (target) => {
      // The analysis, or the output before, is garbage now: collect it before the next starts.
      collectGarbage();
      log.err(`plotrate: writing ${given.get(target) ?? target}`);
    });
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    throw new OutputFailed(
      `could not write the outputs (${err.code ?? 'error'}: ${err.message}); none was written.`,
    );
  }
  for (const line of summary(report)) log.out(line);
  return report;
}

/** Roles the run names before fitting, in this order: the numbers every rate rests on. */
const SAID_ROLES: Record<string, string> = {
  rate: 'rate',
  yield: 'yield',
  plotWeight: 'plot weight',
  plotArea: 'plot area',
};

/**
 * Which columns the rates and yields were read from, in which unit and, for a rate, as N or as
 * product: a column read wrongly (a plot weight as a yield, urea as N) is seen before any rate.
 * @param mapping - the import's mapping entries
 * @returns e.g. 'rate from "Urea (lb/ac)" (lb/ac of product: Urea 46-0-0); plot weight from
 *   "Harvest wt (lb)" (lb); --map gives a column another role'
 */
export function columnsReadSentence(mapping: readonly MappingEntry[]): string {
  // A sheet with a yield column reads its yields there; its plot weights are not used.
  const sheetOf = (e: MappingEntry) => `${e.file}\u0000${e.sheet}`;
  const withYield = new Set(mapping.filter((e) => e.role === 'yield').map(sheetOf));
  const used = mapping.filter(
    (e) => !((e.role === 'plotWeight' || e.role === 'plotArea') && withYield.has(sheetOf(e))),
  );
  const parts: string[] = [];
  for (const role of Object.keys(SAID_ROLES)) {
    const seen = new Set<string>();
    for (const m of used.filter((e) => e.role === role)) {
      const how = [m.unit, m.readAs].filter(Boolean).join(' ');
      const part = `${SAID_ROLES[role]} from "${m.header}"${how ? ` (${how})` : ''}`;
      if (!seen.has(part)) parts.push(part);
      seen.add(part);
    }
  }
  // The moisture basis is most often guessed from a moisture column, and it moves every yield.
  const adjusted = used.some((e) => e.role === 'yield' && e.readAs.startsWith('at harvest'));
  return `${parts.slice(0, 8).join('; ')}${parts.length > 8 ? '; …' : ''}; --map gives a column another role${adjusted ? ', --yield-moisture standard says the yields are already at standard moisture' : ''}`;
}

/** What the demo command adds to a run: sheets to import, a fixed time stamp, run notes. */
export interface AnalyzeExtra {
  sheets?: string[];
  createdAt?: string;
  warnings?: string[];
}

/**
 * A sentence for every output when the run has more sites than get a chart each.
 * @param sites - the run's site count
 * @param limit - the most sites that get a chart each (`--site-charts`)
 * @returns the note, or null when every site gets its chart
 * @example
 * siteChartsNote(5000, 1000) // 'Site charts are left out: 5,000 sites is more than …'
 */
export function siteChartsNote(sites: number, limit: number): string | null {
  if (sites <= limit) return null;
  const n = (x: number) => x.toLocaleString('en-US');
  return limit === 0
    ? 'Site charts are left out (--site-charts 0); the tables hold every number a chart would show.'
    : `Site charts are left out: ${n(sites)} sites is more than the ${n(limit)} a run draws a chart for (--site-charts); the tables hold every number a chart would show.`;
}

/**
 * Reads, analyzes and prices the trial and assembles its report; the analysis behind it is
 * released when this returns.
 */
async function analyzedReport(
  args: AnalyzeArgs,
  log: Console2,
  version: string,
  extra: AnalyzeExtra,
): Promise<TrialReport> {
  const files = await readInputs(args.files);
  log.err(`plotrate: reading ${files.map((f) => f.name).join(', ')}`);
  const imported = await importFiles(files, {
    crop: args.crop,
    overrides: args.map,
    units: args.columnUnits,
    sheets: extra.sheets,
    ...(args.plotAreaM2 !== null ? { plotAreaM2: args.plotAreaM2 } : {}),
    ...(args.yieldMoisture ? { yieldMoisture: args.yieldMoisture } : {}),
    // The product priced is the product of rates whose sheet names none.
    ...(args.product ? { product: args.product } : {}),
  });
  const units = args.units ? displayUnits(args.units) : imported.inputUnits;
  const prices = pricesFrom(args, units, imported.table.crop);
  if (prices.defaulted) {
    log.err(
      `plotrate: no ${args.grainPrice === null ? 'grain' : 'nitrogen'} price given; using illustrative prices (see --grain-price, --nutrient-price).`,
    );
  }
  const display: DisplaySettings = {
    units,
    unitSystem: args.units,
    prices,
    currency: args.currency,
    pageFields: args.pageFields,
  };
  const terms = priceTerms({ ...display, crop: imported.table.crop });
  const canonical = {
    grainPricePerKg: terms.grainPricePerKg,
    nutrientPricePerKg: terms.nutrientPricePerKg,
    applicationCostPerHa: terms.applicationCostPerHa,
  };
  // A ratio far from the crop's usual is most often a slip (per tonne typed as per kg): said, not
  // refused, since the command line cannot ask and a real market may be that far out.
  const ratioCheck = checkPriceRatio(canonical, imported.table.crop);
  if (!ratioCheck.plausible)
    log.err(
      `plotrate: warning: ${priceRatioFarOff(ratioCheck, imported.table.crop)}; check --grain-price and the nitrogen price and their units before using any rate.`,
    );
  const settings = analysisSettings({
    prices: canonical,
    resamples: args.boot,
    seed: args.seed,
    blocks: args.blocks === 'fixed' ? 'auto' : 'none',
  });
  // The analysed unit is the site-year; a site harvested in several years is several of them.
  const { siteYears } = siteYearsOf(imported.table);
  const siteCount = siteYears.length;
  const bareSites = new Set(siteYears.map((s) => s.site)).size;
  const where =
    bareSites === siteCount
      ? `${siteCount} site${siteCount === 1 ? '' : 's'}`
      : `${siteCount} site-years (${bareSites} site${bareSites === 1 ? '' : 's'})`;
  log.err(
    `plotrate: ${imported.table.plots.length} plots at ${where}; fitting seven models per site${args.boot ? ` with ${args.boot} bootstrap resamples` : ''}`,
  );
  log.err(`plotrate: ${columnsReadSentence(imported.mapping)}`);
  // Which crop, and why: its bushel weight and moisture enter every yield.
  const cropNote = imported.findings.find((f) => f.code === 'crop-from-files');
  if (cropNote) log.err(`plotrate: ${cropNote.message}`);
  // Past the chart limit the outputs with charts say so (the overview, every grower page), and
  // so does the progress.
  const chartsNote = args.out || args.pdf ? siteChartsNote(siteCount, args.siteChartLimit) : null;
  if (chartsNote) log.err(`plotrate: ${chartsNote}`);
  const step = Math.max(1, Math.ceil(siteCount / 10));
  // Progress each tenth of the sites (the threads' batches can pass a tenth without landing on it).
  const said = { fitted: 0, resampled: 0 };
  const progress = (done: number, total: number, stage: 'fitted' | 'resampled') => {
    if (total < 20 || (Math.floor(done / step) === said[stage] && done !== total)) return;
    said[stage] = Math.floor(done / step);
    log.err(`plotrate: ${stage} ${done}/${total} sites`);
  };
  const threads = args.boot > 0 && drawWorkerBuilt() ? drawThreads(args.threads, siteCount) : 1;
  if (threads > 1) log.err(`plotrate: drawing the resamples on ${threads} threads`);
  const analysis =
    threads > 1
      ? await analyzeTrialDrawnBy(imported.table, settings, drawOnThreads(threads), progress)
      : analyzeTrial(imported.table, settings, progress);
  // Data findings do not stop the run, but each names its file, sheet and cell so it can be fixed.
  const serious = [...imported.findings, ...analysis.findings].filter((f) => f.severity !== 'info');
  for (const f of serious.slice(0, 10)) {
    const where = f.refs.length ? describeRef(f.refs[0]) : '';
    log.err(
      `plotrate: ${f.severity}: ${where && !f.message.includes(f.refs[0].cell) ? `${where}: ` : ''}${f.message}`,
    );
  }
  if (serious.length > 10)
    log.err(`plotrate: … ${serious.length - 10} more findings; the workbook lists them by site.`);
  // The tolerance is given per display area, like every money figure of the reports.
  const perArea = unitScale(units, imported.table.crop).perArea(1);
  const shortfallTolerancePerHa =
    args.shortfallTolerance === null ? null : args.shortfallTolerance / perArea;
  // A level's own N price is quoted as --nutrient-price is: per lb of N with lb/ac rates.
  const perKgN = units.rate === 'lb/ac' ? 1 / KG_PER_LB : 1;
  const levelNutrientPricePerKg = Object.fromEntries(
    Object.entries(args.levelPrices).map(([level, p]) => [level, p * perKgN]),
  );
  const known = new Set(analysis.levels.flatMap((s) => s.levels.map((l) => l.level)));
  for (const level of Object.keys(levelNutrientPricePerKg))
    if (!known.has(level))
      log.err(
        `plotrate: warning: --level-price names "${level}", which is no level of a treatment factor here${known.size ? ` (levels: ${[...known].join(', ')})` : ' (no column has the factor role; see --map factor=Header)'}; it is not used.`,
      );
  const priced = priceTrial(
    analysis,
    canonical,
    {},
    {
      shortfallTolerancePerHa,
      levelNutrientPricePerKg,
    },
  );
  const report = assembleReport(analysis, priced, display, {
    tool: { name: 'Plotrate', version },
    createdAt: extra.createdAt ?? new Date().toISOString().replace(/\.\d+Z$/, 'Z'),
    mapping: imported.mapping,
    warnings: chartsNote ? [...(extra.warnings ?? []), chartsNote] : extra.warnings,
    findings: imported.findings,
  });
  // Nothing fitted where the input holds errors (impossible rates or yields, text in number
  // cells, …) is the input's fault: exit 2 with the first cell to correct, never a rate.
  const nothingFitted = report.sites.every((s) => s.models.length === 0);
  const findings = [...imported.findings, ...analysis.findings];
  // An error names the cell to fix; failing that, a warning does (a formula saved without result).
  const firstError =
    findings.find((f) => f.severity === 'error') ??
    findings.find((f) => f.severity === 'warning' && f.refs.length > 0);
  if (nothingFitted && (firstError || analyzablePlots(imported.table).length === 0)) {
    const ref = firstError?.refs[0];
    // Without a cell to name, the files are named, with what to check in them.
    const names = files.map((f) => `"${f.name}"`).join(', ');
    throw new ImportError(
      'no-data',
      `Nothing could be fitted because of the input${firstError ? `: ${firstError.message}` : `: no plot in ${names} has both a rate and a yield; check that the rate and yield columns are filled in, or name them with --map.`}`,
      ref
        ? { file: ref.file, sheet: ref.sheet || undefined, cell: ref.cell }
        : { file: files.map((f) => f.name).join(', ') },
    );
  }
  if (nothingFitted) {
    throw new AnalysisFailed(
      `No site could be fitted: ${report.sites[0]?.warnings[0] ?? 'no plots with both a rate and a yield'}`,
    );
  }
  return report;
}
