/**
 * Uncertainty of the economic optimum by a seeded stratified bootstrap: the
 * plots of each rate are resampled with replacement (shared/optimize), the
 * model is re-estimated on every resample with the same global profiled search,
 * and the optimum is recomputed at the same prices. Reports the percentile
 * interval of the optimum rate (Efron & Tibshirani, An Introduction to the
 * Bootstrap, 1993, §13.3), the share of resamples without an interior optimum,
 * and for each candidate rate the probability that it returns within a chosen
 * amount per ha of each resample's best rate.
 *
 * With block terms the yields are first adjusted for the block offsets (for a
 * balanced design y − ȳ_block + ȳ, exactly what the blocked fit sees; otherwise
 * the offsets of the one-mean-per-rate model with blocks), and the adjusted
 * yields are resampled within rates. Resampling raw plots within blocks instead
 * would leave blocks without some rates and break the design.
 *
 * Speed: rates are fixed across resamples, so a resample only rebuilds the
 * per-rate means and within-rate SS; the fit then runs on group sums.
 */
import { estimateCurve } from '../models/estimateCurve';
import type { CurveEstimate, FitOptions, ModelName, SiteData } from '../models/modelTypes';
import { prepareSite, type PreparedSite } from '../models/prepareSite';
import { blockColumns } from '../models/solve/profileSolver';
import { resampleWithinGroups, strataOf } from '../optimize/resampleWithinGroups';
import { seededRandom } from '../optimize/seededRandom';
import { StatsInputError } from '../stats/errors';
import { applyQTranspose, qrDecompose, solveUpperTriangular } from '../stats/qr';
import { sortedQuantile } from '../stats/quantile';
import {
  economicOptimum,
  netReturn,
  type EconomicOptimum,
  type OptimumStatus,
} from './economicOptimum';
import { assertPrices, type Prices } from './priceRatio';
import { recommendationCautions } from './recommendationCautions';

export interface BootstrapOptions {
  /** Number of resamples, default 1000. */
  resamples?: number;
  /** Seed of the generator, default 1: the same seed gives the same result. */
  seed?: number;
  /** Level of the percentile interval, default 0.95. */
  confidence?: number;
  /** Block terms, as for the fit; default 'none'. */
  blocks?: FitOptions['blocks'];
  /** Exponential intercept, as for the fit. */
  exponentialIntercept?: FitOptions['exponentialIntercept'];
  /** "Within" margin for the probability curve, currency/ha; default 10. */
  withinAmountPerHa?: number;
  /** Rates to evaluate that probability at, kg/ha; default 51 even steps from 0 to the highest rate. */
  candidateRatesKgHa?: ArrayLike<number>;
  /** How the point estimate's explanation writes rates; default kg/ha rounded. */
  rateFormat?: FitOptions['rateFormat'];
}

export interface BootstrapOptimum {
  model: ModelName;
  resamples: number;
  seed: number;
  confidence: number;
  /** How plots were resampled. */
  resampling: 'within-rates' | 'within-rates-block-adjusted';
  /** The optimum of the original data (same search as every resample). */
  pointEstimate: EconomicOptimum;
  /** The optimum rate of every resample, kg/ha; NaN where a resample has no single rate. */
  rateSamplesKgHa: Float64Array;
  /** Percentile interval of the optimum rate, kg/ha, over resamples with a rate; null if none. */
  ciKgHa: [number, number] | null;
  /** Median optimum rate over resamples with a rate, kg/ha (NaN if none). */
  medianKgHa: number;
  /** Share of resamples whose optimum is not interior (zero, capped, corner, first interval, none). */
  shareNoInteriorOptimum: number;
  /** Share of resamples by optimum status. */
  shareByStatus: Record<OptimumStatus, number>;
  /** The margin used, currency/ha. */
  withinAmountPerHa: number;
  candidateRatesKgHa: Float64Array;
  /**
   * For each candidate rate: the share of resamples in which its net return is
   * within withinAmountPerHa of that resample's best net return.
   */
  probabilityWithin: Float64Array;
  cautions: readonly string[];
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
 * Bootstraps the economic optimum rate of one model at one site.
 * @param data - rates (kg/ha), yields (kg/ha), optional block labels
 * @param model - which model
 * @param prices - grain price (currency/kg), nutrient price (currency/kg), application cost (currency/ha)
 * @param options - resamples (1000), seed (1), confidence (0.95), blocks, margin (currency/ha), candidate rates
 * @returns interval, share without interior optimum, probability curve, and every resample's rate
 * @throws {StatsInputError} "bad-argument" for a non-positive price, resamples not a whole number ≥ 1,
 *   confidence outside (0, 1) or a negative margin; input errors as prepareSite
 * @example
 * const b = bootstrapOptimum(site, 'quadraticPlateau', { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 }, { seed: 7 });
 * b.ciKgHa // e.g. [118, 171]
 */
export function bootstrapOptimum(
  data: SiteData,
  model: ModelName,
  prices: Prices,
  options: BootstrapOptions = {},
): BootstrapOptimum {
  assertPrices(prices);
  const resamples = options.resamples ?? 1000;
  const seed = options.seed ?? 1;
  const confidence = options.confidence ?? 0.95;
  const margin = options.withinAmountPerHa ?? 10;
  if (!(Number.isInteger(resamples) && resamples >= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `resamples must be a whole number ≥ 1; got ${resamples}.`,
    );
  }
  if (!(confidence > 0 && confidence < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `confidence must lie strictly between 0 and 1; got ${confidence}.`,
    );
  }
  if (!(Number.isFinite(margin) && margin >= 0)) {
    throw new StatsInputError(
      'bad-argument',
      `withinAmountPerHa must be zero or positive; got ${margin}.`,
    );
  }
  const site = prepareSite(data, options.blocks ?? 'none');
  // The point estimate with the full fits' precision; resamples need less.
  const original = estimateCurve(site, model, {
    exponentialIntercept: options.exponentialIntercept,
    rateFormat: options.rateFormat,
  });
  const fitOptions: FitOptions = {
    exponentialIntercept: options.exponentialIntercept,
    searchTolerance: 1e-7,
  };
  const pointEstimate = economicOptimum(original, prices, { rateFormat: options.rateFormat });

  const highest = site.testedRates.highestKgHa;
  const candidates = options.candidateRatesKgHa
    ? Float64Array.from(options.candidateRatesKgHa)
    : Float64Array.from({ length: 51 }, (_, i) => (highest * i) / 50);

  const yAdj = blockAdjustedYields(site);
  const m = site.rates.length;
  const strata = strataOf(site.groupOf, m);
  const random = seededRandom(seed);
  const drawn = new Int32Array(site.n);
  const means = new Float64Array(m);
  // The resample as a prepared site on group sums (blocks already taken out).
  const work: PreparedSite = {
    ...site,
    design: 'groups',
    blocks: 'none',
    means,
    ssWithin: 0,
  };

  const rateSamples = new Float64Array(resamples);
  const statusCount: Record<OptimumStatus, number> = {
    interior: 0,
    zero: 0,
    'capped-at-highest': 0,
    corner: 0,
    'join-in-first-interval': 0,
    'not-available': 0,
  };
  const within = new Float64Array(candidates.length);
  const nets = new Float64Array(candidates.length);
  const { starts } = strata;
  for (let b = 0; b < resamples; b++) {
    resampleWithinGroups(strata, random, drawn);
    let ss = 0;
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let k = starts[j]; k < starts[j + 1]; k++) s += yAdj[drawn[k]];
      const mean = s / (starts[j + 1] - starts[j]);
      means[j] = mean;
      for (let k = starts[j]; k < starts[j + 1]; k++) ss += (yAdj[drawn[k]] - mean) ** 2;
    }
    work.ssWithin = ss;
    const est: CurveEstimate = estimateCurve(work, model, fitOptions);
    const opt = economicOptimum(est, prices);
    statusCount[opt.status]++;
    rateSamples[b] = opt.rateKgHa ?? NaN;
    let best = opt.netReturnPerHa ?? -Infinity;
    for (let c = 0; c < candidates.length; c++) {
      nets[c] = netReturn(est, prices, candidates[c]);
      if (nets[c] > best) best = nets[c];
    }
    for (let c = 0; c < candidates.length; c++) if (nets[c] >= best - margin) within[c]++;
  }

  const finite = rateSamples.filter((v) => Number.isFinite(v)).sort();
  const tail = (1 - confidence) / 2;
  const shareByStatus = { ...statusCount };
  for (const key of Object.keys(shareByStatus) as OptimumStatus[]) shareByStatus[key] /= resamples;
  return {
    model,
    resamples,
    seed,
    confidence,
    resampling: site.blocks === 'fixed' ? 'within-rates-block-adjusted' : 'within-rates',
    pointEstimate,
    rateSamplesKgHa: rateSamples,
    ciKgHa:
      finite.length > 0 ? [sortedQuantile(finite, tail), sortedQuantile(finite, 1 - tail)] : null,
    medianKgHa: finite.length > 0 ? sortedQuantile(finite, 0.5) : NaN,
    shareNoInteriorOptimum: 1 - statusCount.interior / resamples,
    shareByStatus,
    withinAmountPerHa: margin,
    candidateRatesKgHa: candidates,
    probabilityWithin: within.map((v) => v / resamples),
    cautions: recommendationCautions,
  };
}
