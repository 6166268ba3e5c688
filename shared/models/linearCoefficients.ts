/**
 * The inner linear coefficients at a fixed nonlinear parameter, solved once on
 * the full design by Householder QR (the profiled search only needed SSE):
 * columns [1], the curve's regressors, then effect-coded block columns.
 */
import { applyQTranspose, qrDecompose, solveUpperTriangular } from '../stats/qr';
import type { PreparedSite } from './prepareSite';
import { blockColumns } from './profileSolver';

export interface LinearCoefficients {
  /** Intercept (if asked for) then one coefficient per regressor. */
  curve: Float64Array;
  /** Effect-coded block coefficients, B − 1 of them (empty without blocks). */
  blocks: Float64Array;
  /** False when the design is rank-deficient (then the coefficients are NaN). */
  fullRank: boolean;
}

/**
 * Least-squares coefficients of y on [1], regressors (given per distinct rate) and blocks.
 * @param site - from prepareSite
 * @param regressors - each a Float64Array with one value per distinct rate
 * @param intercept - put a column of ones first
 * @returns the curve and block coefficients
 * @example
 * // the straight line: linearCoefficients(site, [site.rates], true).curve → [a, b]
 */
export function linearCoefficients(
  site: PreparedSite,
  regressors: Float64Array[],
  intercept: boolean,
): LinearCoefficients {
  const { n, groupOf } = site;
  const blocks = site.blocks === 'fixed' ? blockColumns(site) : [];
  const lead = intercept ? 1 : 0;
  const qc = lead + regressors.length;
  const p = qc + blocks.length;
  const matrix = new Float64Array(n * p);
  if (intercept) matrix.fill(1, 0, n);
  regressors.forEach((g, k) => {
    const off = (lead + k) * n;
    for (let i = 0; i < n; i++) matrix[off + i] = g[groupOf[i]];
  });
  blocks.forEach((c, k) => matrix.set(c, (qc + k) * n));
  const qr = qrDecompose(matrix, n, p);
  if (qr.rank < p) {
    return {
      curve: new Float64Array(qc).fill(NaN),
      blocks: new Float64Array(blocks.length).fill(NaN),
      fullRank: false,
    };
  }
  const qty = Float64Array.from(site.y);
  applyQTranspose(qr, qty);
  const b = solveUpperTriangular(qr, qty);
  return { curve: b.slice(0, qc), blocks: b.slice(qc), fullRank: true };
}
