/**
 * Cholesky factor and triangular solves for small dense symmetric matrices
 * (a handful of rows: the random effects of one group, the fixed effects of a
 * mixed model). Row-major Float64Arrays; element (i, j) is at i * n + j.
 *
 * Method: the column-by-column Cholesky–Banachiewicz recurrence (Golub & Van
 * Loan, Matrix Computations, 4th ed., §4.2.5). No pivoting: callers pass
 * matrices that are positive definite in exact arithmetic (I + ΛᵀZᵀZΛ, or a
 * Schur complement of it) and read a failure as "not positive definite here".
 */

/**
 * Writes into `lower` the lower-triangular L with L·Lᵀ = a.
 * @param a - symmetric n × n, row-major (only the lower triangle is read)
 * @param n - order
 * @param lower - output, n × n, row-major; the upper triangle is set to 0
 * @returns false when a pivot is not positive (the matrix is not positive definite), else true
 * @example
 * const l = new Float64Array(4);
 * choleskyLower(new Float64Array([4, 2, 2, 5]), 2, l); // l = [2, 0, 1, 2]
 */
export function choleskyLower(a: Float64Array, n: number, lower: Float64Array): boolean {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= lower[i * n + k] * lower[j * n + k];
      if (i === j) {
        if (!(s > 0)) return false;
        lower[i * n + i] = Math.sqrt(s);
      } else {
        lower[i * n + j] = s / lower[j * n + j];
      }
    }
    for (let j = i + 1; j < n; j++) lower[i * n + j] = 0;
  }
  return true;
}

/**
 * Solves L·x = b in place (forward substitution) for one right-hand side
 * stored with a stride, so a column of a row-major matrix can be solved where it lies.
 * @param lower - lower-triangular n × n, row-major
 * @param n - order
 * @param b - right-hand side, overwritten by x
 * @param offset - index of the first element in b
 * @param stride - distance between consecutive elements in b
 */
export function solveLowerInPlace(
  lower: Float64Array,
  n: number,
  b: Float64Array,
  offset = 0,
  stride = 1,
): void {
  for (let i = 0; i < n; i++) {
    let s = b[offset + i * stride];
    for (let k = 0; k < i; k++) s -= lower[i * n + k] * b[offset + k * stride];
    b[offset + i * stride] = s / lower[i * n + i];
  }
}

/**
 * Solves Lᵀ·x = b in place (back substitution), L lower-triangular.
 * @param lower - lower-triangular n × n, row-major
 * @param n - order
 * @param b - right-hand side, overwritten by x
 * @param offset - index of the first element in b
 * @param stride - distance between consecutive elements in b
 */
export function solveLowerTransposeInPlace(
  lower: Float64Array,
  n: number,
  b: Float64Array,
  offset = 0,
  stride = 1,
): void {
  for (let i = n - 1; i >= 0; i--) {
    let s = b[offset + i * stride];
    for (let k = i + 1; k < n; k++) s -= lower[k * n + i] * b[offset + k * stride];
    b[offset + i * stride] = s / lower[i * n + i];
  }
}

/**
 * The inverse of L·Lᵀ from its Cholesky factor: (L·Lᵀ)⁻¹ = L⁻ᵀ·L⁻¹.
 * @param lower - lower-triangular n × n, row-major, with a positive diagonal
 * @param n - order
 * @returns the symmetric inverse, n × n, row-major
 */
export function inverseFromCholesky(lower: Float64Array, n: number): Float64Array {
  const inverse = new Float64Array(n * n);
  for (let j = 0; j < n; j++) inverse[j * n + j] = 1;
  for (let j = 0; j < n; j++) {
    solveLowerInPlace(lower, n, inverse, j, n);
    solveLowerTransposeInPlace(lower, n, inverse, j, n);
  }
  return inverse;
}
