/**
 * The regional quadratic as a linear mixed model (Pinheiro & Bates, Mixed-Effects Models in S
 * and S-PLUS, 2000, ch. 2; fitted as in Bates et al., J. Stat. Softw. 67(1), 2015):
 *   y = (a + a_s) + (b + b_s)·x + (c + c_s)·x² + block offset + ε,
 * with (a_s, b_s, c_s) ~ N(0, Ψ) per site-year (Ψ unstructured, 3 × 3) and ε ~ N(0, σ²).
 * a, b, c are the population (regional) curve; a_s, b_s, c_s the site-year's departures, whose
 * conditional modes (BLUPs) give each site-year's own curve, shrunk towards the regional one.
 *
 * Choices:
 * - Block offsets are fixed effects nested in the site-year, absorbed within each site
 *   (mixedModelData: every column and y are projected off the site's sum-to-zero block
 *   contrasts, a − ā_block + ā_site when balanced, and each contrast removes one
 *   observation). They are not random: four blocks say little about a block variance, and
 *   the per-site analysis treats them as fixed too. A site with fewer than
 *   two labelled blocks gets none. With blocks the REML log-likelihood exceeds R's (block
 *   contrasts in the fixed formula) by ½·log|CᵀC| summed over sites, a constant of the layout.
 * - Rates are divided by the highest rate tested anywhere before fitting (u = x / s), so the
 *   columns 1, u, u² are all of order 1 instead of 1, 10², 10⁴. The fit is back-transformed
 *   exactly: b = b_u / s, c = c_u / s², Cov(β) = D·Cov_u·D and Ψ = D·Ψ_u·D with
 *   D = diag(1, 1/s, 1/s²); the ML log-likelihood does not change; the REML one gains
 *   log|det D| = −3·ln s, since its log|RX|² term follows the scale of X (so it equals the
 *   REML log-likelihood of the model written in kg/ha, as R's nlme reports it).
 * - REML gives the estimates; ML is fitted too (from REML's θ) for the AIC, which compares
 *   fixed-effect structures only under ML.
 * - With few site-years the REML maximum often lies on the boundary: Ψ of rank 2, one
 *   combination of a_s, b_s, c_s with no variance (both R test sets, the demo's six corn sites
 *   and 16 generated site-years). The fit reports that maximum as found; R's nlme, whose
 *   log-Cholesky parameters cannot reach the boundary, stops short of it with the same fixed
 *   effects to 1e-4 but variance components up to 30 % apart on a covariance near 0.
 */
import { fitLinearMixedModel } from '../optimize/fitLinearMixedModel';
import { mixedModelData, type MixedModelGroup } from '../stats/mixedModelData';
import type { CovarianceStructure } from '../stats/mixedModelDeviance';

/** One site-year's plots as the regional model reads them. */
export interface MixedModelSite {
  site: string;
  /** N rate per plot, kg/ha. */
  rateKgHa: readonly number[];
  /** Yield per plot, kg/ha at standard moisture. */
  yieldKgHa: readonly number[];
  /** Block label per plot, or undefined for no block offsets. */
  block?: readonly string[];
}

/** One site-year's curve: the regional curve plus its conditional modes. */
export interface SiteYearCurve {
  site: string;
  /** Intercept, kg/ha. */
  aKgHa: number;
  /** Linear coefficient, kg grain per kg N. */
  bKgPerKg: number;
  /** Quadratic coefficient, kg grain per (kg N/ha)² per ha. */
  cKgHaPerKgHa2: number;
}

/** The regional quadratic mixed model, in kg/ha. */
export interface RegionalMixedModel {
  model: 'quadratic';
  structure: CovarianceStructure;
  /** Population curve: a (kg/ha), b (kg/kg), c (kg/ha per (kg/ha)²). */
  fixed: { a: number; b: number; c: number };
  stdErrors: { a: number; b: number; c: number };
  /** Cov of (a, b, c), same units squared, 3 × 3. */
  fixedCovariance: number[][];
  /** Ψ, the site-year effects' covariance of (a_s, b_s, c_s), 3 × 3. */
  siteCovariance: number[][];
  /** σ², the plot error variance, (kg/ha)². */
  residualVariance: number;
  logLikelihoodReml: number;
  logLikelihoodMl: number;
  /** AIC of the ML fit (β, Ψ, σ² counted), for comparing regional models. */
  aic: number;
  /** AIC of the REML fit, as R's nlme reports it. */
  aicReml: number;
  siteYears: number;
  observations: number;
  /** Whether block offsets (fixed, nested in site-year) were absorbed. */
  blockOffsets: boolean;
  /** Lowest and highest rate tested across the site-years, kg/ha. */
  testedRangeKgHa: [number, number];
  /** Fixed-effect degrees of freedom for intervals: site-years − 3. */
  dfFixed: number;
  siteCurves: SiteYearCurve[];
  /** False when the REML search stopped at its evaluation limit. */
  converged: boolean;
}

/** Why there is no regional mixed model. */
export interface NoRegionalMixedModel {
  model: null;
  reason: string;
}

/**
 * Fits the regional quadratic with random site-year effects on all three coefficients.
 * @param sites - the site-years' plots (kg/ha); at least 4 site-years with 3 distinct rates overall
 * @param structure - Ψ unstructured (default) or diagonal
 * @returns the fit in kg/ha, or the reason there is none
 * @example
 * const m = fitRegionalMixedModel(sites);
 * if (m.model) m.fixed.b // kg grain per kg N at 0 N
 */
export function fitRegionalMixedModel(
  sites: readonly MixedModelSite[],
  structure: CovarianceStructure = 'unstructured',
): RegionalMixedModel | NoRegionalMixedModel {
  const rates = sites.flatMap((s) => [...s.rateKgHa]);
  const distinct = new Set(rates).size;
  if (sites.length < 4 || distinct < 3) {
    return {
      model: null,
      reason: `A regional mixed model needs at least 4 site-years and 3 distinct rates; there are ${sites.length} and ${distinct}.`,
    };
  }
  // A loop, not Math.min(...rates): spreading every plot's rate as arguments overflows the
  // stack past about 100,000 plots.
  let low = Infinity;
  let scale = -Infinity;
  for (const x of rates) {
    if (x < low) low = x;
    if (x > scale) scale = x;
  }
  if (!(scale > 0)) return { model: null, reason: 'Every tested rate is 0.' };
  const groups: MixedModelGroup[] = sites.map((s) => {
    const rows = s.rateKgHa.map((x) => {
      const u = x / scale;
      return [1, u, u * u];
    });
    return { name: s.site, fixedRows: rows, randomRows: rows, y: s.yieldKgHa, blocks: s.block };
  });
  const data = mixedModelData(groups);
  const reml = fitLinearMixedModel(data, 'REML', structure);
  if (reml === null) return { model: null, reason: 'The rates do not support a quadratic.' };
  const ml = fitLinearMixedModel(data, 'ML', structure, reml.theta);
  const d = [1, 1 / scale, 1 / (scale * scale)];
  const back = (m: number[][]): number[][] => m.map((row, i) => row.map((v, j) => v * d[i] * d[j]));
  const fixed = reml.fixed.map((v, i) => v * d[i]);
  const fixedCovariance = back(reml.fixedCovariance);
  const se = fixedCovariance.map((row, i) => Math.sqrt(row[i]));
  const siteCurves = reml.conditionalModes.map((g) => ({
    site: g.name,
    aKgHa: fixed[0] + g.effects[0] * d[0],
    bKgPerKg: fixed[1] + g.effects[1] * d[1],
    cKgHaPerKgHa2: fixed[2] + g.effects[2] * d[2],
  }));
  const remlShift = -3 * Math.log(scale);
  return {
    model: 'quadratic',
    structure,
    fixed: { a: fixed[0], b: fixed[1], c: fixed[2] },
    stdErrors: { a: se[0], b: se[1], c: se[2] },
    fixedCovariance,
    siteCovariance: back(reml.randomCovariance),
    residualVariance: reml.residualVariance,
    logLikelihoodReml: reml.logLikelihood + remlShift,
    logLikelihoodMl: ml?.logLikelihood ?? NaN,
    aic: ml?.aic ?? NaN,
    aicReml: reml.aic - 2 * remlShift,
    siteYears: sites.length,
    observations: data.n,
    blockOffsets: sites.some((s) => s.block !== undefined && new Set(s.block).size > 1),
    testedRangeKgHa: [low, scale],
    dfFixed: sites.length - 3,
    siteCurves,
    converged: reml.converged && (ml?.converged ?? false),
  };
}
