/**
 * The price-free half of the optimum's bootstrap: a seeded stratified resample
 * of the plots (each rate refilled from its own plots, Davison & Hinkley,
 * Bootstrap Methods and their Application, 1997, §3.2) and every asked model
 * re-estimated on it with the same global profiled search as the fit. The
 * estimates are kept, not the optima, so an interval at new prices is a pass of
 * closed forms over them (optimumInterval) and never a new bootstrap.
 *
 * With block terms the yields are first adjusted for the block offsets (for a
 * balanced design y − ȳ_block + ȳ, exactly what the blocked fit sees; otherwise
 * the offsets of the one-mean-per-rate model with blocks), and the adjusted
 * yields are resampled within rates. Resampling raw plots within blocks instead
 * would leave blocks without some rates and break the design.
 *
 * Storage is compact (typed arrays per model) because a trial of 1,000 sites
 * keeps 200 resamples × 7 models of each: objects per draw would cost the
 * garbage collector more than the fits.
 */
import { MODEL_CURVES } from '../models/curves';
import { estimateCurve } from '../models/estimateCurve';
import type {
  BlockTerms,
  CurveSummary,
  FitStatus,
  ModelName,
  SiteData,
  TestedRates,
} from '../models/modelTypes';
import { prepareSite, type PreparedSite } from '../models/prepareSite';
import { blockColumns } from '../models/solve/profileSolver';
import { resampleWithinGroups, strataOf, type Strata } from '../optimize/resampleWithinGroups';
import { seededRandom } from '../optimize/seededRandom';
import { StatsInputError } from '../stats/errors';
import { applyQTranspose, qrDecompose, solveUpperTriangular } from '../stats/qr';

/** Fit statuses in a fixed order, so a draw stores its status as one byte (its index here). */
export const DRAW_STATUSES: readonly FitStatus[] = [
  'ok',
  'no-plateau',
  'full-response-at-lowest-rate',
  'convex',
  'no-response',
  'too-few-rates',
];

/** Every resample's estimate of one model, column by column. */
export interface ModelDraws {
  model: ModelName;
  /** Parameter names, in the order of `params`' columns. */
  paramNames: string[];
  /** Status of each draw, as an index into the fixed status list (drawSummary decodes it). */
  status: Uint8Array;
  /** Parameters, draw-major: draw b's parameter j is params[b × paramNames.length + j]. */
  params: Float64Array;
  /** Residual sum of squares of each draw, (kg/ha)². */
  sse: Float64Array;
  /**
   * Coefficients the site's own fit of this model estimates: curve parameters plus block
   * offsets (ModelFit.parameterCount). The resamples are fitted without block terms to
   * block-adjusted yields, but the offsets were estimated from the site's plots and the
   * adjusted SSE is the blocked fit's SSE (exactly so in a balanced design), so a draw's
   * AICc counts them as the site's AICc does (shared/economics/drawChoices).
   */
  parameterCount: number;
  /** The interval the join fell in (plateau models), kg/ha; NaN when none. */
  joinLowKgHa: Float64Array;
  joinHighKgHa: Float64Array;
}

/** The bootstrap estimates of one site. */
export interface BootstrapDraws {
  resamples: number;
  seed: number;
  /** How plots were resampled. */
  resampling: 'within-rates' | 'within-rates-block-adjusted';
  /** The site's tested rates (the same in every resample: rates are the strata). */
  testedRates: TestedRates;
  /** Plots per resample. */
  n: number;
  models: Partial<Record<ModelName, ModelDraws>>;
}

export interface DrawOptions {
  /** Number of resamples, a whole number ≥ 1. */
  resamples: number;
  /** Seed of the generator: the same seed gives the same draws. */
  seed: number;
  /** Block terms, as for the fit; default 'none'. */
  blocks?: BlockTerms;
  /** Exponential intercept, as for the fit. */
  exponentialIntercept?: 'free' | 'zero';
}

/**
 * Curve parameters a model estimates, as its fit counts them: the catalog's parameter
 * names, less the intercept of the exponential through the origin (a = 0 is fixed).
 */
function curveParameters(model: ModelName, options: DrawOptions): number {
  const q = MODEL_CURVES[model].spec.paramNames.length;
  return model === 'exponential' && options.exponentialIntercept === 'zero' ? q - 1 : q;
}

/** Yields adjusted for block offsets (or the yields themselves without block terms). */
function blockAdjustedYields(site: PreparedSite): Float64Array {
  if (site.blocks !== 'fixed') return site.y;
  if (site.design !== 'full') return site.yGroup;
  // One mean per rate plus effect-coded blocks; subtract the fitted offsets.
  const { n } = site;
  const m = site.rates.length;
  const cols = blockColumns(site);
  const p = m + cols.length;
  const matrix = new Float64Array(n * p);
  for (let i = 0; i < n; i++) matrix[site.groupOf[i] * n + i] = 1;
  cols.forEach((c, k) => matrix.set(c, (m + k) * n));
  const qr = qrDecompose(matrix, n, p);
  if (qr.rank < p) return site.y;
  const qty = Float64Array.from(site.y);
  applyQTranspose(qr, qty);
  const coef = solveUpperTriangular(qr, qty);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let offset = 0;
    for (let k = 0; k < cols.length; k++) offset += coef[m + k] * cols[k][i];
    out[i] = site.y[i] - offset;
  }
  return out;
}

/**
 * Each rate's mean of the (block-adjusted) yields and the factor its plots' deviations from
 * that mean are stretched by before resampling. Drawing r plots with replacement from r
 * deviations gives a rate mean whose variance is (r − 1)/r of the true σ²/r (the divisor-n
 * variance of the plug-in distribution), and the block adjustment takes away a further
 * (n − m − blockDf)/(n − m) of the deviations' sum of squares; stretching by
 * √(r/(r − 1) · (n − m)/(n − m − blockDf)) gives the resampled rate means the right
 * variance on average (the rescaled residuals of Davison & Hinkley, 1997, §6.2.3, applied
 * within strata). With 4 blocks and 6 rates the plain resample's standard errors were
 * 79 % of the truth (√(15/24)), which alone cost the 90 % interval several points of coverage.
 * A rate with one plot has no deviation to stretch (factor 0).
 */
function deviationInflation(
  site: PreparedSite,
  yAdj: Float64Array,
  strata: Strata,
): { rateMeans: Float64Array; inflation: Float64Array } {
  const m = site.rates.length;
  const { members, starts } = strata;
  const rateMeans = new Float64Array(m);
  const inflation = new Float64Array(m);
  const withinDf = site.n - m;
  const residualDf = withinDf - site.blockDf;
  const blockShare = residualDf > 0 ? withinDf / residualDf : 0;
  for (let j = 0; j < m; j++) {
    const r = starts[j + 1] - starts[j];
    let s = 0;
    for (let k = starts[j]; k < starts[j + 1]; k++) s += yAdj[members[k]];
    rateMeans[j] = s / r;
    inflation[j] = r > 1 ? Math.sqrt((r / (r - 1)) * blockShare) : 0;
  }
  return { rateMeans, inflation };
}

/**
 * Resamples one site's plots within rates and re-estimates every asked model on each resample.
 * @param data - rates (kg/ha), yields (kg/ha), optional block labels
 * @param models - the models to re-estimate (the same resample serves them all)
 * @param options - resamples, seed, block terms, exponential intercept
 * @returns every draw's status, parameters, SSE and join interval, by model
 * @throws {StatsInputError} "bad-argument" when resamples is not a whole number ≥ 1; input
 *   errors as prepareSite
 * @example
 * const d = drawBootstrapEstimates(site, ['quadraticPlateau'], { resamples: 200, seed: 7 });
 * d.models.quadraticPlateau!.params.length // 200 × 3 (P, c, x0)
 */
export function drawBootstrapEstimates(
  data: SiteData,
  models: readonly ModelName[],
  options: DrawOptions,
): BootstrapDraws {
  const { resamples, seed } = options;
  if (!(Number.isInteger(resamples) && resamples >= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `resamples must be a whole number ≥ 1; got ${resamples}.`,
    );
  }
  const site = prepareSite(data, options.blocks ?? 'none');
  // Resamples need less precision than the reported fit.
  const fitOptions = { exponentialIntercept: options.exponentialIntercept, searchTolerance: 1e-7 };
  const yAdj = blockAdjustedYields(site);
  const m = site.rates.length;
  const strata = strataOf(site.groupOf, m);
  const random = seededRandom(seed);
  const drawn = new Int32Array(site.n);
  const means = new Float64Array(m);
  // The resample as a prepared site on group sums (blocks already taken out).
  const work: PreparedSite = { ...site, design: 'groups', blocks: 'none', means, ssWithin: 0 };
  const out: Partial<Record<ModelName, ModelDraws>> = {};
  const { starts } = strata;
  const { rateMeans, inflation } = deviationInflation(site, yAdj, strata);
  const value = new Float64Array(site.n);
  for (let b = 0; b < resamples; b++) {
    resampleWithinGroups(strata, random, drawn);
    let ss = 0;
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let k = starts[j]; k < starts[j + 1]; k++) {
        value[k] = rateMeans[j] + inflation[j] * (yAdj[drawn[k]] - rateMeans[j]);
        s += value[k];
      }
      const mean = s / (starts[j + 1] - starts[j]);
      means[j] = mean;
      for (let k = starts[j]; k < starts[j + 1]; k++) ss += (value[k] - mean) ** 2;
    }
    work.ssWithin = ss;
    for (const model of models) {
      const est = estimateCurve(work, model, fitOptions);
      let d = out[model];
      if (!d) {
        const paramNames = Object.keys(est.params);
        d = {
          model,
          paramNames,
          status: new Uint8Array(resamples),
          params: new Float64Array(resamples * paramNames.length),
          sse: new Float64Array(resamples),
          parameterCount: curveParameters(model, options) + site.blockDf,
          joinLowKgHa: new Float64Array(resamples).fill(NaN),
          joinHighKgHa: new Float64Array(resamples).fill(NaN),
        };
        out[model] = d;
      }
      const k = d.paramNames.length;
      d.status[b] = DRAW_STATUSES.indexOf(est.status);
      for (let j = 0; j < k; j++) d.params[b * k + j] = est.params[d.paramNames[j]] ?? NaN;
      d.sse[b] = est.sse;
      if (est.joinBetweenKgHa) {
        d.joinLowKgHa[b] = est.joinBetweenKgHa[0];
        d.joinHighKgHa[b] = est.joinBetweenKgHa[1];
      }
    }
  }
  return {
    resamples,
    seed,
    resampling: site.blocks === 'fixed' ? 'within-rates-block-adjusted' : 'within-rates',
    testedRates: site.testedRates,
    n: site.n,
    models: out,
  };
}

/**
 * One draw's fit status, decoded from its stored byte.
 * @param d - one model's draws
 * @param b - the resample, 0 ≤ b < resamples
 * @returns the status of that resample's estimate
 * @example
 * drawStatus(d.models.linearPlateau!, 0) // e.g. 'ok'
 */
export function drawStatus(d: ModelDraws, b: number): FitStatus {
  return DRAW_STATUSES[d.status[b]];
}

/**
 * A reader of one model's draws as curve summaries (what economicOptimum reads). It refills
 * one object per call instead of making one per draw: read each summary before the next call.
 * @param draws - the site's draws
 * @param model - a model that was drawn
 * @returns a function from draw index to that draw's summary, or null when the model was not drawn
 * @example
 * const at = drawSummaries(d, 'quadratic')!;
 * economicOptimum(at(0), prices).rateKgHa
 */
export function drawSummaries(
  draws: BootstrapDraws,
  model: ModelName,
): ((b: number) => CurveSummary) | null {
  const d = draws.models[model];
  if (!d) return null;
  const params: Record<string, number> = {};
  const summary: {
    -readonly [K in keyof CurveSummary]: CurveSummary[K];
  } = {
    model,
    status: 'ok',
    params,
    testedRates: draws.testedRates,
    joinBetweenKgHa: null,
  };
  const k = d.paramNames.length;
  return (b) => {
    summary.status = DRAW_STATUSES[d.status[b]];
    for (let j = 0; j < k; j++) params[d.paramNames[j]] = d.params[b * k + j];
    summary.joinBetweenKgHa = Number.isNaN(d.joinLowKgHa[b])
      ? null
      : [d.joinLowKgHa[b], d.joinHighKgHa[b]];
    return summary;
  };
}
