/**
 * Minimizes a smooth function of a few variables from a point near its minimum by Newton's
 * method with central-difference derivatives and step halving: quadratic convergence where
 * Nelder–Mead's simplex (shared/optimize/nelderMead) converges linearly, so a warm start costs
 * tens of evaluations instead of hundreds. For the LME step of the plateau mixed models, whose
 * θ moves little from one round to the next.
 *
 * Derivatives: steps h_i = 1e-4·max(1, |x_i|); with f of size F, rounding gives gradient errors
 * near F·1e-16/h and Hessian errors near F·1e-16/h², small next to the curvature of a
 * likelihood in θ of order 1.
 *
 * Edge cases: a Hessian that is not positive definite (a minimum on a boundary, e.g. a variance
 * at 0, where the deviance is flat) or a step that halving cannot make decrease f returns null,
 * and the caller falls back to a derivative-free search.
 */
import {
  choleskyLower,
  solveLowerInPlace,
  solveLowerTransposeInPlace,
} from '../stats/smallCholesky';

/** Newton's result. */
export interface NewtonResult {
  x: number[];
  fx: number;
  evaluations: number;
}

/**
 * Newton's method with numerical derivatives.
 * @param f - the function (finite near the start)
 * @param start - a point near the minimum
 * @param tolerance - stop when the step is below this in every coordinate (or when the
 *   decrease a full step predicts is below f's resolution, see below)
 * @returns the minimum, or null where Newton cannot proceed (see edge cases)
 * @example
 * newtonMinimize(([a, b]) => (a - 1) ** 2 + 3 * (b + 2) ** 2 + a * b, [0, 0], 1e-10)?.x
 */
export function newtonMinimize(
  f: (x: number[]) => number,
  start: readonly number[],
  tolerance: number,
): NewtonResult | null {
  const d = start.length;
  let x = [...start];
  let fx = f(x);
  let evaluations = 1;
  const at = (i: number, hi: number, j: number, hj: number): number => {
    const p = [...x];
    p[i] += hi;
    if (j >= 0) p[j] += hj;
    evaluations++;
    return f(p);
  };
  for (let iteration = 0; iteration < 50; iteration++) {
    const h = x.map((v) => 1e-4 * Math.max(1, Math.abs(v)));
    const g = new Float64Array(d);
    const hess = new Float64Array(d * d);
    const plus: number[] = [];
    const minus: number[] = [];
    for (let i = 0; i < d; i++) {
      plus[i] = at(i, h[i], -1, 0);
      minus[i] = at(i, -h[i], -1, 0);
      g[i] = (plus[i] - minus[i]) / (2 * h[i]);
      hess[i * d + i] = (plus[i] - 2 * fx + minus[i]) / (h[i] * h[i]);
    }
    for (let i = 0; i < d; i++) {
      for (let j = 0; j < i; j++) {
        const v =
          (at(i, h[i], j, h[j]) -
            at(i, h[i], j, -h[j]) -
            at(i, -h[i], j, h[j]) +
            at(i, -h[i], j, -h[j])) /
          (4 * h[i] * h[j]);
        hess[i * d + j] = v;
        hess[j * d + i] = v;
      }
    }
    if (![...g, ...hess].every(Number.isFinite)) return null;
    const lower = new Float64Array(d * d);
    if (!choleskyLower(hess, d, lower)) return null;
    const step = Float64Array.from(g, (v) => -v);
    solveLowerInPlace(lower, d, step);
    solveLowerTransposeInPlace(lower, d, step);
    // The decrease a full step predicts, ½·gᵀH⁻¹g, below what f resolves (1e-15 of |f|): the
    // step is then the last Newton step worth taking (quadratic convergence leaves it accurate
    // to about its square), and a line search could only halve in vain on f's rounding.
    // Measured on the LME step at 1,000 site-years: the deviance's rounding (its r² is a
    // difference of large sums of squares) puts the gradient's noise near 1e-4 and the steps
    // near 5e-8, above a 1e-9 tolerance, and the search spent ~60 evaluations a call on noise.
    let predicted = 0;
    for (let i = 0; i < d; i++) predicted -= 0.5 * g[i] * step[i];
    if (predicted <= 1e-15 * Math.max(1, Math.abs(fx))) {
      const last = x.map((v, i) => v + step[i]);
      const fLast = f(last);
      evaluations++;
      return fLast <= fx ? { x: last, fx: fLast, evaluations } : { x, fx, evaluations };
    }
    let t = 1;
    let next = x;
    let fNext = Infinity;
    for (let halving = 0; halving < 20; halving++) {
      next = x.map((v, i) => v + t * step[i]);
      fNext = f(next);
      evaluations++;
      if (fNext <= fx) break;
      t /= 2;
    }
    const size = Math.max(...step.map((v) => Math.abs(t * v)));
    if (!(fNext <= fx)) {
      // No decrease along the Newton direction: at the minimum to rounding, or not convex here.
      return size <= 1e3 * tolerance ? { x, fx, evaluations } : null;
    }
    x = next;
    fx = fNext;
    if (size <= tolerance) return { x, fx, evaluations };
  }
  return null;
}
