/**
 * The price-free part of the analysis, one site at a time: every response
 * model with its AICc ranking, the intercept question and the rate–yield
 * correlation, plus the across-site tests of a common response. It runs in
 * the worker (fitting 50 sites takes a while); the results are plain data, so
 * re-pricing on the main thread needs no refit.
 */
import type { AllModelsFit, ModelRank } from '../../../shared/models/fitAllModels';
import { fitAllModels } from '../../../shared/models/fitAllModels';
import type { BlockTerms, ModelFit, ModelName } from '../../../shared/models/modelTypes';
import {
  testCommonResponse,
  type CommonResponseTests,
  type PooledLinearModel,
} from '../../../shared/sites/commonResponseTests';
import { sitePlots, type SitePlots } from '../../../shared/sites/sitePlots';
import { testIntercept } from '../../../shared/stats/interceptTest';
import { pearsonCorrelation, type PearsonResult } from '../../../shared/stats/pearson';
import type { PlotTable } from '../../../shared/table/plotTable';

/** A model fit as plain data: everything but the predict function (which cannot cross to the window). */
export type FitData = Omit<ModelFit, 'predict'>;

/** The intercept question in one sentence, with the numbers behind it. */
export interface InterceptSummary {
  verdict: string;
  interceptKgHa: number;
  stdErrorKgHa: number;
  t: number;
  p: number;
  df: number;
  aiccDifference: number | null;
  interceptNeeded: boolean;
}

/** Either a result, or why it could not be had for this site. */
export type Maybe<T> = { ok: true; value: T } | { ok: false; reason: string };

export interface SiteAnalysis {
  site: string;
  plots: SitePlots;
  /** Why the site has nothing to fit, or null. */
  problem: string | null;
  fits: Partial<Record<ModelName, FitData>>;
  ranking: ModelRank[];
  best: ModelName | null;
  intercept: Maybe<InterceptSummary>;
  correlation: Maybe<PearsonResult>;
}

export interface AcrossSites {
  /** Tests of whether sites share a straight-line and a quadratic response. */
  tests: Maybe<CommonResponseTests>[];
}

export interface AnalysisInput {
  table: PlotTable;
  blocks: BlockTerms;
}

export interface AnalysisOutput {
  sites: SiteAnalysis[];
  across: AcrossSites;
}

function attempt<T>(compute: () => T): Maybe<T> {
  try {
    return { ok: true, value: compute() };
  } catch (error) {
    return { ok: false, reason: error instanceof Error ? error.message : String(error) };
  }
}

function withoutPredict(all: AllModelsFit): Partial<Record<ModelName, FitData>> {
  const out: Partial<Record<ModelName, FitData>> = {};
  for (const [name, fit] of Object.entries(all.fits) as [ModelName, ModelFit][]) {
    const { predict: _predict, ...data } = fit;
    out[name] = data;
  }
  return out;
}

/**
 * Analyses one site's plots (price-free).
 * @param plots - the site's analysable plots, kg/ha
 * @param blocks - block terms for the curve fits
 * @returns fits, ranking, intercept test and correlation; failures become reasons
 */
export function analyseSite(plots: SitePlots, blocks: BlockTerms): SiteAnalysis {
  const base = { site: plots.site, plots };
  if (plots.problem) {
    const reason = plots.problem;
    return {
      ...base,
      problem: reason,
      fits: {},
      ranking: [],
      best: null,
      intercept: { ok: false, reason },
      correlation: { ok: false, reason },
    };
  }
  const blockTerms = blocks === 'fixed' && plots.block.every((b) => b !== null) ? 'fixed' : 'none';
  const all = attempt(() =>
    fitAllModels(
      { rateKgHa: plots.rateKgHa, yieldKgHa: plots.yieldKgHa, block: plots.block },
      { blocks: blockTerms },
    ),
  );
  const intercept = attempt((): InterceptSummary => {
    const t = testIntercept(plots.rateKgHa, plots.yieldKgHa);
    return {
      verdict: t.verdict,
      interceptKgHa: t.intercept.estimate,
      stdErrorKgHa: t.intercept.stdError,
      t: t.t,
      p: t.p,
      df: t.df2,
      aiccDifference: t.aiccDifference,
      interceptNeeded: t.interceptNeeded,
    };
  });
  const correlation = attempt(() => pearsonCorrelation(plots.rateKgHa, plots.yieldKgHa));
  return {
    ...base,
    problem: all.ok ? null : all.reason,
    fits: all.ok ? withoutPredict(all.value) : {},
    ranking: all.ok ? all.value.ranking : [],
    best: all.ok ? all.value.best : null,
    intercept,
    correlation,
  };
}

/** The pooled models whose common-response tests the all-sites step shows. */
export const POOLED_MODELS: readonly PooledLinearModel[] = ['linear', 'quadratic'];

/**
 * Analyses every site, then the across-site tests, reporting progress per site.
 * @param input - the plot table and block terms
 * @param progress - awaited after each site (the worker yields there so a cancel can arrive)
 * @returns per-site results in table order and the across-site tests
 */
export async function analyseTable(
  input: AnalysisInput,
  progress: (done: number, total: number, note: string) => Promise<void>,
): Promise<AnalysisOutput> {
  const sites = sitePlots(input.table);
  const out: SiteAnalysis[] = [];
  for (const [i, plots] of sites.entries()) {
    await progress(i, sites.length + 1, plots.site);
    out.push(analyseSite(plots, input.blocks));
  }
  await progress(sites.length, sites.length + 1, 'across sites');
  const tests =
    sites.length < 2
      ? []
      : POOLED_MODELS.map((model) => attempt(() => testCommonResponse(sites, model)));
  return { sites: out, across: { tests } };
}
