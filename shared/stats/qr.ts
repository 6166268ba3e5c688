/**
 * Householder QR decomposition of a tall matrix (rows ≥ cols), the numerically
 * stable route to least squares: it never forms XᵀX, whose condition number is
 * the square of X's (Golub & Van Loan, Matrix Computations, 4th ed., §5.2 and §5.3).
 *
 * Matrices are column-major Float64Arrays: element (i, j) is at j * rows + i.
 */

export interface QrDecomposition {
  readonly rows: number;
  readonly cols: number;
  /** Householder vectors below the diagonal, R on and above it (column-major). */
  readonly packed: Float64Array;
  /** Diagonal of R (kept apart because the packed diagonal holds the vector heads). */
  readonly rDiagonal: Float64Array;
  /** The scalars β of the reflections H = I − β v vᵀ. */
  readonly beta: Float64Array;
  /** Numerical rank: columns whose |R_jj| exceed tolerance × the largest column norm. */
  readonly rank: number;
}

/** Relative tolerance below which a diagonal of R counts as zero (rank deficiency). */
export const RANK_TOLERANCE = 1e-10;

/**
 * Decomposes a column-major matrix A = QR without pivoting.
 * @param matrix - column-major values, length rows × cols (not modified)
 * @param rows - number of rows (observations)
 * @param cols - number of columns (parameters), at most rows
 * @param into - where to factor: a buffer of at least rows × cols values the caller lends for as
 *   long as it uses the decomposition (a fit's own scratch); default a new array
 * @returns the packed decomposition and its numerical rank
 * @example
 * qrDecompose(new Float64Array([1, 1, 1, 1, 2, 3]), 3, 2).rank // 2
 */
export function qrDecompose(
  matrix: Float64Array,
  rows: number,
  cols: number,
  into?: Float64Array,
): QrDecomposition {
  const a = into ? into.subarray(0, rows * cols) : Float64Array.from(matrix);
  if (into) a.set(matrix.subarray(0, rows * cols));
  const rDiagonal = new Float64Array(cols);
  const beta = new Float64Array(cols);
  let largestNorm = 0;
  for (let j = 0; j < cols; j++) {
    let s = 0;
    for (let i = 0; i < rows; i++) s += a[j * rows + i] ** 2;
    largestNorm = Math.max(largestNorm, Math.sqrt(s));
  }
  let rank = 0;
  for (let k = 0; k < cols; k++) {
    const col = k * rows;
    // Scaled norm of the trailing part of column k, safe from overflow.
    let scale = 0;
    for (let i = k; i < rows; i++) scale = Math.max(scale, Math.abs(a[col + i]));
    if (scale === 0) {
      rDiagonal[k] = 0;
      beta[k] = 0;
      continue;
    }
    let sum = 0;
    for (let i = k; i < rows; i++) sum += (a[col + i] / scale) ** 2;
    const norm = scale * Math.sqrt(sum);
    const alpha = a[col + k] > 0 ? -norm : norm;
    // v = x − alpha e1, stored in place; β = 1 / (norm (norm + |x_k|)).
    a[col + k] -= alpha;
    const b = 1 / (norm * (norm + Math.abs(a[col + k] + alpha)));
    beta[k] = b;
    rDiagonal[k] = alpha;
    if (Math.abs(alpha) > RANK_TOLERANCE * largestNorm) rank++;
    for (let j = k + 1; j < cols; j++) {
      const other = j * rows;
      let dot = 0;
      for (let i = k; i < rows; i++) dot += a[col + i] * a[other + i];
      const f = b * dot;
      for (let i = k; i < rows; i++) a[other + i] -= f * a[col + i];
    }
  }
  return { rows, cols, packed: a, rDiagonal, beta, rank };
}

/**
 * Applies Qᵀ to a vector in place (y ← Qᵀ y).
 * @param qr - a decomposition from qrDecompose
 * @param y - a vector of length qr.rows, overwritten
 * @returns nothing; y holds Qᵀy, whose first cols entries give R b = Qᵀy and the rest the residual part
 * @example
 * const qr = qrDecompose(new Float64Array([1, 1, 1, 1, 2, 3]), 3, 2);
 * const y = new Float64Array([2, 4, 6]);
 * applyQTranspose(qr, y); // y[2] ≈ 0: the points lie on a line
 */
export function applyQTranspose(qr: QrDecomposition, y: Float64Array): void {
  const { rows, cols, packed, beta } = qr;
  for (let k = 0; k < cols; k++) {
    if (beta[k] === 0) continue;
    const col = k * rows;
    let dot = 0;
    for (let i = k; i < rows; i++) dot += packed[col + i] * y[i];
    const f = beta[k] * dot;
    for (let i = k; i < rows; i++) y[i] -= f * packed[col + i];
  }
}

/**
 * Applies Q to a vector in place (y ← Q y), the reflections in reverse order.
 * @param qr - a decomposition from qrDecompose
 * @param y - a vector of length qr.rows, overwritten
 * @returns nothing; y holds Qy
 * @example
 * const e = new Float64Array([1, 0, 0]);
 * applyQ(qr, e); // e is now the first column of Q
 */
export function applyQ(qr: QrDecomposition, y: Float64Array): void {
  const { rows, cols, packed, beta } = qr;
  for (let k = cols - 1; k >= 0; k--) {
    if (beta[k] === 0) continue;
    const col = k * rows;
    let dot = 0;
    for (let i = k; i < rows; i++) dot += packed[col + i] * y[i];
    const f = beta[k] * dot;
    for (let i = k; i < rows; i++) y[i] -= f * packed[col + i];
  }
}

/** R's element (i, j) for i ≤ j. */
function rAt(qr: QrDecomposition, i: number, j: number): number {
  return i === j ? qr.rDiagonal[i] : qr.packed[j * qr.rows + i];
}

/**
 * Solves R b = c for the leading cols entries of c (back substitution).
 * @param qr - a full-rank decomposition from qrDecompose
 * @param c - Qᵀy (at least qr.cols entries)
 * @returns b, length qr.cols
 * @example
 * applyQTranspose(qr, y); const b = solveUpperTriangular(qr, y); // least-squares coefficients
 */
export function solveUpperTriangular(qr: QrDecomposition, c: Float64Array): Float64Array {
  const p = qr.cols;
  const b = new Float64Array(p);
  for (let i = p - 1; i >= 0; i--) {
    let s = c[i];
    for (let j = i + 1; j < p; j++) s -= rAt(qr, i, j) * b[j];
    b[i] = s / qr.rDiagonal[i];
  }
  return b;
}

/**
 * (RᵀR)⁻¹ = R⁻¹R⁻ᵀ, the unscaled covariance (XᵀX)⁻¹, computed from R alone.
 * @param qr - a full-rank decomposition from qrDecompose
 * @returns a dense row-major cols × cols array of arrays; times σ² it is the coefficients' covariance
 * @example
 * unscaledCovariance(qrDecompose(new Float64Array([1, 1, 1, 1, 2, 3]), 3, 2))[1][1] // 0.5 = 1/Σ(x − x̄)²
 */
export function unscaledCovariance(qr: QrDecomposition): number[][] {
  const p = qr.cols;
  // Rinv is upper triangular: solve R Rinv = I column by column.
  const rInv: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let col = 0; col < p; col++) {
    for (let i = col; i >= 0; i--) {
      let s = i === col ? 1 : 0;
      for (let j = i + 1; j <= col; j++) s -= rAt(qr, i, j) * rInv[j][col];
      rInv[i][col] = s / qr.rDiagonal[i];
    }
  }
  const cov: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++) {
    for (let j = i; j < p; j++) {
      let s = 0;
      for (let k = j; k < p; k++) s += rInv[i][k] * rInv[j][k];
      cov[i][j] = s;
      cov[j][i] = s;
    }
  }
  return cov;
}

/**
 * Diagonal of the hat matrix H = Q₁Q₁ᵀ (the leverages), from the rows of the thin Q.
 * @param qr - a decomposition from qrDecompose
 * @param out - where to write the leverages (rows values, all 0); default a new array
 * @param work - a working buffer of at least rows values, overwritten; default a new array
 * @returns leverage h_i for every row, each in [0, 1], summing to the rank
 * @example
 * hatDiagonal(qrDecompose(new Float64Array([1, 1, 1, 1, 2, 3]), 3, 2)) // [5/6, 1/3, 5/6]
 */
export function hatDiagonal(
  qr: QrDecomposition,
  out?: Float64Array,
  work?: Float64Array,
): Float64Array {
  const { rows, cols } = qr;
  const h = out ?? new Float64Array(rows);
  const e = work ? work.subarray(0, rows) : new Float64Array(rows);
  for (let k = 0; k < cols; k++) {
    e.fill(0);
    e[k] = 1;
    applyQ(qr, e); // column k of Q
    for (let i = 0; i < rows; i++) h[i] += e[i] * e[i];
  }
  return h;
}
