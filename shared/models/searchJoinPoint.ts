/**
 * Global search for a join point x0 with no starting value. SSE(x0), with the
 * inner linear fit solved exactly at each x0, is smooth between consecutive
 * distinct rates and may have a kink at each, so it is minimised within every
 * interval [r_j, r_{j+1}] by Brent's method and the best of all intervals kept.
 * Its ends are evaluated too, so a join exactly at a rate is found.
 */
import { minimizeBrent } from '../optimize/minimizeBrent';

export interface JoinSearchResult {
  /** Best join point, kg/ha. */
  x0: number;
  sse: number;
  /** Index j of the interval [r_j, r_{j+1}] it lies in. */
  interval: number;
  evaluations: number;
}

/**
 * Minimises sse(x0) over [r_0, r_max] interval by interval.
 * @param rates - distinct rates ascending, kg/ha (at least 2)
 * @param sse - SSE as a function of the join point (kg/ha)
 * @param relativeTolerance - Brent's tolerance on x0, default 1e-10
 * @returns the best join point and its SSE
 * @example
 * searchJoinPoint(new Float64Array([0, 50, 100]), (x0) => (x0 - 70) ** 2).x0 // ≈ 70
 */
export function searchJoinPoint(
  rates: Float64Array,
  sse: (x0: number) => number,
  relativeTolerance = 1e-10,
): JoinSearchResult {
  let best: JoinSearchResult = { x0: NaN, sse: Infinity, interval: -1, evaluations: 0 };
  let evaluations = 0;
  for (let j = 0; j + 1 < rates.length; j++) {
    const r = minimizeBrent(sse, rates[j], rates[j + 1], {
      relativeTolerance,
      absoluteTolerance: 1e-9 * (rates[j + 1] - rates[j]),
    });
    evaluations += r.evaluations;
    // Strictly lower only: on a tie the lower join is kept, so a flat stretch
    // (check against the rest) is reported from its first interval.
    if (r.fx < best.sse * (1 - 1e-13)) best = { x0: r.x, sse: r.fx, interval: j, evaluations: 0 };
  }
  best.evaluations = evaluations;
  return best;
}
