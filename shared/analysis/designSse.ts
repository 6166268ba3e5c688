/**
 * Residual sum of squares of a least-squares fit, and nothing else: the
 * across-site F-tests need only SSE and the design's rank, for hundreds of small
 * designs, so this skips the coefficients, intervals and diagnostics that
 * fitLeastSquares computes. Same Householder QR (shared/stats/qr.ts); SSE is the
 * squared norm of the trailing n − p entries of Qᵀy (Golub & Van Loan, 4th ed., §5.3).
 */
import { applyQTranspose, qrDecompose } from '../stats/qr';

export interface DesignSse {
  /** Residual sum of squares, in the response's units squared. */
  sse: number;
  /** Numerical rank of the design (columns not a combination of earlier ones). */
  rank: number;
  /** Number of columns given. */
  columns: number;
}

/** The working buffer of designSse (it calls nothing that calls it back). */
let scratch = new Float64Array(0);

function scratchFor(doubles: number): Float64Array {
  if (scratch.length < doubles) scratch = new Float64Array(Math.max(doubles, 2 * scratch.length));
  return scratch;
}

/**
 * SSE of y regressed on the given columns (no intercept is added: pass a column of ones).
 * @param columns - the regressors, each of length y.length
 * @param y - the response
 * @returns SSE and rank; when rank < columns the SSE is not a least-squares SSE and callers must
 *   treat the design as unusable (this routine does not pivot)
 * @example
 * designSse([[1, 1, 1], [1, 2, 3]], [1, 2, 3.5]).sse // ≈ 0.0833
 */
export function designSse(
  columns: ReadonlyArray<ArrayLike<number>>,
  y: ArrayLike<number>,
): DesignSse {
  const n = y.length;
  const p = columns.length;
  // Qᵀy, the design and its QR live only in this call: one buffer kept from call to call.
  const work = scratchFor(n * (2 * p + 1));
  const qy = work.subarray(0, n);
  for (let i = 0; i < n; i++) qy[i] = y[i];
  if (p === 0) {
    let s = 0;
    for (let i = 0; i < n; i++) s += qy[i] * qy[i];
    return { sse: s, rank: 0, columns: 0 };
  }
  if (n < p) return { sse: NaN, rank: Math.min(n, p) - 1, columns: p };
  const x = work.subarray(n, n + n * p);
  for (let j = 0; j < p; j++) {
    const c = columns[j];
    for (let i = 0; i < n; i++) x[j * n + i] = c[i];
  }
  const qr = qrDecompose(x, n, p, work.subarray(n + n * p));
  applyQTranspose(qr, qy);
  let sse = 0;
  for (let i = p; i < n; i++) sse += qy[i] * qy[i];
  return { sse, rank: qr.rank, columns: p };
}
