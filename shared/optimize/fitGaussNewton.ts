/**
 * A plain damped Gauss-Newton (Levenberg-Marquardt) nonlinear least-squares fit
 * from given starting values, the way general nonlinear solvers work. Plotrate's
 * response models do not use it (they profile the one nonlinear parameter and
 * need no start); it is here to polish or to cross-check a fit, and to show
 * how a start-dependent solver behaves on the same data.
 *
 * Each step solves the damped linear problem [J; √λ·D] δ = [r; 0] by Householder
 * QR (D = diag of the column norms of J, Marquardt's scaling), accepts it when
 * SSE falls (λ ← λ/10) and otherwise raises λ ← 10λ (Marquardt 1963; Nocedal &
 * Wright, Numerical Optimization, 2nd ed., §10.3). Stops when the relative
 * change in SSE and in every parameter is below the tolerance.
 */
import { applyQTranspose, qrDecompose, solveUpperTriangular } from '../stats/qr';
import { StatsInputError } from '../stats/errors';

export interface GaussNewtonInput {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Starting values of the parameters. */
  start: ArrayLike<number>;
  /** Model value at x for parameters p. */
  model: (p: Float64Array, x: number) => number;
  /** ∂model/∂p at x, written into out. */
  jacobian: (p: Float64Array, x: number, out: Float64Array) => void;
  /** Relative tolerance, default 1e-12. */
  tolerance?: number;
  /** Largest number of iterations, default 500. */
  maxIterations?: number;
}

export interface GaussNewtonResult {
  params: Float64Array;
  sse: number;
  iterations: number;
  /** False when the iteration limit was hit or the damping grew without bound. */
  converged: boolean;
}

/**
 * Fits y ≈ model(p, x) by damped Gauss-Newton from `start`.
 * @param input - data, start, model and its Jacobian
 * @returns the parameters reached, their SSE and whether the iteration converged
 * @throws {StatsInputError} "length-mismatch" when x and y differ in length
 * @example
 * fitGaussNewton({ x: [1, 2, 3], y: [2, 4, 6], start: [1], model: (p, x) => p[0] * x,
 *   jacobian: (_p, x, out) => { out[0] = x; } }).params[0] // ≈ 2
 */
export function fitGaussNewton(input: GaussNewtonInput): GaussNewtonResult {
  const { x, y, model, jacobian } = input;
  const n = x.length;
  if (y.length !== n) {
    throw new StatsInputError('length-mismatch', `y has ${y.length} values but x has ${n}.`);
  }
  const q = input.start.length;
  const tol = input.tolerance ?? 1e-12;
  const maxIterations = input.maxIterations ?? 500;
  let p = Float64Array.from(input.start);
  const sseOf = (params: Float64Array): number => {
    let s = 0;
    for (let i = 0; i < n; i++) s += (y[i] - model(params, x[i])) ** 2;
    return s;
  };
  let sse = sseOf(p);
  let lambda = 1e-3;
  const row = new Float64Array(q);
  let converged = false;
  let iterations = 0;
  for (; iterations < maxIterations && !converged; iterations++) {
    const rows = n + q;
    const a = new Float64Array(rows * q);
    const rhs = new Float64Array(rows);
    const norms = new Float64Array(q);
    for (let i = 0; i < n; i++) {
      jacobian(p, x[i], row);
      for (let k = 0; k < q; k++) {
        a[k * rows + i] = row[k];
        norms[k] += row[k] * row[k];
      }
      rhs[i] = y[i] - model(p, x[i]);
    }
    let accepted = false;
    while (!accepted) {
      for (let k = 0; k < q; k++) {
        for (let j = 0; j < q; j++) a[k * rows + n + j] = 0;
        a[k * rows + n + k] = Math.sqrt(lambda * norms[k]);
      }
      const qr = qrDecompose(a, rows, q);
      const c = Float64Array.from(rhs);
      applyQTranspose(qr, c);
      const step = solveUpperTriangular(qr, c);
      const trial = p.map((v, k) => v + step[k]);
      const trialSse = sseOf(trial);
      if (Number.isFinite(trialSse) && trialSse <= sse) {
        let small = Math.abs(sse - trialSse) <= tol * Math.max(sse, 1e-300);
        for (let k = 0; k < q; k++) {
          if (Math.abs(step[k]) > Math.sqrt(tol) * (Math.abs(p[k]) + Math.sqrt(tol))) small = false;
        }
        p = trial;
        sse = trialSse;
        lambda = Math.max(lambda / 10, 1e-12);
        accepted = true;
        converged = small;
      } else {
        lambda *= 10;
        if (lambda > 1e16) return { params: p, sse, iterations, converged: false };
      }
    }
  }
  return { params: p, sse, iterations, converged };
}
