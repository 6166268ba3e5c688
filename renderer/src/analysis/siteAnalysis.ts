/**
 * The price-free analysis in the worker, site by site: the one pipeline of
 * shared/sites (planAcrossSites, analyzeSite per site, acrossSites), with a
 * progress report after each site so a cancel can arrive between sites. The
 * result is plain data; the window re-prices it (repriceAcrossSites) and
 * applies the user's model choices (chooseSiteModels) without refitting.
 *
 * The views below only reshape the pipeline's result for the components; the
 * fits, tests and model choice all come from shared/sites.
 */
import type { Prices } from '../../../shared/economics/priceRatio';
import type { ModelRank } from '../../../shared/models/fitAllModels';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import {
  acrossSites,
  analyzeSite as analyzePipelineSite,
  planAcrossSites,
  type AcrossSiteAnalysis,
  type FitData,
  type SiteAnalysis as PipelineSite,
} from '../../../shared/analysis/analyzeAcrossSites';
import type { CommonResponseTests } from '../../../shared/analysis/commonResponseTests';
import type { ResponseOverCheckOutcome } from '../../../shared/analysis/siteResponseOverCheck';
import type { SitePlots } from '../../../shared/analysis/sitePlots';
import type { PearsonResult } from '../../../shared/stats/pearson';
import type { PlotTable } from '../../../shared/table/plotTable';

export type { FitData };

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

/** One site as the screen shows it: its plots beside the pipeline's analysis of them. */
export interface SiteAnalysis {
  site: string;
  plots: SitePlots;
  /** Why the site has nothing to fit, or null. */
  problem: string | null;
  fits: Partial<Record<ModelName, FitData>>;
  ranking: ModelRank[];
  /** The pipeline's recommendation model (shared/sites recommendationModel), price-independent. */
  recommended: ModelName | null;
  intercept: Maybe<InterceptSummary>;
  correlation: Maybe<PearsonResult>;
  /** Gains over each block's zero-rate plot through the origin, and the test of a gain at rate zero. */
  responseOverCheck: Maybe<ResponseOverCheckOutcome>;
}

export interface AnalysisInput {
  table: PlotTable;
  blocks: BlockTerms;
  /** Prices of the first pricing; the window re-prices without refitting. */
  prices: Prices;
}

export interface AnalysisOutput {
  /** The pipeline's result (fits, rows, pooling tests, regional rate). */
  analysis: AcrossSiteAnalysis;
  /** The sites' plots, in the analysis' order (charts and bootstrap intervals read them). */
  plots: SitePlots[];
}

/** The common-response tests the all-sites step shows, or none with fewer than two sites. */
export function poolingTests(analysis: AcrossSiteAnalysis): CommonResponseTests[] {
  return analysis.sites.length < 2
    ? []
    : [analysis.sharedResponse.linear, analysis.sharedResponse.quadratic];
}

function siteView(s: PipelineSite, plots: SitePlots): SiteAnalysis {
  const t = s.intercept;
  const c = s.correlation;
  const g = s.responseOverCheck;
  return {
    site: s.site,
    plots,
    problem: s.problem,
    fits: s.fits?.fits ?? {},
    ranking: s.fits?.ranking ?? [],
    recommended: s.recommended.model,
    intercept:
      'problem' in t
        ? { ok: false, reason: t.problem }
        : {
            ok: true,
            value: {
              verdict: t.verdict,
              interceptKgHa: t.interceptKgHa,
              stdErrorKgHa: t.interceptSeKgHa,
              t: t.t,
              p: t.p,
              df: t.df2,
              aiccDifference: t.aiccDifference,
              interceptNeeded: t.needed,
            },
          },
    correlation: 'problem' in c ? { ok: false, reason: c.problem } : { ok: true, value: c },
    responseOverCheck: 'problem' in g ? { ok: false, reason: g.problem } : { ok: true, value: g },
  };
}

/**
 * The sites as the screen shows them.
 * @param output - the worker's result
 * @returns one view per site, in the analysis' order
 */
export function siteViews(output: AnalysisOutput): SiteAnalysis[] {
  return output.analysis.sites.map((s, i) => siteView(s, output.plots[i]));
}

/**
 * Analyses every site, then the across-site step, reporting progress per site.
 * @param input - the plot table, block terms ("fixed": fixed blocks where every plot has one)
 *   and canonical prices
 * @param progress - awaited before each site (the worker yields there so a cancel can arrive)
 * @returns the pipeline's analysis and the sites' plots
 */
export async function analyzeTable(
  input: AnalysisInput,
  progress: (done: number, total: number, note: string) => Promise<void>,
): Promise<AnalysisOutput> {
  // The screen's groups step does not exist, so the group analyses are not asked for.
  const plan = planAcrossSites(input.table, {
    prices: input.prices,
    blocks: input.blocks === 'fixed' ? 'auto' : 'none',
    groupKeys: [],
  });
  const sites: PipelineSite[] = [];
  for (const [i, plots] of plan.plots.entries()) {
    await progress(i, plan.plots.length + 1, plots.site);
    sites.push(analyzePipelineSite(plots, plan.options));
  }
  await progress(plan.plots.length, plan.plots.length + 1, 'across sites');
  return { analysis: acrossSites(plan, sites), plots: [...plan.plots] };
}
