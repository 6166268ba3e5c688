/**
 * The regional quadratic with a treatment factor's level (source, timing…) as a fixed effect, a
 * linear mixed model over the site-years (Pinheiro & Bates, Mixed-Effects Models in S and
 * S-PLUS, 2000, ch. 2 and §2.4.2; fitted as regionalMixedModel is):
 *   y = a + b_k·x + c_k·x² + (a_s + b_s·x + c_s·x²) + block offset + ε   (plot of level k),
 *   y = a + a_s + block offset + ε                                       (a shared check plot),
 * with (a_s, b_s, c_s) ~ N(0, Ψ) per site-year and ε ~ N(0, σ²). One intercept a, because the
 * zero-rate check belongs to every level (the trade's design, siteLevels), and a linear and a
 * quadratic term per level; the site-year effects are those of the regional quadratic, shared by
 * the levels (a site-year's soil moves every level's curve alike).
 *
 * Whether the levels share one regional curve (b_k = b_1 and c_k = c_1 for every k, 2·(L − 1)
 * constraints) is tested twice:
 * - likelihood ratio: 2·(ℓ_ML(levels) − ℓ_ML(one curve)), the two fitted by maximum likelihood
 *   (REML likelihoods of different fixed effects are not comparable; Pinheiro & Bates §2.4.2),
 *   against χ² on 2·(L − 1) df. The headline.
 * - Wald: the REML estimates' contrasts Cβ with their covariance, (Cβ)ᵀ(C·Cov·Cᵀ)⁻¹(Cβ) against
 *   the same χ².
 * Both are asymptotic and read liberal with few site-years (Pinheiro & Bates §2.4.2 show the
 * likelihood-ratio test anti-conservative for fixed effects). Measured on simulated rate × timing
 * regions with equal timings (`npm run validate`, 400 regions each): 6.5 % declared different at
 * 5 % with 4 site-years, 5.0 % with 8, the Wald test the same; the sentence cautions below 8.
 *
 * Choices shared with regionalMixedModel (its header says why): rates divided by the highest rate
 * tested (u = x / s), back-transformed exactly (REML log-likelihood shifted by −(L·1 + L·2)·ln s,
 * the scale of the rate columns); block offsets fixed and absorbed within each site-year; Ψ
 * unstructured by default. With blocks, the ML fits (and so the likelihood ratio) are those of
 * the within-block contrasts of the plots (mixedModelData's absorption): both models see the
 * same data, so their ratio is a likelihood ratio, but it is not R's ML with block contrasts in
 * the fixed formula (σ² is divided by n − contrasts, not n). The reference checks hold R's nlme
 * to it without blocks, and the Wald test (REML, where absorption is exact) with blocks.
 *
 * Edge cases: fewer than 4 site-years with the factor, a level with fewer than 2 fertilized
 * rates, or a rank-deficient design: no model, with the reason.
 */
import { fitLinearMixedModel } from '../optimize/fitLinearMixedModel';
import { chiSquareUpperP } from '../stats/distributions';
import { mixedModelData, type MixedModelGroup } from '../stats/mixedModelData';
import type { CovarianceStructure } from '../stats/mixedModelDeviance';
import { choleskyLower, inverseFromCholesky } from '../stats/smallCholesky';
import type { MixedModelSite } from './regionalMixedModel';

/** One site-year's plots with each plot's level. */
export interface LevelMixedModelSite extends MixedModelSite {
  /** Per plot: the level's index in the model's `levels`, or −1 for a shared check (rate 0). */
  levelIndex: readonly number[];
}

/** One level's regional (population) curve, in kg/ha. */
export interface LevelMixedModelCurve {
  level: string;
  /** a (kg/ha, the shared check), b_k (kg grain per kg N), c_k (kg/ha per (kg N/ha)²). */
  fixed: { a: number; b: number; c: number };
  stdErrors: { a: number; b: number; c: number };
  /** Cov of (a, b_k, c_k), 3 × 3, as mixedModelOptimum reads it. */
  fixedCovariance: number[][];
  /** Lowest and highest rate of this level's plots and the checks, kg/ha. */
  testedRangeKgHa: [number, number];
  /** Degrees of freedom for its optimum's interval: site-years − 3, as the regional quadratic. */
  dfFixed: number;
  /** Site-years with plots of this level. */
  siteYears: number;
}

/** A χ² test of whether the levels share one regional curve. */
export interface LevelChiSquareTest {
  statistic: number;
  df: number;
  p: number;
}

/** The regional quadratic with the level as a fixed effect. */
export interface RegionalLevelMixedModel {
  model: 'quadratic-by-level';
  factor: string;
  structure: CovarianceStructure;
  levels: LevelMixedModelCurve[];
  /** β in kg/ha units, ordered a, b_1, c_1, b_2, c_2, …, and its covariance (REML). */
  fixed: number[];
  fixedCovariance: number[][];
  /** Ψ of (a_s, b_s, c_s), 3 × 3, and σ², (kg/ha)² (REML). */
  siteCovariance: number[][];
  residualVariance: number;
  logLikelihoodReml: number;
  /** ML log-likelihoods with a curve per level and with one curve for every level. */
  logLikelihoodMl: number;
  logLikelihoodMlOneCurve: number;
  /** The one regional curve's fixed effects (ML), kg/ha. */
  oneCurve: { a: number; b: number; c: number };
  /** Likelihood ratio (ML) of one curve against a curve per level: the headline test. */
  likelihoodRatio: LevelChiSquareTest;
  /** Wald test of the same constraints on the REML estimates. */
  wald: LevelChiSquareTest;
  siteYears: number;
  observations: number;
  blockOffsets: boolean;
  /** False when a search stopped at its evaluation limit. */
  converged: boolean;
}

/** Why there is no level model. */
export interface NoRegionalLevelMixedModel {
  model: null;
  factor: string;
  reason: string;
}

/**
 * Fits the regional quadratic with a curve per level and the shared check, and tests it against
 * one curve for every level.
 * @param sites - site-years (kg/ha) with each plot's level index (−1: a shared check)
 * @param levels - the level names, indexed by levelIndex
 * @param factor - the factor's column header
 * @param structure - Ψ unstructured (default) or diagonal
 * @returns the fit in kg/ha with the two tests, or the reason there is none
 * @example
 * const m = fitRegionalLevelMixedModel(sites, ['At planting', 'Split'], 'Timing');
 * if (m.model) m.likelihoodRatio.p // e.g. 4e-19
 */
export function fitRegionalLevelMixedModel(
  sites: readonly LevelMixedModelSite[],
  levels: readonly string[],
  factor: string,
  structure: CovarianceStructure = 'unstructured',
): RegionalLevelMixedModel | NoRegionalLevelMixedModel {
  const none = (reason: string): NoRegionalLevelMixedModel => ({ model: null, factor, reason });
  const L = levels.length;
  if (L < 2) return none(`The ${factor} column has fewer than two levels across the site-years.`);
  if (sites.length < 4) {
    return none(
      `A regional model by ${factor.toLowerCase()} needs at least 4 site-years with the factor; there are ${sites.length}.`,
    );
  }
  let scale = 0;
  const ranges = levels.map(() => [Infinity, -Infinity]);
  const rates = levels.map(() => new Set<number>());
  const siteCount = levels.map(() => new Set<string>());
  for (const s of sites) {
    s.rateKgHa.forEach((x, i) => {
      if (x > scale) scale = x;
      const k = s.levelIndex[i];
      const into = k < 0 ? levels.map((_, j) => j) : [k];
      for (const j of into) {
        ranges[j][0] = Math.min(ranges[j][0], x);
        ranges[j][1] = Math.max(ranges[j][1], x);
      }
      if (k >= 0 && x > 0) {
        rates[k].add(x);
        siteCount[k].add(s.site);
      }
    });
  }
  const thin = levels.findIndex((_, k) => rates[k].size < 2);
  if (thin >= 0) {
    return none(
      `Level "${levels[thin]}" has fewer than 2 fertilized rates across the site-years; a quadratic per level needs 2.`,
    );
  }
  const random = (x: number) => {
    const u = x / scale;
    return [1, u, u * u];
  };
  const full = (x: number, k: number) => {
    const row = new Array<number>(1 + 2 * L).fill(0);
    row[0] = 1;
    if (k >= 0) {
      const u = x / scale;
      row[1 + 2 * k] = u;
      row[2 + 2 * k] = u * u;
    }
    return row;
  };
  const groups = (fixed: (x: number, k: number) => number[]): MixedModelGroup[] =>
    sites.map((s) => ({
      name: s.site,
      fixedRows: s.rateKgHa.map((x, i) => fixed(x, s.levelIndex[i])),
      randomRows: s.rateKgHa.map(random),
      y: s.yieldKgHa,
      blocks: s.block,
    }));
  const data = mixedModelData(groups(full));
  const oneData = mixedModelData(groups((x) => random(x)));
  const reml = fitLinearMixedModel(data, 'REML', structure);
  if (reml === null) return none('The rates and levels do not support a quadratic per level.');
  const ml = fitLinearMixedModel(data, 'ML', structure, reml.theta);
  const oneMl = ml && fitLinearMixedModel(oneData, 'ML', structure, ml.theta);
  if (ml === null || oneMl === null) return none('The maximum-likelihood fits failed.');
  // Back to kg/ha: the b columns were divided by s, the c columns by s².
  const d = [1, ...levels.flatMap(() => [1 / scale, 1 / (scale * scale)])];
  const fixed = reml.fixed.map((v, i) => v * d[i]);
  const fixedCovariance = reml.fixedCovariance.map((row, i) => row.map((v, j) => v * d[i] * d[j]));
  const d3 = [1, 1 / scale, 1 / (scale * scale)];
  const curves = levels.map((level, k): LevelMixedModelCurve => {
    const idx = [0, 1 + 2 * k, 2 + 2 * k];
    const cov = idx.map((i) => idx.map((j) => fixedCovariance[i][j]));
    return {
      level,
      fixed: { a: fixed[0], b: fixed[idx[1]], c: fixed[idx[2]] },
      stdErrors: { a: Math.sqrt(cov[0][0]), b: Math.sqrt(cov[1][1]), c: Math.sqrt(cov[2][2]) },
      fixedCovariance: cov,
      testedRangeKgHa: [ranges[k][0], ranges[k][1]],
      dfFixed: sites.length - 3,
      siteYears: siteCount[k].size,
    };
  });
  const df = 2 * (L - 1);
  const lr = Math.max(0, 2 * (ml.logLikelihood - oneMl.logLikelihood));
  return {
    model: 'quadratic-by-level',
    factor,
    structure,
    levels: curves,
    fixed,
    fixedCovariance,
    siteCovariance: reml.randomCovariance.map((row, i) => row.map((v, j) => v * d3[i] * d3[j])),
    residualVariance: reml.residualVariance,
    logLikelihoodReml: reml.logLikelihood - 3 * L * Math.log(scale),
    logLikelihoodMl: ml.logLikelihood,
    logLikelihoodMlOneCurve: oneMl.logLikelihood,
    oneCurve: { a: oneMl.fixed[0], b: oneMl.fixed[1] * d3[1], c: oneMl.fixed[2] * d3[2] },
    likelihoodRatio: { statistic: lr, df, p: chiSquareUpperP(lr, df) },
    wald: levelWaldTest(fixed, fixedCovariance, L),
    siteYears: sites.length,
    observations: data.n,
    blockOffsets: sites.some((s) => s.block !== undefined && new Set(s.block).size > 1),
    converged: reml.converged && ml.converged && oneMl.converged,
  };
}

/**
 * The Wald test of one curve for every level: (Cβ)ᵀ(C·V·Cᵀ)⁻¹(Cβ) for the contrasts b_k − b_1
 * and c_k − c_1, k = 2…L, against χ² on 2·(L − 1) df. Unchanged by rescaling the rate.
 * @param beta - a, b_1, c_1, …, b_L, c_L in any consistent units
 * @param cov - their covariance, same order
 * @param L - number of levels
 * @returns the statistic, df and p (NaN when C·V·Cᵀ is not positive definite)
 * @example
 * levelWaldTest(m.fixed, m.fixedCovariance, 2).p // e.g. 0.96
 */
export function levelWaldTest(
  beta: readonly number[],
  cov: readonly (readonly number[])[],
  L: number,
): LevelChiSquareTest {
  const rows: number[][] = [];
  for (let k = 1; k < L; k++) {
    for (const t of [1, 2]) {
      const r = new Array<number>(beta.length).fill(0);
      r[t] = -1;
      r[2 * k + t] = 1;
      rows.push(r);
    }
  }
  const m = rows.length;
  const cb = rows.map((r) => r.reduce((s, v, i) => s + v * beta[i], 0));
  const ccc = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      let v = 0;
      for (let a = 0; a < beta.length; a++) {
        if (rows[i][a] === 0) continue;
        for (let b = 0; b < beta.length; b++) v += rows[i][a] * cov[a][b] * rows[j][b];
      }
      ccc[i * m + j] = v;
    }
  }
  const lower = new Float64Array(m * m);
  if (!choleskyLower(ccc, m, lower)) return { statistic: NaN, df: m, p: NaN };
  const inv = inverseFromCholesky(lower, m);
  let w = 0;
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) w += cb[i] * inv[i * m + j] * cb[j];
  return { statistic: w, df: m, p: chiSquareUpperP(w, m) };
}
