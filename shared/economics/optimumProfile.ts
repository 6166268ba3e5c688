/**
 * The profile interval of a site's economic optimum, shown beside its bootstrap interval
 * (optimumInterval). Same criterion as the join's (shared/models/solve/profileInterval):
 * {θ : (S(θ) − S_min)/(S_min/df) ≤ F(1, df; level)}, S(θ) the least SSE of the model
 * whose optimum at these prices is θ.
 *
 * Which optima, and why only these. The priced view re-prices without refitting (priceTrial
 * must never refit; the analysis holds no plots to refit on), so an optimum gets a profile
 * interval only where S(θ) needs no new fit at each price:
 * - linear-plateau: the optimum is the join x0 whenever the slope b beats the price ratio
 *   (curves/linearPlateau), so its interval is the join's (shared/models/joinProfile),
 *   price-free and made once by the analysis. The profile holds b at its own optimum along
 *   x0 and does not impose b > PR; with the fitted b well above PR (as at a responsive
 *   site) the two coincide.
 * - quadratic: x* = (PR − b)/(2c) (curves/quadratic). Holding x* = θ is the linear constraint
 *   b + 2cθ = PR, and for a model linear in its parameters the least SSE under one linear
 *   constraint is exact in closed form: S(θ) = S_min + (b̂ + 2ĉθ − PR)²/(ℓᵀ(XᵀX)⁻¹ℓ) with
 *   ℓ = (0, 1, 2θ) (Seber & Lee, Linear Regression Analysis, 2nd ed., 2003, §4.3), so the
 *   interval is Fieller's (Fieller 1954): the θ where
 *   (b̂ − PR + 2ĉθ)² ≤ F(1, df; level)·(V_bb + 4θ V_bc + 4θ² V_cc), V the fit's covariance
 *   s²(XᵀX)⁻¹ (block offsets included). It needs only the stored estimate and covariance.
 * - quadratic-plateau (x* = x0 + PR/(2c)) and exponential (x* = ln(bk/PR)/k): holding x* = θ
 *   leaves a nonlinear parameter free, so S(θ) is a new profiled fit of the plots at every θ
 *   and every price. Made at the analysis' first prices only, it would disagree with the
 *   screen as soon as a price moved and would make the price-free analysis depend on prices.
 *   They get none: their optimum keeps its bootstrap interval, and the quadratic-plateau
 *   its join's profile interval, which is price-free.
 */
import type { RateProfileInterval } from '../models/joinProfile';
import type { ModelFit, ModelName } from '../models/modelTypes';
import { fisherFQuantile } from '../stats/distributions';
import { optimumCore } from './economicOptimum';
import type { Prices } from './priceRatio';

/**
 * How the optimum's profile interval was made: "join" (the linear-plateau's optimum is its
 * join, whose profile interval it takes), "linear-constraint" (the quadratic's, in closed form).
 */
export type OptimumProfileBasis = 'join' | 'linear-constraint';

/** A profile interval of an economic optimum, kg/ha, and how it was made. */
export interface OptimumProfileInterval extends RateProfileInterval {
  model: ModelName;
  basis: OptimumProfileBasis;
}

/** What of a fit the optimum's profile interval reads (a stored fit satisfies it). */
export type ProfiledFit = Pick<
  ModelFit,
  | 'model'
  | 'status'
  | 'params'
  | 'paramNames'
  | 'covariance'
  | 'dfResidual'
  | 'testedRates'
  | 'joinBetweenKgHa'
>;

/**
 * The profile interval of one fit's economic optimum at these prices.
 * @param fit - the fit whose optimum it is (parameters, covariance, residual df, tested rates)
 * @param joinProfile - the fit's join profile interval (joinProfileInterval), or null; read for
 *   the linear-plateau
 * @param prices - canonical prices; the optimum is the closed form's (optimumCore)
 * @param level - level in (0, 1), e.g. 0.9 (the join's interval keeps its own level)
 * @returns the interval within the tested rates, open at an end the data do not close; null
 *   unless the optimum is interior and the model is the linear-plateau (with a join interval)
 *   or the quadratic (see the file's note on the others)
 * @example
 * optimumProfileInterval(fits.quadratic, null, prices, 0.9)
 * // e.g. { estimateKgHa: 155, lowKgHa: 123, highKgHa: 200, highOpen: true, basis: 'linear-constraint', … }
 */
export function optimumProfileInterval(
  fit: ProfiledFit,
  joinProfile: RateProfileInterval | null,
  prices: Prices,
  level: number,
): OptimumProfileInterval | null {
  if (fit.model !== 'linearPlateau' && fit.model !== 'quadratic') return null;
  const optimum = optimumCore(fit, prices);
  if (optimum.status !== 'interior' || optimum.rateKgHa === null) return null;
  if (fit.model === 'linearPlateau') {
    return joinProfile ? { ...joinProfile, model: fit.model, basis: 'join' } : null;
  }
  return quadraticOptimumProfile(fit, optimum.priceRatio, optimum.rateKgHa, level);
}

/** Fieller's interval of x* = (PR − b)/(2c), clipped to the tested rates. */
function quadraticOptimumProfile(
  fit: ProfiledFit,
  priceRatio: number,
  estimateKgHa: number,
  level: number,
): OptimumProfileInterval | null {
  const ib = fit.paramNames.indexOf('b');
  const ic = fit.paramNames.indexOf('c');
  const v = fit.covariance;
  const vbb = v[ib][ib];
  const vbc = v[ib][ic];
  const vcc = v[ic][ic];
  if (!(fit.dfResidual > 0) || !Number.isFinite(vbb + vbc + vcc)) return null;
  const f = fisherFQuantile(level, 1, fit.dfResidual);
  const d = fit.params.b - priceRatio;
  const c = fit.params.c;
  // The criterion as q(θ) = a2 θ² + a1 θ + a0 ≤ 0. At θ̂ the constraint holds exactly
  // (b̂ + 2ĉθ̂ = PR), so q(θ̂) = −f·Var(b̂ + 2ĉθ̂) < 0: the estimate lies inside.
  const a2 = 4 * (c * c - f * vcc);
  const a1 = 4 * (d * c - f * vbc);
  const a0 = d * d - f * vbb;
  const [lowEnd, highEnd] = pieceAround(a2, a1, a0, estimateKgHa);
  const lowest = fit.testedRates.lowestKgHa;
  const highest = fit.testedRates.highestKgHa;
  const lowOpen = !(lowEnd > lowest);
  const highOpen = !(highEnd < highest);
  return {
    model: fit.model,
    basis: 'linear-constraint',
    estimateKgHa,
    lowKgHa: lowOpen ? lowest : lowEnd,
    highKgHa: highOpen ? highest : highEnd,
    lowOpen,
    highOpen,
    level,
  };
}

/**
 * The connected piece of {θ : a2 θ² + a1 θ + a0 ≤ 0} that holds θ̂ (where the quadratic is
 * negative), with ±Infinity for an end that runs away. Roots by the cancellation-free form
 * q = −(a1 + sign(a1)√disc)/2, roots q/a2 and a0/q (Press et al., Numerical Recipes, 3rd ed., §5.6).
 */
function pieceAround(a2: number, a1: number, a0: number, at: number): [number, number] {
  const disc = a1 * a1 - 4 * a2 * a0;
  if (a2 === 0) {
    if (a1 === 0) return [-Infinity, Infinity];
    const root = -a0 / a1;
    return a1 > 0 ? [-Infinity, root] : [root, Infinity];
  }
  if (!(disc > 0)) return [-Infinity, Infinity];
  const q = -0.5 * (a1 + (a1 >= 0 ? 1 : -1) * Math.sqrt(disc));
  const r1 = q / a2;
  const r2 = a0 / q;
  const lo = Math.min(r1, r2);
  const hi = Math.max(r1, r2);
  // Opening upward: negative between the roots; downward: outside them.
  if (a2 > 0) return [lo, hi];
  return at <= lo ? [-Infinity, lo] : [hi, Infinity];
}
