/**
 * Brent's method for the minimum of a function of one variable on a closed
 * interval: golden-section steps, replaced by parabolic interpolation whenever
 * the parabola through the three best points falls safely inside the bracket.
 * It needs no derivative and no starting value, and it never leaves [lower, upper].
 *
 * Method: R. P. Brent, Algorithms for Minimization without Derivatives (1973),
 * ch. 5, procedure "localmin"; the same scheme as in Press et al., Numerical
 * Recipes, 3rd ed., §10.3. The result is a local minimum within the interval
 * (the global one when f is unimodal there): callers that need the global
 * minimum split the range into pieces on which f is smooth and compare.
 *
 * Edge cases:
 * - lower === upper: that point is returned after one evaluation.
 * - a minimum at an end: the search converges to within the tolerance of it;
 *   both ends are also evaluated, and the smallest of the three is returned.
 * - NaN from f counts as +Infinity (never chosen).
 */
import { StatsInputError } from '../stats/errors';

export interface BrentOptions {
  /** Relative tolerance on x, default 1e-10 (about √ε is the floor for a smooth f). */
  relativeTolerance?: number;
  /** Absolute tolerance on x, default 1e-12 × (|lower| + |upper|) + 1e-300. */
  absoluteTolerance?: number;
  /** Largest number of iterations, default 200. */
  maxIterations?: number;
}

export interface BrentResult {
  /** The minimizing argument, in the units of the interval. */
  x: number;
  /** f(x). */
  fx: number;
  /** How many times f was called. */
  evaluations: number;
  /** True when the tolerance was met before the iteration limit. */
  converged: boolean;
}

const GOLDEN = 0.381966011250105; // (3 − √5) / 2

/**
 * Minimizes f on [lower, upper] by Brent's method.
 * @param f - the function to minimize; NaN is treated as +Infinity
 * @param lower - left end of the interval (same unit as f's argument)
 * @param upper - right end, ≥ lower
 * @param options - tolerances and iteration limit
 * @returns the best point found, including the two ends
 * @throws {StatsInputError} "bad-argument" when an end is not finite or upper < lower
 * @example
 * minimizeBrent((x) => (x - 2) ** 2 + 1, 0, 5).x // ≈ 2
 */
export function minimizeBrent(
  f: (x: number) => number,
  lower: number,
  upper: number,
  options: BrentOptions = {},
): BrentResult {
  if (!Number.isFinite(lower) || !Number.isFinite(upper) || upper < lower) {
    throw new StatsInputError(
      'bad-argument',
      `minimizeBrent: the interval [${lower}, ${upper}] must have finite ends with lower ≤ upper.`,
    );
  }
  const rel = options.relativeTolerance ?? 1e-10;
  const absTol = options.absoluteTolerance ?? 1e-12 * (Math.abs(lower) + Math.abs(upper)) + 1e-300;
  const maxIterations = options.maxIterations ?? 200;
  if (upper === lower)
    return { x: lower, fx: orInfinity(f(lower)), evaluations: 1, converged: true };

  let a = lower;
  let b = upper;
  let x = a + GOLDEN * (b - a);
  let w = x;
  let v = x;
  let fx = orInfinity(f(x));
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let evaluations = 1;
  let converged = false;
  for (let iter = 0; iter < maxIterations; iter++) {
    const m = 0.5 * (a + b);
    const tol = rel * Math.abs(x) + absTol;
    const tol2 = 2 * tol;
    if (Math.abs(x - m) <= tol2 - 0.5 * (b - a)) {
      converged = true;
      break;
    }
    let useGolden = true;
    if (Math.abs(e) > tol) {
      // Parabola through (v, fv), (w, fw), (x, fx).
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        // Never evaluate too close to an end.
        if (u - a < tol2 || b - u < tol2) d = x < m ? tol : -tol;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = (x < m ? b : a) - x;
      d = GOLDEN * e;
    }
    const u = x + (Math.abs(d) >= tol ? d : d > 0 ? tol : -tol);
    const fu = orInfinity(f(u));
    evaluations++;
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  // The ends are candidates too: a minimum at an end is common for profiled SSEs.
  const fLower = orInfinity(f(lower));
  const fUpper = orInfinity(f(upper));
  evaluations += 2;
  if (fLower < fx) return { x: lower, fx: fLower, evaluations, converged };
  if (fUpper < fx) return { x: upper, fx: fUpper, evaluations, converged };
  return { x, fx, evaluations, converged };
}

/** NaN counts as +Infinity, so it is never chosen. */
function orInfinity(v: number): number {
  return v === v ? v : Infinity;
}
