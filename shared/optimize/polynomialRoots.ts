/**
 * The real roots of a low-degree polynomial inside an open interval, all of
 * them, to full precision. Between consecutive roots of the derivative the
 * polynomial is monotone, so each such piece holds at most one root and it is
 * bracketed by a sign change: the derivative's roots are found first (the same
 * way, recursively down to degree 1) and each bracketed root is then polished
 * by Newton's method safeguarded by bisection (Press et al., Numerical Recipes,
 * 3rd ed., §9.4, "rtsafe").
 *
 * Edge cases:
 * - a root of even multiplicity (the polynomial touches zero without changing
 *   sign) is found only when the value there is exactly 0;
 * - trailing zero coefficients are dropped, so a degree given too high is harmless;
 * - the zero polynomial has no isolated roots: none are returned.
 */

/** Highest degree handled (scratch is kept per recursion level, so no allocation per call). */
const MAX_DEGREE = 8;
const derivatives = Array.from({ length: MAX_DEGREE }, () => new Float64Array(MAX_DEGREE));
const criticals = Array.from({ length: MAX_DEGREE + 1 }, () => new Float64Array(MAX_DEGREE + 2));

/**
 * Real roots of c[0] + c[1] x + … + c[degree] x^degree in (lower, upper), ascending.
 * @param c - coefficients, constant term first
 * @param degree - degree of the polynomial (at most 8)
 * @param lower - left end of the interval (exclusive)
 * @param upper - right end (exclusive), > lower
 * @param out - receives the roots; needs room for `degree` of them
 * @returns how many roots were written to out
 * @example
 * const out = new Float64Array(2);
 * polynomialRoots(Float64Array.of(-2, 0, 1), 2, 0, 3, out); // 1, out[0] ≈ 1.41421356
 */
export function polynomialRoots(
  c: ArrayLike<number>,
  degree: number,
  lower: number,
  upper: number,
  out: Float64Array,
): number {
  return rootsAtLevel(c, Math.min(degree, MAX_DEGREE), lower, upper, out, 0, 0);
}

function rootsAtLevel(
  c: ArrayLike<number>,
  degree: number,
  lower: number,
  upper: number,
  out: Float64Array,
  at: number,
  level: number,
): number {
  let d = degree;
  while (d > 0 && c[d] === 0) d--;
  if (d === 0) return 0;
  if (d === 1) {
    const x = -c[0] / c[1];
    if (x > lower && x < upper) {
      out[at] = x;
      return 1;
    }
    return 0;
  }
  // Monotone pieces between the derivative's roots.
  const dc = derivatives[level];
  for (let k = 1; k <= d; k++) dc[k - 1] = k * c[k];
  const cp = criticals[level];
  cp[0] = lower;
  // (An offset rather than a subarray: a typed-array view is an allocation.)
  const inner = rootsAtLevel(dc, d - 1, lower, upper, cp, 1, level + 1);
  cp[inner + 1] = upper;
  let count = 0;
  let a = cp[0];
  let fa = horner(c, d, a);
  for (let piece = 1; piece <= inner + 1; piece++) {
    const b = cp[piece];
    const fb = horner(c, d, b);
    if (fb === 0 && piece <= inner) {
      // Exactly zero at a critical point: a root that need not change sign.
      if (count === 0 || out[at + count - 1] !== b) out[at + count++] = b;
    } else if ((fa < 0 && fb > 0) || (fa > 0 && fb < 0)) {
      out[at + count++] = bracketedRoot(c, d, a, b, fa);
    }
    a = b;
    fa = fb;
  }
  return count;
}

/** c evaluated at x by Horner's rule. */
function horner(c: ArrayLike<number>, d: number, x: number): number {
  let v = c[d];
  for (let k = d - 1; k >= 0; k--) v = v * x + c[k];
  return v;
}

/** The one root in (a, b) of a polynomial monotone there with f(a) = fa and a sign change. */
function bracketedRoot(c: ArrayLike<number>, d: number, a: number, b: number, fa: number): number {
  // Orient so that f(lo) < 0 < f(hi).
  let lo = fa < 0 ? a : b;
  let hi = fa < 0 ? b : a;
  let x = 0.5 * (a + b);
  let dxOld = Math.abs(b - a);
  let dx = dxOld;
  for (let iter = 0; iter < 100; iter++) {
    let f = c[d];
    let df = 0;
    for (let k = d - 1; k >= 0; k--) {
      df = df * x + f;
      f = f * x + c[k];
    }
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const newton = x - f / df;
    // Bisect when Newton would leave the bracket or is not halving the step.
    if (
      !(df !== 0) ||
      (newton - lo) * (newton - hi) > 0 ||
      Math.abs(2 * f) > Math.abs(dxOld * df)
    ) {
      dxOld = dx;
      dx = 0.5 * (hi - lo);
      const mid = lo + dx;
      if (mid === x || mid === lo || mid === hi) return mid;
      x = mid;
    } else {
      dxOld = dx;
      dx = newton - x;
      if (newton === x) return x;
      x = newton;
    }
    if (Math.abs(hi - lo) <= 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) return x;
  }
  return x;
}
