/**
 * The regional quadratic-plateau and linear-plateau as nonlinear mixed models (Pinheiro &
 * Bates, Mixed-Effects Models in S and S-PLUS, 2000, ch. 6–7), fitted by ML with the
 * Lindstrom–Bates alternation (shared/optimize/fitNonlinearMixedModel), as R's nlme fits them:
 *   quadratic-plateau: y = (P + P_s) + c·min(x − (x0 + x0_s), 0)²,
 *   linear-plateau:    y = (P + P_s) + b·min(x − (x0 + x0_s), 0),
 * plus block offsets, with (P_s, x0_s) ~ N(0, Ψ) per site-year and ε ~ N(0, σ²). P is the
 * plateau (kg/ha), x0 the join (kg/ha), c the curvature (c < 0) or b the slope below the join
 * (kg grain per kg N). Both forms share the parameterization, so Ψ reads the same: how much
 * site-years' plateaus and joins differ. The curvature or slope is fixed: with a handful of
 * site-years three random effects are not identified.
 *
 * Choices:
 * - Ψ diagonal by default (pdDiag in nlme). With six site-years (the demo's corn) a plateau–join
 *   correlation is not estimable: R's nlme with Ψ unstructured ends at a correlation of −0.999
 *   for the linear-plateau, and for the quadratic-plateau stops where re-solving moves its fixed
 *   effects by 1e-3 (tests/fixtures/mixed/plateauMixedModelFits.json). nlme converges on the
 *   demo with neither structure (the diagonal hits its 500-iteration limit, both forms); ours
 *   converges for the quadratic-plateau with both, and the linear-plateau cycles with both. On
 *   18 generated site-years both structures converge in R and here, to the same estimates.
 *   Unstructured is available for large series.
 * - Starting values from the site-years' own fits (plateauMixedStart): the medians of the
 *   plateaus, curvatures or slopes and joins of the site-years whose own fit levelled off, so
 *   the user never gives starts; the starting Ψ from their spread (scaled median absolute
 *   deviations), which only sets the working units of the random effects.
 * - Rates are divided by the highest rate tested (u = x / s) while fitting, as the quadratic's
 *   mixed model does; the fit is reported in kg/ha. The ML log-likelihood does not change, so
 *   the AIC is comparable with the quadratic mixed model's ML AIC (same plots, same absorbed
 *   block offsets): k = 3 fixed + entries of Ψ + 1 for σ², counted as nlme counts it.
 * - The population curve is the curve at zero random effects (the fixed effects), the curve
 *   of a typical site-year, not the average of the site-years' curves.
 */
import { estimateCurve } from '../models/estimateCurve';
import { prepareSite } from '../models/prepareSite';
import {
  fitNonlinearMixedModel,
  type NonlinearMixedGroup,
  type NonlinearMixedSpec,
} from '../optimize/fitNonlinearMixedModel';
import { thetaLength, type CovarianceStructure } from '../stats/mixedModelDeviance';
import { sampleMedian } from '../stats/quantile';
import type { MixedModelSite } from './regionalMixedModel';

/** The plateau forms fitted as regional mixed models. */
export type PlateauMixedForm = 'quadraticPlateau' | 'linearPlateau';

/** The plateau forms in the order reports list them. */
export const PLATEAU_MIXED_FORMS: readonly PlateauMixedForm[] = [
  'quadraticPlateau',
  'linearPlateau',
];

/** Population curve: plateau P (kg/ha), shape c (kg/ha per (kg N/ha)²) or b (kg/kg), join x0 (kg N/ha). */
export interface PlateauFixedEffects {
  P: number;
  shape: number;
  x0: number;
}

/** One site-year's curve: the population curve plus its conditional modes. */
export interface PlateauSiteYearCurve {
  site: string;
  plateauKgHa: number;
  joinKgHa: number;
}

/** A regional plateau mixed model, in kg/ha. */
export interface RegionalPlateauMixedModel {
  model: PlateauMixedForm;
  structure: CovarianceStructure;
  fixed: PlateauFixedEffects;
  stdErrors: PlateauFixedEffects;
  /** Cov of (P, shape, x0), 3 × 3, in their units squared. */
  fixedCovariance: number[][];
  /** Ψ of (P_s, x0_s), 2 × 2: (kg/ha)², kg/ha·kg N/ha, (kg N/ha)². */
  siteCovariance: number[][];
  /** σ², (kg/ha)². */
  residualVariance: number;
  /** ML log-likelihood of the converged linearization, as R's nlme reports it. */
  logLikelihoodMl: number;
  /** −2ℓ + 2k, k = 3 + entries of Ψ + 1. */
  aic: number;
  siteYears: number;
  observations: number;
  blockOffsets: boolean;
  testedRangeKgHa: [number, number];
  /** Degrees of freedom for intervals: site-years − 3, as the quadratic's. */
  dfFixed: number;
  siteCurves: PlateauSiteYearCurve[];
  /** PNLS + LME alternations taken. */
  iterations: number;
  /** The alternation reached a fixed point. */
  converged: boolean;
  /**
   * Converged, or cycling between linearizations with the fixed effects within 0.1 % (and θ
   * within 1e-3) over the last ten rounds (a linear-plateau whose site-years' joins cross
   * tested rates has no exact fixed point).
   */
  settled: boolean;
  /** Why the fit did not converge; '' when it did. */
  note: string;
}

/** Why a plateau form has no regional mixed model. */
export interface NoRegionalPlateauMixedModel {
  model: null;
  form: PlateauMixedForm;
  reason: string;
}

/** Where the fit starts, from the site-years' own fits. */
export interface PlateauMixedStart {
  /** (P kg/ha, c or b, x0 kg N/ha): medians over the site-years whose fit levelled off. */
  fixedKgHa: [number, number, number];
  /** Spread of the site-years' plateaus (kg/ha) and joins (kg N/ha). */
  sdPlateauKgHa: number;
  sdJoinKgHa: number;
  /** Median of the site-years' residual mean squares, (kg/ha)². */
  residualVariance: number;
}

/** MAD scaled to the normal SD (R's mad()). */
function spread(values: number[]): number {
  const m = sampleMedian(values);
  return 1.4826 * sampleMedian(values.map((v) => Math.abs(v - m)));
}

/**
 * The starting values: each site-year's own plateau fit (its profiled global search, with its
 * block offsets), then medians over those that levelled off (status "ok"); with none, the fit
 * of all plots pooled.
 * @param sites - the site-years' plots (kg/ha)
 * @param form - which plateau form
 * @returns starting fixed effects in kg/ha and the spread of plateaus and joins
 * @example
 * plateauMixedStart(sites, 'quadraticPlateau').fixedKgHa // [P, c, x0]
 */
export function plateauMixedStart(
  sites: readonly MixedModelSite[],
  form: PlateauMixedForm,
): PlateauMixedStart {
  const triples: [number, number, number][] = [];
  const variances: number[] = [];
  const asTriple = (params: Readonly<Record<string, number>>): [number, number, number] =>
    form === 'quadraticPlateau'
      ? [params.P, params.c, params.x0]
      : [params.a + params.b * params.x0, params.b, params.x0];
  for (const s of sites) {
    const blocks = s.block !== undefined && new Set(s.block).size > 1;
    const site = prepareSite(
      { rateKgHa: s.rateKgHa, yieldKgHa: s.yieldKgHa, block: blocks ? s.block : undefined },
      blocks ? 'fixed' : 'none',
    );
    const est = estimateCurve(site, form);
    if (est.status !== 'ok') continue;
    triples.push(asTriple(est.params));
    const dof = s.rateKgHa.length - 3 - (blocks ? new Set(s.block).size - 1 : 0);
    if (dof > 0) variances.push(est.sse / dof);
  }
  let high = 0;
  let low = Infinity;
  for (const s of sites) {
    for (const x of s.rateKgHa) {
      if (x > high) high = x;
      if (x < low) low = x;
    }
  }
  if (triples.length === 0) {
    const pooled = prepareSite(
      {
        rateKgHa: sites.flatMap((s) => [...s.rateKgHa]),
        yieldKgHa: sites.flatMap((s) => [...s.yieldKgHa]),
      },
      'none',
    );
    const est = estimateCurve(pooled, form);
    triples.push(asTriple(est.params));
    variances.push(est.sse / Math.max(1, pooled.n - 3));
  }
  const fixedKgHa = [0, 1, 2].map((j) => sampleMedian(triples.map((t) => t[j]))) as [
    number,
    number,
    number,
  ];
  const sdP = triples.length >= 3 ? spread(triples.map((t) => t[0])) : 0;
  const sdX = triples.length >= 3 ? spread(triples.map((t) => t[2])) : 0;
  return {
    fixedKgHa,
    // A spread of 0 (fewer than three fits, or ties) would give no working scale.
    sdPlateauKgHa: sdP > 0 ? sdP : 0.05 * Math.abs(fixedKgHa[0]) || 1,
    sdJoinKgHa: sdX > 0 ? sdX : 0.1 * (high - low) || 1,
    residualVariance: variances.length > 0 ? sampleMedian(variances) : 1,
  };
}

/**
 * The plateau form as a nonlinear mixed model: f(φ, u) and ∂f/∂φ with φ = (P, shape, x0) at a
 * rate u in the caller's units (the fit uses rates divided by the highest), random effects on
 * P and x0.
 * @param form - quadraticPlateau or linearPlateau
 * @returns the model function for fitNonlinearMixedModel
 * @example
 * plateauMixedSpec('linearPlateau').randomParameters // [0, 2]
 */
export function plateauMixedSpec(form: PlateauMixedForm): NonlinearMixedSpec {
  const evaluate =
    form === 'quadraticPlateau'
      ? (phi: Float64Array, u: number, g: Float64Array): number => {
          const d = u < phi[2] ? u - phi[2] : 0;
          g[0] = 1;
          g[1] = d * d;
          g[2] = -2 * phi[1] * d;
          return phi[0] + phi[1] * d * d;
        }
      : (phi: Float64Array, u: number, g: Float64Array): number => {
          // Below the join the slope; at and past it the plateau (the one-sided derivative
          // from the right, where ∂f/∂x0 is 0; a rate exactly at a join has probability 0).
          const below = u < phi[2];
          const d = below ? u - phi[2] : 0;
          g[0] = 1;
          g[1] = d;
          g[2] = below ? -phi[1] : 0;
          return phi[0] + phi[1] * d;
        };
  return { p: 3, randomParameters: [0, 2], evaluate };
}

/**
 * Fits one plateau form as a regional mixed model with random site-year plateaus and joins.
 * @param sites - the site-years' plots (kg/ha); at least 4 site-years and 3 distinct rates
 * @param form - quadraticPlateau or linearPlateau
 * @param structure - Ψ diagonal (default) or unstructured
 * @returns the ML fit in kg/ha, or why there is none
 * @example
 * const m = fitRegionalPlateauMixedModel(sites, 'quadraticPlateau');
 * if (m.model) m.fixed.x0 // the population join, kg N/ha
 */
export function fitRegionalPlateauMixedModel(
  sites: readonly MixedModelSite[],
  form: PlateauMixedForm,
  structure: CovarianceStructure = 'diagonal',
): RegionalPlateauMixedModel | NoRegionalPlateauMixedModel {
  let low = Infinity;
  let scale = -Infinity;
  const distinct = new Set<number>();
  for (const s of sites) {
    for (const x of s.rateKgHa) {
      distinct.add(x);
      if (x < low) low = x;
      if (x > scale) scale = x;
    }
  }
  if (sites.length < 4 || distinct.size < 3) {
    return {
      model: null,
      form,
      reason: `A regional mixed model needs at least 4 site-years and 3 distinct rates; there are ${sites.length} and ${distinct.size}.`,
    };
  }
  if (!(scale > 0)) return { model: null, form, reason: 'Every tested rate is 0.' };
  const start = plateauMixedStart(sites, form);
  const shapeScale = form === 'quadraticPlateau' ? scale * scale : scale;
  const groups: NonlinearMixedGroup[] = sites.map((s) => {
    const blocks = s.block !== undefined && new Set(s.block).size > 1 ? s.block : undefined;
    return { name: s.site, x: s.rateKgHa.map((x) => x / scale), y: s.yieldKgHa, blocks };
  });
  const sigma = Math.sqrt(start.residualVariance);
  const fit = fitNonlinearMixedModel(groups, plateauMixedSpec(form), {
    structure,
    start: [start.fixedKgHa[0], start.fixedKgHa[1] * shapeScale, start.fixedKgHa[2] / scale],
    randomScale: [sigma / start.sdPlateauKgHa, (sigma * scale) / start.sdJoinKgHa],
  });
  if ('failure' in fit) {
    // Rank deficiency comes from a population join outside the tested rates: past the highest
    // (the linear-plateau's join and plateau trade off) or below the lowest (every plot on the
    // plateau, the quadratic-plateau's c and x0 unseen).
    const outside = fit.failure.includes('not identified');
    return {
      model: null,
      form,
      reason: outside
        ? 'The regional curve does not level off within the tested rates (or has levelled off by the lowest), so its join cannot be placed.'
        : `The fit stopped: ${fit.failure}.`,
    };
  }
  const d = [1, 1 / shapeScale, scale];
  const dr = [1, scale];
  const fixed = fit.fixed.map((v, i) => v * d[i]);
  const fixedCovariance = fit.fixedCovariance.map((row, i) => row.map((v, j) => v * d[i] * d[j]));
  const se = fixedCovariance.map((row, i) => Math.sqrt(row[i]));
  const k = 3 + thetaLength(2, structure) + 1;
  return {
    model: form,
    structure,
    fixed: { P: fixed[0], shape: fixed[1], x0: fixed[2] },
    stdErrors: { P: se[0], shape: se[1], x0: se[2] },
    fixedCovariance,
    siteCovariance: fit.randomCovariance.map((row, i) => row.map((v, j) => v * dr[i] * dr[j])),
    residualVariance: fit.residualVariance,
    logLikelihoodMl: fit.logLikelihood,
    aic: -2 * fit.logLikelihood + 2 * k,
    siteYears: sites.length,
    observations: fit.observations,
    blockOffsets: groups.some((g) => g.blocks !== undefined),
    testedRangeKgHa: [low, scale],
    dfFixed: sites.length - 3,
    siteCurves: fit.conditionalModes.map((g) => ({
      site: g.name,
      plateauKgHa: fixed[0] + g.effects[0],
      joinKgHa: fixed[2] + g.effects[1] * scale,
    })),
    iterations: fit.iterations,
    converged: fit.converged,
    settled: fit.settled,
    note: fit.converged
      ? ''
      : fit.settled
        ? `The alternating fit cycles between nearby solutions (over its last ten rounds the fixed effects stay within 0.1 %: site-year joins crossing tested rates); the estimates are the last ones.`
        : `The alternating fit had not settled after ${fit.iterations} rounds; the estimates are the last ones.`,
  };
}
