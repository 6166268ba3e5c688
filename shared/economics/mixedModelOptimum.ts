/**
 * The economic optimum of the regional (population) quadratic of the mixed model, and its
 * interval, in closed form from the stored fixed effects and their covariance, so a new price
 * needs no refit.
 *
 * For y = a + b·x + c·x² with c < 0 the net return y − PR·x is largest where the slope
 * b + 2c·x equals the price ratio: x_opt = (PR − b) / (2c). Its interval is the delta method's
 * (Casella & Berger, Statistical Inference, 2nd ed., §5.5.4): with the gradient
 * g = (∂x_opt/∂b, ∂x_opt/∂c) = (−1/(2c), −x_opt/c), Var(x_opt) ≈ gᵀ·Cov(b, c)·g, and the
 * interval is x_opt ± t·SE with t the Student quantile on site-years − 3 degrees of freedom (b and c are
 * learned from the site-years' curves, three parameters of which the population fixes;
 * common practice for fixed effects whose terms vary between groups). Its coverage is checked
 * by simulation (tests/economics.mixedModelOptimum.test.ts).
 *
 * Edge cases:
 * - c ≥ 0 (no maximum): the better end of the tested range, with no interval;
 * - x_opt outside the tested range: capped to the nearer end, the interval clipped there and the
 *   end marked open, since nothing was measured beyond it.
 */
import { studentTQuantile } from '../stats/distributions';

/** What the optimum needs of the regional mixed model: its fixed effects and their covariance. */
export interface MixedModelFixedEffects {
  /** a (kg/ha), b (kg grain per kg N), c (kg/ha per (kg N/ha)²). */
  fixed: { a: number; b: number; c: number };
  /** Cov of (a, b, c), 3 × 3, in the same units squared. */
  fixedCovariance: number[][];
  /** Lowest and highest rate tested across the site-years, kg/ha. */
  testedRangeKgHa: [number, number];
  /** Degrees of freedom for the interval: site-years − 3. */
  dfFixed: number;
}

/** The regional optimum rate and its interval. */
export interface MixedModelOptimum {
  /** interior: x_opt inside the tested range; capped-low/high: x_opt beyond it; no-maximum: c ≥ 0. */
  status: 'interior' | 'capped-low' | 'capped-high' | 'no-maximum';
  /** The optimum rate, kg N/ha, within the tested range. */
  rateKgHa: number;
  /** The delta-method interval, kg N/ha, clipped to the tested range; null without a maximum. */
  interval: { lowKgHa: number; highKgHa: number; lowOpen: boolean; highOpen: boolean } | null;
  /** Standard error of x_opt (uncapped), kg N/ha; null without a maximum. */
  stdErrorKgHa: number | null;
  level: number;
  method: 'delta (Student t, site-years − 3 df)';
}

/**
 * The population optimum rate x_opt = (PR − b)/(2c) and its delta-method interval.
 * @param model - the fixed effects of the regional mixed model and their covariance
 * @param priceRatio - nutrient price / grain price, kg grain per kg N
 * @param level - the interval's level, e.g. 0.9
 * @returns the rate, capped to the tested range, and its interval
 * @example
 * mixedModelOptimum(model, 5.5, 0.9).rateKgHa // e.g. 171.3
 */
export function mixedModelOptimum(
  model: MixedModelFixedEffects,
  priceRatio: number,
  level: number,
): MixedModelOptimum {
  const { b, c } = model.fixed;
  const [low, high] = model.testedRangeKgHa;
  const method = 'delta (Student t, site-years − 3 df)' as const;
  if (!(c < 0)) {
    // Convex or straight: the net return is largest at an end of the range.
    const gain = b * (high - low) + c * (high * high - low * low) - priceRatio * (high - low);
    const rateKgHa = gain > 0 ? high : low;
    return { status: 'no-maximum', rateKgHa, interval: null, stdErrorKgHa: null, level, method };
  }
  const x = (priceRatio - b) / (2 * c);
  const v = model.fixedCovariance;
  const gb = -1 / (2 * c);
  const gc = -x / c;
  const se = Math.sqrt(gb * gb * v[1][1] + 2 * gb * gc * v[1][2] + gc * gc * v[2][2]);
  return deltaOptimumInRange(x, se, model.dfFixed, [low, high], level);
}

/**
 * A population optimum x ± t·SE (Student t on `df`) on the tested range: the rate capped to the
 * nearer end when it falls outside ("capped-low"/"capped-high"), the interval clipped to the range
 * and an end the range cuts marked open. One rule for every regional mixed model form
 * (mixedModelOptimum, plateauMixedModelOptimum).
 * @param x - the optimum rate, uncapped, kg N/ha
 * @param se - its delta-method standard error, kg N/ha
 * @param df - degrees of freedom of t (0 or fewer: an unbounded interval)
 * @param range - the lowest and highest tested rates, kg N/ha
 * @param level - the interval's level, e.g. 0.9
 * @returns the optimum as the report reads it
 * @example
 * deltaOptimumInRange(150, 10, 9, [0, 200], 0.9).interval // { lowKgHa: 131.7, highKgHa: 168.3, … }
 */
export function deltaOptimumInRange(
  x: number,
  se: number,
  df: number,
  range: [number, number],
  level: number,
): MixedModelOptimum {
  const [low, high] = range;
  const t = df > 0 ? studentTQuantile((1 + level) / 2, df) : Infinity;
  const lowEnd = x - t * se;
  const highEnd = x + t * se;
  const lowOpen = !(lowEnd > low);
  const highOpen = !(highEnd < high);
  const clip = (r: number) => Math.min(Math.max(r, low), high);
  return {
    status: x < low ? 'capped-low' : x > high ? 'capped-high' : 'interior',
    rateKgHa: clip(x),
    interval: {
      lowKgHa: lowOpen ? low : clip(lowEnd),
      highKgHa: highOpen ? high : clip(highEnd),
      lowOpen,
      highOpen,
    },
    stdErrorKgHa: se,
    level,
    method: 'delta (Student t, site-years − 3 df)',
  };
}
