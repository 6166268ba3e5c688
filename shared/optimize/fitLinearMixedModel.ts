/**
 * Fits a linear mixed model with one grouping factor by minimizing the
 * profiled deviance over θ alone (shared/stats/mixedModelDeviance; Bates et
 * al., J. Stat. Softw. 67(1), 2015, §3), REML or ML, with Nelder–Mead
 * (shared/optimize/nelderMead). β and σ² never enter the search: they are
 * profiled out in closed form at every θ.
 *
 * The search starts at T = I (random effects as large as the residual, in the
 * units the caller chose; lme4 starts there too) and lets T's diagonal take
 * either sign, since the deviance depends on T only through TTᵀ and |Lθ|; the
 * estimates report the positive-diagonal factor. A variance that should be 0
 * (a singular fit) shows as a diagonal of T near 0, where the deviance is flat
 * to first order: the search then stops on f's tolerance, and the variance is
 * reported as found (small), not forced to 0.
 *
 * AIC = −2ℓ + 2k with k = p + (entries of θ) + 1 (β, Ψ, σ²), for either
 * likelihood, as R's nlme counts it. Compare AICs only between ML fits, or
 * between REML fits with the same fixed effects.
 */
import type { MixedModelData } from '../stats/mixedModelData';
import {
  mixedModelEstimates,
  profiledDeviance,
  thetaLength,
  type CovarianceStructure,
  type LikelihoodKind,
  type MixedModelEstimates,
} from '../stats/mixedModelDeviance';
import { nelderMead } from './nelderMead';

/** A fitted linear mixed model. */
export interface LinearMixedModelFit extends MixedModelEstimates {
  kind: LikelihoodKind;
  structure: CovarianceStructure;
  /** θ at the minimum (T's entries column by column). */
  theta: number[];
  /** −2ℓ + 2k, k = fixed effects + entries of θ + 1. */
  aic: number;
  /** Observations (after any absorbed block contrasts) and groups. */
  observations: number;
  groups: number;
  /** Deviance evaluations the search took, and whether it met its tolerance. */
  evaluations: number;
  converged: boolean;
}

/**
 * Fits the model by REML or ML.
 * @param data - cross-products from `mixedModelData`
 * @param kind - "REML" (variance components) or "ML" (likelihoods comparable across fixed effects)
 * @param structure - Ψ unstructured or diagonal
 * @param start - θ to start from (default T = I); a REML fit's θ is a good start for ML
 * @returns the fit, or null when no θ gives a positive-definite system (X rank deficient, or an exact fit)
 * @example
 * fitLinearMixedModel(mixedModelData(groups), 'REML', 'unstructured')?.fixed // β̂
 */
export function fitLinearMixedModel(
  data: MixedModelData,
  kind: LikelihoodKind,
  structure: CovarianceStructure,
  start?: readonly number[],
): LinearMixedModelFit | null {
  const size = thetaLength(data.q, structure);
  const initial =
    start !== undefined && start.length === size ? [...start] : identityTheta(data.q, structure);
  const deviance = (theta: number[]) => profiledDeviance(data, theta, structure, kind);
  // The deviance grows with n; its rounding does too, so the tolerance is relative to it.
  const scale = Math.max(1, Math.abs(deviance(initial)));
  const search = nelderMead(deviance, initial, {
    functionTolerance: 1e-12 * scale,
    pointTolerance: 1e-5,
  });
  const estimates = mixedModelEstimates(data, search.x, structure, kind);
  if (estimates === null) return null;
  const k = data.p + size + 1;
  return {
    ...estimates,
    kind,
    structure,
    theta: search.x,
    aic: -2 * estimates.logLikelihood + 2 * k,
    observations: data.n,
    groups: data.groups.length,
    evaluations: search.evaluations,
    converged: search.converged,
  };
}

function identityTheta(q: number, structure: CovarianceStructure): number[] {
  if (structure === 'diagonal') return new Array<number>(q).fill(1);
  const theta: number[] = [];
  for (let j = 0; j < q; j++) for (let i = j; i < q; i++) theta.push(i === j ? 1 : 0);
  return theta;
}
