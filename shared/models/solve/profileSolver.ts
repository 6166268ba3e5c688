/**
 * The inner linear problem of a profiled fit (variable projection, Golub &
 * Pereyra 1973): with the nonlinear parameter θ fixed, the curve is
 * y = a + β g_θ(x) (+ block offsets), linear in a and β, so SSE(θ) is the
 * residual sum of squares of an ordinary least-squares fit.
 *
 * Two routes, same answer:
 * - group sums (no blocks, or blocks with proportional frequencies): weighted
 *   least squares on the per-rate means with weights n_j, centered sums
 *   S_gg = Σ n_j (g_j − ḡ)², S_gm = Σ n_j (g_j − ḡ)(m_j − m̄), β = S_gm / S_gg,
 *   then SSE = SS_within + Σ n_j (m_j − a − β g_j)² from explicit residuals
 *   (accurate even when the fit is nearly exact);
 * - full design (unbalanced blocks): Householder QR of [1, g(x_i), block columns].
 *
 * A rising curve needs β of a given sign (β > 0 for the plateau and exponential
 * models, c < 0 for the quadratic-plateau). When the unconstrained β has the
 * wrong sign, the constrained optimum is β = 0 (SSE is a convex quadratic in β),
 * which is the flat fit: that SSE is returned instead.
 */
import { applyQTranspose, qrDecompose } from '../../stats/qr';
import type { PreparedSite } from '../prepareSite';

export interface ProfileSolver {
  /** SSE at g (one value per distinct rate), respecting the sign constraint on β. */
  sse: (g: Float64Array) => number;
  /** SSE of the flat fit (β = 0): intercept and block offsets only (or zero without intercept). */
  flatSse: number;
  /**
   * The inner coefficients of the latest sse() call (overwritten by the next):
   * intercept a (0 without one) and β (0 for the flat fit). With block terms, a
   * is the intercept of the block-adjusted fit.
   */
  last: { intercept: number; beta: number };
}

export interface ProfileSolverOptions {
  /** Estimate an intercept a (true for every model except the exponential with a = 0). */
  intercept: boolean;
  /** Required sign of β, or 'free'. */
  sign: 'positive' | 'negative' | 'free';
}

/**
 * Builds the SSE(g) evaluator for a prepared site.
 * @param site - from prepareSite
 * @param options - intercept and the sign β must have
 * @returns the evaluator and the flat fit's SSE
 * @example
 * const s = profileSolver(prepareSite({ rateKgHa: [0, 1, 2], yieldKgHa: [1, 2, 3.2] }, 'none'), { intercept: true, sign: 'free' });
 * s.sse(new Float64Array([0, 1, 2])) // ≈ 0.0067 (the straight line)
 */
export function profileSolver(site: PreparedSite, options: ProfileSolverOptions): ProfileSolver {
  return site.design === 'full' ? fullDesignSolver(site, options) : groupSolver(site, options);
}

function groupSolver(site: PreparedSite, options: ProfileSolverOptions): ProfileSolver {
  const { counts, means, ssWithin } = site;
  const m = counts.length;
  let w = 0;
  let mBar = 0;
  for (let j = 0; j < m; j++) {
    w += counts[j];
    mBar += counts[j] * means[j];
  }
  mBar /= w;
  let flatSse = ssWithin;
  for (let j = 0; j < m; j++) {
    const d = options.intercept ? means[j] - mBar : means[j];
    flatSse += counts[j] * d * d;
  }
  const last = { intercept: 0, beta: 0 };
  // The evaluators come from module-level factories: a closure bound to a name
  // here would be renamed on every call by tools that keep function names (tsx,
  // which runs the benchmarks), at a cost comparable to the evaluation itself.
  const sse = options.intercept
    ? centeredSse(site, options.sign, w, mBar, flatSse, last)
    : originSse(site, options.sign, flatSse, last);
  return { sse, flatSse, last };
}

/** SSE(g) with an intercept: centered sums, explicit residuals. */
function centeredSse(
  site: PreparedSite,
  sign: ProfileSolverOptions['sign'],
  w: number,
  mBar: number,
  flatSse: number,
  last: ProfileSolver['last'],
): (g: Float64Array) => number {
  const { counts, means, ssWithin } = site;
  const m = counts.length;
  return (g) => {
    let gBar = 0;
    for (let j = 0; j < m; j++) gBar += counts[j] * g[j];
    gBar /= w;
    let sgg = 0;
    let sgm = 0;
    let gScale = 0;
    for (let j = 0; j < m; j++) {
      const dg = g[j] - gBar;
      sgg += counts[j] * dg * dg;
      sgm += counts[j] * dg * (means[j] - mBar);
      gScale += counts[j] * g[j] * g[j];
    }
    const beta = sgm / sgg;
    // g constant (e.g. a join below the lowest rate): only the flat fit exists;
    // β of the wrong sign: the constrained optimum is the flat fit too.
    if (
      !(sgg > 1e-24 * gScale) ||
      (sign === 'positive' && beta <= 0) ||
      (sign === 'negative' && beta >= 0)
    ) {
      last.intercept = mBar;
      last.beta = 0;
      return flatSse;
    }
    last.intercept = mBar - beta * gBar;
    last.beta = beta;
    let s = ssWithin;
    for (let j = 0; j < m; j++) {
      const r = means[j] - mBar - beta * (g[j] - gBar);
      s += counts[j] * r * r;
    }
    return s;
  };
}

/** SSE(g) through the origin (no intercept). */
function originSse(
  site: PreparedSite,
  sign: ProfileSolverOptions['sign'],
  flatSse: number,
  last: ProfileSolver['last'],
): (g: Float64Array) => number {
  const { counts, means, ssWithin } = site;
  const m = counts.length;
  return (g) => {
    let sgg = 0;
    let sgm = 0;
    for (let j = 0; j < m; j++) {
      sgg += counts[j] * g[j] * g[j];
      sgm += counts[j] * g[j] * means[j];
    }
    const beta = sgm / sgg;
    if (!(sgg > 0) || (sign === 'positive' && beta <= 0) || (sign === 'negative' && beta >= 0)) {
      last.intercept = 0;
      last.beta = 0;
      return flatSse;
    }
    last.intercept = 0;
    last.beta = beta;
    let s = ssWithin;
    for (let j = 0; j < m; j++) {
      const r = means[j] - beta * g[j];
      s += counts[j] * r * r;
    }
    return s;
  };
}

/**
 * Effect-coded block columns (block b: +1, last block: −1), B − 1 of them.
 * @param site - from prepareSite, with block terms
 * @returns B − 1 columns of length n
 * @example
 * blockColumns(prepareSite({ rateKgHa: [0, 0], yieldKgHa: [1, 2], block: ['a', 'b'] }, 'fixed')) // [[1, −1]]
 */
export function blockColumns(site: PreparedSite): Float64Array[] {
  const nb = site.blockLabels.length;
  const cols: Float64Array[] = [];
  for (let b = 0; b < nb - 1; b++) {
    const c = new Float64Array(site.n);
    for (let i = 0; i < site.n; i++) {
      const k = site.blockOf[i];
      c[i] = k === b ? 1 : k === nb - 1 ? -1 : 0;
    }
    cols.push(c);
  }
  return cols;
}

function fullDesignSolver(site: PreparedSite, options: ProfileSolverOptions): ProfileSolver {
  const { n, y, groupOf } = site;
  const blocks = blockColumns(site);
  const lead = options.intercept ? 1 : 0;
  // Column order: [1], g, blocks…; g's position is `lead`.
  const p = lead + 1 + blocks.length;
  const base = new Float64Array(n * p);
  if (options.intercept) base.fill(1, 0, n);
  blocks.forEach((c, k) => base.set(c, (lead + 1 + k) * n));

  const residualSs = (
    matrix: Float64Array,
    cols: number,
  ): { sse: number; coef: number; intercept: number } => {
    const qr = qrDecompose(matrix, n, cols);
    const qty = Float64Array.from(y);
    applyQTranspose(qr, qty);
    let s = 0;
    for (let i = cols; i < n; i++) s += qty[i] * qty[i];
    if (qr.rank < cols) return { sse: NaN, coef: NaN, intercept: NaN };
    // β by back substitution only when it is needed (the sign check).
    const rAt = (i: number, j: number): number =>
      i === j ? qr.rDiagonal[i] : qr.packed[j * n + i];
    const b = new Float64Array(cols);
    for (let i = cols - 1; i >= 0; i--) {
      let t = qty[i];
      for (let j = i + 1; j < cols; j++) t -= rAt(i, j) * b[j];
      b[i] = t / qr.rDiagonal[i];
    }
    return { sse: s, coef: b[lead], intercept: options.intercept ? b[0] : 0 };
  };

  // Flat fit: drop the g column.
  const flatCols = p - 1;
  let flatSse = 0;
  let flatIntercept = 0;
  if (flatCols === 0) {
    for (let i = 0; i < n; i++) flatSse += y[i] * y[i];
  } else {
    const flat = new Float64Array(n * flatCols);
    if (options.intercept) flat.fill(1, 0, n);
    blocks.forEach((c, k) => flat.set(c, (lead + k) * n));
    const r = residualSs(flat, flatCols);
    flatSse = r.sse;
    flatIntercept = r.intercept;
  }
  const last = { intercept: 0, beta: 0 };
  const flatFit = (): number => {
    last.intercept = flatIntercept;
    last.beta = 0;
    return flatSse;
  };
  const work = new Float64Array(n * p);
  const sse = (g: Float64Array): number => {
    work.set(base);
    let gMin = Infinity;
    let gMax = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = g[groupOf[i]];
      work[lead * n + i] = v;
      if (v < gMin) gMin = v;
      if (v > gMax) gMax = v;
    }
    const spread = gMax - gMin;
    if (options.intercept && !(spread > 1e-12 * Math.max(Math.abs(gMax), Math.abs(gMin)))) {
      return flatFit();
    }
    const { sse: s, coef, intercept } = residualSs(work, p);
    if (!Number.isFinite(s)) return flatFit();
    if ((options.sign === 'positive' && coef <= 0) || (options.sign === 'negative' && coef >= 0)) {
      return flatFit();
    }
    last.intercept = intercept;
    last.beta = coef;
    return s;
  };
  return { sse, flatSse, last };
}
