/**
 * The per-site step of the across-site analysis: one site fitted with every model and the
 * site-level tests beside the fits (rate effect, intercept, correlation, gain over the check).
 * The result is plain data (fits without `predict`), so a worker can post it.
 */
import { isReplicated, NO_REPLICATION_REASON } from './siteReplication';
import {
  drawBootstrapEstimates,
  type BootstrapDraws,
  type DrawOptions,
} from '../economics/bootstrapDraws';
import { fitAllModelsPrepared, type AllModelsFit } from '../models/fitAllModels';
import { joinProfileInterval, type RateProfileInterval } from '../models/joinProfile';
import type { BlockTerms, ModelFit, ModelName, SiteData } from '../models/modelTypes';
import { prepareSite, type PreparedSite } from '../models/prepareSite';
import { StatsInputError } from '../stats/errors';
import { defaultBlockTerms } from '../stats/hasBlocks';
import {
  fitRateBlockModel,
  type RateBlockModel,
  type RateBlockProblem,
} from '../stats/rateBlockModel';
import { testIntercept } from '../stats/interceptTest';
import { toNumberArray } from '../stats/toNumberArray';
import { pearsonCorrelation, type PearsonResult } from '../stats/pearson';
import { bootstrapSeed } from './analysisSettings';
import type { AcrossSiteSettings } from './planAcrossSites';
import { recommendationModel, type RecommendationModel } from './recommendationModel';
import { siteAnova, type AnovaSummary, type TreatmentMeanRow } from './siteAnova';
import { siteRateEffect, type SiteRateEffect } from './siteRateEffect';
import { siteResponseOverCheck, type ResponseOverCheckOutcome } from './siteResponseOverCheck';
import type { SitePlots } from './sitePlots';

/** A model fit as plain data: everything but `predict`, so the analysis can be posted from a worker. */
export type FitData = Omit<ModelFit, 'predict'>;

/** fitAllModels' result as plain data (fits without `predict`; curveValue gives the curve). */
export type AllModelsFitData = Omit<AllModelsFit, 'fits'> & { fits: Record<ModelName, FitData> };

export interface SiteAnalysis {
  /** The site-year's display name (shared/table/siteYear). */
  site: string;
  /** The harvest year, or null when the plots carry none. */
  year: number | null;
  /** Analyzable plots. */
  plots: number;
  /** Why the site could not be fitted at all, or null. */
  problem: string | null;
  blocks: BlockTerms;
  fits: AllModelsFitData | null;
  /**
   * The profile interval of each model's join (joinProfileInterval: the linear-plateau and the
   * quadratic-plateau when they report one), at the analysis' interval level, kg/ha; a model
   * without one is absent. Price-free, so a price change never redoes it; the
   * linear-plateau's optimum takes it (optimumProfileInterval).
   */
  joinProfiles: Partial<Record<ModelName, RateProfileInterval>>;
  rateEffect: SiteRateEffect;
  responded: boolean;
  /**
   * False when no rate is replicated within the site's design (siteReplication.ts): then no
   * rate is recommended and no resamples are drawn.
   */
  replicated: boolean;
  /** The model the site's recommendation uses and why (recommendationModel). */
  recommended: RecommendationModel;
  /** The straight line's intercept test (stats/interceptTest), or why there is none. */
  intercept: InterceptOutcome | { problem: string };
  /** Pearson's r of yield on rate with its t-test and 95 % interval (stats/pearson), or why there is none. */
  correlation: PearsonResult | { problem: string };
  /**
   * Gains over the zero-rate plot of the same block: the line through the origin fitted to them
   * and whether a gain at rate zero is present (siteResponseOverCheck), or why there is none.
   */
  responseOverCheck: ResponseOverCheckOutcome | { problem: string };
  /** ANOVA of yield on rate as a factor (blocks when every plot has one) and the means ± SE. */
  anova: AnovaSummary | null;
  treatmentMeans: TreatmentMeanRow[];
  /**
   * Every fitted model re-estimated on seeded resamples (drawBootstrapEstimates), for the
   * optimum's interval at any prices (optimumInterval); null without resamples or fits.
   */
  draws: BootstrapDraws | null;
  groups: Record<string, string | null>;
}

/** The straight line's intercept test of one site, as plain data. */
export interface InterceptOutcome {
  p: number;
  needed: boolean;
  verdict: string;
  /** t of the intercept and the extra-sum-of-squares F against the line through the origin. */
  t: number;
  F: number;
  df1: number;
  df2: number;
  /** The straight line's intercept and its standard error, kg/ha. */
  interceptKgHa: number;
  interceptSeKgHa: number;
  /** AICc of the line through the origin minus that of the straight line; null when not defined. */
  aiccDifference: number | null;
}

/** The join profile interval of every fit that reports a join, at this level. */
function joinProfiles(
  site: PreparedSite,
  fits: Record<ModelName, ModelFit>,
  level: number,
): SiteAnalysis['joinProfiles'] {
  const out: SiteAnalysis['joinProfiles'] = {};
  for (const model of Object.keys(fits) as ModelName[]) {
    const interval = joinProfileInterval(site, fits[model], level);
    if (interval) out[model] = interval;
  }
  return out;
}

/** Drops the predict closures (functions cannot be cloned to another thread). */
function withoutPredict(fits: Record<ModelName, ModelFit>): Record<ModelName, FitData> {
  const out = {} as Record<ModelName, FitData>;
  for (const name of Object.keys(fits) as ModelName[]) {
    const { predict: _predict, ...data } = fits[name];
    out[name] = data;
  }
  return out;
}

function siteBlocks(site: SitePlots, choice: 'auto' | BlockTerms): BlockTerms {
  if (choice !== 'auto') return choice;
  return defaultBlockTerms(site.block);
}

/** A stats call whose input mistake is a data problem of this site: the result, or the reason. */
function orProblem<T>(compute: () => T): T | { problem: string } {
  try {
    return compute();
  } catch (e) {
    if (!(e instanceof StatsInputError)) throw e;
    return { problem: e.message };
  }
}

/**
 * The per-site step of the analysis: one site fitted with every model, its recommendation
 * model, rate effect, intercept test, correlation and response over the check. Price-free; a caller that wants progress
 * per site calls this site by site and then acrossSites().
 * @param site - one site's plots from sitePlots() (kg/ha)
 * @param settings - the plan's settings (planAcrossSites): block terms, alpha, curve points,
 *   resamples, the run's seed and the interval level
 * @param siteIndex - the site's position in the table's site order (seeds its resamples)
 * @param fitted - the site's rate + block model when the caller has fitted it (fitRateBlockModel
 *   on these plots), so the quality checks and this step share one fit
 * @returns the site's analysis; a site the models refuse keeps its rows with the reason
 * @example
 * const plan = planAcrossSites(table, { prices });
 * const first = analyzeSite(plan.plots[0], plan.options);
 * first.recommended.model // e.g. 'quadraticPlateau'
 */
export function analyzeSite(
  site: SitePlots,
  settings: Pick<
    AcrossSiteSettings,
    'blocks' | 'alpha' | 'curvePoints' | 'resamples' | 'seed' | 'intervalLevel'
  >,
  siteIndex = 0,
  fitted?: RateBlockModel | RateBlockProblem,
): SiteAnalysis {
  const { blocks, alpha, curvePoints } = settings;
  const b = siteBlocks(site, blocks);
  // One rate + block model per site, read by the rate effect and the ANOVA alike.
  const rateBlock =
    fitted ??
    fitRateBlockModel({
      rateKgHa: site.rateKgHa,
      yieldKgHa: site.yieldKgHa,
      block: site.block,
    });
  const rateEffect = siteRateEffect(site, rateBlock);
  const responded = rateEffect.test.kind === 'f-test' && rateEffect.test.p < alpha;
  const replicated = isReplicated(rateBlock);
  let fits: AllModelsFitData | null = null;
  let profiles: SiteAnalysis['joinProfiles'] = {};
  let problem = site.problem;
  let intercept: SiteAnalysis['intercept'] = { problem: problem ?? '' };
  let correlation: SiteAnalysis['correlation'] = { problem: problem ?? '' };
  let responseOverCheck: SiteAnalysis['responseOverCheck'] = { problem: problem ?? '' };
  if (!problem) {
    try {
      const prepared = prepareSite(
        { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block },
        b,
      );
      const all = fitAllModelsPrepared(prepared, { curvePoints });
      fits = { ...all, fits: withoutPredict(all.fits) };
      profiles = joinProfiles(prepared, all.fits, settings.intervalLevel);
    } catch (e) {
      // A value the models refuse (e.g. a negative rate) is a data problem of this site.
      if (!(e instanceof StatsInputError)) throw e;
      problem = e.message;
    }
    intercept = orProblem(() => {
      const t = testIntercept(site.rateKgHa, site.yieldKgHa, alpha);
      return {
        p: t.p,
        needed: t.interceptNeeded,
        verdict: t.verdict,
        t: t.t,
        F: t.F,
        df1: t.df1,
        df2: t.df2,
        interceptKgHa: t.intercept.estimate,
        interceptSeKgHa: t.intercept.stdError,
        aiccDifference: t.aiccDifference,
      };
    });
    correlation = orProblem(() => pearsonCorrelation(site.rateKgHa, site.yieldKgHa));
    responseOverCheck = siteResponseOverCheck(site, rateBlock, alpha);
  }
  const rates = toNumberArray(site.rateKgHa);
  const { anova, means } = siteAnova(
    rates,
    toNumberArray(site.yieldKgHa),
    [...site.block],
    rateBlock,
  );
  return {
    site: site.site,
    year: site.year,
    plots: site.yieldKgHa.length,
    problem,
    blocks: b,
    fits,
    joinProfiles: profiles,
    recommended: !fits
      ? { model: null, reason: `no model could be fitted: ${problem ?? 'not fitted'}` }
      : !replicated
        ? { model: null, reason: NO_REPLICATION_REASON }
        : recommendationModel(fits),
    rateEffect,
    responded,
    intercept,
    correlation,
    responseOverCheck,
    anova,
    treatmentMeans: means,
    replicated,
    draws: siteDraws(site, { fits, blocks: b, replicated }, settings, siteIndex),
    groups: site.groups,
  };
}

/**
 * One site's bootstrap as plain data: the arguments of drawBootstrapEstimates (the plots, the
 * models to refit, resamples, seed and block terms), so another thread can draw it (the command
 * line's pool, cli/drawPool.ts) and get the same draws.
 */
export interface SiteDrawJob {
  data: SiteData;
  models: ModelName[];
  options: DrawOptions;
}

/**
 * What a site's bootstrap draws: every model but those with too few rates, refitted on each
 * resample, behind the optimum's interval and the shortfall risk at any prices.
 * @param site - the site's plots (kg/ha)
 * @param fitted - the site's fits and block terms, as analyzeSite found them
 * @param settings - resamples (0: none) and the run's seed
 * @param siteIndex - the site's position in the table's site order (seeds its resamples)
 * @returns the job; null without fits, resamples, two distinct rates or replication
 * @example
 * siteDrawJob(plan.plots[0], fitted, plan.options, 0)?.options.resamples // 200
 */
export function siteDrawJob(
  site: SitePlots,
  fitted: Pick<SiteAnalysis, 'fits' | 'blocks' | 'replicated'>,
  settings: Pick<AcrossSiteSettings, 'resamples' | 'seed'>,
  siteIndex: number,
): SiteDrawJob | null {
  const { fits } = fitted;
  // Without replication the resamples would all be the data (siteReplication.ts).
  if (!fits || settings.resamples <= 0 || new Set(site.rateKgHa).size < 2 || !fitted.replicated)
    return null;
  return {
    // Only what the draws read: a job crosses to another thread by copy.
    data: { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block },
    models: (Object.keys(fits.fits) as ModelName[]).filter(
      (m) => fits.fits[m].status !== 'too-few-rates',
    ),
    options: {
      resamples: settings.resamples,
      seed: bootstrapSeed(settings.seed, siteIndex),
      blocks: fitted.blocks,
    },
  };
}

/**
 * Draws a site's bootstrap job.
 * @param job - from siteDrawJob, here or copied from another thread
 * @returns the draws (drawBootstrapEstimates)
 * @example
 * drawSite(siteDrawJob(plan.plots[0], fitted, plan.options, 0)!).resamples // 200
 */
export function drawSite(job: SiteDrawJob): BootstrapDraws {
  return drawBootstrapEstimates(job.data, job.models, job.options);
}

/**
 * A site's bootstrap draws (siteDrawJob, drawn here). analyzeSite makes them with the rest of
 * the site; the trial's analysis makes them after every site's fits (analyzeTrialSteps), so the
 * sites are shown before their resampling.
 * @param site - the site's plots (kg/ha)
 * @param fitted - the site's fits and block terms, as analyzeSite found them
 * @param settings - resamples (0: none) and the run's seed
 * @param siteIndex - the site's position in the table's site order (seeds its resamples)
 * @returns the draws; null without fits, resamples or two distinct rates
 * @example
 * siteDraws(plan.plots[0], analyzeSite(plan.plots[0], { ...plan.options, resamples: 0 }), plan.options, 0)?.resamples // 200
 */
export function siteDraws(
  site: SitePlots,
  fitted: Pick<SiteAnalysis, 'fits' | 'blocks' | 'replicated'>,
  settings: Pick<AcrossSiteSettings, 'resamples' | 'seed'>,
  siteIndex: number,
): BootstrapDraws | null {
  const job = siteDrawJob(site, fitted, settings, siteIndex);
  return job && drawSite(job);
}
