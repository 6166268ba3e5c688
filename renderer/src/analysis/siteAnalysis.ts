/**
 * The analysis in the worker, site by site: the one analysis run of
 * shared/analysis (analyzeTrialSteps, the same steps analyzeTrial runs for the
 * command line), with a progress report after each site so a cancel can arrive
 * between sites. The result is plain data; the window prices it (priceTrial)
 * for every new price or model pick without refitting or resampling.
 *
 * The views below only reshape the analysis for the components; the fits,
 * tests and model choice all come from shared/analysis.
 */
import type {
  AcrossSiteAnalysis,
  FitData,
  SiteAnalysis as PipelineSite,
} from '../../../shared/analysis/analyzeAcrossSites';
import type { AnalysisSettings } from '../../../shared/analysis/analysisSettings';
import {
  analyzeTrialSteps,
  type SiteResamples,
  type TrialAnalysis,
} from '../../../shared/analysis/analyzeTrial';
import type { ModelRank } from '../../../shared/models/fitAllModels';
import type { ModelName } from '../../../shared/models/modelTypes';
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
  /** Each model's join profile interval, kg/ha (the pipeline's joinProfiles; absent without a join). */
  joinProfiles: PipelineSite['joinProfiles'];
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
  /** The analysis settings (analysisSettings: the defaults the command line uses too). */
  settings: AnalysisSettings;
}

/** The worker's result: the one analysis the screens and the report read. */
export type AnalysisOutput = TrialAnalysis;

/**
 * What the worker sends before its result, in this order: the sites (the preview, their draws
 * and the regional models pending), then every site's draws (withDraws lays them in).
 */
export type AnalysisPartial =
  { kind: 'sites'; analysis: AnalysisOutput } | { kind: 'draws'; draws: SiteResamples };

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
    joinProfiles: s.joinProfiles,
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
  return output.across.sites.map((s, i) => siteView(s, output.plots[i]));
}

/**
 * Analyzes every site, then the across-site step, reporting progress per site and handing on
 * what is done before the rest: the preview (every site's own result, the draws and the regional
 * models pending) after the last site's fits, then the draws after the last site's resamples.
 * @param input - the plot table and the analysis settings
 * @param progress - awaited after each site is fitted and again after it is resampled (the
 *   worker yields there so a cancel can arrive)
 * @param early - called with the preview, then with the draws (when there are resamples); the
 *   preview's promise is awaited before the resamples are drawn, so the window draws the sites
 *   without the resampling taking the cores (on two cores it delayed the demo's first optimum
 *   by about 0.1 s)
 * @returns the trial's analysis
 */
export async function analyzeTable(
  input: AnalysisInput,
  progress: (done: number, total: number, note: string) => Promise<void>,
  early: (partial: AnalysisPartial) => void | Promise<void> = () => {},
): Promise<AnalysisOutput> {
  const steps = analyzeTrialSteps(input.table, input.settings);
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    const s = step.value;
    if (s.kind === 'site') {
      await progress(s.done, s.total + 1, `fitting ${s.site}`);
    } else if (s.kind === 'resampling') {
      await progress(s.done, s.total + 1, `resampling ${s.site}`);
    } else if (s.kind === 'draws-wanted') {
      // Drawn here, in this worker, a site at a time (the next steps), so a cancel can arrive.
    } else if (s.kind === 'preview') {
      await early({ kind: 'sites', analysis: s.analysis });
      const sites = s.analysis.across.sites.length;
      if (input.settings.resamples <= 0) await progress(sites, sites + 1, 'regional models');
    } else {
      void early({ kind: 'draws', draws: s.draws });
      const sites = s.draws.length;
      await progress(sites, sites + 1, 'regional models');
    }
  }
}
