/**
 * The inner linear coefficients at a fixed nonlinear parameter, solved once on
 * the full design by Householder QR (the profiled search only needed SSE):
 * columns [1], the curve's regressors, then effect-coded block columns.
 */
import {
  applyQTranspose,
  qrDecompose,
  solveUpperTriangular,
  type QrDecomposition,
} from '../../stats/qr';
import { exactScratch } from './exactScratch';
import type { PreparedSite } from '../prepareSite';
import { blockColumns } from './profileSolver';

export interface LinearCoefficients {
  /** Intercept (if asked for) then one coefficient per regressor. */
  curve: Float64Array;
  /** Effect-coded block coefficients, B − 1 of them (empty without blocks). */
  blocks: Float64Array;
  /** False when the design is rank-deficient (then the coefficients are NaN). */
  fullRank: boolean;
  /**
   * QR of the design the coefficients came from (the weighted per-rate rows with
   * orthogonal blocks, the plot rows otherwise): for a curve linear in its
   * parameters it is also the QR of the Jacobian finishFit needs.
   */
  qr: QrDecomposition | null;
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
  const offsets = site.orthogonalBlockOffsets;
  if (offsets) {
    // Orthogonal blocks (or none): the weighted fit of the per-rate means gives the
    // curve, and the effect-coded block coefficients are ȳ_block − ȳ.
    const fast = groupLinearCoefficients(site, regressors, intercept);
    return {
      curve: fast.curve,
      blocks: offsets.slice(0, Math.max(offsets.length - 1, 0)),
      fullRank: Number.isFinite(fast.sse),
      qr: fast.qr,
    };
  }
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
      qr,
    };
  }
  const qty = Float64Array.from(site.y);
  applyQTranspose(qr, qty);
  const b = solveUpperTriangular(qr, qty);
  return { curve: b.slice(0, qc), blocks: b.slice(qc), fullRank: true, qr };
}

/**
 * The curve coefficients alone, cheaply: with group sums available (no blocks,
 * or blocks with proportional frequencies) a weighted least-squares fit of the
 * m per-rate means with weights n_j gives the same coefficients as the plot-level
 * fit (regressors depend on rate only), and SSE = SS_within + the weighted
 * residual SS. Unbalanced block designs fall back to the full design.
 * @param site - from prepareSite
 * @param regressors - each one value per distinct rate
 * @param intercept - put a column of ones first
 * @returns curve coefficients (intercept first, if any; that of the block-adjusted
 *   fit with blocks), the SSE (block offsets included; NaN when rank-deficient) and the
 *   QR of the weighted per-rate design (null for the full design)
 * @example
 * groupLinearCoefficients(site, [site.rates], true).curve // [a, b] of the straight line
 */
export function groupLinearCoefficients(
  site: PreparedSite,
  regressors: Float64Array[],
  intercept: boolean,
): { curve: Float64Array; sse: number; qr: QrDecomposition | null } {
  const lead = intercept ? 1 : 0;
  const p = lead + regressors.length;
  if (site.design === 'full') {
    const full = linearCoefficients(site, regressors, intercept);
    let sse = 0;
    if (full.fullRank) {
      const nb = site.blockLabels.length;
      for (let i = 0; i < site.n; i++) {
        const j = site.groupOf[i];
        let f = intercept ? full.curve[0] : 0;
        for (let k = 0; k < regressors.length; k++) f += full.curve[lead + k] * regressors[k][j];
        const b = site.blockOf[i];
        if (b < nb - 1) f += full.blocks[b];
        else for (let k = 0; k < nb - 1; k++) f -= full.blocks[k];
        sse += (site.y[i] - f) ** 2;
      }
    }
    return { curve: full.curve, sse: full.fullRank ? sse : NaN, qr: null };
  }
  const { counts, means, ssWithin } = site;
  const m = counts.length;
  if (m < p) return { curve: new Float64Array(p).fill(NaN), sse: NaN, qr: null };
  // qrDecompose copies the matrix, so a reused buffer serves.
  const matrix = exactScratch(m * p);
  const rhs = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const w = Math.sqrt(counts[j]);
    if (intercept) matrix[j] = w;
    for (let k = 0; k < regressors.length; k++) matrix[(lead + k) * m + j] = w * regressors[k][j];
    rhs[j] = w * means[j];
  }
  const qr = qrDecompose(matrix, m, p);
  if (qr.rank < p) return { curve: new Float64Array(p).fill(NaN), sse: NaN, qr };
  applyQTranspose(qr, rhs);
  const curve = solveUpperTriangular(qr, rhs);
  let sse = ssWithin;
  for (let j = p; j < m; j++) sse += rhs[j] * rhs[j];
  return { curve, sse, qr };
}

/**
 * The inner coefficients at the estimate's nonlinear parameter. On group sums
 * (orthogonal blocks or none) the profiled search already solved this exact
 * least-squares problem at the reported parameter, so its intercept and β are
 * taken as they are; the full design, or a fit where the search's sign
 * constraint held β at 0 while the unconstrained fit is wanted, is solved again.
 * @param site - from prepareSite
 * @param intercept - estimate's intercept (0 without one)
 * @param beta - estimate's coefficient of the regressor
 * @param regressor - the regressor at the estimate, one value per distinct rate
 * @param withIntercept - whether the model has an intercept
 * @returns curve coefficients ([intercept,] β) and block coefficients
 * @example
 * // fitLinearPlateauPrepared: profiledCoefficients(site, est.params.a, est.params.b, g, true)
 */
export function profiledCoefficients(
  site: PreparedSite,
  intercept: number,
  beta: number,
  regressor: Float64Array,
  withIntercept: boolean,
): { curve: Float64Array; blocks: Float64Array } {
  const offsets = site.orthogonalBlockOffsets;
  if (offsets && beta !== 0 && Number.isFinite(beta) && Number.isFinite(intercept)) {
    return {
      curve: withIntercept ? Float64Array.of(intercept, beta) : Float64Array.of(beta),
      blocks: offsets.slice(0, Math.max(offsets.length - 1, 0)),
    };
  }
  return linearCoefficients(site, [regressor], withIntercept);
}
