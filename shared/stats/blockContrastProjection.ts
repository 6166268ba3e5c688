/**
 * Projection off a group's block contrasts: the one place the mixed models absorb fixed block
 * offsets nested in a site-year (mixedModelData for the linear models, the plateau forms'
 * penalized nonlinear least squares for theirs).
 *
 * C holds the group's b − 1 sum-to-zero block contrasts (column k: block k's indicator minus
 * the first block's), and a column a maps to a − C·(CᵀC)⁻¹·Cᵀa; in a balanced group that is
 * a − ā_block + ā_group. The contrasts sum to zero over blocks, so the group's unweighted mean
 * of block means stays in the data. Fewer than two distinct labels: no contrast, no projection.
 */
import { choleskyLower, solveLowerInPlace, solveLowerTransposeInPlace } from './smallCholesky';

/** Projects columns of one group off its block contrasts. */
export interface BlockContrastProjection {
  /** How many contrasts (observations) the projection removes: blocks − 1. */
  contrasts: number;
  /**
   * Projects one column in place.
   * @param column - read by row index
   * @param set - receives each row's projected value
   */
  project(column: (row: number) => number, set: (row: number, value: number) => void): void;
  /**
   * Projects one column stored in a flat array in place, without a closure per column: row r
   * sits at values[offset + r·stride]. For callers that project every Gauss–Newton step.
   * @param values - the flat array
   * @param offset - index of row 0
   * @param stride - distance between rows
   */
  projectStrided(values: Float64Array, offset: number, stride: number): void;
}

/**
 * The projection of one group's rows off its block contrasts.
 * @param labels - block label per row
 * @returns the projection, or null with fewer than two distinct labels
 * @example
 * const p = blockContrastProjection(['1', '1', '2', '2'])!;
 * const y = [1, 3, 5, 7];
 * p.project((r) => y[r], (r, v) => (y[r] = v)); // y = [3, 5, 3, 5]
 */
export function blockContrastProjection(labels: readonly string[]): BlockContrastProjection | null {
  const blockNames = [...new Set(labels)];
  if (blockNames.length < 2) return null;
  const m = labels.length;
  const blockOf = labels.map((label) => blockNames.indexOf(label));
  const k = blockNames.length - 1;
  const counts = new Float64Array(blockNames.length);
  for (const b of blockOf) counts[b]++;
  const ctc = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) ctc[i * k + j] = counts[0] + (i === j ? counts[i + 1] : 0);
  }
  const ctcLower = new Float64Array(k * k);
  choleskyLower(ctc, k, ctcLower);
  const w = new Float64Array(k);
  const sums = new Float64Array(blockNames.length);
  // w_i = ((CᵀC)⁻¹Cᵀa)_i from the block sums; the first block's offset is −Σ w_i.
  const offsets = (): number => {
    for (let i = 0; i < k; i++) w[i] = sums[i + 1] - sums[0];
    solveLowerInPlace(ctcLower, k, w);
    solveLowerTransposeInPlace(ctcLower, k, w);
    let first = 0;
    for (let i = 0; i < k; i++) first -= w[i];
    return first;
  };
  return {
    contrasts: k,
    project(column, set) {
      sums.fill(0);
      for (let r = 0; r < m; r++) sums[blockOf[r]] += column(r);
      const first = offsets();
      for (let r = 0; r < m; r++) {
        set(r, column(r) - (blockOf[r] === 0 ? first : w[blockOf[r] - 1]));
      }
    },
    projectStrided(values, offset, stride) {
      sums.fill(0);
      for (let r = 0; r < m; r++) sums[blockOf[r]] += values[offset + r * stride];
      const first = offsets();
      for (let r = 0; r < m; r++) {
        values[offset + r * stride] -= blockOf[r] === 0 ? first : w[blockOf[r] - 1];
      }
    },
  };
}
