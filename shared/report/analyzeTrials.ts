/**
 * Runs every analysis stage on a plot table and assembles the one summary the
 * report writers read (TrialReport): per site the intercept test, the ANOVA
 * with treatment means ± SE, the six model fits with their optima, the chosen
 * model and its bootstrap interval, the profitable range; across sites the
 * regional rate and the pooling tests. Pure: no I/O, the caller passes the
 * tool version, the time and the mapping it used.
 */
import { economicOptimum, type EconomicOptimum } from '../economics/economicOptimum';
import type { Prices } from '../economics/priceRatio';
import { fitAllModels, type AllModelsFit } from '../models/fitAllModels';
import type { ModelFit, ModelName } from '../models/modelTypes';
import { testCommonResponse } from '../sites/commonResponseTests';
import { rateGrid } from '../sites/rateGrid';
import {
  prepareRegionalReturn,
  regionalReturnAtPrices,
  ONE_PER_ACRE_IN_PER_HA,
} from '../sites/regionalReturn';
import { sitePlots } from '../sites/sitePlots';
import { testIntercept } from '../stats/interceptTest';
import { oneWayAnova } from '../stats/oneWayAnova';
import { randomizedBlockAnova } from '../stats/randomizedBlockAnova';
import { describeRef, type QualityFinding } from '../quality/qualityFinding';
import { analysablePlots, siteNames, type PlotTable } from '../table/plotTable';
import { bootstrapSiteOptimum } from './bootstrapSiteOptimum';
import { priceTerms, type ReportSettings } from './reportSettings';
import type {
  AcrossSitesReport,
  AnovaSummary,
  InterceptSummary,
  LackOfFitSummary,
  MappingEntry,
  ModelRow,
  SiteReport,
  TreatmentMeanRow,
  TrialReport,
} from './trialReport';

export interface AnalyzeMeta {
  tool: { name: string; version: string };
  /** ISO 8601 time stamp to print. */
  createdAt: string;
  mapping: MappingEntry[];
  /** Run-level findings from import (e.g. defaulted prices) to carry into the report. */
  warnings?: string[];
  /** Quality findings from import and the checks; warnings and errors are shown by their site. */
  findings?: readonly QualityFinding[];
  /** Called after each site with (done, total), for progress on long runs. */
  onProgress?: (done: number, total: number) => void;
}

/** Optima that are a rate the page can print (the others explain why there is none). */
const HAS_RATE = new Set<EconomicOptimum['status']>([
  'interior',
  'zero',
  'capped-at-highest',
  'corner',
]);
/** Curves preferred over the straight lines when both give a rate (a line only gives a corner). */
const CURVES = new Set<ModelName>([
  'quadratic',
  'linearPlateau',
  'quadraticPlateau',
  'exponential',
]);

/**
 * A fit's status in words without numbers, for the same reason as the
 * optimum note: the models stage writes its rates in kg/ha.
 */
function fitMessage(f: ModelFit): string {
  switch (f.status) {
    case 'ok':
      return f.model === 'proportional'
        ? 'R² is uncentered (about zero, not the mean): do not compare it with the others.'
        : '';
    case 'no-plateau':
      return 'No plateau within the tested rates: the straight line (or the quadratic) fits as well.';
    case 'full-response-at-lowest-rate':
      return 'Full response by the lowest non-zero rate: the join lies between the two lowest rates and cannot be placed more precisely.';
    case 'convex':
      return 'The quadratic opens upward, so it has no maximum.';
    case 'no-response':
      return 'Yield does not rise with rate: the best curve is flat.';
    case 'too-few-rates':
      return f.message;
  }
}

/**
 * The optimum's status in words without numbers: the writers show the rates
 * in their own units (the economics stage's explanation speaks kg/ha).
 */
function optimumNote(o: EconomicOptimum): string {
  switch (o.status) {
    case 'interior':
      return '';
    case 'zero':
      return 'At these prices nitrogen does not pay here: the first unit already returns less than it costs.';
    case 'capped-at-highest':
      return 'The optimum lies beyond the highest tested rate; the highest tested rate is given instead.';
    case 'corner':
      return 'A straight line never levels off, so it gives only a corner (no N or the highest tested rate); a curve says more.';
    case 'join-in-first-interval':
      return 'Full response by the lowest non-zero rate: the optimum lies between the two lowest rates and cannot be given as one number.';
    case 'not-available':
      return 'This fit has no economic optimum (no plateau, no maximum or no response).';
  }
}

function chooseModel(
  all: AllModelsFit,
  optima: Map<ModelName, EconomicOptimum>,
): { model: ModelName | null; reason: string } {
  const ranked = all.ranking.filter((r) => r.rank !== null);
  const usable = ranked.filter((r) => HAS_RATE.has(optima.get(r.model)!.status));
  const curve = usable.find((r) => CURVES.has(r.model));
  if (curve) {
    const first = ranked[0];
    return {
      model: curve.model,
      reason:
        first && first.model === curve.model
          ? `lowest AICc of the models fitted, Akaike weight ${curve.weight.toFixed(2)}`
          : `lowest AICc among the curves with an economic optimum, ΔAICc ${curve.deltaAicc.toFixed(1)} from the best`,
    };
  }
  if (usable.length) {
    return {
      model: usable[0].model,
      reason: 'no curve gave an optimum; a straight line gives only a corner rate',
    };
  }
  return { model: null, reason: 'no model gave an economic optimum' };
}

function anovaSummary(
  rates: number[],
  yields: number[],
  blocks: (string | null)[],
): { anova: AnovaSummary | null; means: TreatmentMeanRow[] } {
  const distinct = new Set(rates).size;
  if (distinct < 2 || rates.length <= distinct) return { anova: null, means: [] };
  const hasBlocks = blocks.every((b) => b !== null) && new Set(blocks).size > 1;
  const toRow = (level: string, n: number, mean: number, se: number): TreatmentMeanRow => ({
    rateKgHa: Number(level),
    n,
    meanKgHa: mean,
    seKgHa: se,
  });
  try {
    if (hasBlocks) {
      const a = randomizedBlockAnova({ treatment: rates, block: blocks as string[], y: yields });
      const line = (
        source: string,
        s: { df: number; ss: number; ms: number },
        F: number | null,
        p: number | null,
      ) => ({ source, df: s.df, ss: s.ss, ms: s.ms, F, p });
      return {
        anova: {
          design: 'rcbd',
          rows: [
            line('Blocks', a.blocks, a.blockF, a.blockP),
            line('N rate', a.treatments, a.F, a.p),
            line('Error', a.error, null, null),
            { ...line('Total', a.total, null, null), ms: null },
          ],
          cvPercent: a.cvPercent,
          lsdKgHa: a.lsd.lsd,
          notes: [],
          missingPlots: a.missingPlots.map((m) => ({
            rateKgHa: Number(m.treatment),
            block: m.block,
          })),
        },
        means: a.treatmentMeans
          .map((m) => toRow(m.level, m.n, m.mean, m.se))
          .sort((x, y) => x.rateKgHa - y.rateKgHa),
      };
    }
    const a = oneWayAnova({ treatment: rates, y: yields });
    return {
      anova: {
        design: 'oneWay',
        rows: [
          {
            source: 'N rate',
            df: a.between.df,
            ss: a.between.ss,
            ms: a.between.ms,
            F: a.F,
            p: a.p,
          },
          { source: 'Error', df: a.within.df, ss: a.within.ss, ms: a.within.ms, F: null, p: null },
          { source: 'Total', df: a.total.df, ss: a.total.ss, ms: null, F: null, p: null },
        ],
        cvPercent: a.cvPercent,
        lsdKgHa: a.lsd.lsd,
        notes: [],
        missingPlots: [],
      },
      means: a.treatments
        .map((m) => toRow(m.level, m.n, m.mean, m.se))
        .sort((x, y) => x.rateKgHa - y.rateKgHa),
    };
  } catch {
    // Too few replicates or identical yields: no ANOVA, which the sheet says.
    return { anova: null, means: [] };
  }
}

function interceptSummary(rates: number[], yields: number[]): InterceptSummary | null {
  if (rates.length < 3 || new Set(rates).size < 2) return null;
  const t = testIntercept(rates, yields);
  return {
    t: t.t,
    F: t.F,
    df1: t.df1,
    df2: t.df2,
    p: t.p,
    interceptKgHa: t.intercept.estimate,
    interceptSeKgHa: t.intercept.stdError,
    interceptNeeded: t.interceptNeeded,
    verdict: t.verdict,
  };
}

function lackOfFitOf(fit: ModelFit | null): LackOfFitSummary {
  if (!fit) return { available: false, model: null, message: 'No chosen model.' };
  const l = fit.lackOfFit;
  if (!l) {
    return {
      available: false,
      model: fit.model,
      message:
        'not available: no rate is replicated, or the model has as many parameters as there are rates.',
    };
  }
  return {
    available: true,
    model: fit.model,
    F: l.f,
    df1: l.dfLackOfFit,
    df2: l.dfPureError,
    p: l.p,
  };
}

/** Rates within `band` of the best return on the chosen curve, kg/ha. */
function siteProfitableRange(fit: ModelFit, prices: Prices, band: number): [number, number] {
  const t = fit.testedRates;
  const step = Math.max((t.highestKgHa - t.lowestKgHa) / 400, 0.25);
  const prepared = prepareRegionalReturn(
    [{ site: 's', gainKgHa: (x) => fit.predict(x) - fit.predict(0) }],
    rateGrid(t.lowestKgHa, t.highestKgHa, step),
  );
  const r = regionalReturnAtPrices(prepared, prices, { bandPerHa: band });
  return [r.profitableRange.lowKgHa, r.profitableRange.highKgHa];
}

/**
 * Analyses every site of a plot table and assembles the report summary.
 * @param table - the plot table (canonical kg/ha)
 * @param settings - display units, prices, bootstrap size and seed, block terms
 * @param meta - tool name/version, time stamp, mapping, progress callback
 * @returns the TrialReport every writer reads
 * @throws {RangeError} for prices that are missing or not positive
 * @example
 * const report = analyzeTrials(table, settings, { tool, createdAt, mapping: [] });
 * report.sites[0].bestModel // 'quadraticPlateau'
 */
export function analyzeTrials(
  table: PlotTable,
  settings: ReportSettings,
  meta: AnalyzeMeta,
): TrialReport {
  const terms = priceTerms({ ...settings, crop: table.crop });
  const prices: Prices = {
    grainPricePerKg: terms.grainPricePerKg,
    nutrientPricePerKg: terms.nutrientPricePerKg,
  };
  const band = ONE_PER_ACRE_IN_PER_HA;
  const usableAll = analysablePlots(table);
  const names = siteNames(table);
  const sites: SiteReport[] = [];
  const chosenFits = new Map<string, ModelFit>();
  const findingsBySite = new Map<string, string[]>();
  const runFindings: string[] = [];
  for (const f of meta.findings ?? []) {
    if (f.severity === 'info') continue;
    const ref = f.refs.length ? describeRef(f.refs[0]) : '';
    const text = ref && !f.message.includes(f.refs[0].cell) ? `${f.message} (${ref})` : f.message;
    if (f.site === undefined) runFindings.push(text);
    else findingsBySite.set(f.site, [...(findingsBySite.get(f.site) ?? []), text]);
  }
  names.forEach((site, index) => {
    const plots = table.plots.filter((p) => p.site === site);
    const used = usableAll.filter((p) => p.site === site);
    const rates = used.map((p) => p.rateKgHa!);
    const yields = used.map((p) => p.yieldKgHa!);
    const blocks = used.map((p) => p.block);
    const found = findingsBySite.get(site) ?? [];
    // A long list hides the important lines; the rest are in the quality report on screen.
    const warnings: string[] =
      found.length > 6
        ? [...found.slice(0, 5), `… and ${found.length - 5} more findings about this site's data.`]
        : [...found];
    const distinct = [...new Set(rates)].sort((a, b) => a - b);
    const blockCount = new Set(blocks.filter((b) => b !== null)).size;
    const designText = `${blockCount > 0 ? `${blockCount} block${blockCount === 1 ? '' : 's'} × ` : ''}${distinct.length} rate${distinct.length === 1 ? '' : 's'}`;
    const blocksMode =
      settings.blocks === 'fixed' && blocks.every((b) => b !== null) ? 'fixed' : 'none';
    if (settings.blocks === 'fixed' && blocksMode === 'none')
      warnings.push(
        'Some plots have no block label, so the curves were fitted without block terms.',
      );
    const { anova, means } = anovaSummary(rates, yields, blocks);
    let interceptTest: InterceptSummary | null = null;
    try {
      interceptTest = interceptSummary(rates, yields);
    } catch (e) {
      warnings.push(`Intercept test not possible: ${(e as Error).message}`);
    }
    let all: AllModelsFit | null = null;
    if (distinct.length >= 2) {
      try {
        all = fitAllModels(
          { rateKgHa: rates, yieldKgHa: yields, block: blocks },
          { blocks: blocksMode, curvePoints: 81 },
        );
      } catch (e) {
        warnings.push(`The curves could not be fitted: ${(e as Error).message}`);
      }
    } else {
      warnings.push(
        `Only ${distinct.length} distinct rate${distinct.length === 1 ? '' : 's'} with usable plots: no response curve can be fitted.`,
      );
    }
    const optima = new Map<ModelName, EconomicOptimum>();
    if (all)
      for (const f of Object.values(all.fits)) optima.set(f.model, economicOptimum(f, prices));
    const choice = all
      ? chooseModel(all, optima)
      : { model: null, reason: 'no model could be fitted' };
    const bestFit = all && choice.model ? all.fits[choice.model] : null;
    let bootstrap: SiteReport['bootstrap'] = null;
    if (bestFit && settings.boot > 0) {
      // One seed per site, derived from the run's seed, so a site's interval does not depend on the sites before it.
      const b = bootstrapSiteOptimum(
        {
          rateKgHa: rates,
          yieldKgHa: yields,
          block: blocks,
          model: bestFit.model,
          blocks: blocksMode,
          prices,
        },
        settings.boot,
        (settings.seed + index * 7919) >>> 0,
        settings.intervalLevel,
      );
      bootstrap = b;
      if (!b.ciKgHa)
        warnings.push(
          `Only ${b.usable} of ${b.count} bootstrap resamples gave an optimum: no interval is reported.`,
        );
    }
    const order = all ? all.ranking.map((r) => r.model) : [];
    const models: ModelRow[] = all
      ? order.map((name) => {
          const f = all!.fits[name];
          const o = optima.get(name)!;
          return {
            model: name,
            label: f.label,
            status: f.status,
            message: fitMessage(f),
            params: { ...f.params },
            stdErrors: { ...f.stdErrors },
            sse: f.sse,
            dfResidual: f.dfResidual,
            aicc: f.aicc,
            r2: f.r2,
            optimumRateKgHa: o.rateKgHa,
            optimumCiKgHa: name === choice.model ? (bootstrap?.ciKgHa ?? null) : null,
            yieldAtOptimumKgHa: o.yieldKgHa,
            optimumNote: optimumNote(o),
            curve: {
              rateKgHa: Array.from(f.curve.rateKgHa),
              yieldKgHa: Array.from(f.curve.yieldKgHa),
            },
          };
        })
      : [];
    if (bestFit) {
      chosenFits.set(site, bestFit);
      const o = optima.get(bestFit.model)!;
      if (o.cappedAtHighest)
        warnings.push(
          'The optimum lies at or beyond the highest tested rate; the trial did not test high enough to find it.',
        );
    }
    const bestOpt = bestFit ? optima.get(bestFit.model)! : null;
    sites.push({
      site,
      n: used.length,
      plots,
      interceptTest,
      lackOfFit: lackOfFitOf(bestFit),
      anova,
      treatmentMeans: means,
      models,
      bestModel: choice.model,
      bestModelReason: choice.reason,
      bootstrap,
      profitableRangeKgHa: bestFit ? siteProfitableRange(bestFit, prices, band) : null,
      returnAtOptimumPerHa: bestOpt?.gainOverCheckPerHa ?? null,
      designText,
      residuals: bestFit
        ? used.map((p, i) => ({
            rateKgHa: rates[i],
            residualKgHa: bestFit.residuals[i],
            block: p.block,
          }))
        : [],
      ratesKgHa: distinct,
      warnings,
    });
    meta.onProgress?.(index + 1, names.length);
  });

  const acrossSites = acrossSitesOf(table, chosenFits, prices, band);
  const runWarnings = [...(meta.warnings ?? []), ...runFindings.slice(0, 10)];
  if (settings.prices.defaulted)
    runWarnings.push(
      'No prices were given: illustrative prices were used. Give your own grain and nitrogen prices before acting on any rate.',
    );
  return {
    tool: meta.tool,
    createdAt: meta.createdAt,
    crop: table.crop,
    settings: { ...settings, crop: table.crop },
    prices: terms,
    sources: table.sources,
    mapping: meta.mapping,
    sites,
    acrossSites,
    warnings: runWarnings,
  };
}

function acrossSitesOf(
  table: PlotTable,
  fits: Map<string, ModelFit>,
  prices: Prices,
  band: number,
): AcrossSitesReport | null {
  if (fits.size < 2) return null;
  const list = [...fits.entries()];
  const lo = Math.min(...list.map(([, f]) => f.testedRates.lowestKgHa));
  // The common grid stops at the highest rate every site tested, so no curve is extrapolated.
  const hi = Math.min(...list.map(([, f]) => f.testedRates.highestKgHa));
  const notes: string[] = [];
  if (Math.max(...list.map(([, f]) => f.testedRates.highestKgHa)) > hi) {
    notes.push(
      'Sites tested different highest rates; the regional curve stops at the lowest of them.',
    );
  }
  const grid = rateGrid(lo, hi, Math.max((hi - lo) / 500, 0.25));
  const prepared = prepareRegionalReturn(
    list.map(([site, f]) => ({ site, gainKgHa: (x: number) => f.predict(x) - f.predict(0) })),
    grid,
  );
  const r = regionalReturnAtPrices(prepared, prices, { bandPerHa: band });
  if (!r.profitableRange.contiguous)
    notes.push('The profitable range has gaps: the mean return curve is not single-peaked.');
  const tests: AcrossSitesReport['tests'] = [];
  try {
    const t = testCommonResponse(
      sitePlots(table).filter((s) => fits.has(s.site)),
      'quadratic',
    );
    for (const x of t.tests) {
      if (x.result.kind !== 'f-test') continue;
      tests.push({
        question: x.question,
        F: x.result.f,
        df1: x.result.df1,
        df2: x.result.df2,
        p: x.result.p,
        verdict: x.sentence,
      });
    }
  } catch (e) {
    notes.push(`Pooling tests not possible: ${(e as Error).message}`);
  }
  // Thin the curve for charts and files: about 200 points is smooth at report sizes.
  const every = Math.max(1, Math.floor(grid.length / 200));
  const rateKgHa: number[] = [];
  const returnPerHa: number[] = [];
  for (let i = 0; i < grid.length; i += every) {
    rateKgHa.push(grid[i]);
    returnPerHa.push(r.meanReturnPerHa[i]);
  }
  return {
    sites: list.map(([s]) => s),
    bestRateKgHa: r.bestRateKgHa,
    profitableRangeKgHa: [r.profitableRange.lowKgHa, r.profitableRange.highKgHa],
    bandPerHa: band,
    bestMeanReturnPerHa: r.bestMeanReturnPerHa,
    meanYieldGainAtBestKgHa: r.meanYieldGainAtBestKgHa,
    returnCurve: { rateKgHa, returnPerHa },
    siteOptima: r.siteOptima.map((o) => ({
      site: o.site,
      rateKgHa: o.rateKgHa,
      returnPerHa: o.returnPerHa,
    })),
    tests,
    notes,
  };
}
