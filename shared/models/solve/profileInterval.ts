/**
 * The F-based profile interval of one parameter θ of a nonlinear least-squares fit
 * (Bates & Watts, Nonlinear Regression Analysis and Its Applications, 1988, §6.1;
 * Venables & Ripley, Modern Applied Statistics with S, 4th ed., 2002, §8.4):
 *   { θ : (S(θ) − S_min) / (S_min / df) ≤ F(1, df; level) },
 * where S(θ) is the residual sum of squares minimized over every other parameter
 * (block offsets included) with θ held fixed, S_min the fit's and df its residual df.
 * Unlike estimate ± t·SE it follows the curvature and kinks of S, so it need not be
 * symmetric about the estimate.
 *
 * Search: from the estimate outward through the caller's points (every place where S may
 * bend or turn: the tested rates, S's stationary points, a few even points between), S is
 * evaluated at each point until it passes the threshold; the crossing is then found by
 * Brent's root finder (shared/optimize/findRoot) between that point and the one before.
 * The interval is the connected piece around the estimate, as in MASS's profile(): a
 * second dip of S below the threshold further out is not joined to it. When S stays below
 * the threshold up to the last point, the interval runs off the searched range and is
 * reported open at that end, at the end of the range.
 */
import { findRoot } from '../../optimize/findRoot';
import { fisherFQuantile } from '../../stats/distributions';
import type { StationaryJoinPoints } from './stationaryJoinPoints';

/** A plateau model's profiled SSE as a function of its join, and where it can turn. */
export interface JoinSseProfile {
  /** S(x0), (kg/ha)², at a join x0 in kg/ha; the other parameters fitted. */
  sse: (x0: number) => number;
  /** The joins inside each interval between rates where S can have a minimum; none for the full block design. */
  stationary: StationaryJoinPoints | undefined;
}

/** A profile interval in the units of θ. */
export interface ProfileBounds {
  low: number;
  high: number;
  /** True when S stayed below the threshold down to the range's low end: the data do not close it there. */
  lowOpen: boolean;
  /** True when S stayed below the threshold up to the range's high end. */
  highOpen: boolean;
  /** S_min·(1 + F(1, df; level)/df): S at each finite end, (yield unit)². */
  thresholdSse: number;
}

export interface ProfileSearch {
  /** S(θ): the SSE minimized over every other parameter with θ fixed. */
  sse: (theta: number) => number;
  /** θ at the fit's minimum; inside [points[0], points[last]]. */
  estimate: number;
  /** S at the minimum: sse(estimate), so the estimate is inside whatever the rounding. */
  sseMin: number;
  /** Residual df of the fit (every parameter counted, θ and block offsets included). */
  df: number;
  /** Level in (0, 1), e.g. 0.9. */
  level: number;
  /**
   * Ascending points from the low end of the searched range to its high end; S must be
   * continuous and monotone between neighbours on each side of the estimate.
   */
  points: ArrayLike<number>;
}

/**
 * The profile interval of θ over a bounded range.
 * @param p - S(θ), the estimate and S_min, df, level, and the points to search through
 * @returns the two ends, whether each is open, and the SSE threshold
 * @example
 * // S(θ) = 10 + (θ − 5)², df 10, level 0.95: ends where (θ − 5)² = F(1, 10; 0.95) · 10 / 10
 * profileInterval({ sse: (t) => 10 + (t - 5) ** 2, estimate: 5, sseMin: 10, df: 10, level: 0.95, points: [0, 10] })
 * // { low ≈ 2.77, high ≈ 7.23, lowOpen: false, highOpen: false, … }
 */
export function profileInterval(p: ProfileSearch): ProfileBounds {
  const f = fisherFQuantile(p.level, 1, p.df);
  const thresholdSse = p.sseMin * (1 + f / p.df);
  const excess = (theta: number): number => p.sse(theta) - thresholdSse;
  const points = p.points;
  const last = points.length - 1;
  let high = points[last];
  let highOpen = true;
  let inner = p.estimate;
  for (let i = 0; i <= last; i++) {
    if (!(points[i] > p.estimate)) continue;
    if (excess(points[i]) > 0) {
      high = findRoot(excess, inner, points[i]).x;
      highOpen = false;
      break;
    }
    inner = points[i];
  }
  let low = points[0];
  let lowOpen = true;
  inner = p.estimate;
  for (let i = last; i >= 0; i--) {
    if (!(points[i] < p.estimate)) continue;
    if (excess(points[i]) > 0) {
      low = findRoot(excess, points[i], inner).x;
      lowOpen = false;
      break;
    }
    inner = points[i];
  }
  return { low, high, lowOpen, highOpen, thresholdSse };
}
