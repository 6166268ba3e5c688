/**
 * A root of a function of one variable inside a bracket [lower, upper] where it changes
 * sign, by Brent's method: bisection, replaced by the secant step or inverse quadratic
 * interpolation whenever that step falls safely inside the bracket and shrinks it fast
 * enough. It needs no derivative, never leaves the bracket and converges at least as
 * surely as bisection.
 *
 * Method: R. P. Brent, Algorithms for Minimization without Derivatives (1973), ch. 4,
 * procedure "zero"; the same scheme as Forsythe, Malcolm & Moler, Computer Methods for
 * Mathematical Computations (1977), §7.2 "zeroin", and as R's uniroot().
 *
 * Edge cases:
 * - f(lower) or f(upper) exactly 0: that end is returned;
 * - no sign change between the ends: a StatsInputError (the caller brackets first);
 * - f discontinuous inside the bracket: the result is where the sign changes, within the
 *   tolerance (a jump across zero is found as if it were a root).
 */
import { StatsInputError } from '../stats/errors';

export interface RootOptions {
  /** Relative tolerance on x, default 1e-12. */
  relativeTolerance?: number;
  /** Absolute tolerance on x, default 1e-12 × (|lower| + |upper|) + 1e-300. */
  absoluteTolerance?: number;
  /** Largest number of iterations, default 200. */
  maxIterations?: number;
}

export interface RootResult {
  /** The root, in the units of the bracket. */
  x: number;
  /** f(x). */
  fx: number;
  /** How many times f was called, the two ends included. */
  evaluations: number;
  /** True when the tolerance was met before the iteration limit. */
  converged: boolean;
}

/**
 * Finds a root of f in [lower, upper] by Brent's method.
 * @param f - the function; f(lower) and f(upper) must differ in sign (or one be 0)
 * @param lower - one end of the bracket
 * @param upper - the other end
 * @param options - tolerances and iteration limit
 * @returns the root, f there and the work done
 * @throws {StatsInputError} "bad-argument" when an end or f at an end is not finite, or
 *   f has the same sign at both ends
 * @example
 * findRoot((x) => x * x - 2, 0, 2).x // ≈ 1.41421356237
 */
export function findRoot(
  f: (x: number) => number,
  lower: number,
  upper: number,
  options: RootOptions = {},
): RootResult {
  if (!Number.isFinite(lower) || !Number.isFinite(upper)) {
    throw new StatsInputError(
      'bad-argument',
      `findRoot: the bracket [${lower}, ${upper}] must have finite ends.`,
    );
  }
  const rel = options.relativeTolerance ?? 1e-12;
  const absTol = options.absoluteTolerance ?? 1e-12 * (Math.abs(lower) + Math.abs(upper)) + 1e-300;
  const maxIterations = options.maxIterations ?? 200;
  let a = lower;
  let b = upper;
  let fa = f(a);
  let fb = f(b);
  if (!Number.isFinite(fa) || !Number.isFinite(fb)) {
    throw new StatsInputError(
      'bad-argument',
      `findRoot: f must be finite at both ends; f(${a}) = ${fa}, f(${b}) = ${fb}.`,
    );
  }
  if (fa === 0) return { x: a, fx: 0, evaluations: 2, converged: true };
  if (fb === 0) return { x: b, fx: 0, evaluations: 2, converged: true };
  if (fa > 0 === fb > 0) {
    throw new StatsInputError(
      'bad-argument',
      `findRoot: f has the same sign at both ends of [${a}, ${b}] (${fa}, ${fb}); bracket a sign change first.`,
    );
  }
  let evaluations = 2;
  // b is the best estimate, a the previous one, c the other end of the bracket [b, c].
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < maxIterations; iter++) {
    if (fb > 0 === fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * rel * Math.abs(b) + 0.5 * absTol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) {
      return { x: b, fx: fb, evaluations, converged: true };
    }
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      // Secant (two distinct points) or inverse quadratic interpolation (three).
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      // Accept the step only if it stays well inside the bracket and shrinks fast enough.
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
    evaluations++;
    if (!Number.isFinite(fb)) {
      throw new StatsInputError('bad-argument', `findRoot: f(${b}) = ${fb} inside the bracket.`);
    }
  }
  return { x: b, fx: fb, evaluations, converged: false };
}
