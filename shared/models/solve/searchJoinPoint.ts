/**
 * Global search for a join point x0 with no starting value. SSE(x0), with the
 * inner linear fit solved exactly at each x0, is smooth between consecutive
 * distinct rates and may have a kink at each, so it is minimized within every
 * interval [r_j, r_{j+1}] by Brent's method and the best of all intervals kept.
 * Its ends are evaluated too, so a join exactly at a rate is found.
 *
 * Speed (optional): a model may give a lower bound of SSE over each interval,
 * from a relaxed fit in which the pieces left and right of the join need not
 * meet. Intervals are then searched in order of their bound and an interval
 * whose bound is not below the best SSE found so far is skipped: it cannot hold
 * the minimum (branch and bound), so the result is the same, with fewer evaluations.
 *
 * Speed (optional): a model whose SSE is a known function of x0 within each
 * interval may also give the interior points where it can have its minimum
 * (stationaryJoinPoints). The interval is then settled by SSE at its two ends and
 * at those points, a handful of evaluations where Brent needs about twenty
 * (most of them creeping towards an end when the minimum lies there).
 */
import { minimizeBrent } from '../../optimize/minimizeBrent';
import type { StationaryJoinPoints } from './stationaryJoinPoints';

/** Candidate joins of one interval (at most 4 from stationaryJoinPoints). */
const candidates = new Float64Array(4);

export interface JoinSearchResult {
  /** Best join point, kg/ha. */
  x0: number;
  sse: number;
  /** Index j of the interval [r_j, r_{j+1}] it lies in. */
  interval: number;
  evaluations: number;
}

/**
 * Minimizes sse(x0) over [r_0, r_max] interval by interval.
 * @param rates - distinct rates ascending, kg/ha (at least 2)
 * @param sse - SSE as a function of the join point (kg/ha)
 * @param relativeTolerance - Brent's tolerance on x0, default 1e-10
 * @param lowerBounds - optional: lowerBounds[j] ≤ SSE(x0) for every x0 in [r_j, r_{j+1}]
 * @param stationary - optional: every interior point of interval j where SSE can have its
 *   minimum; when given, no Brent search is made and the tolerance is not used
 * @returns the best join point and its SSE
 * @example
 * searchJoinPoint(new Float64Array([0, 50, 100]), (x0) => (x0 - 70) ** 2).x0 // ≈ 70
 */
export function searchJoinPoint(
  rates: Float64Array,
  sse: (x0: number) => number,
  relativeTolerance = 1e-10,
  lowerBounds?: Float64Array,
  stationary?: StationaryJoinPoints,
): JoinSearchResult {
  const intervals = rates.length - 1;
  const order: number[] = [];
  for (let j = 0; j < intervals; j++) order.push(j);
  if (lowerBounds) order.sort((p, q) => lowerBounds[p] - lowerBounds[q] || p - q);
  let bestX = NaN;
  let bestSse = Infinity;
  let bestInterval = -1;
  let evaluations = 0;
  for (const j of order) {
    // A bound at or above the best cannot win (the margin absorbs rounding in the bound).
    if (lowerBounds && lowerBounds[j] * (1 - 1e-7) >= bestSse) continue;
    const r = stationary
      ? bestOfCandidates(sse, rates[j], rates[j + 1], stationary(j, candidates))
      : minimizeBrent(sse, rates[j], rates[j + 1], {
          relativeTolerance,
          absoluteTolerance: 1e-9 * (rates[j + 1] - rates[j]),
        });
    evaluations += r.evaluations;
    // On a tie the lower interval is kept, so a flat stretch (check against the
    // rest) is reported from its first interval whatever the search order.
    const tie = bestInterval >= 0 && Math.abs(r.fx - bestSse) <= 1e-13 * bestSse;
    if ((r.fx < bestSse && !tie) || (tie && j < bestInterval)) {
      bestX = r.x;
      bestSse = r.fx;
      bestInterval = j;
    }
  }
  return { x0: bestX, sse: bestSse, interval: bestInterval, evaluations };
}

/**
 * The smallest SSE among the interior candidates and the two ends; as in
 * minimizeBrent, an end is taken only when it is strictly better than the interior.
 */
function bestOfCandidates(
  sse: (x0: number) => number,
  lower: number,
  upper: number,
  count: number,
): { x: number; fx: number; evaluations: number } {
  let x = NaN;
  let fx = Infinity;
  for (let k = 0; k < count; k++) {
    const f = orInfinity(sse(candidates[k]));
    if (f < fx) {
      x = candidates[k];
      fx = f;
    }
  }
  const fLower = orInfinity(sse(lower));
  const fUpper = orInfinity(sse(upper));
  if (fLower < fx) {
    x = lower;
    fx = fLower;
  }
  if (fUpper < fx) {
    x = upper;
    fx = fUpper;
  }
  return { x, fx, evaluations: count + 2 };
}

/** NaN counts as +Infinity, so it is never chosen. */
function orInfinity(v: number): number {
  return v === v ? v : Infinity;
}
