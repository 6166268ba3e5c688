/**
 * The economic optimum of a regional plateau mixed model's population curve (the fixed
 * effects, a typical site-year's curve) and its interval, in closed form from the stored fixed
 * effects and their covariance, so a new price needs no refit.
 *
 * - Quadratic-plateau y = P + c·min(x − x0, 0)², c < 0: below the join the slope is
 *   2c·(x − x0), equal to the price ratio at x_opt = x0 + PR/(2c), left of the join.
 * - Linear-plateau y = P + b·min(x − x0, 0): the slope is b below the join and 0 past it, so
 *   when PR < b every kg up to the join pays and none after: x_opt = x0; when PR ≥ b none pays.
 *
 * The interval is the delta method's (Casella & Berger, Statistical Inference, 2nd ed.,
 * §5.5.4), x_opt ± t·SE with t on site-years − 3 degrees of freedom as the quadratic's
 * (mixedModelOptimum): gradient (0, −PR/(2c²), 1) in (P, c, x0) for the quadratic-plateau,
 * (0, 0, 1) for the linear-plateau, whose interval is then that of the join itself. The delta
 * method, not a parametric bootstrap, because it re-prices from the stored covariance without a
 * refit (a bootstrap of a nonlinear mixed model refits it hundreds of times, minutes at 1,000
 * site-years, and again at every price) and because x_opt is linear (linear-plateau) or nearly
 * linear (quadratic-plateau, through PR/(2c)) in the fixed effects, where the delta method and
 * a parametric bootstrap agree. It inherits the fit's standard errors, which for the
 * linear-plateau assume the join stays between the two tested rates around it.
 *
 * Edge cases:
 * - quadratic-plateau with c ≥ 0, or linear-plateau with b ≤ 0: no maximum; the better end of
 *   the tested range, no interval;
 * - linear-plateau with PR ≥ b: the lowest tested rate ("capped-low"), no interval;
 * - x_opt outside the tested range: capped to the nearer end, the interval clipped there and
 *   the end marked open.
 */
import { deltaOptimumInRange, type MixedModelOptimum } from './mixedModelOptimum';

/** What the optimum needs of a plateau mixed model (shared/analysis/regionalPlateauMixedModel). */
export interface PlateauMixedFixedEffects {
  model: 'quadraticPlateau' | 'linearPlateau';
  /** P (kg/ha), shape c (kg/ha per (kg N/ha)²) or b (kg/kg), x0 (kg N/ha). */
  fixed: { P: number; shape: number; x0: number };
  /** Cov of (P, shape, x0), 3 × 3. */
  fixedCovariance: number[][];
  testedRangeKgHa: [number, number];
  dfFixed: number;
}

/**
 * The population optimum rate of a plateau mixed model and its delta-method interval.
 * @param model - the plateau mixed model's fixed effects and their covariance
 * @param priceRatio - nutrient price / grain price, kg grain per kg N
 * @param level - the interval's level, e.g. 0.9
 * @returns the rate, capped to the tested range, and its interval
 * @example
 * plateauMixedModelOptimum(qp, 5.5, 0.9).rateKgHa // x0 + 5.5/(2c), e.g. 148
 */
export function plateauMixedModelOptimum(
  model: PlateauMixedFixedEffects,
  priceRatio: number,
  level: number,
): MixedModelOptimum {
  const { P, shape, x0 } = model.fixed;
  const [low, high] = model.testedRangeKgHa;
  const method = 'delta (Student t, site-years − 3 df)' as const;
  const curve = (x: number) => {
    const d = Math.min(x - x0, 0);
    return model.model === 'quadraticPlateau' ? P + shape * d * d : P + shape * d;
  };
  const noMaximum = model.model === 'quadraticPlateau' ? !(shape < 0) : !(shape > 0);
  if (noMaximum) {
    const gain = curve(high) - curve(low) - priceRatio * (high - low);
    return {
      status: 'no-maximum',
      rateKgHa: gain > 0 ? high : low,
      interval: null,
      stdErrorKgHa: null,
      level,
      method,
    };
  }
  if (model.model === 'linearPlateau' && priceRatio >= shape) {
    return {
      status: 'capped-low',
      rateKgHa: low,
      interval: null,
      stdErrorKgHa: null,
      level,
      method,
    };
  }
  // Gradient of x_opt in (P, shape, x0).
  const g =
    model.model === 'quadraticPlateau' ? [0, -priceRatio / (2 * shape * shape), 1] : [0, 0, 1];
  const x = model.model === 'quadraticPlateau' ? x0 + priceRatio / (2 * shape) : x0;
  const v = model.fixedCovariance;
  let variance = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) variance += g[i] * v[i][j] * g[j];
  const se = Math.sqrt(variance);
  return deltaOptimumInRange(x, se, model.dfFixed, [low, high], level);
}
