/**
 * The whole across-site analysis of a plot table in one call: every site fitted
 * with every model (shared/models), the side-by-side rows, the tests of whether
 * the sites share one response, the regional rate by maximum return to N, the
 * share of sites that responded, and the same per group (previous crop, soil,
 * year) with tests of whether the groups differ. Everything that depends on
 * prices is kept apart so that repriceAcrossSites() can follow a price slider
 * without refitting.
 * The result is plain data (fits are stored without `predict`; curves are
 * evaluated with curveValue from the parameters), so a worker can post it with
 * structuredClone.
 *
 * This is the one place where sites are fitted and their models ranked: the
 * report (shared/report/analyzeTrials) builds on this result, and each site's
 * recommendation model comes from recommendationModel, so the report and the
 * regional return ('best') speak of the same curve.
 *
 * No site is dropped silently: a site with nothing to fit keeps its rows (status
 * "not-fitted" and the reason), and every test or average that leaves a site out
 * lists it with the reason.
 *
 * "Responded" is defined here as: the site's rate effect (one-way ANOVA of yield
 * on rate as a factor, with blocks when present; siteRateEffect) is significant
 * at alpha (default 0.05). It needs no curve, so it does not depend on which
 * model wins. Sites where it cannot be tested are counted apart, not as "no".
 */
import { economicOptimum } from '../economics/economicOptimum';
import { assertPrices, type Prices } from '../economics/priceRatio';
import { curveValue } from '../models/curveValue';
import { fitAllModels, type AllModelsFit } from '../models/fitAllModels';
import { fitExponential } from '../models/exponential';
import { fitLinearPlateau } from '../models/linearPlateau';
import { fitQuadraticPlateau } from '../models/quadraticPlateau';
import { MODEL_NAMES, type BlockTerms, type ModelFit, type ModelName } from '../models/modelTypes';
import { StatsInputError } from '../stats/errors';
import { testIntercept } from '../stats/interceptTest';
import { pearsonCorrelation, type PearsonResult } from '../stats/pearson';
import type { PlotTable } from '../table/plotTable';
import {
  testCommonResponse,
  type CommonResponseTests,
  type LevelTerms,
  type SiteLeftOut,
} from './commonResponseTests';
import { groupResponseTest, type GroupResponseTest } from './groupResponseTest';
import {
  pooledCurveTest,
  type CurveFitOutcome,
  type CurvePart,
  type PooledCurveTest,
} from './pooledCurveTest';
import { rateGrid } from './rateGrid';
import {
  ONE_PER_ACRE_IN_PER_HA,
  prepareRegionalReturn,
  regionalReturnAtPrices,
  type PreparedRegionalReturn,
  type RegionalReturn,
  type SiteGainCurve,
} from './regionalReturn';
import { leadingModel } from './leadingModel';
import { recommendationModel, type RecommendationModel } from './recommendationModel';
import { regionalRecommendation, type RegionalRecommendationText } from './regionalRecommendation';
import { siteRateEffect, type SiteRateEffect } from './siteRateEffect';
import type { SiteModelRow } from './siteModelRows';
import { siteResponseOverCheck, type ResponseOverCheckOutcome } from './siteResponseOverCheck';
import { sitePlots, type SitePlots } from './sitePlots';
import { SitesInputError } from './sitesInputError';

/** Models compared across sites by pooled-versus-separate fits (not linear in all parameters). */
export type PlateauModel = 'linearPlateau' | 'quadraticPlateau' | 'exponential';
export const PLATEAU_MODELS: readonly PlateauModel[] = [
  'linearPlateau',
  'quadraticPlateau',
  'exponential',
];

/**
 * Which curve each site contributes to the regional return: "best" is the site's
 * recommendation model (recommendationModel: the lowest-AICc curve with a usable
 * rate, else a straight line), the same model the report recommends from; or
 * one model for all sites.
 */
export type RegionalModelChoice = 'best' | ModelName;

export interface AcrossSiteOptions {
  /** Grain and nutrient prices (currency/kg) and optional application cost (currency/ha). */
  prices: Prices;
  /** Block terms in the site fits: "auto" (default) uses fixed blocks where every plot has a label. */
  blocks?: 'auto' | BlockTerms;
  /** Default "best" (each site's recommendation model, see recommendationModel). */
  regionalModel?: RegionalModelChoice;
  /**
   * The user's model per site, used instead of the site's recommendation model wherever "best"
   * applies (a model the site has no fit of is ignored); default none. See leadingModel.
   */
  siteModels?: Readonly<Record<string, ModelName>>;
  /** Points on each fitted curve kept for charts; default that of shared/models (61). */
  curvePoints?: number;
  /** Grid spacing, kg/ha; default 1 (1 lb/ac is 1.120851 kg/ha). */
  gridStepKgHa?: number;
  /** Grid start, kg/ha; default 0. */
  gridFromKgHa?: number;
  /** Grid end, kg/ha; default the lowest of the sites' highest tested rates (no curve extrapolated). */
  gridToKgHa?: number;
  /** Profitable band below the best mean return, currency/ha; default 1 per acre (common practice). */
  bandPerHa?: number;
  /** Significance level of every test and of "responded", default 0.05. */
  alpha?: number;
  /** Level terms of the common-response tests, default "site". */
  levels?: LevelTerms;
  /**
   * Group columns to analyse (Plot.groups keys, or "year"). Default: every column that is a
   * property of the site, i.e. whose value never differs between the plots of one site; a
   * column that varies within sites (a treatment attribute such as source or timing) is
   * listed in `groupKeysSkipped` with the reason.
   */
  groupKeys?: readonly string[];
}

/** A model fit as plain data: everything but `predict`, so the analysis can be posted from a worker. */
export type FitData = Omit<ModelFit, 'predict'>;

/** fitAllModels' result as plain data (fits without `predict`; curveValue gives the curve). */
export type AllModelsFitData = Omit<AllModelsFit, 'fits'> & { fits: Record<ModelName, FitData> };

export interface SiteAnalysis {
  site: string;
  /** Analysable plots. */
  plots: number;
  /** Why the site could not be fitted at all, or null. */
  problem: string | null;
  blocks: BlockTerms;
  fits: AllModelsFitData | null;
  rateEffect: SiteRateEffect;
  responded: boolean;
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

/** How many sites responded, by the definition in the file header. */
export interface ResponseShare {
  definition: string;
  responded: number;
  /** Sites where the rate effect could be tested. */
  assessed: number;
  /** responded / assessed (NaN when none was assessed). */
  share: number;
  notAssessed: SiteLeftOut[];
}

/** The regional rate of a set of sites and what stands behind it. */
export interface RegionalAnalysis {
  regional: RegionalReturn;
  text: RegionalRecommendationText;
  /** The site and the model it contributes. */
  sitesUsed: { site: string; model: ModelName; note: string }[];
  sitesLeftOut: SiteLeftOut[];
  /** Where the rate grid ends and why, e.g. "… 225 kg/ha, the highest rate tested at every site …". */
  gridNote: string;
  /** Price-free part, for repricing. */
  prepared: PreparedRegionalReturn;
}

/** The tests of whether sites (or groups) share one response. */
export interface SharedResponseTests {
  linear: CommonResponseTests;
  proportional: CommonResponseTests;
  quadratic: CommonResponseTests;
  plateau: Record<PlateauModel, PooledCurveTest>;
}

export interface GroupValueAnalysis {
  value: string;
  sites: string[];
  regional: RegionalAnalysis;
  response: ResponseShare;
  sharedResponse: SharedResponseTests;
}

export interface GroupAnalysis {
  key: string;
  values: GroupValueAnalysis[];
  /** Sites with no single value in this column, with the reason. */
  sitesWithoutValue: SiteLeftOut[];
  /** Do the groups differ? Linear-model tests with site levels, and pooled-vs-group plateau fits. */
  differ: {
    linear: GroupResponseTest;
    quadratic: GroupResponseTest;
    plateau: Record<PlateauModel, PooledCurveTest>;
  };
}

/** The options of an analysis with every default filled in. */
export type AcrossSiteSettings = Required<
  Omit<AcrossSiteOptions, 'gridToKgHa' | 'groupKeys' | 'curvePoints'>
> & {
  gridToKgHa: number | null;
  groupKeys: readonly string[];
  curvePoints?: number;
};

export interface AcrossSiteAnalysis {
  options: AcrossSiteSettings;
  sites: SiteAnalysis[];
  /** Group columns not analysed by default, with the reason. */
  groupKeysSkipped: { key: string; reason: string }[];
  /** One row per site and model, at the current prices. */
  rows: SiteModelRow[];
  sharedResponse: SharedResponseTests;
  regional: RegionalAnalysis;
  response: ResponseShare;
  groups: GroupAnalysis[];
}

const RESPONDED_DEFINITION =
  'A site responded when its rate effect (one-way ANOVA of yield on rate as a factor, blocks included when present) is significant at the chosen level.';

const PLATEAU_FITTERS: Record<PlateauModel, (x: Float64Array, y: Float64Array) => ModelFit> = {
  linearPlateau: (x, y) => fitLinearPlateau({ rateKgHa: x, yieldKgHa: y }),
  quadraticPlateau: (x, y) => fitQuadraticPlateau({ rateKgHa: x, yieldKgHa: y }),
  exponential: (x, y) => fitExponential({ rateKgHa: x, yieldKgHa: y }),
};

const MODEL_LABEL: Record<ModelName, string> = {
  linear: 'straight line',
  proportional: 'line through the origin',
  quadratic: 'quadratic',
  linearPlateau: 'linear-plateau',
  quadraticPlateau: 'quadratic-plateau',
  exponential: 'exponential rise',
};

function outcomeOf(fit: FitData): CurveFitOutcome {
  if (fit.status === 'too-few-rates') return { problem: fit.message };
  if (!Number.isFinite(fit.sse))
    return { problem: `the ${MODEL_LABEL[fit.model]} could not be fitted` };
  return { sse: fit.sse, parameters: fit.parameterCount };
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
  const labels = new Set(site.block);
  return site.block.length > 0 && !labels.has(null) && !labels.has('') && labels.size >= 2
    ? 'fixed'
    : 'none';
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
 * @param settings - the plan's settings (planAcrossSites): block terms, alpha, curve points
 * @returns the site's analysis; a site the models refuse keeps its rows with the reason
 * @example
 * const plan = planAcrossSites(table, { prices });
 * const first = analyseSite(plan.plots[0], plan.options);
 * first.recommended.model // e.g. 'quadraticPlateau'
 */
export function analyseSite(
  site: SitePlots,
  settings: Pick<AcrossSiteSettings, 'blocks' | 'alpha' | 'curvePoints'>,
): SiteAnalysis {
  const { blocks, alpha, curvePoints } = settings;
  const b = siteBlocks(site, blocks);
  const rateEffect = siteRateEffect(site);
  const responded = rateEffect.test.kind === 'f-test' && rateEffect.test.p < alpha;
  let fits: AllModelsFitData | null = null;
  let problem = site.problem;
  let intercept: SiteAnalysis['intercept'] = { problem: problem ?? '' };
  let correlation: SiteAnalysis['correlation'] = { problem: problem ?? '' };
  let responseOverCheck: SiteAnalysis['responseOverCheck'] = { problem: problem ?? '' };
  if (!problem) {
    try {
      const all = fitAllModels(
        { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block },
        { blocks: b, curvePoints },
      );
      fits = { ...all, fits: withoutPredict(all.fits) };
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
    responseOverCheck = siteResponseOverCheck(site, alpha);
  }
  return {
    site: site.site,
    plots: site.yieldKgHa.length,
    problem,
    blocks: b,
    fits,
    recommended: fits
      ? recommendationModel(fits)
      : { model: null, reason: `no model could be fitted: ${problem ?? 'not fitted'}` },
    rateEffect,
    responded,
    intercept,
    correlation,
    responseOverCheck,
    groups: site.groups,
  };
}

/**
 * The side-by-side rows of a site at given prices.
 * @param s - the site's analysis
 * @param prices - canonical prices
 * @returns one row per model, in MODEL_NAMES order
 */
export function siteModelRows(s: SiteAnalysis, prices: Prices): SiteModelRow[] {
  const interceptP = 'p' in s.intercept ? s.intercept.p : null;
  const interceptNeeded = 'p' in s.intercept ? s.intercept.needed : null;
  const rateEffectP = s.rateEffect.test.kind === 'f-test' ? s.rateEffect.test.p : null;
  // Every row is written out field by field: V8 builds object-spread copies of
  // the site columns slowly enough to dominate re-pricing thousands of rows.
  return MODEL_NAMES.map((model): SiteModelRow => {
    const fit = s.fits?.fits[model];
    const opt = s.fits && fit ? economicOptimum(fit, prices) : null;
    const rank = (fit && s.fits?.ranking.find((r) => r.model === model)?.rank) ?? null;
    return {
      site: s.site,
      model,
      status: fit ? fit.status : 'not-fitted',
      message: fit ? fit.message : (s.problem ?? 'not fitted'),
      optimumRateKgHa: opt ? opt.rateKgHa : null,
      optimumStatus: opt ? opt.status : 'not-fitted',
      yieldAtOptimumKgHa: opt ? opt.yieldKgHa : null,
      gainOverCheckPerHa: opt ? opt.gainOverCheckPerHa : null,
      plateauYieldKgHa: fit?.plateauYield?.estimate ?? null,
      aicc: fit ? fit.aicc : NaN,
      aiccRank: rank,
      aiccWinner: rank === 1,
      interceptP,
      interceptNeeded,
      cvPct: s.rateEffect.cvPct,
      rateEffectP,
      responded: s.responded,
      groups: s.groups,
    };
  });
}

function responseShare(sites: readonly SiteAnalysis[]): ResponseShare {
  const assessed = sites.filter((s) => s.rateEffect.test.kind === 'f-test');
  const responded = assessed.filter((s) => s.responded).length;
  return {
    definition: RESPONDED_DEFINITION,
    responded,
    assessed: assessed.length,
    share: assessed.length > 0 ? responded / assessed.length : NaN,
    notAssessed: sites
      .filter((s) => s.rateEffect.test.kind === 'no-test')
      .map((s) => ({
        site: s.site,
        reason: s.rateEffect.test.kind === 'no-test' ? s.rateEffect.test.reason : '',
      })),
  };
}

/** The model a curve reduces to when it reaches no plateau within the tested rates. */
const LIMIT_MODEL: Partial<Record<ModelName, ModelName>> = {
  linearPlateau: 'linear',
  quadraticPlateau: 'quadratic',
  exponential: 'linear',
};

/** True when the fit's parameters give a finite curve over its tested rates. */
function gives(fit: FitData): boolean {
  return (
    Number.isFinite(curveValue(fit.model, fit.params, 0)) &&
    Number.isFinite(curveValue(fit.model, fit.params, fit.testedRates.highestKgHa))
  );
}

/** Each site's gain curve for the regional return, or why it has none. */
function regionalCurves(
  sites: readonly SiteAnalysis[],
  choice: RegionalModelChoice,
  siteModels: Readonly<Record<string, ModelName>>,
): {
  used: { site: string; model: ModelName; fit: FitData; note: string }[];
  leftOut: SiteLeftOut[];
} {
  const used: { site: string; model: ModelName; fit: FitData; note: string }[] = [];
  const leftOut: SiteLeftOut[] = [];
  for (const s of sites) {
    if (!s.fits) {
      leftOut.push({ site: s.site, reason: s.problem ?? 'not fitted' });
      continue;
    }
    const model = choice === 'best' ? leadingModel(s, siteModels) : choice;
    if (!model) {
      const reasons = [...new Set(s.fits.ranking.map((r) => r.reason).filter((r) => r))].join(' ');
      leftOut.push({ site: s.site, reason: `${s.recommended.reason}. ${reasons}`.trim() });
      continue;
    }
    const notes: string[] = [];
    let fit = s.fits.fits[model];
    // A rise that never levels off within the tested rates is its limit curve
    // (DESIGN.md: the straight line, or the quadratic for the quadratic-plateau);
    // use that rather than drop a strongly responding site from the average.
    const limit = LIMIT_MODEL[model];
    if (fit.status === 'no-plateau' && !gives(fit) && limit && gives(s.fits.fits[limit])) {
      notes.push(
        `the ${MODEL_LABEL[model]} reached no plateau, so its limit, the ${MODEL_LABEL[limit]}, is used`,
      );
      fit = s.fits.fits[limit];
    }
    if (fit.status === 'too-few-rates' || !gives(fit)) {
      leftOut.push({
        site: s.site,
        reason: `the ${MODEL_LABEL[model]} gives no curve here: ${fit.message}`,
      });
      continue;
    }
    if (fit.testedRates.lowestKgHa > 0) {
      notes.push(
        `no plot at rate 0: the check is the ${MODEL_LABEL[model]}'s value at 0, below the lowest tested rate`,
      );
    }
    if (fit.status === 'full-response-at-lowest-rate' && fit.joinBetweenKgHa) {
      // DESIGN.md, identifiability: any join in the first interval fits equally well.
      const [lo, hi] = fit.joinBetweenKgHa;
      notes.push(
        `full response by the lowest non-zero rate: the curve between ${lo} and ${hi} kg/ha is not fixed by the data`,
      );
    }
    const note = notes.join('; ');
    used.push({ site: s.site, model: fit.model, fit, note });
  }
  return { used, leftOut };
}

/**
 * The regional rate of a set of analysed sites at the settings' prices, models and grid.
 * @param sites - the sites' analyses
 * @param o - the analysis settings (prices, regional model, site models, grid, band)
 * @returns the regional return, its sentence and cautions, sites used and left out
 */
export function regionalAnalysis(
  sites: readonly SiteAnalysis[],
  o: AcrossSiteSettings,
): RegionalAnalysis {
  const { used, leftOut } = regionalCurves(sites, o.regionalModel, o.siteModels);
  const top =
    o.gridToKgHa ??
    (used.length > 0
      ? Math.min(...used.map((u) => u.fit.testedRates.highestKgHa))
      : o.gridFromKgHa);
  const grid = rateGrid(o.gridFromKgHa, Math.max(top, o.gridFromKgHa), o.gridStepKgHa);
  const curves: SiteGainCurve[] = used.map((u) => {
    const at0 = curveValue(u.model, u.fit.params, 0);
    return { site: u.site, gainKgHa: (x) => curveValue(u.model, u.fit.params, x) - at0 };
  });
  const sitesUsed = used.map((u) => {
    const beyond = u.fit.testedRates.highestKgHa < grid[grid.length - 1];
    const extra = beyond
      ? `the grid runs past the site's highest tested rate (${u.fit.testedRates.highestKgHa} kg/ha)`
      : '';
    return { site: u.site, model: u.model, note: [u.note, extra].filter((t) => t).join('; ') };
  });
  const end = grid[grid.length - 1];
  const lowest = used.filter((u) => u.fit.testedRates.highestKgHa === top).map((u) => u.site);
  const gridNote =
    o.gridToKgHa !== null
      ? `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha, as chosen.`
      : `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha: ${end} kg/ha is the highest rate tested at every site` +
        (lowest.length > 0 && lowest.length < used.length
          ? ` (${lowest.join(', ')} stopped there)`
          : '') +
        ', so no site curve is extended past its data.';
  const prepared = prepareRegionalReturn(curves, grid);
  const regional = regionalReturnAtPrices(prepared, o.prices, { bandPerHa: o.bandPerHa });
  return {
    regional,
    text: regionalRecommendation(regional),
    sitesUsed,
    sitesLeftOut: leftOut,
    gridNote,
    prepared,
  };
}

function plateauParts(
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  model: PlateauModel,
): CurvePart[] {
  return plots.map((p) => {
    const a = analyses.get(p.site);
    // Reuse the site's own fit when it was made without block terms (the pooled fit has none).
    const fit = a?.fits && a.blocks === 'none' ? a.fits.fits[model] : undefined;
    return {
      label: p.site,
      rateKgHa: p.rateKgHa,
      yieldKgHa: p.yieldKgHa,
      known: fit ? outcomeOf(fit) : undefined,
    };
  });
}

function sharedResponse(
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  o: AcrossSiteSettings,
): SharedResponseTests {
  const usable = plots.filter((p) => !analyses.get(p.site)?.problem);
  const fitter = (model: PlateauModel) => (x: Float64Array, y: Float64Array) =>
    outcomeOf(PLATEAU_FITTERS[model](x, y));
  const plateau = {} as Record<PlateauModel, PooledCurveTest>;
  for (const model of PLATEAU_MODELS) {
    const label = MODEL_LABEL[model];
    plateau[model] = pooledCurveTest(
      plateauParts(usable, analyses, model),
      fitter(model),
      {
        comparison: `One ${label} per site against one ${label} fitted to the pooled plots`,
        significant: 'the sites do not share one curve',
        notSignificant: 'one common curve describes the sites as well',
      },
      o.alpha,
    );
    for (const p of plots) {
      const problem = analyses.get(p.site)?.problem;
      if (problem) plateau[model].partsLeftOut.push({ site: p.site, reason: problem });
    }
  }
  return {
    linear: testCommonResponse(plots, 'linear', { levels: o.levels, alpha: o.alpha }),
    proportional: testCommonResponse(plots, 'proportional', { levels: o.levels, alpha: o.alpha }),
    quadratic: testCommonResponse(plots, 'quadratic', { levels: o.levels, alpha: o.alpha }),
    plateau,
  };
}

function groupAnalysis(
  key: string,
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  o: AcrossSiteSettings,
  whole: Pick<GroupValueAnalysis, 'regional' | 'response' | 'sharedResponse'> | null,
): GroupAnalysis {
  const sitesWithoutValue: SiteLeftOut[] = [];
  const byValue = new Map<string, SitePlots[]>();
  for (const p of plots) {
    const v = p.groups[key];
    if (v === undefined || v === null) {
      sitesWithoutValue.push({
        site: p.site,
        reason:
          key in p.groups ? `its plots carry different values of ${key}` : `no value of ${key}`,
      });
      continue;
    }
    const list = byValue.get(v);
    if (list) list.push(p);
    else byValue.set(v, [p]);
  }
  const values: GroupValueAnalysis[] = [...byValue.entries()].map(([value, members]) => {
    // A value that every site shares (one year, one soil) is the whole analysis again: reuse it.
    if (members.length === plots.length && whole)
      return { value, sites: members.map((m) => m.site), ...whole };
    const sub = members.map((m) => analyses.get(m.site) as SiteAnalysis);
    return {
      value,
      sites: members.map((m) => m.site),
      regional: regionalAnalysis(sub, o),
      response: responseShare(sub),
      sharedResponse: sharedResponse(members, analyses, o),
    };
  });
  const grouped = [...byValue.values()].flat();
  const groupOf = new Map(grouped.map((p) => [p.site, p.groups[key] as string]));
  const usable = grouped.filter((p) => !analyses.get(p.site)?.problem);
  const plateau = {} as Record<PlateauModel, PooledCurveTest>;
  for (const model of PLATEAU_MODELS) {
    const label = MODEL_LABEL[model];
    const parts: CurvePart[] = [...byValue.entries()].map(([value, members]) => {
      const ok = members.filter((m) => !analyses.get(m.site)?.problem);
      return {
        label: value,
        rateKgHa: Float64Array.from(ok.flatMap((m) => Array.from(m.rateKgHa))),
        yieldKgHa: Float64Array.from(ok.flatMap((m) => Array.from(m.yieldKgHa))),
      };
    });
    plateau[model] = pooledCurveTest(
      usable.length > 0 ? parts : [],
      (x, y) => outcomeOf(PLATEAU_FITTERS[model](x, y)),
      {
        comparison: `One ${label} per value of ${key} against one ${label} for all, on pooled plots`,
        significant: `the groups of ${key} respond differently`,
        notSignificant: `the groups of ${key} do not differ detectably`,
      },
      o.alpha,
    );
  }
  return {
    key,
    values,
    sitesWithoutValue,
    differ: {
      linear: groupResponseTest(grouped, groupOf, 'linear', key, o.alpha),
      quadratic: groupResponseTest(grouped, groupOf, 'quadratic', key, o.alpha),
      plateau,
    },
  };
}

/** What the per-site and across steps share: the sites' plots and the settings with defaults. */
export interface AcrossSitePlan {
  plots: readonly SitePlots[];
  options: AcrossSiteSettings;
  groupKeysSkipped: { key: string; reason: string }[];
}

/**
 * Checks the options and lays out the analysis, before any fitting: the first of the three
 * steps analyseAcrossSites() takes in one call (planAcrossSites, analyseSite per site,
 * acrossSites), for a caller that reports progress per site or can stop between sites.
 * @param source - a plot table (rates and yields in kg/ha), or its sites from sitePlots()
 * @param options - as analyseAcrossSites
 * @returns the sites' plots, the settings with every default, the group columns left out
 * @throws {StatsInputError} "bad-argument" for a price that is not positive (shared/economics)
 * @throws {SitesInputError} "bad-grid" for a bad grid; "bad-argument" for alpha outside (0, 1) or a negative band
 * @example
 * const plan = planAcrossSites(table, { prices });
 * const sites = plan.plots.map((p) => analyseSite(p, plan.options));
 * acrossSites(plan, sites).regional.regional.bestRateKgHa // as analyseAcrossSites(table, { prices })
 */
export function planAcrossSites(
  source: PlotTable | readonly SitePlots[],
  options: AcrossSiteOptions,
): AcrossSitePlan {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) {
    throw new SitesInputError(
      'bad-argument',
      `alpha is ${alpha}; it must lie strictly between 0 and 1.`,
    );
  }
  const plots = Array.isArray(source)
    ? (source as readonly SitePlots[])
    : sitePlots(source as PlotTable);
  const keys = new Set<string>();
  for (const p of plots) for (const k of Object.keys(p.groups)) keys.add(k);
  // sitePlots maps a column that differs within a site to null for that site.
  const groupKeysSkipped = options.groupKeys
    ? []
    : [...keys]
        .filter((k) => plots.some((p) => k in p.groups && p.groups[k] === null))
        .map((key) => ({
          key,
          reason: `its value differs between the plots of ${plots.filter((p) => key in p.groups && p.groups[key] === null).length} site(s), so it is not a property of the site`,
        }));
  const skipped = new Set(groupKeysSkipped.map((k) => k.key));
  const o: AcrossSiteSettings = {
    prices: { ...options.prices },
    blocks: options.blocks ?? 'auto',
    regionalModel: options.regionalModel ?? 'best',
    siteModels: { ...options.siteModels },
    curvePoints: options.curvePoints,
    gridStepKgHa: options.gridStepKgHa ?? 1,
    gridFromKgHa: options.gridFromKgHa ?? 0,
    gridToKgHa: options.gridToKgHa ?? null,
    bandPerHa: options.bandPerHa ?? ONE_PER_ACRE_IN_PER_HA,
    alpha,
    levels: options.levels ?? 'site',
    groupKeys: options.groupKeys ?? [...keys].filter((k) => !skipped.has(k)),
  };
  // Check prices, band and grid once, before any fitting.
  assertPrices(o.prices);
  if (!(Number.isFinite(o.bandPerHa) && o.bandPerHa >= 0)) {
    throw new SitesInputError('bad-argument', `bandPerHa is ${o.bandPerHa}; it must be 0 or more.`);
  }
  rateGrid(o.gridFromKgHa, o.gridToKgHa ?? o.gridFromKgHa, o.gridStepKgHa);
  return { plots, options: o, groupKeysSkipped };
}

/**
 * The across step: from the sites' analyses (analyseSite, in the plan's order) to the rows,
 * the shared-response tests, the regional rate, the response share and the groups.
 * @param plan - from planAcrossSites
 * @param sites - analyseSite of each of plan.plots, same order
 * @returns the whole analysis, as analyseAcrossSites
 * @throws {SitesInputError} "bad-argument" when the sites do not match the plan's plots
 * @example
 * acrossSites(plan, plan.plots.map((p) => analyseSite(p, plan.options))).response.share // e.g. 0.75
 */
export function acrossSites(
  plan: AcrossSitePlan,
  sites: readonly SiteAnalysis[],
): AcrossSiteAnalysis {
  const { plots, options: o, groupKeysSkipped } = plan;
  if (sites.length !== plots.length || sites.some((s, i) => s.site !== plots[i].site)) {
    throw new SitesInputError(
      'bad-argument',
      `sites must be the analyses of the plan's ${plots.length} site(s), in the plan's order.`,
    );
  }
  const analyses = new Map(sites.map((s) => [s.site, s]));
  // A site the models refused (e.g. a negative rate) carries that reason into every pooled test.
  const checked = plots.map((p, i) =>
    sites[i].problem && !p.problem ? { ...p, problem: sites[i].problem } : p,
  );
  const whole = {
    sharedResponse: sharedResponse(checked, analyses, o),
    regional: regionalAnalysis(sites, o),
    response: responseShare(sites),
  };
  return {
    options: o,
    sites: [...sites],
    groupKeysSkipped,
    rows: sites.flatMap((s) => siteModelRows(s, o.prices)),
    ...whole,
    groups: o.groupKeys.map((k) => groupAnalysis(k, checked, analyses, o, whole)),
  };
}

/**
 * The across-site analysis of a plot table, in one call (planAcrossSites, analyseSite for
 * every site, acrossSites).
 * @param source - a plot table (rates and yields in kg/ha), or its sites from sitePlots()
 * @param options - prices (currency/kg; application cost currency/ha), block terms, regional
 *   model choice, the user's site models, grid (kg/ha), profitable band (currency/ha), alpha,
 *   level terms, group columns
 * @returns sites, side-by-side rows, shared-response tests, regional rate, response share, groups
 * @throws {StatsInputError} "bad-argument" for a price that is not positive (shared/economics)
 * @throws {SitesInputError} "bad-grid" for a bad grid; "bad-argument" for alpha outside (0, 1) or a negative band
 * @example
 * const a = analyseAcrossSites(table, { prices: { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 } });
 * a.regional.regional.bestRateKgHa   // e.g. 168
 * a.regional.text.cautions           // always shown with the rate
 */
export function analyseAcrossSites(
  source: PlotTable | readonly SitePlots[],
  options: AcrossSiteOptions,
): AcrossSiteAnalysis {
  const plan = planAcrossSites(source, options);
  return acrossSites(
    plan,
    plan.plots.map((p) => analyseSite(p, plan.options)),
  );
}
